import { useMutation } from '@tanstack/react-query';
import { useState } from 'react';
import { api } from '../../../lib/client/api';
import type { CrossingSummaryView, LonLat } from '../../../lib/schemas/crossing-view';
import type { FenceLine } from '../../../lib/schemas/plan';
import { PLAN_COLOURS } from '../../map/plan-layers';
import { formatChainage, formatMetres } from './format';

/** A suggested square crossing being previewed on the map. */
export type RealignmentPreview = {
  crossingId: number;
  fenceLineId: number;
  fenceVersion: number;
  coordinates: LonLat[];
  addedLengthM: number;
  newAngleDeg: number;
  replacedChainageRange: { fromM: number; toM: number };
};

type Props = {
  propertyId: number;
  summary: CrossingSummaryView;
  canEdit: boolean;
  preview: RealignmentPreview | null;
  onPreview: (preview: RealignmentPreview | null) => void;
  onRealigned: (fenceLine: FenceLine) => Promise<void>;
};

/** The offer of a square crossing for a fair or poor one: previewed on the map, then accepted or rejected. */
export function RealignmentBox({ propertyId, summary, canEdit, preview, onPreview, onRealigned }: Props) {
  const [problem, setProblem] = useState<string | null>(null);
  const suggest = useMutation({
    mutationFn: () => api.getRealignment(propertyId, summary.id).then((answer) => answer.realignment),
    onSuccess: (realignment) => {
      if (!realignment.suggestion.ok) {
        setProblem(realignment.suggestion.reason);
        onPreview(null);
        return;
      }
      setProblem(null);
      const { coordinates, addedLengthM, newAngleDeg, replacedChainageRange } = realignment.suggestion;
      onPreview({
        crossingId: summary.id,
        fenceLineId: realignment.fenceLine.id,
        fenceVersion: realignment.fenceLine.version,
        coordinates,
        addedLengthM,
        newAngleDeg,
        replacedChainageRange,
      });
    },
  });
  const accept = useMutation({
    mutationFn: (version: number) => api.acceptRealignment(propertyId, summary.id, version).then((answer) => answer.fenceLine),
    onSuccess: async (fenceLine) => {
      onPreview(null);
      await onRealigned(fenceLine);
    },
  });
  const error = suggest.error ?? accept.error;

  return (
    <div className="mt-3">
      {!preview && (
        <button type="button" className="btn-quiet w-full" onClick={() => suggest.mutate()} disabled={suggest.isPending}>
          {suggest.isPending ? 'Working out a square crossing…' : 'Suggest a square crossing'}
        </button>
      )}
      {problem && (
        <p className="mt-2 rounded-lg border border-sand-300 bg-sand-100 p-2 text-sm" role="status">
          No square crossing to suggest here: {problem}
        </p>
      )}
      {preview && (
        <div className="rounded-lg border-2 p-3 text-sm" style={{ borderColor: PLAN_COLOURS.realign }} data-testid="realign-preview" role="status">
          <p className="font-semibold">Suggested square crossing</p>
          <p className="mt-1">
            The dashed green line on the map is the fence with a dog-leg that crosses the channel at {Math.round(preview.newAngleDeg)}°. It replaces the fence from{' '}
            {formatChainage(preview.replacedChainageRange.fromM)} to {formatChainage(preview.replacedChainageRange.toM)} and adds {formatMetres(preview.addedLengthM, 0)} of fence.
          </p>
          <div className="mt-3 flex flex-wrap gap-2">
            {canEdit && (
              <button
                type="button"
                className="btn-primary flex-1"
                data-testid="realign-accept"
                onClick={() => accept.mutate(preview.fenceVersion)}
                disabled={accept.isPending}
              >
                {accept.isPending ? 'Moving the fence line…' : 'Accept'}
              </button>
            )}
            <button type="button" className="btn-quiet flex-1" onClick={() => onPreview(null)} disabled={accept.isPending}>
              {canEdit ? 'Reject' : 'Hide suggestion'}
            </button>
          </div>
          {!canEdit && <p className="mt-2 text-bark-700">A manager or owner can accept it.</p>}
        </div>
      )}
      {error && (
        <p className="alert-error mt-2 text-sm" role="alert">
          {error.message}
        </p>
      )}
    </div>
  );
}
