import { describe, expect, it } from 'vitest';
import {
  MAX_SAVED_RECORDS,
  doneMessage,
  dropStep,
  emptyHistory,
  nextStep,
  recordSave,
  refusedMessage,
  settleStep,
  type PlanAnswer,
  type PlanRequest,
  type SavedHistory,
} from '../../../src/components/workspace/editing/saved-history';
import type { Paddock } from '../../../src/lib/schemas/paddock';
import { wireSpecSchema, type FenceLine } from '../../../src/lib/schemas/plan';

const wireSpec = wireSpecSchema.parse({});
const straight: [number, number][] = [[141.64, -31.44], [141.65, -31.44]];
const bent: [number, number][] = [[141.64, -31.44], [141.645, -31.441], [141.65, -31.44]];
const fence = (id: number, version: number, changes: Partial<FenceLine> = {}): FenceLine => ({
  id, version, name: 'North boundary', status: 'planned', coordinates: straight, lengthM: 951, wireSpec, updatedAt: '2026-12-02T00:00:00Z', ...changes,
});
const square: [number, number][] = [[141.64, -31.44], [141.65, -31.44], [141.65, -31.43], [141.64, -31.44]];
const paddock = (id: number, version: number, changes: Partial<Paddock> = {}): Paddock => ({
  id, version, name: 'Creek flat', rings: [square], areaHa: 50, updatedAt: '2026-12-02T00:00:00Z', ...changes,
});

/** A stand-in for the API, just enough to play requests against: versions checked as the server checks them. */
function fakeServer(nextId = 100) {
  const saved = new Map<string, { version: number; fields: object }>();
  const sent: PlanRequest[] = [];
  return {
    sent,
    saved,
    put: (key: string, version: number, fields: object) => saved.set(key, { version, fields }),
    send(request: PlanRequest): PlanAnswer | 'conflict' {
      sent.push(request);
      if (request.action === 'create') {
        const id = nextId++;
        saved.set(`${request.target}:${id}`, { version: 1, fields: request.fields });
        return { id, version: 1 };
      }
      const key = `${request.target}:${request.id}`;
      const now = saved.get(key);
      if (!now || now.version !== request.version) return 'conflict';
      if (request.action === 'delete') {
        saved.delete(key);
        return null;
      }
      saved.set(key, { version: now.version + 1, fields: { ...now.fields, ...request.changes } });
      return { id: request.id, version: now.version + 1 };
    },
  };
}

/** Plays the next undo or redo against the server as the workspace does. */
function play(history: SavedHistory, direction: 'undo' | 'redo', server: ReturnType<typeof fakeServer>): SavedHistory {
  const step = nextStep(history, direction)!;
  const answer = server.send(step.request);
  return answer === 'conflict' ? dropStep(history, direction) : settleStep(history, direction, answer);
}

