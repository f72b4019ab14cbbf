import type { CrossingDetailView } from '../../../lib/schemas/crossing-view';
import { formatChainage, formatMetres } from './format';

/** Why a meeting of fence and drainage line has no floodgate design: it runs along, touches, crosses twice, or lacks terrain. */
export function KindNote({ crossing }: { crossing: CrossingDetailView }) {
  const design = crossing.design;
  if (crossing.kind === 'runs-along' && design && !('status' in design && design.status)) {
    const along = design as { fromChainageM?: number; toChainageM?: number; lengthM?: number };
    return (
      <p className="mt-4 rounded-lg border border-ochre-600 bg-sand-100 p-3 text-sm">
        The fence runs along this drainage line for {formatMetres(along.lengthM, 0)}
        {along.fromChainageM !== undefined && along.toChainageM !== undefined
          ? ` (from ${formatChainage(along.fromChainageM)} to ${formatChainage(along.toChainageM)} along the fence)`
          : ''}
        . A fence in a channel catches every flood: move it onto higher ground beside the channel, or cross the channel square.
      </p>
    );
  }
  if (crossing.kind === 'touch') {
    const reason = design && 'touchReason' in design ? design.touchReason : null;
    return <p className="mt-4 rounded-lg border border-sand-300 bg-sand-100 p-3 text-sm">The fence only touches this drainage line{reason ? `: ${reason}` : '.'}</p>;
  }
  if (crossing.kind === 'crosses-twice') {
    return (
      <p className="mt-4 rounded-lg border border-sand-300 bg-sand-100 p-3 text-sm">
        The fence crosses this drainage line more than once close together: a single square crossing is usually better.
      </p>
    );
  }
  if (crossing.designStatus === 'no-terrain') {
    return <p className="mt-4 text-sm text-bark-700">No processed elevation model lies under this part of the fence, so the crossing cannot be designed yet.</p>;
  }
  return null;
}
