import { useMutation, useQueryClient } from '@tanstack/react-query';
import { useState } from 'react';
import { ApiError, api } from '../../../lib/client/api';
import type { CrossingSummaryView } from '../../../lib/schemas/crossing-view';
import type { FenceLine } from '../../../lib/schemas/plan';
import { FENCE_STATUS_STYLES } from '../../map/plan-layers';
import { FenceLineForm, type FenceLineDetails } from './FenceLineForm';
import { formatLength } from './format-measure';
import type { SavedChange } from './saved-history';

type Props = {
  propertyId: number;
  fence: FenceLine;
  crossings: CrossingSummaryView[];
  canEdit: boolean;
  onReshape: () => void;
  onClose: () => void;
  onSelectCrossing: (crossingId: number) => void;
  /** A change saved here, for the saved history, with a sentence saying so. */
  onSaved: (change: SavedChange, message: string) => void;
};

const wireSummary = (fence: FenceLine) => {
  const { wireHeightsM, wireKinds, postSpacingM, dropperSpacingM } = fence.wireSpec;
  const barbed = wireKinds.filter((kind) => kind === 'barbed').length;
  return `${wireHeightsM.length} wires (${wireHeightsM.length - barbed} plain, ${barbed} barbed), posts every ${postSpacingM} m, droppers every ${dropperSpacingM} m`;
};

/** One fence line: what it is, its crossings, and (for editors) its details, shape and removal. */
export function FenceLinePanel({ propertyId, fence, crossings, canEdit, onReshape, onClose, onSelectCrossing, onSaved }: Props) {
  const queryClient = useQueryClient();
  const [editing, setEditing] = useState(false);
  const [confirmDelete, setConfirmDelete] = useState(false);
  const refresh = () => Promise.all(['fence-lines', 'crossings', 'costs'].map((key) => queryClient.invalidateQueries({ queryKey: [key, propertyId] })));

  const save = useMutation({
    mutationFn: async (details: FenceLineDetails) => ({ before: fence, after: (await api.updateFenceLine(propertyId, fence.id, { ...details, version: fence.version })).fenceLine }),
    onSuccess: async ({ before, after }) => {
      await refresh();
      setEditing(false);
      onSaved({ what: 'fence-details', before, after }, `The details of ${after.name} were saved.`);
    },
  });
  const remove = useMutation({
    // With the version read, so a line someone else changed meanwhile is not deleted unseen.
    mutationFn: async () => {
      await api.deleteFenceLine(propertyId, fence.id, fence.version);
      return fence;
    },
    onSuccess: async (deleted) => {
      await refresh();
      onClose();
      onSaved({ what: 'fence-deleted', fence: deleted }, `${deleted.name} was deleted with its crossings.`);
    },
  });
  const own = crossings.filter((c) => c.fenceLineId === fence.id && c.kind !== 'runs-along').sort((a, b) => a.chainageM - b.chainageM);
  const saveError = save.error instanceof ApiError ? save.error : null;

  return (
    <section className="card flex flex-col gap-3 p-4" aria-labelledby="fence-detail-heading" data-testid="fence-line-detail">
      <div className="flex items-start justify-between gap-2">
        <div>
          <h2 id="fence-detail-heading" className="font-bold">
            {fence.name}
          </h2>
          <p className="text-sm text-bark-700">
            {FENCE_STATUS_STYLES[fence.status].label} · {formatLength(fence.lengthM)} · {own.length} {own.length === 1 ? 'crossing' : 'crossings'}
          </p>
        </div>
        <button type="button" className="btn-quiet min-h-11 px-3" onClick={onClose} aria-label={`Close ${fence.name}`}>
          Close
        </button>
      </div>
      {editing ? (
        <>
          {saveError && (
            <p className="alert-error text-sm" role="alert">
              {saveError.message}
              {saveError.status === 409 && ' Your details are still in the form; close it and open the fence again to see the change.'}
            </p>
          )}
          <FenceLineForm
            initial={{ name: fence.name, status: fence.status, wireSpec: fence.wireSpec }}
            submitLabel="Save details"
            busy={save.isPending}
            fieldErrors={saveError ? Object.fromEntries(Object.entries(saveError.fields).map(([k, v]) => [k.replace(/^wireSpec\./, ''), v])) : {}}
            onSubmit={(details) => save.mutate(details)}
            onCancel={() => setEditing(false)}
          />
        </>
      ) : (
        <>
          <p className="text-sm">{wireSummary(fence)}.</p>
          {own.length > 0 && (
            <ul className="flex flex-col gap-1 text-sm">
              {own.map((crossing) => (
                <li key={crossing.id}>
                  <button type="button" className="text-left text-creek-700 underline-offset-2 hover:underline" onClick={() => onSelectCrossing(crossing.id)}>
                    {Math.round(crossing.chainageM)} m along: {crossing.angleDeg === null ? 'runs along a channel' : `${Math.round(crossing.angleDeg)}° to the flow`}
                  </button>
                </li>
              ))}
            </ul>
          )}
          {canEdit && (
            <div className="flex flex-wrap gap-2">
              <button type="button" className="btn-quiet" onClick={() => setEditing(true)} data-testid="fence-edit-details">
                Edit details
              </button>
              <button type="button" className="btn-quiet" onClick={onReshape} data-testid="fence-reshape">
                Reshape on the map
              </button>
              {confirmDelete ? (
                <span className="flex flex-wrap items-center gap-2">
                  <button type="button" className="btn min-h-11 bg-clay-600 text-white" disabled={remove.isPending} onClick={() => remove.mutate()} data-testid="fence-delete-confirm">
                    {remove.isPending ? 'Deleting…' : `Delete ${fence.name}`}
                  </button>
                  <button type="button" className="btn-quiet" onClick={() => setConfirmDelete(false)}>
                    Keep it
                  </button>
                </span>
              ) : (
                <button type="button" className="btn-quiet" onClick={() => setConfirmDelete(true)} data-testid="fence-delete">
                  Delete…
                </button>
              )}
            </div>
          )}
          {remove.error && (
            <p className="alert-error text-sm" role="alert">
              {remove.error.message}
            </p>
          )}
        </>
      )}
    </section>
  );
}
