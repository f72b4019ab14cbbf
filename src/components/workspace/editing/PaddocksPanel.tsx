import { useMutation, useQueryClient } from '@tanstack/react-query';
import { useState } from 'react';
import { api } from '../../../lib/client/api';
import type { Paddock } from '../../../lib/schemas/paddock';
import { formatArea } from './format-measure';
import type { SavedChange } from './saved-history';

type Props = {
  propertyId: number;
  paddocks: Paddock[];
  loading: boolean;
  canEdit: boolean;
  hasFences: boolean;
  onReshape: (paddock: Paddock) => void;
  /** A removal saved here, for the saved history. */
  onSaved: (change: SavedChange, message: string) => void;
};

/** Paddocks with their areas; editors reshape or remove them, or make them from closed fence networks. */
export function PaddocksPanel({ propertyId, paddocks, loading, canEdit, hasFences, onReshape, onSaved }: Props) {
  const queryClient = useQueryClient();
  const [message, setMessage] = useState<string | null>(null);
  const refresh = () => queryClient.invalidateQueries({ queryKey: ['paddocks', propertyId] });
  const fromFences = useMutation({
    mutationFn: () => api.paddocksFromFences(propertyId),
    onSuccess: async ({ paddocks: made }) => {
      await refresh();
      setMessage(
        made.length
          ? `${made.length} ${made.length === 1 ? 'paddock' : 'paddocks'} made: ${made.map((p) => `${p.name} (${formatArea(p.areaHa)})`).join(', ')}.`
          : 'No new closed areas: the fence lines do not close off any area that is not a paddock already.',
      );
    },
  });
  const remove = useMutation({
    // With the version read, so a paddock someone else changed meanwhile is not removed unseen.
    mutationFn: (paddock: Paddock) => api.deletePaddock(propertyId, paddock.id, paddock.version),
    onSuccess: async (_answer, paddock) => {
      await refresh();
      setMessage(null);
      onSaved({ what: 'paddock-deleted', paddock }, `Paddock ${paddock.name} was removed.`);
    },
  });
  const totalHa = paddocks.reduce((sum, p) => sum + p.areaHa, 0);
  const failure = fromFences.error ?? remove.error;

  return (
    <section className="card flex flex-col gap-2 p-4" aria-labelledby="paddocks-heading" data-testid="paddocks-panel">
      <h2 id="paddocks-heading" className="font-bold">
        Paddocks
      </h2>
      {loading ? (
        <p className="text-sm text-bark-700">Loading…</p>
      ) : paddocks.length === 0 ? (
        <p className="text-sm text-bark-700">No paddocks yet.</p>
      ) : (
        <>
          <p className="text-sm text-bark-700">
            {paddocks.length} {paddocks.length === 1 ? 'paddock' : 'paddocks'}, {formatArea(totalHa)} in all.
          </p>
          <ul className="flex flex-col divide-y divide-sand-200 text-sm">
            {paddocks.map((paddock) => (
              <li key={paddock.id} className="flex flex-wrap items-center justify-between gap-2 py-1.5">
                <span>
                  <span className="font-semibold">{paddock.name}</span> <span className="tabular-nums text-bark-700">{formatArea(paddock.areaHa)}</span>
                </span>
                {canEdit && (
                  <span className="flex gap-2">
                    <button type="button" className="btn-quiet min-h-11 px-3" onClick={() => onReshape(paddock)}>
                      Reshape
                    </button>
                    <button type="button" className="btn-quiet min-h-11 px-3" aria-label={`Remove paddock ${paddock.name}`} disabled={remove.isPending} onClick={() => remove.mutate(paddock)}>
                      Remove
                    </button>
                  </span>
                )}
              </li>
            ))}
          </ul>
        </>
      )}
      {canEdit && hasFences && (
        <button type="button" className="btn-quiet self-start" disabled={fromFences.isPending} onClick={() => fromFences.mutate()} data-testid="paddocks-from-fences">
          {fromFences.isPending ? 'Looking for closed areas…' : 'Make paddocks from fence lines'}
        </button>
      )}
      {message && (
        <p className="text-sm text-saltbush-700" role="status">
          {message}
        </p>
      )}
      {failure && (
        <p className="alert-error text-sm" role="alert">
          {failure.message}
        </p>
      )}
    </section>
  );
}
