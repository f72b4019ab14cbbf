import type { Knex } from 'knex';

// The four design figures the crossing list shows, kept beside the design JSON: reading them with
// json_extract parsed every whole design (tens of kB with its profile) on every list request.
export async function up(knex: Knex): Promise<void> {
  await knex.schema.alterTable('crossings', (table) => {
    table.boolean('design_provisional').notNullable().defaultTo(false);
    table.string('design_style', 20);
    table.double('design_flood_level_m');
    table.double('design_floodgate_length_m');
  });
  await knex('crossings')
    .whereNotNull('design')
    .update({
      design_provisional: knex.raw("coalesce(json_extract(design, '$.provisional'), 0)"),
      design_style: knex.raw("json_extract(design, '$.layout.style')"),
      design_flood_level_m: knex.raw("json_extract(design, '$.floods.levelM')"),
      design_floodgate_length_m: knex.raw("json_extract(design, '$.layout.floodgate.lengthM')"),
    });
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.alterTable('crossings', (table) => {
    table.dropColumn('design_provisional');
    table.dropColumn('design_style');
    table.dropColumn('design_flood_level_m');
    table.dropColumn('design_floodgate_length_m');
  });
}
