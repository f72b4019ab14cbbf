import { booleanPointInPolygon, lineIntersect, lineString, polygon } from '@turf/turf';
import { checkFenceLine, cleanFenceLine } from '../crossings/geometry/fence-checks';
import { localFrameAt } from '../crossings/geometry/local-frame';
import { MIN_SEGMENT_M, nearDistanceM, describePositionProblem } from '../crossings/geometry/position-checks';
import { polygonAreaHa } from './measure';

/** A problem with one ring of a paddock boundary, in words a person can act on. */
export interface PaddockRingProblem {
  /** 0 for the outer boundary, 1… for holes. */
  readonly ringIndex: number;
  readonly message: string;
}

/** The checked rings (closed, repeated vertices dropped) and every problem found. */
export interface CheckedPaddockRings {
  readonly rings: [number, number][][];
  readonly problems: PaddockRingProblem[];
}

/** A boundary enclosing less than this (m²) encloses nothing: its corners lie on one line. */
export const MIN_PADDOCK_AREA_M2 = 1;

/**
 * Checks a paddock boundary given as an outer ring then holes, each closed or not, and returns
 * the rings made usable: repeated vertices (less than 1 cm apart, a double click) dropped and
 * every ring closed. Problems: a position that is not `[lon, lat]` degrees in range; fewer than
 * three distinct corners; corners all on one line (within 1 cm); a segment across the antimeridian; a ring crossing or touching itself
 * (`checkFenceLine`, whose self-crossing test ignores a closed ring's start meeting its end); an
 * area under 1 m² (GeographicLib's geodesic area); a hole not wholly inside the outer ring, or
 * crossing another hole (holes compared in degrees with Turf's `booleanPointInPolygon` and
 * `lineIntersect`, enough to tell inside from outside).
 *
 * @param rings - outer ring then holes, `[lon, lat]` WGS84 degrees; not modified
 * @returns the cleaned, closed rings and the problems, ring by ring (none when usable)
 */
export function checkPaddockRings(rings: readonly (readonly (readonly number[])[])[]): CheckedPaddockRings {
  if (!Array.isArray(rings) || rings.length === 0) {
    return { rings: [], problems: [{ ringIndex: 0, message: 'expected the boundary as rings of [lon, lat] positions, the outer ring first' }] };
  }
  const problems: PaddockRingProblem[] = [];
  const cleaned = rings.map((ring, ringIndex) => {
    const ringProblems = checkRing(ring);
    problems.push(...ringProblems.problems.map((message) => ({ ringIndex, message })));
    return ringProblems.ring;
  });
  if (problems.length === 0) problems.push(...checkHoles(cleaned));
  return { rings: cleaned, problems };
}

function checkRing(ring: readonly (readonly number[])[]): { ring: [number, number][]; problems: string[] } {
  if (!Array.isArray(ring)) return { ring: [], problems: ['expected a ring of [lon, lat] positions'] };
  const bad = ring.map((p, k) => [k, describePositionProblem(p)] as const).filter(([, problem]) => problem !== null);
  if (bad.length) return { ring: [], problems: bad.map(([k, problem]) => `corner ${k}: ${problem}`) };
  const open = cleanFenceLine(ring as readonly (readonly [number, number])[]);
  if (open.length > 1 && nearDistanceM(open[0]!, open.at(-1)!) < MIN_SEGMENT_M) open.pop();
  if (open.length < 3) return { ring: [], problems: [`a paddock boundary needs at least three distinct corners, got ${open.length}`] };
  if (onOneLine(open)) return { ring: [], problems: ['the boundary encloses no area: its corners lie on one line'] };
  const closed = [...open, [open[0]![0], open[0]![1]] as [number, number]];
  const problems = checkFenceLine(closed)
    .filter((problem) => problem.code !== 'repeated-vertex')
    .map((problem) =>
      problem.code === 'self-crossing' && problem.position
        ? `the boundary crosses or touches itself at [${problem.position[0].toFixed(6)}, ${problem.position[1].toFixed(6)}], near corner ${problem.vertexIndex}`
        : problem.message,
    );
  if (problems.length === 0 && polygonAreaHa([closed]) * 10_000 < MIN_PADDOCK_AREA_M2) {
    problems.push('the boundary encloses no area: its corners lie on one line');
  }
  return { ring: closed, problems };
}

/** Whether every corner lies within 1 cm of the line from the first corner to the one farthest from it. */
function onOneLine(corners: [number, number][]): boolean {
  const { kx, ky } = localFrameAt(corners[0]![0], corners[0]![1]);
  const xy = corners.map(([lon, lat]) => [(lon - corners[0]![0]) * kx, (lat - corners[0]![1]) * ky] as const);
  const [fx, fy] = xy.reduce((far, p) => (Math.hypot(...p) > Math.hypot(...far) ? p : far));
  const length = Math.hypot(fx, fy);
  return xy.every(([x, y]) => Math.abs(x * fy - y * fx) / length < MIN_SEGMENT_M);
}

function checkHoles(rings: [number, number][][]): PaddockRingProblem[] {
  const [outer, ...holes] = rings;
  if (!outer || holes.length === 0) return [];
  const outerPolygon = polygon([outer]);
  const problems: PaddockRingProblem[] = [];
  holes.forEach((hole, i) => {
    const ringIndex = i + 1;
    const inside = hole.every(([lon, lat]) => booleanPointInPolygon([lon, lat], outerPolygon, { ignoreBoundary: true }));
    if (!inside || lineIntersect(lineString(hole), lineString(outer)).features.length > 0) {
      problems.push({ ringIndex, message: 'a hole must lie wholly inside the outer boundary' });
      return;
    }
    const overlapped = holes.slice(0, i).findIndex((other) => lineIntersect(lineString(hole), lineString(other)).features.length > 0 || booleanPointInPolygon(hole[0]!, polygon([other])) || booleanPointInPolygon(other[0]!, polygon([hole])));
    if (overlapped >= 0) problems.push({ ringIndex, message: `this hole overlaps hole ${overlapped + 1}` });
  });
  return problems;
}
