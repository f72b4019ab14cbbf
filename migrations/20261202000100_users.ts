import type { Knex } from 'knex';

export async function up(knex: Knex): Promise<void> {
  await knex.schema.createTable('users', (table) => {
    table.increments('id').primary();
    // Stored lower-cased and trimmed, so the unique index compares addresses as people expect.
    table.string('email', 254).notNullable().unique();
    table.string('name', 120).notNullable();
    table.string('password_hash', 255).notNullable();
    table.string('created_at', 30).notNullable();
    table.string('updated_at', 30).notNullable();
  });
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTable('users');
}
