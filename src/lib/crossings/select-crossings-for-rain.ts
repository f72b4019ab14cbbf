import { booleanIntersects, booleanPointInPolygon, multiPolygon, point, polygon } from '@turf/turf';

type LonLat = [number, number];

/** A crossing as the selection sees it: its point, its catchment area and, when traced, its outline. */
export type RainCandidate = {
  readonly id: number;
  /** [lon, lat], WGS84. */
  readonly position: readonly [number, number];
  /** Catchment area in hectares, or null when unknown. */
  readonly catchmentHa: number | null;
  /** The catchment outline as MultiPolygon coordinates ([lon, lat] rings), or null when none is available. */
  readonly catchmentOutline: readonly (readonly (readonly (readonly [number, number])[])[])[] | null;
};

/** Where the rain fell: the whole property, or these paddocks (rings of [lon, lat], outer first). */
export type RainScope =
  | { readonly kind: 'property' }
  | { readonly kind: 'paddocks'; readonly paddocks: readonly { readonly id: number; readonly rings: readonly (readonly (readonly [number, number])[])[] }[] };

export type SelectedCrossing = {
  readonly id: number;
  readonly catchmentHa: number | null;
  /** `property`: the whole property had rain; `catchment`: its outline meets a chosen paddock; `point`: no outline, its point lies in one. */
  readonly selectedBy: 'property' | 'catchment' | 'point';
};

const mutable = (rings: readonly (readonly (readonly [number, number])[])[]): LonLat[][] => rings.map((ring) => ring.map(([lon, lat]) => [lon, lat] as LonLat));

/**
 * The crossings to check after rain, largest catchment first (unknown areas last, then by id).
 * Whole property: every crossing. Chosen paddocks: a crossing whose catchment outline intersects
 * (shares any point with) a chosen paddock; a crossing without an outline, when its point lies in
 * (or on the boundary of) a chosen paddock. Our rule: rain on any part of a catchment reaches its crossing.
 * @throws Error when the scope names paddocks but gives none
 */
export function selectCrossingsForRain(candidates: readonly RainCandidate[], scope: RainScope): SelectedCrossing[] {
  if (scope.kind === 'paddocks' && scope.paddocks.length === 0) throw new Error('selectCrossingsForRain: choose at least one paddock, or the whole property.');
  const paddocks = scope.kind === 'paddocks' ? scope.paddocks.map((paddock) => polygon(mutable(paddock.rings))) : [];
  const selected: SelectedCrossing[] = [];
  for (const candidate of candidates) {
    if (scope.kind === 'property') {
      selected.push({ id: candidate.id, catchmentHa: candidate.catchmentHa, selectedBy: 'property' });
    } else if (candidate.catchmentOutline && candidate.catchmentOutline.length > 0) {
      const outline = multiPolygon(candidate.catchmentOutline.map(mutable));
      if (paddocks.some((paddock) => booleanIntersects(outline, paddock))) selected.push({ id: candidate.id, catchmentHa: candidate.catchmentHa, selectedBy: 'catchment' });
    } else {
      const at = point([candidate.position[0], candidate.position[1]]);
      if (paddocks.some((paddock) => booleanPointInPolygon(at, paddock))) selected.push({ id: candidate.id, catchmentHa: candidate.catchmentHa, selectedBy: 'point' });
    }
  }
  return selected.sort((a, b) => (b.catchmentHa ?? -1) - (a.catchmentHa ?? -1) || a.id - b.id);
}
