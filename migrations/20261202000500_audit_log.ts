import type { Knex } from 'knex';

export async function up(knex: Knex): Promise<void> {
  await knex.schema.createTable('audit_log', (table) => {
    table.increments('id').primary();
    // Entries outlive what they describe: no cascades, plain ids.
    table.integer('property_id');
    table.integer('user_id');
    table.string('action', 60).notNullable();
    table.string('entity_type', 40).notNullable();
    table.string('entity_id', 40);
    table.text('detail').notNullable().defaultTo('{}');
    table.string('created_at', 30).notNullable();
    table.index(['property_id', 'created_at']);
  });
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTable('audit_log');
}
