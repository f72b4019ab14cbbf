import type { FloodgateLayout } from './design/floodgate-layout';

/** A place on the fence for a crew to find: what stands there, its chainage and `[lon, lat]`. */
export interface LayoutPoint {
  readonly kind: 'end-strainer' | 'flex-run-strainer' | 'floodgate-post' | 'line-post' | 'breakaway-tie';
  readonly label: string;
  readonly chainageM: number;
  readonly position: [number, number];
  /** The chainage lies past an end of the fence line: the point is put at that end. */
  readonly beyondFence: boolean;
  readonly braced?: boolean;
  readonly link?: 'open' | 'closed' | null;
}

export type LayoutPositions = LayoutPoint[];

/**
 * Positions of a layout's strainers, posts and breakaway ties, interpolated linearly by chainage
 * between the fence's profile samples (which carry `[lon, lat]`; samples a metre apart keep the
 * error to centimetres).
 *
 * @param layout - from `layoutFloodgate`, chainages along the fence in metres
 * @param samples - the fence's profile, sorted by chainage, each with its position
 */
export function positionsOfLayout(layout: FloodgateLayout, samples: readonly { chainageM: number; position: readonly [number, number] }[]): LayoutPositions {
  const at = (chainageM: number): { position: [number, number]; beyondFence: boolean } => {
    const first = samples[0]!;
    const last = samples[samples.length - 1]!;
    if (chainageM <= first.chainageM) return { position: [first.position[0], first.position[1]], beyondFence: chainageM < first.chainageM - 0.5 };
    if (chainageM >= last.chainageM) return { position: [last.position[0], last.position[1]], beyondFence: chainageM > last.chainageM + 0.5 };
    let lo = 0;
    let hi = samples.length - 1;
    while (hi - lo > 1) {
      const mid = (lo + hi) >> 1;
      if (samples[mid]!.chainageM <= chainageM) lo = mid;
      else hi = mid;
    }
    const a = samples[lo]!;
    const b = samples[hi]!;
    const t = (chainageM - a.chainageM) / (b.chainageM - a.chainageM || 1);
    return { position: [a.position[0] + t * (b.position[0] - a.position[0]), a.position[1] + t * (b.position[1] - a.position[1])], beyondFence: false };
  };
  const points: LayoutPoint[] = [];
  for (const strainer of layout.endStrainers) {
    points.push({ kind: 'end-strainer', label: `End strainer (${strainer.side === 'start' ? 'near' : 'far'} side)`, chainageM: strainer.chainageM, ...at(strainer.chainageM) });
  }
  for (const strainer of layout.styleDetail.flexRunStrainers) {
    points.push({ kind: 'flex-run-strainer', label: `Flex-run strainer (${strainer.side === 'start' ? 'near' : 'far'} side)`, chainageM: strainer.chainageM, ...at(strainer.chainageM) });
  }
  layout.posts.forEach((post, index) => {
    points.push({
      kind: post.role === 'floodgate' ? 'floodgate-post' : 'line-post',
      label: `${post.role === 'floodgate' ? 'Floodgate post' : 'Line post'} ${index + 1}${post.braced ? ', stayed' : ''}`,
      chainageM: post.chainageM,
      braced: post.braced,
      link: post.hungDropper?.link ?? null,
      ...at(post.chainageM),
    });
  });
  for (const tie of layout.breakawayTies) {
    points.push({ kind: 'breakaway-tie', label: tie.at === 'lowest-post' ? 'Breakaway tie (lowest post)' : 'Breakaway tie (end assembly)', chainageM: tie.chainageM, ...at(tie.chainageM) });
  }
  return points;
}
