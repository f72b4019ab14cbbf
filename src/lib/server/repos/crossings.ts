import type { Knex } from 'knex';
import type { CrossingInputs } from '../../schemas/crossing';
import { db } from '../db';
import { NotFoundError } from '../http';

type CrossingRow = {
  id: number;
  property_id: number;
  fence_line_id: number;
  fence_name: string;
  drainage_line_id: number | null;
  kind: string;
  lon: number;
  lat: number;
  chainage_m: number;
  angle_deg: number | null;
  angle_class: string | null;
  upstream_area_m2: number | null;
  stream_order: number | null;
  inputs: string;
  design: string | null;
  design_status: string;
  computed_at: string | null;
};

/** What the crossing list and the map show of a crossing. */
export type CrossingSummary = {
  id: number;
  fenceLineId: number;
  fenceName: string;
  drainageLineId: number | null;
  kind: string;
  position: [number, number];
  chainageM: number;
  angleDeg: number | null;
  angleClass: string | null;
  upstreamAreaHa: number | null;
  streamOrder: number | null;
  designStatus: string;
  provisional: boolean;
  style: string | null;
  floodLevelM: number | null;
  floodgateLengthM: number | null;
  computedAt: string | null;
};

/** The few design figures a summary shows. */
type DesignFigures = { provisional: boolean; style: string | null; floodLevelM: number | null; floodgateLengthM: number | null };

function figuresOf(design: Record<string, unknown> | null): DesignFigures {
  const layout = design?.layout as { style?: string; floodgate?: { lengthM?: number } } | undefined;
  const floods = design?.floods as { levelM?: number | null } | undefined;
  return { provisional: Boolean(design?.provisional), style: layout?.style ?? null, floodLevelM: floods?.levelM ?? null, floodgateLengthM: layout?.floodgate?.lengthM ?? null };
}

function rowToSummary(row: Omit<CrossingRow, 'inputs' | 'design'>, figures: DesignFigures): CrossingSummary {
  return {
    id: row.id,
    fenceLineId: row.fence_line_id,
    fenceName: row.fence_name,
    drainageLineId: row.drainage_line_id,
    kind: row.kind,
    position: [row.lon, row.lat],
    chainageM: row.chainage_m,
    angleDeg: row.angle_deg,
    angleClass: row.angle_class,
    upstreamAreaHa: row.upstream_area_m2 === null ? null : row.upstream_area_m2 / 10_000,
    streamOrder: row.stream_order,
    designStatus: row.design_status,
    ...figures,
    computedAt: row.computed_at,
  };
}

const selectRows = (trx: Knex) =>
  trx<CrossingRow>('crossings as c').join('fence_lines as f', 'f.id', 'c.fence_line_id').select('c.*', 'f.name as fence_name');

type SummaryRow = Omit<CrossingRow, 'inputs' | 'design'> & {
  design_provisional: number;
  design_style: string | null;
  design_flood_level_m: number | null;
  design_floodgate_length_m: number | null;
};

const SUMMARY_COLUMNS = [
  'id', 'property_id', 'fence_line_id', 'drainage_line_id', 'kind', 'lon', 'lat', 'chainage_m', 'angle_deg', 'angle_class', 'upstream_area_m2',
  'stream_order', 'design_status', 'computed_at', 'design_provisional', 'design_style', 'design_flood_level_m', 'design_floodgate_length_m',
];

/**
 * Every crossing of a property as the list and the map show it: the design figures a summary
 * needs are columns of their own (written with the design), so no design JSON is read.
 */
export async function listCrossings(propertyId: number, trx: Knex = db()): Promise<CrossingSummary[]> {
  const rows: SummaryRow[] = await trx('crossings as c')
    .join('fence_lines as f', 'f.id', 'c.fence_line_id')
    .select(...SUMMARY_COLUMNS.map((column) => `c.${column}`), 'f.name as fence_name')
    .where('c.property_id', propertyId)
    .orderBy([{ column: 'c.fence_line_id' }, { column: 'c.chainage_m' }]);
  return rows.map((row) => rowToSummary(row, figuresOfRow(row)));
}

/** The summary's design figures from their own columns. */
function figuresOfRow(row: SummaryRow): DesignFigures {
  return { provisional: Boolean(row.design_provisional), style: row.design_style, floodLevelM: row.design_flood_level_m, floodgateLengthM: row.design_floodgate_length_m };
}

/**
 * Every crossing with its stored design as text, unparsed: a design is tens of kilobytes of JSON,
 * and the plan export parses only the ones that changed since it last looked (plan-export.ts).
 */
export async function listCrossingsWithDesignText(propertyId: number, trx: Knex = db()): Promise<(CrossingSummary & { designText: string | null })[]> {
  const rows: (SummaryRow & { design: string | null })[] = await trx('crossings as c')
    .join('fence_lines as f', 'f.id', 'c.fence_line_id')
    .select(...SUMMARY_COLUMNS.map((column) => `c.${column}`), 'c.design', 'f.name as fence_name')
    .where('c.property_id', propertyId)
    .orderBy([{ column: 'c.fence_line_id' }, { column: 'c.chainage_m' }]);
  return rows.map((row) => ({ ...rowToSummary(row, figuresOfRow(row)), designText: row.design }));
}

/**
 * What one crossing's full design answer is made of, as a stamp that changes whenever it does: the
 * crossing's row version (moved by a trigger), its fence line's version (the name) and the property
 * settings' version (prices). Read from indexes, without the stored design.
 * @throws NotFoundError (also for another property's crossing)
 */
export async function crossingStamp(propertyId: number, id: number, trx: Knex = db()): Promise<string> {
  const row = (await trx('crossings as c')
    .join('fence_lines as f', 'f.id', 'c.fence_line_id')
    .leftJoin('property_settings as s', 's.property_id', 'c.property_id')
    .where({ 'c.id': id, 'c.property_id': propertyId })
    .first('c.row_version', 'f.version as fence_version', 's.version as settings_version')) as { row_version: number; fence_version: number; settings_version: number | null } | undefined;
  if (!row) throw new NotFoundError('crossing');
  return `${row.row_version}:${row.fence_version}:${row.settings_version ?? 0}`;
}

/** One crossing with its inputs and full design. @throws NotFoundError (also for another property's crossing) */
export async function getCrossing(propertyId: number, id: number, trx: Knex = db()) {
  const row = await selectRows(trx).where({ 'c.id': id, 'c.property_id': propertyId }).first();
  if (!row) throw new NotFoundError('crossing');
  const design = row.design ? (JSON.parse(row.design) as Record<string, unknown>) : null;
  return { ...rowToSummary(row, figuresOf(design)), inputs: JSON.parse(row.inputs) as CrossingInputs, design };
}

export async function setCrossingInputs(propertyId: number, id: number, inputs: CrossingInputs, trx: Knex = db()): Promise<{ fenceLineId: number }> {
  const row = await trx('crossings').where({ id, property_id: propertyId }).first('fence_line_id');
  if (!row) throw new NotFoundError('crossing');
  await trx('crossings').where({ id }).update({ inputs: JSON.stringify(inputs) });
  return { fenceLineId: row.fence_line_id };
}
