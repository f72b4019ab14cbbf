import type { Knex } from 'knex';

export async function up(knex: Knex): Promise<void> {
  await knex.schema.createTable('outbox', (table) => {
    table.increments('id').primary();
    table.string('to', 254).notNullable();
    table.string('subject', 300).notNullable();
    table.text('text').notNullable();
    table.text('html').notNullable();
    // A JSON array of { filename, contentType, contentBase64 }, or null for none.
    table.text('attachments');
    table.string('status', 10).notNullable().defaultTo('queued').checkIn(['queued', 'sending', 'sent', 'failed'], 'outbox_status_check');
    table.integer('attempts').notNullable().defaultTo(0);
    table.string('next_attempt_at', 30).notNullable();
    table.text('last_error');
    table.string('created_at', 30).notNullable();
    table.string('sent_at', 30);
    table.index(['status', 'next_attempt_at']);
  });
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTable('outbox');
}
