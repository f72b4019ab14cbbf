/**
 * The plan of one property as the exporters take it: plain data, gathered by the server from
 * fence lines, paddocks and the stored crossing designs. Positions are `[lon, lat]` WGS84
 * degrees; lengths, heights and chainages in metres; areas in hectares.
 */
import type { FenceLine } from '../schemas/plan';

export type LonLat = [number, number];

/** Version of the export's layout; raised when a field is renamed or removed, so an import can tell. */
export const PLAN_EXPORT_FORMAT_VERSION = 1;

export type PlanFenceLine = Pick<FenceLine, 'id' | 'name' | 'status' | 'coordinates' | 'lengthM' | 'wireSpec' | 'version'>;

export interface PlanPaddock {
  readonly id: number;
  readonly name: string;
  /** Outer ring then holes, closed, in any winding (the exporters rewind them). */
  readonly rings: LonLat[][];
  readonly areaHa: number;
}

export type PlanLayoutPointKind = 'end-strainer' | 'flex-run-strainer' | 'floodgate-post' | 'line-post' | 'breakaway-tie';

/** A place a crew must find: a strainer, a post or a breakaway tie of a designed crossing. */
export interface PlanLayoutPoint {
  readonly kind: PlanLayoutPointKind;
  /** The design's own words, e.g. "Floodgate post 3, stayed". */
  readonly label: string;
  /** Distance along the fence line from its first point. */
  readonly chainageM: number;
  readonly position: LonLat;
  /** A post with a stay (braced post). */
  readonly braced: boolean;
  /** The hanger link of the post's hung droppers, when it has them. */
  readonly hungDropperLink: 'open' | 'closed' | null;
  /** The chainage lies past an end of the fence: the point stands at that end. */
  readonly beyondFence: boolean;
  /** Ground height from the elevation model, when known. */
  readonly elevationM: number | null;
}

export interface PlanCrossing {
  readonly id: number;
  readonly fenceLineId: number;
  readonly drainageLineId: number | null;
  readonly kind: string;
  readonly position: LonLat;
  readonly chainageM: number;
  readonly angleDeg: number | null;
  readonly angleClass: string | null;
  readonly streamOrder: number | null;
  readonly catchmentHa: number | null;
  readonly designStatus: string;
  readonly style: string | null;
  /** The design flood: water level (elevation model heights), deepest water and wetted width. */
  readonly flood: { readonly levelM: number | null; readonly maxDepthM: number | null; readonly widthM: number | null } | null;
  /** Empty unless the crossing is designed. */
  readonly layoutPoints: readonly PlanLayoutPoint[];
}

export interface PlanForExport {
  readonly propertyName: string;
  /** ISO 8601 time of the export (the caller's clock). */
  readonly exportedAt: string;
  readonly fenceLines: readonly PlanFenceLine[];
  readonly paddocks: readonly PlanPaddock[];
  readonly crossings: readonly PlanCrossing[];
}

/**
 * A part of a plan to write (a work order's): the fence lines and crossings by id. The whole plan
 * is still numbered, so a waypoint keeps the name it has in the property's full export.
 */
export interface PlanScope {
  readonly fenceLineIds: ReadonlySet<number>;
  readonly crossingIds: ReadonlySet<number>;
}

/** The plan's parts a scope keeps (all of them without a scope); paddocks only without one. */
export function scopedParts(plan: PlanForExport, scope: PlanScope | undefined) {
  if (!scope) return { fenceLines: plan.fenceLines, paddocks: plan.paddocks, crossings: plan.crossings };
  return {
    fenceLines: plan.fenceLines.filter((fence) => scope.fenceLineIds.has(fence.id)),
    paddocks: [],
    crossings: plan.crossings.filter((crossing) => scope.crossingIds.has(crossing.id)),
  };
}

/**
 * Checks a plan at the entry of an exporter: every position a finite `[lon, lat]` in range,
 * every fence line of two points or more, every paddock ring closed with four positions or more,
 * every crossing on a fence line of the plan.
 *
 * @throws RangeError naming the first thing that is wrong
 */
export function checkPlan(plan: PlanForExport): void {
  const checkPosition = (position: readonly number[], where: string) => {
    const [lon, lat] = position;
    if (!(Number.isFinite(lon) && Number.isFinite(lat) && Math.abs(lon!) <= 180 && Math.abs(lat!) <= 90)) {
      throw new RangeError(`${where} must be [lon, lat] in degrees (lon −180…180, lat −90…90), got ${JSON.stringify(position)}`);
    }
  };
  if (Number.isNaN(Date.parse(plan.exportedAt))) throw new RangeError(`exportedAt must be an ISO 8601 time, got ${plan.exportedAt}`);
  for (const fence of plan.fenceLines) {
    if (fence.coordinates.length < 2) throw new RangeError(`fence line ${fence.id} needs at least two positions`);
    fence.coordinates.forEach((p, i) => checkPosition(p, `fence line ${fence.id} position ${i}`));
  }
  for (const paddock of plan.paddocks) {
    if (paddock.rings.length === 0) throw new RangeError(`paddock ${paddock.id} has no outer ring`);
    paddock.rings.forEach((ring, r) => {
      ring.forEach((p, i) => checkPosition(p, `paddock ${paddock.id} ring ${r} position ${i}`));
      const first = ring[0];
      const last = ring.at(-1);
      if (ring.length < 4 || !first || !last || first[0] !== last[0] || first[1] !== last[1]) {
        throw new RangeError(`paddock ${paddock.id} ring ${r} must be closed (first position repeated last) with at least four positions`);
      }
    });
  }
  const fenceIds = new Set(plan.fenceLines.map((fence) => fence.id));
  for (const crossing of plan.crossings) {
    if (!fenceIds.has(crossing.fenceLineId)) throw new RangeError(`crossing ${crossing.id} is on fence line ${crossing.fenceLineId}, which is not in the plan`);
    checkPosition(crossing.position, `crossing ${crossing.id}`);
    crossing.layoutPoints.forEach((point, i) => checkPosition(point.position, `crossing ${crossing.id} layout point ${i}`));
  }
}