describe('the history of saved changes', () => {
  it('undoes a reshape by sending the old shape with the version last seen, and redoes it with the version after the undo', () => {
    let history = recordSave(emptyHistory(), { what: 'fence-reshaped', before: fence(7, 1), after: fence(7, 2, { coordinates: bent }) });
    expect(history.undo[0]!.label).toBe('new shape of North boundary');
    expect(nextStep(history, 'undo')!.request).toEqual({ target: 'fence', action: 'update', id: 7, changes: { coordinates: straight }, version: 2 });

    history = settleStep(history, 'undo', { id: 7, version: 3 });
    expect(history.undo).toEqual([]);
    expect(nextStep(history, 'redo')!.request).toEqual({ target: 'fence', action: 'update', id: 7, changes: { coordinates: bent }, version: 3 });
    history = settleStep(history, 'redo', { id: 7, version: 4 });
    expect(history.versions).toEqual({ 'fence:7': 4 });
    expect(history.undo).toHaveLength(1);
  });

  it('undoes a new fence line by deleting it at its version, and redoes it by making it anew from the whole line', () => {
    let history = recordSave(emptyHistory(), { what: 'fence-created', fence: fence(7, 1, { status: 'approved' }) });
    expect(nextStep(history, 'undo')!.request).toEqual({ target: 'fence', action: 'delete', id: 7, version: 1 });
    history = settleStep(history, 'undo', null);
    expect(history.versions).toEqual({});
    expect(nextStep(history, 'redo')!.request).toEqual({ target: 'fence', action: 'create', fields: { name: 'North boundary', status: 'approved', coordinates: straight, wireSpec } });
    history = settleStep(history, 'redo', { id: 12, version: 1 });
    // Made anew under another id: undo now deletes that one.
    expect(nextStep(history, 'undo')!.request).toEqual({ target: 'fence', action: 'delete', id: 12, version: 1 });
  });

  it('follows an object made anew under its new id: earlier records of it are sent to the new id', () => {
    const server = fakeServer(100);
    server.put('fence:7', 3, fenceFieldsOf(fence(7, 3, { coordinates: bent })));
    let history = emptyHistory();
    history = recordSave(history, { what: 'fence-reshaped', before: fence(7, 2), after: fence(7, 3, { coordinates: bent }) });
    history = recordSave(history, { what: 'fence-details', before: fence(7, 3, { coordinates: bent }), after: fence(7, 4, { coordinates: bent, name: 'North', status: 'approved' }) });
    server.put('fence:7', 4, fenceFieldsOf(fence(7, 4, { coordinates: bent, name: 'North', status: 'approved' })));
    history = recordSave(history, { what: 'fence-deleted', fence: fence(7, 4, { coordinates: bent, name: 'North', status: 'approved' }) });
    server.saved.delete('fence:7');

    history = play(history, 'undo', server); // the deletion: made anew as 100
    expect(server.sent.at(-1)).toMatchObject({ action: 'create', fields: { name: 'North', status: 'approved', coordinates: bent } });
    expect(history.undo.map((r) => r.id)).toEqual([100, 100]);
    expect(history.redo.map((r) => r.id)).toEqual([100]);
    history = play(history, 'undo', server); // the details, on 100
    expect(server.sent.at(-1)).toEqual({ target: 'fence', action: 'update', id: 100, changes: { name: 'North boundary', status: 'planned' }, version: 1 });
    history = play(history, 'undo', server); // the shape, on 100
    expect(server.sent.at(-1)).toEqual({ target: 'fence', action: 'update', id: 100, changes: { coordinates: straight }, version: 2 });
    expect(server.saved.get('fence:100')).toMatchObject({ version: 3, fields: { name: 'North boundary', coordinates: straight } });

    // And forward again: the deletion deletes 100 at the version last seen.
    history = play(play(history, 'redo', server), 'redo', server);
    history = play(history, 'redo', server);
    expect(server.sent.at(-1)).toEqual({ target: 'fence', action: 'delete', id: 100, version: 5 });
    expect(server.saved.has('fence:100')).toBe(false);
    expect(history.undo).toHaveLength(3);
    expect(history.redo).toEqual([]);
  });

  it('keeps the newest 50 records, and a new save clears the redo side', () => {
    let history = emptyHistory();
    for (let i = 1; i <= MAX_SAVED_RECORDS + 5; i++) history = recordSave(history, { what: 'paddock-created', paddock: paddock(i, 1, { name: `Paddock ${i}` }) });
    expect(history.undo).toHaveLength(MAX_SAVED_RECORDS);
    expect(history.undo[0]!.label).toBe('new paddock Paddock 6');
    history = settleStep(history, 'undo', null);
    expect(history.redo).toHaveLength(1);
    history = recordSave(history, { what: 'paddock-deleted', paddock: paddock(3, 1) });
    expect(history.redo).toEqual([]);
    expect(history.undo.at(-1)!.label).toBe('removal of paddock Creek flat');
  });

  it('drops a refused undo (someone else changed the line) with a message naming it, and leaves the rest', () => {
    const server = fakeServer();
    let history = recordSave(emptyHistory(), { what: 'paddock-created', paddock: paddock(3, 1) });
    history = recordSave(history, { what: 'fence-reshaped', before: fence(7, 1), after: fence(7, 2, { coordinates: bent }) });
    server.put('paddock:3', 1, {});
    server.put('fence:7', 3, {}); // someone else saved version 3
    const refused = nextStep(history, 'undo')!.record;
    history = play(history, 'undo', server);
    expect(history.undo.map((r) => r.label)).toEqual(['new paddock Creek flat']);
    expect(history.redo).toEqual([]);
    expect(refusedMessage(refused, 'undo', 'changed')).toBe(
      'Could not undo the new shape of North boundary: someone else has changed North boundary since. Nothing was changed; the plan now shows what is saved, and that step was taken off the list.',
    );
    expect(refusedMessage(refused, 'redo', 'gone')).toMatch(/^Could not redo the new shape of North boundary: North boundary is no longer there\. Nothing was changed/);
  });

  it('keeps only what changed in a details save, and ignores a save that changed nothing', () => {
    const before = fence(7, 1);
    let history = recordSave(emptyHistory(), { what: 'fence-details', before, after: fence(7, 2, { wireSpec: { ...wireSpec, postSpacingM: 8 } }) });
    expect(nextStep(history, 'undo')!.request).toMatchObject({ changes: { wireSpec }, version: 2 });
    history = recordSave(history, { what: 'fence-details', before: fence(7, 2), after: fence(7, 3) });
    expect(history.undo).toHaveLength(1);
    expect(history.versions['fence:7']).toBe(3);
  });

  it('names paddock changes by what changed, and a realignment as a square crossing', () => {
    const renamed = recordSave(emptyHistory(), { what: 'paddock-changed', before: paddock(3, 1), after: paddock(3, 2, { name: 'Creek paddock' }) });
    expect(renamed.undo[0]!.label).toBe('new name of paddock Creek paddock');
    expect(nextStep(renamed, 'undo')!.request).toEqual({ target: 'paddock', action: 'update', id: 3, changes: { name: 'Creek flat' }, version: 2 });
    const redrawn = recordSave(emptyHistory(), { what: 'paddock-changed', before: paddock(3, 1), after: paddock(3, 2, { rings: [square.slice().reverse()] }) });
    expect(redrawn.undo[0]!.label).toBe('new boundary of paddock Creek flat');
    // A boundary saved over someone else's rename leaves their name alone.
    const reshaped = recordSave(emptyHistory(), { what: 'paddock-reshaped', before: paddock(3, 1), after: paddock(3, 3, { name: 'Their name', rings: [square.slice().reverse()] }) });
    expect(nextStep(reshaped, 'undo')!.request).toEqual({ target: 'paddock', action: 'update', id: 3, changes: { rings: [square] }, version: 3 });
    const realigned = recordSave(emptyHistory(), { what: 'fence-realigned', before: fence(7, 1), after: fence(7, 2, { coordinates: bent }) });
    expect(realigned.undo[0]!.label).toBe('square crossing on North boundary');
    expect(recordSave(emptyHistory(), { what: 'fence-created', fence: fence(7, 1), fromTrack: true }).undo[0]!.label).toBe('fence line North boundary made from a track');
  });

  it('says plainly what an undone deletion does not bring back', () => {
    const deleted = recordSave(emptyHistory(), { what: 'fence-deleted', fence: fence(7, 4) }).undo[0]!;
    expect(doneMessage(deleted, 'undo')).toBe(
      'Undone: deletion of North boundary. North boundary is back; its crossings were found and designed again. Crossing inputs set by hand and work order items it was on were not restored.',
    );
    expect(doneMessage(deleted, 'redo')).toBe('Redone: deletion of North boundary.');
    const removedPaddock = recordSave(emptyHistory(), { what: 'paddock-deleted', paddock: paddock(3, 1) }).undo[0]!;
    expect(doneMessage(removedPaddock, 'undo')).toMatch(/Creek flat is back as a new paddock; rain events recorded for the old one still list it as removed\.$/);
  });

  it('never changes the history it is given', () => {
    const history = recordSave(emptyHistory(), { what: 'fence-created', fence: fence(7, 1) });
    const copy = structuredClone(history);
    recordSave(history, { what: 'fence-deleted', fence: fence(7, 1) });
    settleStep(history, 'undo', null);
    dropStep(history, 'undo');
    expect(history).toEqual(copy);
  });
});

function fenceFieldsOf(f: FenceLine) {
  return { name: f.name, status: f.status, coordinates: f.coordinates, wireSpec: f.wireSpec };
}
