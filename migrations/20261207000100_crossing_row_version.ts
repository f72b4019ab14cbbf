import type { Knex } from 'knex';

/**
 * A version per crossing that SQLite moves on every change of its row (a trigger, so no write path
 * can forget it: an analysis, new inputs, a terrain run clearing its drainage line). The server
 * keeps each crossing's full design answer until this, its fence line's version or the property
 * settings' version moves. The index answers that check without reading the stored design.
 */
export async function up(knex: Knex): Promise<void> {
  await knex.schema.alterTable('crossings', (table) => table.integer('row_version').notNullable().defaultTo(1));
  await knex.raw(
    `CREATE TRIGGER crossings_update_moves_row_version AFTER UPDATE ON crossings WHEN NEW.row_version = OLD.row_version BEGIN
       UPDATE crossings SET row_version = OLD.row_version + 1 WHERE id = NEW.id;
     END`,
  );
  await knex.schema.alterTable('crossings', (table) => table.index(['id', 'property_id', 'fence_line_id', 'row_version'], 'crossings_row_version'));
}

export async function down(knex: Knex): Promise<void> {
  await knex.raw('DROP TRIGGER IF EXISTS crossings_update_moves_row_version');
  await knex.schema.alterTable('crossings', (table) => table.dropIndex(['id', 'property_id', 'fence_line_id', 'row_version'], 'crossings_row_version'));
  // SQLite's own DROP COLUMN: knex would rebuild the table, losing the other triggers on it.
  await knex.raw('ALTER TABLE crossings DROP COLUMN row_version');
}
