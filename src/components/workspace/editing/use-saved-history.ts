import { useQueryClient } from '@tanstack/react-query';
import { useCallback, useRef, useState } from 'react';
import { ApiError, api } from '../../../lib/client/api';
import { refreshPlanQueries } from '../../../lib/client/plan-queries';
import {
  doneMessage,
  dropStep,
  emptyHistory,
  nextStep,
  recordSave,
  refusedMessage,
  settleStep,
  type PlanAnswer,
  type PlanRequest,
  type SavedChange,
} from './saved-history';

/** Sends one undo or redo to the API; the answer is the object's id and version now, or null once deleted. */
async function send(propertyId: number, request: PlanRequest): Promise<PlanAnswer> {
  if (request.action === 'delete') {
    await (request.target === 'fence' ? api.deleteFenceLine : api.deletePaddock)(propertyId, request.id, request.version ?? undefined);
    return null;
  }
  if (request.target === 'fence') {
    const { fenceLine } =
      request.action === 'create' ? await api.createFenceLine(propertyId, request.fields) : await api.updateFenceLine(propertyId, request.id, { ...request.changes, version: request.version! });
    return { id: fenceLine.id, version: fenceLine.version };
  }
  const { paddock } =
    request.action === 'create' ? await api.createPaddock(propertyId, request.fields) : await api.updatePaddock(propertyId, request.id, { ...request.changes, version: request.version! });
  return { id: paddock.id, version: paddock.version };
}

/**
 * Undo and redo of saved plan changes in the workspace: every save is recorded, and undo or redo
 * sends it back or again with the version last seen. A step someone else's change has overtaken
 * (409) or whose line or paddock is gone (404) is taken off the list; the plan is refreshed after
 * every step and `onMessage` says what happened.
 */
export function useSavedHistory({ propertyId, onMessage }: { propertyId: number; onMessage: (message: string) => void }) {
  const queryClient = useQueryClient();
  const [history, setHistory] = useState(emptyHistory);
  const [busy, setBusy] = useState(false);
  const latest = useRef({ history, busy, onMessage });
  latest.current = { history, busy, onMessage };

  const record = useCallback((change: SavedChange) => setHistory((current) => recordSave(current, change)), []);

  const step = useCallback(
    async (direction: 'undo' | 'redo') => {
      const next = latest.current.busy ? null : nextStep(latest.current.history, direction);
      if (!next) return;
      const { record: saved, request } = next;
      setBusy(true);
      latest.current.busy = true;
      try {
        // An update or deletion without a version seen: the object went away outside this history.
        if (request.action !== 'create' && request.version === null) throw new ApiError(404, `${saved.name} is no longer there.`);
        const answer = await send(propertyId, request);
        setHistory((current) => settleStep(current, direction, answer));
        latest.current.onMessage(doneMessage(saved, direction));
      } catch (caught) {
        // A 409 on making something anew is the property's fence line limit, not someone else's change: the step stays.
        const overtaken = caught instanceof ApiError && ((caught.status === 409 && request.action !== 'create') || caught.status === 404);
        if (overtaken) {
          setHistory((current) => dropStep(current, direction));
          latest.current.onMessage(refusedMessage(saved, direction, caught.status === 404 ? 'gone' : 'changed'));
        } else {
          latest.current.onMessage(`Could not ${direction} the ${saved.label}: ${caught instanceof Error ? caught.message : 'the server did not answer.'} Nothing was changed.`);
        }
      } finally {
        await refreshPlanQueries(queryClient, propertyId);
        setBusy(false);
      }
    },
    [propertyId, queryClient],
  );

  return {
    record,
    busy,
    /** What the next undo would send back, in words ("new shape of North boundary"); null when there is none. */
    undoLabel: history.undo.at(-1)?.label ?? null,
    redoLabel: history.redo.at(-1)?.label ?? null,
    undo: () => void step('undo'),
    redo: () => void step('redo'),
  };
}

export type SavedHistoryControls = ReturnType<typeof useSavedHistory>;
