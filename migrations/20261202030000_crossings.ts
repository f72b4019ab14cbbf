import type { Knex } from 'knex';

export async function up(knex: Knex): Promise<void> {
  await knex.schema.createTable('crossings', (table) => {
    table.increments('id').primary();
    table.integer('property_id').notNullable().references('properties.id').onDelete('CASCADE');
    table.integer('fence_line_id').notNullable().references('fence_lines.id').onDelete('CASCADE');
    table.integer('drainage_line_id').references('drainage_lines.id').onDelete('SET NULL');
    table.string('kind', 14).notNullable().checkIn(['crossing', 'touch', 'crosses-twice', 'runs-along'], 'crossings_kind_check');
    table.double('lon').notNullable();
    table.double('lat').notNullable();
    table.double('chainage_m').notNullable();
    table.double('angle_deg');
    table.string('angle_class', 6);
    table.double('upstream_area_m2');
    table.integer('stream_order');
    // JSON: what the person set for this crossing (flood mark, roughness, runoff coefficient,
    // AEP, freeboard, style, overrides); kept when the crossing is found again after a change.
    table.text('inputs').notNullable().defaultTo('{}');
    // JSON: the computed design with its inputs and methods; null until designed.
    table.text('design');
    table.string('design_status', 12).notNullable().defaultTo('pending');
    table.string('computed_at', 30);
    table.index(['property_id']);
    table.index(['fence_line_id']);
  });

  await knex.schema.createTable('property_settings', (table) => {
    table.integer('property_id').primary().references('properties.id').onDelete('CASCADE');
    // JSON: design settings (tolerances, set-backs, thresholds), the IFD table and the price list.
    table.text('design_settings').notNullable().defaultTo('{}');
    table.text('ifd_table');
    table.text('price_list').notNullable().defaultTo('[]');
    table.integer('version').notNullable().defaultTo(1);
    table.string('updated_at', 30).notNullable();
  });
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTable('property_settings');
  await knex.schema.dropTable('crossings');
}
