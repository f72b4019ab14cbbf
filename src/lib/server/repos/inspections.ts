import type { Knex } from 'knex';
import { checkGuide, statusesForStyle, FAILURE_STATUSES, type CheckStatus } from '../../crossings/inspection-statuses';
import { redesignFlag, type RedesignFlag } from '../../crossings/inspection-history';
import type { SelectedCrossing } from '../../crossings/select-crossings-for-rain';
import type { CheckUpdate, CheckView, CrossingInspectionsView, HistoryEntry, PhotoView, RainEventInput, RainEventView, RoundProgress, RoundUpdate, RoundView } from '../../schemas/inspection';
import { db } from '../db';
import { ConflictError, NotFoundError } from '../http';
import { recordAudit } from './audit-log';

type RainEventRow = {
  id: number;
  property_id: number;
  fell_on: string;
  rainfall_mm: number;
  scope: 'property' | 'paddocks';
  paddock_ids: string;
  note: string;
  recorded_by: number | null;
  recorded_by_name?: string | null;
  created_at: string;
};
type RoundRow = { id: number; property_id: number; rain_event_id: number; status: 'open' | 'closed'; version: number; created_at: string; closed_at: string | null };
type CheckRow = {
  id: number;
  property_id: number;
  round_id: number;
  crossing_id: number | null;
  position: number;
  crossing_label: string;
  style: string | null;
  catchment_ha: number | null;
  selected_by: 'property' | 'catchment' | 'point';
  status: CheckStatus;
  note: string;
  checked_by: number | null;
  checked_by_name?: string | null;
  checked_at: string | null;
  version: number;
  lon?: number | null;
  lat?: number | null;
};
export type PhotoRow = {
  id: number;
  property_id: number;
  check_id: number;
  storage_key: string;
  thumbnail_key: string;
  content_type: string;
  size_bytes: number;
  width: number;
  height: number;
  location_kept: number | boolean;
  uploaded_by: number | null;
  uploaded_by_name?: string | null;
  created_at: string;
};

export function rowToPhoto(row: PhotoRow): PhotoView {
  const base = `/api/properties/${row.property_id}/photos/${row.id}`;
  return {
    id: row.id,
    checkId: row.check_id,
    url: base,
    thumbnailUrl: `${base}?size=thumbnail`,
    contentType: row.content_type,
    sizeBytes: row.size_bytes,
    width: row.width,
    height: row.height,
    locationKept: Boolean(row.location_kept),
    uploadedByName: row.uploaded_by_name ?? null,
    uploadedById: row.uploaded_by ?? null,
    createdAt: row.created_at,
  };
}

function rowToCheck(row: CheckRow, photos: PhotoView[]): CheckView {
  return {
    id: row.id,
    roundId: row.round_id,
    crossingId: row.crossing_id,
    position: row.position,
    crossingLabel: row.crossing_label,
    style: row.style,
    catchmentHa: row.catchment_ha,
    selectedBy: row.selected_by,
    status: row.status,
    note: row.note,
    checkedByName: row.checked_by_name ?? null,
    checkedAt: row.checked_at,
    version: row.version,
    statuses: statusesForStyle(row.style),
    guide: checkGuide(row.style),
    lonLat: row.lon != null && row.lat != null ? [row.lon, row.lat] : null,
    photos,
  };
}

function rowToRainEvent(row: RainEventRow, paddockNames: Map<number, string>): Omit<RainEventView, 'round'> {
  const paddockIds = JSON.parse(row.paddock_ids) as number[];
  return {
    id: row.id,
    fellOn: row.fell_on,
    rainfallMm: row.rainfall_mm,
    scope: row.scope,
    paddockIds,
    paddockNames: paddockIds.map((id) => paddockNames.get(id) ?? `paddock ${id} (removed)`),
    note: row.note,
    recordedByName: row.recorded_by_name ?? null,
    createdAt: row.created_at,
  };
}

async function paddockNamesOf(propertyId: number, trx: Knex): Promise<Map<number, string>> {
  const rows = (await trx('paddocks').where({ property_id: propertyId }).select('id', 'name')) as { id: number; name: string }[];
  return new Map(rows.map((row) => [row.id, row.name]));
}

