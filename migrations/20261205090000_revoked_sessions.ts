import type { Knex } from 'knex';

// Sessions are signed cookies; one that was signed out is listed here until it would have expired
// anyway, so a copy of the cookie taken before sign-out is refused.
export async function up(knex: Knex): Promise<void> {
  await knex.schema.createTable('revoked_sessions', (table) => {
    table.string('session_id', 64).primary();
    table.integer('user_id');
    table.string('expires_at', 30).notNullable().index();
    table.string('revoked_at', 30).notNullable();
  });
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTable('revoked_sessions');
}
