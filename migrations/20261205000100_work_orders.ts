import type { Knex } from 'knex';

export async function up(knex: Knex): Promise<void> {
  await knex.schema.createTable('work_orders', (table) => {
    table.increments('id').primary();
    table.integer('property_id').notNullable().references('properties.id').onDelete('CASCADE');
    table.string('title', 120).notNullable();
    table.text('notes').notNullable().defaultTo('');
    // Who does the work: a member of the property, or an outside contractor by e-mail (one of the two).
    table.integer('assignee_user_id').references('users.id').onDelete('SET NULL');
    table.string('contractor_email', 254);
    table.string('target_date', 10);
    table.string('status', 10).notNullable().defaultTo('draft').checkIn(['draft', 'sent', 'done', 'cancelled'], 'work_orders_status_check');
    table.integer('version').notNullable().defaultTo(1);
    // The contractor's read-only link: only a hash of the token is kept, so a copy of the database opens nothing.
    table.string('link_token_hash', 64).unique();
    table.string('link_expires_at', 30);
    table.string('link_revoked_at', 30);
    table.string('sent_at', 30);
    table.integer('created_by').references('users.id').onDelete('SET NULL');
    table.integer('updated_by').references('users.id').onDelete('SET NULL');
    table.string('created_at', 30).notNullable();
    table.string('updated_at', 30).notNullable();
    table.index(['property_id']);
  });

  await knex.schema.createTable('work_order_items', (table) => {
    table.increments('id').primary();
    table.integer('work_order_id').notNullable().references('work_orders.id').onDelete('CASCADE');
    // Exactly one of the two: a whole fence line or one crossing.
    table.integer('fence_line_id').references('fence_lines.id').onDelete('CASCADE');
    table.integer('crossing_id').references('crossings.id').onDelete('CASCADE');
    table.integer('position').notNullable();
    table.string('state', 12).notNullable().defaultTo('not-started').checkIn(['not-started', 'started', 'done', 'blocked'], 'work_order_items_state_check');
    table.text('note').notNullable().defaultTo('');
    table.integer('state_by').references('users.id').onDelete('SET NULL');
    table.string('state_at', 30);
    table.index(['work_order_id']);
    table.index(['fence_line_id']);
    table.index(['crossing_id']);
    table.check('(fence_line_id IS NULL) <> (crossing_id IS NULL)', [], 'work_order_items_one_target_check');
  });
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTable('work_order_items');
  await knex.schema.dropTable('work_orders');
}
