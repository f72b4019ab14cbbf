import type { Knex } from 'knex';

export async function up(knex: Knex): Promise<void> {
  await knex.schema.createTable('memberships', (table) => {
    table.integer('property_id').notNullable().references('properties.id').onDelete('CASCADE');
    table.integer('user_id').notNullable().references('users.id').onDelete('CASCADE');
    table.string('role', 10).notNullable().checkIn(['owner', 'manager', 'crew', 'viewer'], 'memberships_role_check');
    table.string('created_at', 30).notNullable();
    table.primary(['property_id', 'user_id']);
    table.index(['user_id']);
  });
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTable('memberships');
}