async function progressOf(roundIds: number[], trx: Knex): Promise<Map<number, RoundProgress>> {
  const rows = (await trx('inspection_checks').whereIn('round_id', roundIds).select('round_id', 'status')) as { round_id: number; status: CheckStatus }[];
  const progress = new Map<number, RoundProgress>(roundIds.map((id) => [id, { total: 0, checked: 0, failed: 0 }]));
  for (const row of rows) {
    const p = progress.get(row.round_id)!;
    p.total += 1;
    if (row.status !== 'not-checked') p.checked += 1;
    if (FAILURE_STATUSES.includes(row.status)) p.failed += 1;
  }
  return progress;
}

/** A crossing as a round lists it. */
export type RoundCrossing = SelectedCrossing & { label: string; style: string | null };

/**
 * Stores a rain event, the round it opens and a check per crossing in the given order, with the
 * audit entry; `afterInsert` runs in the same transaction (it queues the crew's e-mail).
 */
export async function insertRainEventWithRound(
  propertyId: number,
  input: RainEventInput,
  crossings: readonly RoundCrossing[],
  userId: number,
  afterInsert: (ids: { rainEventId: number; roundId: number; crossingCount: number }, trx: Knex) => Promise<void>,
): Promise<{ rainEventId: number; roundId: number; crossingIds: number[] }> {
  return db().transaction(async (trx) => {
    const now = new Date().toISOString();
    // A terrain run may have redrawn the crossings since they were read: a crossing gone by now is left out.
    const existing = new Set((await trx('crossings').where({ property_id: propertyId }).pluck('id')) as number[]);
    const kept = crossings.filter((crossing) => existing.has(crossing.id));
    const [event] = await trx('rain_events')
      .insert({
        property_id: propertyId, fell_on: input.fellOn, rainfall_mm: input.rainfallMm, scope: input.scope,
        paddock_ids: JSON.stringify(input.scope === 'paddocks' ? input.paddockIds : []), note: input.note, recorded_by: userId, created_at: now,
      })
      .returning('id');
    const rainEventId = (event as { id: number }).id;
    const [round] = await trx('inspection_rounds').insert({ property_id: propertyId, rain_event_id: rainEventId, status: 'open', version: 1, created_at: now }).returning('id');
    const roundId = (round as { id: number }).id;
    const rows = kept.map((crossing, i) => ({
      property_id: propertyId, round_id: roundId, crossing_id: crossing.id, position: i + 1, crossing_label: crossing.label.slice(0, 200),
      style: crossing.style, catchment_ha: crossing.catchmentHa, selected_by: crossing.selectedBy, status: 'not-checked', note: '', version: 1,
    }));
    // knex inserts many rows into SQLite as one compound SELECT, which SQLite limits to 500 terms.
    for (let start = 0; start < rows.length; start += 200) await trx('inspection_checks').insert(rows.slice(start, start + 200));
    const detail = { fellOn: input.fellOn, rainfallMm: input.rainfallMm, scope: input.scope, paddockIds: input.paddockIds, roundId, crossingIds: kept.map((c) => c.id) };
    await recordAudit({ propertyId, userId, action: 'rain_event.create', entityType: 'rain_event', entityId: rainEventId, detail }, trx);
    await afterInsert({ rainEventId, roundId, crossingCount: kept.length }, trx);
    return { rainEventId, roundId, crossingIds: detail.crossingIds };
  });
}

/** The property's rain events, newest first, each with its round's progress. */
export async function listRainEvents(propertyId: number, trx: Knex = db()): Promise<RainEventView[]> {
  const rows = (await trx('rain_events as e')
    .join('inspection_rounds as r', 'r.rain_event_id', 'e.id')
    .leftJoin('users as u', 'u.id', 'e.recorded_by')
    .where('e.property_id', propertyId)
    .orderBy([{ column: 'e.fell_on', order: 'desc' }, { column: 'e.id', order: 'desc' }])
    .select('e.*', 'u.name as recorded_by_name', 'r.id as round_id', 'r.status as round_status', 'r.version as round_version')) as (RainEventRow & { round_id: number; round_status: 'open' | 'closed'; round_version: number })[];
  const names = await paddockNamesOf(propertyId, trx);
  const progress = await progressOf(rows.map((row) => row.round_id), trx);
  return rows.map((row) => ({ ...rowToRainEvent(row, names), round: { id: row.round_id, status: row.round_status, version: row.round_version, progress: progress.get(row.round_id)! } }));
}

