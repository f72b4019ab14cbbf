import type { Knex } from 'knex';

export async function up(knex: Knex): Promise<void> {
  await knex.schema.createTable('invitations', (table) => {
    table.increments('id').primary();
    table.integer('property_id').notNullable().references('properties.id').onDelete('CASCADE');
    table.string('email', 254).notNullable();
    table.string('role', 10).notNullable().checkIn(['owner', 'manager', 'crew', 'viewer'], 'invitations_role_check');
    // Only a hash of the single-use token is kept, so a copy of the database cannot accept invitations.
    table.string('token_hash', 64).notNullable().unique();
    table.integer('invited_by').references('users.id').onDelete('SET NULL');
    table.string('expires_at', 30).notNullable();
    table.string('accepted_at', 30);
    table.string('revoked_at', 30);
    table.string('created_at', 30).notNullable();
    table.index(['property_id']);
  });
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTable('invitations');
}
