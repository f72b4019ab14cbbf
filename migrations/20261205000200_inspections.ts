import type { Knex } from 'knex';

const CHECK_STATUSES = ['not-checked', 'intact', 'tie-reset', 'section-rehung', 'section-lost', 'damaged', 'washed-out'];

// Rain events, the inspection round each one opens, a check per crossing in the round, and the
// photos taken at a check.
export async function up(knex: Knex): Promise<void> {
  await knex.schema.createTable('rain_events', (table) => {
    table.increments('id').primary();
    table.integer('property_id').notNullable().references('properties.id').onDelete('CASCADE');
    // The day the rain fell, YYYY-MM-DD (local to the property, as the person entered it).
    table.string('fell_on', 10).notNullable();
    table.double('rainfall_mm').notNullable();
    table.string('scope', 10).notNullable().checkIn(['property', 'paddocks'], 'rain_events_scope_check');
    // JSON array of paddock ids when the scope is `paddocks`, else '[]'.
    table.text('paddock_ids').notNullable().defaultTo('[]');
    table.text('note').notNullable().defaultTo('');
    table.integer('recorded_by').references('users.id').onDelete('SET NULL');
    table.string('created_at', 30).notNullable();
    table.index(['property_id', 'fell_on']);
  });

  await knex.schema.createTable('inspection_rounds', (table) => {
    table.increments('id').primary();
    table.integer('property_id').notNullable().references('properties.id').onDelete('CASCADE');
    table.integer('rain_event_id').notNullable().unique().references('rain_events.id').onDelete('CASCADE');
    table.string('status', 6).notNullable().defaultTo('open').checkIn(['open', 'closed'], 'inspection_rounds_status_check');
    table.integer('version').notNullable().defaultTo(1);
    table.string('created_at', 30).notNullable();
    table.string('closed_at', 30);
    table.index(['property_id']);
  });

  await knex.schema.createTable('inspection_checks', (table) => {
    table.increments('id').primary();
    table.integer('property_id').notNullable().references('properties.id').onDelete('CASCADE');
    table.integer('round_id').notNullable().references('inspection_rounds.id').onDelete('CASCADE');
    // A crossing that a later analysis no longer finds keeps its history: the check keeps its
    // label and style and loses only the link.
    table.integer('crossing_id').references('crossings.id').onDelete('SET NULL');
    table.integer('position').notNullable();
    table.string('crossing_label', 200).notNullable();
    table.string('style', 20);
    table.double('catchment_ha');
    // Why the crossing is in the round: the whole property, its catchment outline meets a chosen
    // paddock, or (no outline) its point lies in one.
    table.string('selected_by', 10).notNullable().checkIn(['property', 'catchment', 'point'], 'inspection_checks_selected_by_check');
    table.string('status', 14).notNullable().defaultTo('not-checked').checkIn(CHECK_STATUSES, 'inspection_checks_status_check');
    table.text('note').notNullable().defaultTo('');
    table.integer('checked_by').references('users.id').onDelete('SET NULL');
    table.string('checked_at', 30);
    table.integer('version').notNullable().defaultTo(1);
    table.unique(['round_id', 'position']);
    table.index(['crossing_id']);
  });

  await knex.schema.createTable('inspection_photos', (table) => {
    table.increments('id').primary();
    table.integer('property_id').notNullable().references('properties.id').onDelete('CASCADE');
    table.integer('check_id').notNullable().references('inspection_checks.id').onDelete('CASCADE');
    table.string('storage_key', 200).notNullable().unique();
    table.string('thumbnail_key', 200).notNullable().unique();
    table.string('content_type', 40).notNullable();
    table.integer('size_bytes').notNullable();
    table.integer('width').notNullable();
    table.integer('height').notNullable();
    table.boolean('location_kept').notNullable().defaultTo(false);
    table.integer('uploaded_by').references('users.id').onDelete('SET NULL');
    table.string('created_at', 30).notNullable();
    table.index(['check_id']);
  });
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTable('inspection_photos');
  await knex.schema.dropTable('inspection_checks');
  await knex.schema.dropTable('inspection_rounds');
  await knex.schema.dropTable('rain_events');
}