async function photosOfChecks(checkIds: number[], trx: Knex): Promise<Map<number, PhotoView[]>> {
  const rows = (await trx('inspection_photos as p').leftJoin('users as u', 'u.id', 'p.uploaded_by').whereIn('p.check_id', checkIds).orderBy('p.id').select('p.*', 'u.name as uploaded_by_name')) as PhotoRow[];
  const byCheck = new Map<number, PhotoView[]>();
  for (const row of rows) byCheck.set(row.check_id, [...(byCheck.get(row.check_id) ?? []), rowToPhoto(row)]);
  return byCheck;
}

/** One round with its rain event and its checks in order. @throws NotFoundError (also for another property's round) */
export async function getRound(propertyId: number, roundId: number, trx: Knex = db()): Promise<RoundView> {
  const round = (await trx('inspection_rounds').where({ id: roundId, property_id: propertyId }).first()) as RoundRow | undefined;
  if (!round) throw new NotFoundError('inspection round');
  const event = (await trx('rain_events as e').leftJoin('users as u', 'u.id', 'e.recorded_by').where('e.id', round.rain_event_id).first('e.*', 'u.name as recorded_by_name')) as RainEventRow;
  const rows = (await trx('inspection_checks as k')
    .leftJoin('users as u', 'u.id', 'k.checked_by')
    .leftJoin('crossings as c', 'c.id', 'k.crossing_id')
    .where('k.round_id', roundId)
    .orderBy('k.position')
    .select('k.*', 'u.name as checked_by_name', 'c.lon', 'c.lat')) as CheckRow[];
  const photos = await photosOfChecks(rows.map((row) => row.id), trx);
  const checks = rows.map((row) => rowToCheck(row, photos.get(row.id) ?? []));
  const progress = (await progressOf([roundId], trx)).get(roundId)!;
  return {
    id: round.id, status: round.status, version: round.version, createdAt: round.created_at, closedAt: round.closed_at,
    rainEvent: rowToRainEvent(event, await paddockNamesOf(propertyId, trx)), checks, progress,
  };
}

/** A check of the property, with its round's state. @throws NotFoundError */
export async function findCheck(propertyId: number, checkId: number, trx: Knex = db()): Promise<CheckRow & { round_status: 'open' | 'closed' }> {
  const row = (await trx('inspection_checks as k').join('inspection_rounds as r', 'r.id', 'k.round_id').where({ 'k.id': checkId, 'k.property_id': propertyId }).first('k.*', 'r.status as round_status')) as
    | (CheckRow & { round_status: 'open' | 'closed' })
    | undefined;
  if (!row) throw new NotFoundError('check');
  return row;
}

/**
 * Records a crossing's status and note in a round. Two people may check the same crossing: the
 * caller sends the version read, and a stale one is refused (409) with nothing changed. A status
 * that does not fit the crossing's style, or a closed round, is refused too.
 */
export async function updateCheck(propertyId: number, roundId: number, checkId: number, update: CheckUpdate, userId: number): Promise<CheckView> {
  return db().transaction(async (trx) => {
    const current = await findCheck(propertyId, checkId, trx);
    if (current.round_id !== roundId) throw new NotFoundError('check');
    if (current.round_status === 'closed') throw new ConflictError('This inspection round is closed. Ask an owner or manager to reopen it to change a check.');
    if (current.version !== update.version) {
      throw new ConflictError(`Someone recorded this crossing since you opened it (now ${current.status}, version ${current.version}). Reload to see their record, then change it if needed.`);
    }
    const allowed = ['not-checked', ...statusesForStyle(current.style)];
    if (!allowed.includes(update.status)) {
      throw new ConflictError(`"${update.status}" does not fit this crossing's style; choose one of: ${allowed.join(', ')}.`, { status: 'Not for this style.' });
    }
    const checked = update.status !== 'not-checked';
    await trx('inspection_checks')
      .where({ id: checkId, version: update.version })
      .update({ status: update.status, note: update.note, checked_by: checked ? userId : null, checked_at: checked ? new Date().toISOString() : null, version: update.version + 1 });
    await recordAudit({ propertyId, userId, action: 'inspection_check.update', entityType: 'inspection_check', entityId: checkId, detail: { roundId, crossingId: current.crossing_id, from: current.status, to: update.status } }, trx);
    const round = await getRound(propertyId, roundId, trx);
    return round.checks.find((check) => check.id === checkId)!;
  });
}

