import type { Knex } from 'knex';

export async function up(knex: Knex): Promise<void> {
  await knex.schema.createTable('elevation_models', (table) => {
    table.increments('id').primary();
    table.integer('property_id').notNullable().references('properties.id').onDelete('CASCADE');
    table.string('name', 200).notNullable();
    // Relative to DATA_DIR, so a data folder can be moved or restored elsewhere.
    table.string('stored_file', 300).notNullable();
    table.integer('size_bytes').notNullable();
    table.string('crs', 20).notNullable();
    table.string('crs_name', 120).notNullable();
    table.integer('width').notNullable();
    table.integer('height').notNullable();
    table.double('cell_size_m').notNullable();
    table.double('extent_west').notNullable();
    table.double('extent_south').notNullable();
    table.double('extent_east').notNullable();
    table.double('extent_north').notNullable();
    table.integer('uploaded_by').references('users.id').onDelete('SET NULL');
    table.string('created_at', 30).notNullable();
    table.index(['property_id']);
  });

  await knex.schema.createTable('terrain_runs', (table) => {
    table.increments('id').primary();
    table.integer('property_id').notNullable().references('properties.id').onDelete('CASCADE');
    table.integer('elevation_model_id').notNullable().references('elevation_models.id').onDelete('CASCADE');
    table.string('status', 12).notNullable().checkIn(['queued', 'running', 'succeeded', 'failed', 'cancelled'], 'terrain_runs_status_check');
    table.string('stage', 20);
    table.integer('percent').notNullable().defaultTo(0);
    table.text('message');
    table.double('threshold_ha').notNullable();
    // JSON: stage times, bounds and corners, contour interval, heights; set when the run succeeds.
    table.text('summary');
    table.integer('created_by').references('users.id').onDelete('SET NULL');
    table.string('created_at', 30).notNullable();
    table.string('started_at', 30);
    table.string('finished_at', 30);
    table.index(['property_id', 'status']);
  });

  await knex.schema.createTable('drainage_lines', (table) => {
    table.increments('id').primary();
    table.integer('property_id').notNullable().references('properties.id').onDelete('CASCADE');
    table.integer('terrain_run_id').references('terrain_runs.id').onDelete('CASCADE');
    // GeoJSON LineString geometry in WGS84 and in the elevation model's CRS.
    table.text('geometry').notNullable();
    table.text('geometry_crs');
    table.integer('stream_order').notNullable();
    table.double('upstream_area_start_m2').notNullable();
    table.double('upstream_area_end_m2').notNullable();
    table.double('length_m').notNullable();
    table.double('mean_slope').notNullable();
    table.integer('segment_index');
    table.integer('downstream_index');
    table.double('min_lon').notNullable();
    table.double('min_lat').notNullable();
    table.double('max_lon').notNullable();
    table.double('max_lat').notNullable();
    table.index(['property_id']);
    table.index(['terrain_run_id']);
  });
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTable('drainage_lines');
  await knex.schema.dropTable('terrain_runs');
  await knex.schema.dropTable('elevation_models');
}
