import type { Paddock } from '../../../lib/schemas/paddock';
import type { FenceLine, FenceStatus, WireSpec } from '../../../lib/schemas/plan';

/** What a fence line is made of, as saved and sent back. */
export type FenceFields = { name: string; status: FenceStatus; coordinates: [number, number][]; wireSpec: WireSpec };
/** What a paddock is made of, as saved and sent back. */
export type PaddockFields = { name: string; rings: [number, number][][] };

/** A save as the workspace made it, with the objects the server answered (and the one before). */
export type SavedChange =
  | { what: 'fence-created'; fence: FenceLine; fromTrack?: boolean }
  | { what: 'fence-reshaped' | 'fence-realigned' | 'fence-details'; before: FenceLine; after: FenceLine }
  | { what: 'fence-deleted'; fence: FenceLine }
  | { what: 'paddock-created'; paddock: Paddock }
  | { what: 'paddock-reshaped' | 'paddock-changed'; before: Paddock; after: Paddock }
  | { what: 'paddock-deleted'; paddock: Paddock };

/** Created and deleted keep the whole object (to delete it again or make it anew); changed keeps only the fields that changed. */
type Step<F> = { kind: 'created'; fields: F } | { kind: 'deleted'; fields: F } | { kind: 'changed'; before: Partial<F>; after: Partial<F> };

/** One saved change and what is needed to send it back or again. `id` follows the object when it is made anew. */
export type SavedRecord = { label: string; name: string; id: number } & (
  | { target: 'fence'; step: Step<FenceFields> }
  | { target: 'paddock'; step: Step<PaddockFields> }
);

/** The records that can be undone (last is next) and redone (last is next), and the version last seen of each object. */
export type SavedHistory = { undo: SavedRecord[]; redo: SavedRecord[]; versions: Record<string, number> };

/** What to send to the API for one undo or redo. `version: null`: the object's version is not known (it is gone). */
export type PlanRequest =
  | { target: 'fence'; action: 'create'; fields: FenceFields }
  | { target: 'fence'; action: 'update'; id: number; changes: Partial<FenceFields>; version: number | null }
  | { target: 'paddock'; action: 'create'; fields: PaddockFields }
  | { target: 'paddock'; action: 'update'; id: number; changes: Partial<PaddockFields>; version: number | null }
  | { target: 'fence' | 'paddock'; action: 'delete'; id: number; version: number | null };

/** What the server answered to a PlanRequest: the object's id and version now, or null once it is deleted. */
export type PlanAnswer = { id: number; version: number } | null;

/** Records kept on the undo side; the oldest goes first. */
export const MAX_SAVED_RECORDS = 50;

export const emptyHistory = (): SavedHistory => ({ undo: [], redo: [], versions: {} });

const keyOf = (target: 'fence' | 'paddock', id: number) => `${target}:${id}`;
const fenceFields = (f: FenceLine): FenceFields => ({ name: f.name, status: f.status, coordinates: f.coordinates, wireSpec: f.wireSpec });
const paddockFields = (p: Paddock): PaddockFields => ({ name: p.name, rings: p.rings });

/**
 * The fields among `among` that differ between `before` and `after`, with both values. Only the
 * fields the save was about: a shape saved over someone else's rename does not undo their rename.
 */
function diff<F extends object>(before: F, after: F, among: (keyof F)[]): { before: Partial<F>; after: Partial<F> } {
  const keys = among.filter((key) => JSON.stringify(before[key]) !== JSON.stringify(after[key]));
  return { before: Object.fromEntries(keys.map((k) => [k, before[k]])) as Partial<F>, after: Object.fromEntries(keys.map((k) => [k, after[k]])) as Partial<F> };
}

/** The record of a save, its label in plain words, and the object's version after it (null when deleted). */
function recordOf(change: SavedChange): { record: SavedRecord; version: number | null } {
  switch (change.what) {
    case 'fence-created': {
      const { fence } = change;
      const label = change.fromTrack ? `fence line ${fence.name} made from a track` : `new fence line ${fence.name}`;
      return { record: { target: 'fence', id: fence.id, name: fence.name, label, step: { kind: 'created', fields: fenceFields(fence) } }, version: fence.version };
    }
    case 'fence-deleted':
      return { record: { target: 'fence', id: change.fence.id, name: change.fence.name, label: `deletion of ${change.fence.name}`, step: { kind: 'deleted', fields: fenceFields(change.fence) } }, version: null };
    case 'fence-reshaped':
    case 'fence-realigned':
    case 'fence-details': {
      const { before, after } = change;
      const label = { 'fence-reshaped': `new shape of ${after.name}`, 'fence-realigned': `square crossing on ${after.name}`, 'fence-details': `details of ${after.name}` }[change.what];
      const among: (keyof FenceFields)[] = change.what === 'fence-details' ? ['name', 'status', 'wireSpec'] : ['coordinates'];
      return { record: { target: 'fence', id: after.id, name: after.name, label, step: { kind: 'changed', ...diff(fenceFields(before), fenceFields(after), among) } }, version: after.version };
    }
    case 'paddock-created':
      return { record: { target: 'paddock', id: change.paddock.id, name: change.paddock.name, label: `new paddock ${change.paddock.name}`, step: { kind: 'created', fields: paddockFields(change.paddock) } }, version: change.paddock.version };
    case 'paddock-deleted':
      return { record: { target: 'paddock', id: change.paddock.id, name: change.paddock.name, label: `removal of paddock ${change.paddock.name}`, step: { kind: 'deleted', fields: paddockFields(change.paddock) } }, version: null };
    case 'paddock-reshaped':
    case 'paddock-changed': {
      const { before, after } = change;
      const step = diff(paddockFields(before), paddockFields(after), change.what === 'paddock-reshaped' ? ['rings'] : ['name', 'rings']);
      const what = step.after.rings && step.after.name !== undefined ? 'new boundary and name' : step.after.rings ? 'new boundary' : 'new name';
      return { record: { target: 'paddock', id: after.id, name: after.name, label: `${what} of paddock ${after.name}`, step: { kind: 'changed', ...step } }, version: after.version };
    }
  }
}

