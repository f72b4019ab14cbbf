import type { Knex } from 'knex';

const bbox = (table: Knex.CreateTableBuilder) => {
  table.double('min_lon').notNullable();
  table.double('min_lat').notNullable();
  table.double('max_lon').notNullable();
  table.double('max_lat').notNullable();
};

export async function up(knex: Knex): Promise<void> {
  await knex.schema.createTable('fence_lines', (table) => {
    table.increments('id').primary();
    table.integer('property_id').notNullable().references('properties.id').onDelete('CASCADE');
    table.string('name', 120).notNullable();
    table.string('status', 10).notNullable().checkIn(['planned', 'approved', 'building', 'built', 'retired'], 'fence_lines_status_check');
    // GeoJSON LineString in WGS84.
    table.text('geometry').notNullable();
    table.double('length_m').notNullable();
    // JSON: wire heights and kinds, post and dropper spacing.
    table.text('wire_spec').notNullable();
    table.integer('version').notNullable().defaultTo(1);
    bbox(table);
    table.integer('created_by').references('users.id').onDelete('SET NULL');
    table.string('created_at', 30).notNullable();
    table.string('updated_at', 30).notNullable();
    table.index(['property_id']);
  });

  await knex.schema.createTable('tracks', (table) => {
    table.increments('id').primary();
    table.integer('property_id').notNullable().references('properties.id').onDelete('CASCADE');
    table.string('name', 200).notNullable();
    table.string('kind', 10).notNullable().checkIn(['track', 'route', 'line'], 'tracks_kind_check');
    table.string('source_file', 200).notNullable();
    table.text('description').notNullable().defaultTo('');
    table.text('geometry').notNullable();
    table.double('length_m').notNullable();
    bbox(table);
    table.string('created_at', 30).notNullable();
    table.index(['property_id']);
  });

  await knex.schema.createTable('paddocks', (table) => {
    table.increments('id').primary();
    table.integer('property_id').notNullable().references('properties.id').onDelete('CASCADE');
    table.string('name', 120).notNullable();
    // GeoJSON Polygon in WGS84, outer ring counterclockwise (RFC 7946).
    table.text('geometry').notNullable();
    table.double('area_ha').notNullable();
    bbox(table);
    table.string('created_at', 30).notNullable();
    table.index(['property_id']);
  });
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTable('paddocks');
  await knex.schema.dropTable('tracks');
  await knex.schema.dropTable('fence_lines');
}
