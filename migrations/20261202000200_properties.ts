import type { Knex } from 'knex';

export async function up(knex: Knex): Promise<void> {
  await knex.schema.createTable('properties', (table) => {
    table.increments('id').primary();
    table.string('name', 120).notNullable();
    table.string('region', 120).notNullable().defaultTo('');
    // Projected CRS used for raster work on this property, e.g. "EPSG:7854".
    table.string('crs', 20).notNullable();
    // Extent in WGS84 degrees; null until an elevation model or a line places the property.
    table.double('extent_west');
    table.double('extent_south');
    table.double('extent_east');
    table.double('extent_north');
    table.integer('created_by').references('users.id').onDelete('SET NULL');
    table.integer('version').notNullable().defaultTo(1);
    table.string('created_at', 30).notNullable();
    table.string('updated_at', 30).notNullable();
  });
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTable('properties');
}
