import type { Knex } from 'knex';

// Paddocks become editable: a version for stale-edit checks and the time of the last change.
export async function up(knex: Knex): Promise<void> {
  await knex.schema.alterTable('paddocks', (table) => {
    table.integer('version').notNullable().defaultTo(1);
    // SQLite adds a NOT NULL column only with a constant default; the rows already there take
    // their creation time just below, and every write sets it.
    table.string('updated_at', 30).notNullable().defaultTo('');
  });
  await knex('paddocks').update({ updated_at: knex.ref('created_at') });
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.alterTable('paddocks', (table) => {
    table.dropColumn('updated_at');
    table.dropColumn('version');
  });
}
