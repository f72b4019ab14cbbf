import type { PlanCrossing, PlanForExport, PlanLayoutPoint } from './plan-data';

/** Longest waypoint name written; many handheld GPS units show no more. */
export const MAX_WAYPOINT_NAME_LENGTH = 20;

/** A layout point with the short name a crew finds it by and a full description. */
export interface NamedLayoutPoint extends PlanLayoutPoint {
  /** `F3 X2 ES1`: fence 3, crossing 2, end strainer on the near side (`F3 X2 DD ES1` for a drop-down section). */
  readonly shortName: string;
  /** The point's code alone (`ES1`, `P4S`, `BT`). */
  readonly code: string;
  /** A sentence naming the fence, the crossing, the chainage, the ground and what stands there. */
  readonly description: string;
}

export interface PlanNumbering {
  /** 1-based number of a fence line: its place in the plan's list (the property's order, by id). */
  fenceNo(fenceLineId: number): number;
  /** `F3 X2`: the crossing's fence number, then its place along that fence by chainage (1 nearest the fence's first point). */
  crossingTag(crossing: PlanCrossing): string;
  /** The crossing's layout points, each with its short name and description. */
  namedPoints(crossing: PlanCrossing): NamedLayoutPoint[];
}

/**
 * Numbers a plan's fence lines and crossings and names the layout points of each crossing for a
 * handheld GPS: `F{fence} X{crossing} {code}`, at most {@link MAX_WAYPOINT_NAME_LENGTH}
 * characters, with `DD` before the code at a crossing built as a drop-down section (the crew
 * looks for a hung section between end assemblies there, not a floodgate). Codes: `ES1`/`ES2` end strainers on the near (lower chainage) and far side,
 * `FR1`/`FR2` flex-run strainers likewise, `P{n}` the layout's post n (counted from the near
 * side, the number in its label) with `S` added for a stayed post, `BT` the breakaway
 * tie (`BT1`, `BT2` … when there are several). Our own scheme, not taken from any other program.
 */
export function numberPlan(plan: PlanForExport): PlanNumbering {
  const fenceNos = new Map(plan.fenceLines.map((fence, i) => [fence.id, i + 1]));
  const fenceNames = new Map(plan.fenceLines.map((fence) => [fence.id, fence.name]));
  const crossingNos = new Map<number, number>();
  for (const fence of plan.fenceLines) {
    plan.crossings
      .filter((crossing) => crossing.fenceLineId === fence.id)
      .sort((a, b) => a.chainageM - b.chainageM || a.id - b.id)
      .forEach((crossing, i) => crossingNos.set(crossing.id, i + 1));
  }
  const fenceNo = (id: number) => fenceNos.get(id) ?? 0;
  const crossingTag = (crossing: PlanCrossing) => `F${fenceNo(crossing.fenceLineId)} X${crossingNos.get(crossing.id) ?? 0}`;

  const namedPoints = (crossing: PlanCrossing): NamedLayoutPoint[] => {
    const tag = crossingTag(crossing);
    const codes = codesOf(crossing.layoutPoints);
    const fenceName = fenceNames.get(crossing.fenceLineId) ?? '';
    return crossing.layoutPoints.map((point, i) => {
      const code = codes[i]!;
      const shortName = `${tag}${crossing.style === 'drop-down-section' ? ' DD' : ''} ${code}`.slice(0, MAX_WAYPOINT_NAME_LENGTH);
      return { ...point, code, shortName, description: describe(point, tag, fenceName, crossing.style) };
    });
  };
  return { fenceNo, crossingTag, namedPoints };
}

function codesOf(points: readonly PlanLayoutPoint[]): string[] {
  const sideCode = (prefix: string, kind: PlanLayoutPoint['kind']) => {
    const chainages = points.filter((p) => p.kind === kind).map((p) => p.chainageM);
    const nearest = Math.min(...chainages);
    return (point: PlanLayoutPoint) => `${prefix}${chainages.length > 1 && point.chainageM > nearest ? 2 : 1}`;
  };
  const endCode = sideCode('ES', 'end-strainer');
  const flexCode = sideCode('FR', 'flex-run-strainer');
  const ties = points.filter((p) => p.kind === 'breakaway-tie');
  let post = 0;
  let tie = 0;
  return points.map((point) => {
    switch (point.kind) {
      case 'end-strainer':
        return endCode(point);
      case 'flex-run-strainer':
        return flexCode(point);
      case 'floodgate-post':
      case 'line-post':
        post += 1;
        return `P${post}${point.braced ? 'S' : ''}`;
      case 'breakaway-tie':
        tie += 1;
        return ties.length > 1 ? `BT${tie}` : 'BT';
    }
  });
}

/** How each crossing style is named in a waypoint's description. */
const STYLE_NAMES: Record<string, string> = { 'continuous-floodgate': 'continuous floodgate', 'drop-down-section': 'drop-down section' };

function describe(point: PlanLayoutPoint, tag: string, fenceName: string, style: string | null): string {
  const built = style ? `, built as a ${STYLE_NAMES[style] ?? style}` : '';
  const parts = [`${point.label}.`, `Crossing ${tag} on fence line "${fenceName}"${built}, ${point.chainageM.toFixed(1)} m along the fence.`];
  if (point.kind === 'floodgate-post' || point.kind === 'line-post') {
    parts.push(point.braced ? 'Stay: yes (braced post).' : 'Stay: no.');
    if (point.hungDropperLink) parts.push(`Hung droppers: ${point.hungDropperLink} link.`);
  }
  if (point.elevationM !== null) parts.push(`Ground ${point.elevationM.toFixed(1)} m.`);
  if (point.beyondFence) parts.push('Past the end of the fence line: set at its end.');
  return parts.join(' ');
}