/** Closes or reopens a round, with the version read (409 when stale). */
export async function updateRound(propertyId: number, roundId: number, update: RoundUpdate, userId: number): Promise<RoundView> {
  return db().transaction(async (trx) => {
    const round = (await trx('inspection_rounds').where({ id: roundId, property_id: propertyId }).first()) as RoundRow | undefined;
    if (!round) throw new NotFoundError('inspection round');
    if (round.version !== update.version) throw new ConflictError(`Someone changed this round since you opened it (now ${round.status}). Reload it, then try again.`);
    await trx('inspection_rounds')
      .where({ id: roundId, version: update.version })
      .update({ status: update.status, closed_at: update.status === 'closed' ? new Date().toISOString() : null, version: update.version + 1 });
    await recordAudit({ propertyId, userId, action: update.status === 'closed' ? 'inspection_round.close' : 'inspection_round.reopen', entityType: 'inspection_round', entityId: roundId, detail: {} }, trx);
    return getRound(propertyId, roundId, trx);
  });
}

type HistoryRow = { check_id: number; crossing_id: number; round_id: number; fell_on: string; rainfall_mm: number; status: CheckStatus; note: string; checked_at: string | null; checked_by_name: string | null };

const historyRows = (trx: Knex, propertyId: number) =>
  trx('inspection_checks as k')
    .join('inspection_rounds as r', 'r.id', 'k.round_id')
    .join('rain_events as e', 'e.id', 'r.rain_event_id')
    .leftJoin('users as u', 'u.id', 'k.checked_by')
    .where('k.property_id', propertyId)
    .orderBy([{ column: 'e.fell_on', order: 'desc' }, { column: 'r.id', order: 'desc' }])
    .select('k.id as check_id', 'k.crossing_id', 'k.round_id', 'e.fell_on', 'e.rainfall_mm', 'k.status', 'k.note', 'k.checked_at', 'u.name as checked_by_name');

/** A crossing's inspection history (newest rain first) and whether it is flagged for redesign. */
export async function crossingInspections(propertyId: number, crossingId: number, style: string | null, trx: Knex = db()): Promise<CrossingInspectionsView> {
  const rows = (await historyRows(trx, propertyId).andWhere('k.crossing_id', crossingId)) as HistoryRow[];
  const photos = await photosOfChecks(rows.map((row) => row.check_id), trx);
  const history: HistoryEntry[] = rows.map((row) => ({
    roundId: row.round_id, checkId: row.check_id, fellOn: row.fell_on, rainfallMm: row.rainfall_mm, status: row.status, note: row.note,
    checkedAt: row.checked_at, checkedByName: row.checked_by_name, photos: photos.get(row.check_id) ?? [],
  }));
  return { history, redesign: redesignFlag(history.map((h) => ({ roundId: h.roundId, fellOn: h.fellOn, status: h.status })), style) };
}

/** The property's crossings flagged for redesign, by crossing id. */
export async function redesignFlags(propertyId: number, styles: ReadonlyMap<number, string | null>, trx: Knex = db()): Promise<Map<number, RedesignFlag>> {
  const rows = (await historyRows(trx, propertyId).whereIn('k.status', FAILURE_STATUSES as CheckStatus[]).whereNotNull('k.crossing_id')) as HistoryRow[];
  const byCrossing = new Map<number, HistoryRow[]>();
  for (const row of rows) byCrossing.set(row.crossing_id, [...(byCrossing.get(row.crossing_id) ?? []), row]);
  const flags = new Map<number, RedesignFlag>();
  for (const [crossingId, checks] of byCrossing) {
    const flag = redesignFlag(checks.map((c) => ({ roundId: c.round_id, fellOn: c.fell_on, status: c.status })), styles.get(crossingId) ?? null);
    if (flag) flags.set(crossingId, flag);
  }
  return flags;
}