const withVersion = (versions: Record<string, number>, key: string, version: number | null) => {
  const { [key]: _old, ...rest } = versions;
  return version === null ? rest : { ...rest, [key]: version };
};

/**
 * Adds a save to the history: it becomes the next undo, the redo side is cleared, and only the
 * newest MAX_SAVED_RECORDS records are kept. Returns a new history; `history` is not changed.
 */
export function recordSave(history: SavedHistory, change: SavedChange): SavedHistory {
  const { record, version } = recordOf(change);
  const versions = withVersion(history.versions, keyOf(record.target, record.id), version);
  // A save that changed nothing (the same details saved again) has nothing to undo.
  if (record.step.kind === 'changed' && Object.keys(record.step.after).length === 0) return { ...history, versions };
  return {
    undo: [...history.undo, record].slice(-MAX_SAVED_RECORDS),
    redo: [],
    versions,
  };
}

/** Undoing a deletion or redoing a creation makes the object anew; the other two delete it. */
const makesAnew = (record: SavedRecord, direction: 'undo' | 'redo') => record.step.kind !== 'changed' && (record.step.kind === 'deleted') === (direction === 'undo');

/** The request that sends a record back (`undo`) or again (`redo`), with the version last seen. */
export function requestFor(history: SavedHistory, record: SavedRecord, direction: 'undo' | 'redo'): PlanRequest {
  const version = history.versions[keyOf(record.target, record.id)] ?? null;
  const { step } = record;
  if (step.kind === 'changed') {
    const changes = direction === 'undo' ? step.before : step.after;
    return record.target === 'fence'
      ? { target: 'fence', action: 'update', id: record.id, changes: changes as Partial<FenceFields>, version }
      : { target: 'paddock', action: 'update', id: record.id, changes: changes as Partial<PaddockFields>, version };
  }
  if (!makesAnew(record, direction)) return { target: record.target, action: 'delete', id: record.id, version };
  return record.target === 'fence'
    ? { target: 'fence', action: 'create', fields: step.fields as FenceFields }
    : { target: 'paddock', action: 'create', fields: step.fields as PaddockFields };
}

/** The next undo (or redo) and its request; null when that side is empty. */
export function nextStep(history: SavedHistory, direction: 'undo' | 'redo'): { record: SavedRecord; request: PlanRequest } | null {
  const record = (direction === 'undo' ? history.undo : history.redo).at(-1);
  return record ? { record, request: requestFor(history, record, direction) } : null;
}

/**
 * The history after the next undo (or redo) was accepted with `answer`: the record moves to the
 * other side and the version is the one answered. An object made anew has a new id: every record
 * that named the old id now names the new one.
 */
export function settleStep(history: SavedHistory, direction: 'undo' | 'redo', answer: PlanAnswer): SavedHistory {
  const step = nextStep(history, direction);
  if (!step) return history;
  const { record, request } = step;
  const from = direction === 'undo' ? history.undo : history.redo;
  const to = direction === 'undo' ? history.redo : history.undo;
  const oldKey = keyOf(record.target, record.id);
  let versions = history.versions;
  let follow = (r: SavedRecord) => r;
  if (request.action === 'create' && answer) {
    follow = (r) => (r.target === record.target && r.id === record.id ? { ...r, id: answer.id } : r);
    versions = withVersion(withVersion(versions, oldKey, null), keyOf(record.target, answer.id), answer.version);
  } else {
    versions = withVersion(versions, oldKey, answer?.version ?? null);
  }
  return {
    [direction]: from.slice(0, -1).map(follow),
    [direction === 'undo' ? 'redo' : 'undo']: [...to, record].map(follow).slice(-MAX_SAVED_RECORDS),
    versions,
  } as SavedHistory;
}

/** The history without the next undo (or redo): it was refused and cannot be sent again. */
export function dropStep(history: SavedHistory, direction: 'undo' | 'redo'): SavedHistory {
  return direction === 'undo' ? { ...history, undo: history.undo.slice(0, -1) } : { ...history, redo: history.redo.slice(0, -1) };
}

/** The sentence shown after an undo or redo went through, saying plainly what was not brought back. */
export function doneMessage(record: SavedRecord, direction: 'undo' | 'redo'): string {
  const head = `${direction === 'undo' ? 'Undone' : 'Redone'}: ${record.label}.`;
  if (!makesAnew(record, direction)) return head;
  if (record.target === 'paddock') return `${head} ${record.name} is back as a new paddock; rain events recorded for the old one still list it as removed.`;
  const lost = record.step.kind === 'deleted' ? ' Crossing inputs set by hand and work order items it was on were not restored.' : '';
  return `${head} ${record.name} is back; its crossings were found and designed again.${lost}`;
}

/** The sentence shown when an undo or redo was refused: what, why, and that nothing was changed. */
export function refusedMessage(record: SavedRecord, direction: 'undo' | 'redo', reason: 'changed' | 'gone'): string {
  const why = reason === 'changed' ? `someone else has changed ${record.name} since` : `${record.name} is no longer there`;
  return `Could not ${direction} the ${record.label}: ${why}. Nothing was changed; the plan now shows what is saved, and that step was taken off the list.`;
}
