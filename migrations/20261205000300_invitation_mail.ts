import type { Knex } from 'knex';

// Each invitation points at its e-mail in the outbox, so the people page can say whether it went.
export async function up(knex: Knex): Promise<void> {
  await knex.schema.alterTable('invitations', (table) => {
    table.integer('outbox_id').references('outbox.id').onDelete('SET NULL');
  });
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.alterTable('invitations', (table) => {
    table.dropColumn('outbox_id');
  });
}
