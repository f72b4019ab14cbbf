import type { Knex } from 'knex';

/**
 * A counter per property that SQLite itself moves on every change to what the busiest reads
 * answer (the crossing list, the fence lines, the elevation models, the plan export), so the
 * server can keep those answers and know, with one indexed read, whether they still hold. Kept by
 * triggers, so no write path (a route, the analysis, a terrain run, a restore, a script) can
 * forget it. `plan` moves with the plan and its inspections; `terrain` with models and runs (a
 * run's progress moves it every few seconds, and must not throw away the plan's answers).
 * No foreign key: a property's rows deleted in a cascade still fire these triggers.
 */
const WATCHED: { table: string; counter: 'plan' | 'terrain'; propertyColumn: string }[] = [
  { table: 'properties', counter: 'plan', propertyColumn: 'id' },
  { table: 'property_settings', counter: 'plan', propertyColumn: 'property_id' },
  { table: 'fence_lines', counter: 'plan', propertyColumn: 'property_id' },
  { table: 'crossings', counter: 'plan', propertyColumn: 'property_id' },
  { table: 'paddocks', counter: 'plan', propertyColumn: 'property_id' },
  { table: 'rain_events', counter: 'plan', propertyColumn: 'property_id' },
  { table: 'inspection_rounds', counter: 'plan', propertyColumn: 'property_id' },
  { table: 'inspection_checks', counter: 'plan', propertyColumn: 'property_id' },
  { table: 'elevation_models', counter: 'terrain', propertyColumn: 'property_id' },
  { table: 'terrain_runs', counter: 'terrain', propertyColumn: 'property_id' },
];
const EVENTS = [
  { event: 'INSERT', row: 'NEW' },
  { event: 'UPDATE', row: 'NEW' },
  { event: 'DELETE', row: 'OLD' },
] as const;

const triggerName = (table: string, event: string) => `${table}_${event.toLowerCase()}_moves_generation`;

export async function up(knex: Knex): Promise<void> {
  await knex.schema.createTable('read_generations', (table) => {
    table.integer('property_id').primary();
    table.integer('plan').notNullable().defaultTo(0);
    table.integer('terrain').notNullable().defaultTo(0);
  });
  for (const { table, counter, propertyColumn } of WATCHED) {
    for (const { event, row } of EVENTS) {
      await knex.raw(
        `CREATE TRIGGER ${triggerName(table, event)} AFTER ${event} ON ${table} BEGIN
           INSERT INTO read_generations (property_id, ${counter}) VALUES (${row}.${propertyColumn}, 1)
           ON CONFLICT (property_id) DO UPDATE SET ${counter} = ${counter} + 1;
         END`,
      );
    }
  }
}

export async function down(knex: Knex): Promise<void> {
  for (const { table } of WATCHED) for (const { event } of EVENTS) await knex.raw(`DROP TRIGGER IF EXISTS ${triggerName(table, event)}`);
  await knex.schema.dropTable('read_generations');
}
