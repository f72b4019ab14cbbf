import { insertRow, updateRows, writeAtOnce } from '../db';
import { computeInWorker } from '../jobs/analysis-jobs';
import { matchingCrossing, type ComputedCrossings } from './compute-crossing-rows';

export type { StoredDesign } from './compute-crossing-rows';

/**
 * Finds and designs the crossings of a property's fence lines (all of them, or the ones named)
 * against its drainage lines, and stores them in one transaction, replacing the earlier ones of
 * those fence lines. What a person entered for a crossing (flood mark, roughness, style…) is
 * carried over to the crossing found again at the same place. The finding and designing run in a
 * worker thread, so requests keep being answered meanwhile; the writing is done here.
 *
 * One analysis of a property runs at a time: a terrain run finishing while a fence is edited must
 * not interleave two writes of the same crossings. Requests that arrive while one runs wait
 * together as one batch (the union of their fence lines), so a burst of edits costs two analyses,
 * not one per edit; the counts answered are the batch's.
 */
export function analyseCrossings(propertyId: number, fenceLineIds?: number[]): Promise<{ crossings: number; designed: number }> {
  const open = waiting.get(propertyId);
  if (open) {
    if (!fenceLineIds) open.fenceLineIds = 'all';
    else if (open.fenceLineIds !== 'all') for (const id of fenceLineIds) open.fenceLineIds.add(id);
    return open.result;
  }
  const batch: Batch = { fenceLineIds: fenceLineIds ? new Set(fenceLineIds) : 'all', result: Promise.resolve({ crossings: 0, designed: 0 }) };
  waiting.set(propertyId, batch);
  const previous = queues.get(propertyId) ?? Promise.resolve();
  batch.result = previous
    .catch(() => undefined)
    .then(async () => {
      // Started: later requests make the next batch (this one reads the fence lines as they are now).
      if (waiting.get(propertyId) === batch) waiting.delete(propertyId);
      return store(await computeInWorker(propertyId, batch.fenceLineIds === 'all' ? undefined : [...batch.fenceLineIds]));
    });
  const tail = batch.result.catch(() => undefined);
  queues.set(propertyId, tail);
  void tail.then(() => queues.get(propertyId) === tail && queues.delete(propertyId));
  return batch.result;
}

type Batch = { fenceLineIds: Set<number> | 'all'; result: Promise<{ crossings: number; designed: number }> };
/** Per property: the analysis in progress or last queued (its end), and the batch not yet started. */
const queues = new Map<number, Promise<unknown>>();
const waiting = new Map<number, Batch>();

function store({ rows, designed, old }: ComputedCrossings): Promise<{ crossings: number; designed: number }> {
  const matchOf = (fenceId: number, drainageId: number, chainageM: number) => matchingCrossing(old, fenceId, drainageId, chainageM);
  // One synchronous transaction (db.ts, writeAtOnce): the other requests' queries wait only while it writes.
  return writeAtOnce((connection) => {
    const kept = new Set<number>();
    for (const row of rows) {
      const match = matchOf(row.fence_line_id as number, row.drainage_line_id as number, row.chainage_m as number);
      if (match && !kept.has(match.id)) {
        kept.add(match.id);
        updateRows(connection, 'crossings', row, { id: match.id });
      } else {
        insertRow(connection, 'crossings', row);
      }
    }
    const gone = old.filter((row) => !kept.has(row.id)).map((row) => row.id);
    if (gone.length) connection.prepare(`delete from "crossings" where "id" in (${gone.map(() => '?').join(', ')})`).run(...gone);
    return { crossings: rows.length, designed };
  });
}
