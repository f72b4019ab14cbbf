/**
 * findCrossings on constructed cases with known answers.
 *
 * Outside references:
 * - GeographicLib (C. F. F. Karney 2013, "Algorithms for geodesics", Journal of Geodesy
 *   87:43–55; npm geographiclib-geodesic): the test lines are built with its direct solution, and
 *   chainages are checked against its inverse solution within 0.1 %.
 * - Analytic geometry: a radius of a circle meets the circle at a right angle; a staircase of
 *   equal north and east steps runs on average at 45°.
 * The place (near 142.5° E, 31.5° S) and every line are invented.
 */
import { describe, expect, it } from 'vitest';
import { buildDrainageIndex, findCrossings, type DrainageLineInput, type FenceLineInput } from '../../../../src/lib/crossings/geometry/index';
import { alongBearing, arc, deepFreeze, destination, inverseM, lineLengthM, ORIGIN, range, staircase } from './helpers';

/** A straight creek flowing north through ORIGIN, vertices every 100 m (ORIGIN is vertex 5). */
const NORTH_CREEK: DrainageLineInput = {
  id: 'creek',
  coordinates: alongBearing(ORIGIN, 0, range(-500, 500, 100)),
  streamOrder: 2,
  upstreamAreaStartM2: 100_000,
  upstreamAreaEndM2: 300_000,
};

/** A fence through ORIGIN at a bearing, with no vertex at the crossing. */
function fenceAt(bearingDeg: number, id: string | number = 'fence'): FenceLineInput {
  return { id, coordinates: alongBearing(ORIGIN, bearingDeg, [-300, -170, -40, 60, 210]) };
}

const onCreek = (distanceM: number) => destination(ORIGIN, 0, distanceM);
const west = (point: readonly number[], metres: number) => destination(point, 270, metres);
const east = (point: readonly number[], metres: number) => destination(point, 90, metres);

describe('findCrossings: angles', () => {
  it('gives 90° for a fence square to the flow, with bearings, chainages and attributes', () => {
    const { crossings, runsAlong } = findCrossings([fenceAt(90)], [NORTH_CREEK]);
    expect(runsAlong).toEqual([]);
    expect(crossings).toHaveLength(1);
    const c = crossings[0]!;
    expect(c).toMatchObject({ kind: 'crossing', touchReason: null, flags: [], fenceId: 'fence', drainageId: 'creek', angleClass: 'good', streamOrder: 2 });
    expect(c.crossingAngleDeg).toBeCloseTo(90, 3);
    expect(c.flowBearingDeg).toBeCloseTo(0, 6);
    expect(c.fenceBearingDeg).toBeCloseTo(90, 3);
    expect(inverseM(c.position, ORIGIN)).toBeLessThan(0.001);
    expect(c.fenceSegmentIndex).toBe(2);
    expect(c.drainageSegmentIndex).toBe(5);
    expect(c.fenceChainageM).toBeCloseTo(300, 3);
    expect(c.drainageChainageM).toBeCloseTo(500, 3);
    // Halfway along the line by length: halfway between 100 000 and 300 000 m².
    expect(c.upstreamAreaM2).toBeCloseTo(200_000, 0);
  });

  it.each([
    [45, 45, 'poor'], // 45.00006° off square from the geodesic construction: just past the fair limit
    [135, 45, 'fair'],
    [60, 60, 'fair'],
    [300, 60, 'fair'],
    [80, 80, 'good'],
    [10, 10, 'poor'],
  ] as const)('a fence at bearing %d° crosses a north-flowing creek at %d°', (bearing, angle, _) => {
    const c = findCrossings([fenceAt(bearing)], [NORTH_CREEK]).crossings[0]!;
    expect(c.kind).toBe('crossing');
    expect(c.crossingAngleDeg).toBeCloseTo(angle, 3);
    expect(c.fenceBearingDeg).toBeCloseTo(bearing, 3);
  });

  it('classifies at the tolerance boundaries (20° and 45° off square by default, settable)', () => {
    const classOf = (bearing: number, options = {}) => findCrossings([fenceAt(bearing)], [NORTH_CREEK], options).crossings[0]!.angleClass;
    expect(classOf(70.01)).toBe('good');
    expect(classOf(69.99)).toBe('fair');
    expect(classOf(45.01)).toBe('fair');
    expect(classOf(44.99)).toBe('poor');
    expect(classOf(69.99, { goodWithinDeg: 25 })).toBe('good');
    expect(classOf(44.99, { fairWithinDeg: 50 })).toBe('fair');
  });

  it('gives 90° where a fence through the centre of a circular creek meets it (radius ⟂ circle)', () => {
    const centre = ORIGIN;
    const creek = { id: 'bend', coordinates: arc(centre, 200, 200, 340, 7) };
    for (const bearing of [270, 250, 300]) {
      const fence = { id: bearing, coordinates: [destination(centre, bearing, -100), destination(centre, bearing, 400)] };
      const [c, ...rest] = findCrossings([fence], [creek]).crossings;
      expect(rest).toEqual([]);
      expect(c!.kind).toBe('crossing');
      expect(inverseM(c!.position, centre)).toBeCloseTo(200, 0);
      // The polygon's chord over ±40 m is square to the radius within a fraction of a degree.
      expect(c!.crossingAngleDeg).toBeGreaterThan(89.5);
    }
  });

  it('averages a cell-by-cell zigzag: a staircase of 10 m north and east steps flows at 45°', () => {
    const start = destination(ORIGIN, 225, 300);
    const creek = { id: 'zigzag', coordinates: staircase(start, [0, 90], 10, 60) };
    // Square to the average course (bearing 45°), through points mid-step and at a corner.
    for (const offsetM of [0, 3, 5, 10, 17]) {
      const through = destination(ORIGIN, 0, offsetM);
      const fence = { id: offsetM, coordinates: alongBearing(through, 135, [-100, 100]) };
      const averaged = findCrossings([fence], [creek]).crossings;
      expect(averaged).toHaveLength(1);
      expect(averaged[0]!.flowBearingDeg).toBeCloseTo(45, 1);
      expect(averaged[0]!.crossingAngleDeg).toBeCloseTo(90, 1);
      // Segment by segment, the same crossing would look 45° off square.
      const raw = findCrossings([fence], [creek], { flowWindowM: 0 }).crossings[0]!;
      expect(raw.crossingAngleDeg).toBeCloseTo(45, 1);
    }
  });
});

describe('findCrossings: touches and special cases', () => {
  it('reports a fence that ends on the creek as a touch (fence-end)', () => {
    const fence = { id: 'f', coordinates: [west(onCreek(-50), 200), onCreek(30)] };
    const [c, ...rest] = findCrossings([fence], [NORTH_CREEK]).crossings;
    expect(rest).toEqual([]);
    expect(c).toMatchObject({ kind: 'touch', touchReason: 'fence-end', fenceSegmentIndex: 0, drainageSegmentIndex: 5 });
    expect(c!.fenceChainageM).toBeCloseTo(inverseM(fence.coordinates[0]!, fence.coordinates[1]!), 6);
    expect(c!.drainageChainageM).toBeCloseTo(530, 3);
  });

  it('reports a vertex on the creek with the fence staying on one side as a touch (tangent)', () => {
    const fence = { id: 'f', coordinates: [west(onCreek(-100), 150), onCreek(30), west(onCreek(150), 150)] };
    expect(findCrossings([fence], [NORTH_CREEK]).crossings).toMatchObject([{ kind: 'touch', touchReason: 'tangent', fenceSegmentIndex: 1 }]);
  });

  it('counts a fence crossing through a vertex of the creek, or at its own vertex, once', () => {
    // Symmetric about ORIGIN in degrees, so the straight segment passes through the creek's vertex there.
    const throughCreekVertex = { id: 'a', coordinates: [[ORIGIN[0] - 0.001, ORIGIN[1] + 0.0007], [ORIGIN[0] + 0.001, ORIGIN[1] - 0.0007]] as [number, number][] };
    const atFenceVertex = { id: 'b', coordinates: [west(onCreek(0), 100), onCreek(30), east(onCreek(-20), 100)] };
    const atBothVertices = { id: 'c', coordinates: [west(onCreek(0), 100), onCreek(100), east(onCreek(100), 100)] };
    const { crossings } = findCrossings([throughCreekVertex, atFenceVertex, atBothVertices], [NORTH_CREEK]);
    expect(crossings.map((c) => [c.fenceId, c.kind])).toEqual([['a', 'crossing'], ['b', 'crossing'], ['c', 'crossing']]);
    expect(inverseM(crossings[0]!.position, ORIGIN)).toBeLessThan(0.001);
  });

  it('reports a creek that starts on the fence as a touch (drainage-end)', () => {
    const head = { id: 'head', coordinates: alongBearing(ORIGIN, 0, [0, 100, 200]) };
    const fence = fenceAt(90);
    expect(findCrossings([fence], [head]).crossings).toMatchObject([{ kind: 'touch', touchReason: 'drainage-end', drainageChainageM: 0 }]);
  });

  it('follows a fence laid exactly along the creek: same side after → touch (along), other side → crossing', () => {
    const leaveWest = { id: 'w', coordinates: [west(onCreek(-250), 100), onCreek(-100), onCreek(100), west(onCreek(250), 100)] };
    const leaveEast = { id: 'e', coordinates: [west(onCreek(-250), 100), onCreek(-100), onCreek(100), east(onCreek(250), 100)] };
    const { crossings } = findCrossings([leaveWest, leaveEast], [NORTH_CREEK], { runsAlongMinLengthM: 1000 });
    expect(crossings.map((c) => [c.fenceId, c.kind, c.touchReason])).toEqual([['w', 'touch', 'along'], ['e', 'crossing', null]]);
    // Reported at the middle of the shared stretch, so either direction of travel gives the same point.
    expect(inverseM(crossings[1]!.position, ORIGIN)).toBeLessThan(0.001);
    expect(crossings[1]!.fenceChainageM).toBeCloseTo(inverseM(leaveEast.coordinates[0]!, onCreek(-100)) + 100, 3);
  });

  it('reports a fence line just touching the outside of a bend as a tangent touch', () => {
    const centre = ORIGIN;
    const creek = { id: 'bend', coordinates: arc(centre, 200, 200, 340, 7) };
    const vertex = destination(centre, 270, 200); // a vertex of the arc (200 + 10 × 7)
    const fence = { id: 't', coordinates: [[vertex[0], vertex[1] - 0.001], [vertex[0], vertex[1] + 0.001]] as [number, number][] };
    expect(findCrossings([fence], [creek]).crossings).toMatchObject([{ kind: 'touch', touchReason: 'tangent' }]);
  });

  it('flags two crossings of the same creek within 100 m as crosses-twice, keeping both', () => {
    // A U-bend: north for 400 m, east 60 m, south again.
    const s = destination(ORIGIN, 180, 300);
    const n = destination(ORIGIN, 0, 100);
    const uBend = { id: 'u', coordinates: [s, n, east(n, 60), east(s, 60)] };
    const fence = { id: 'f', coordinates: [west(ORIGIN, 200), east(ORIGIN, 300)] };
    const { crossings } = findCrossings([fence], [uBend]);
    expect(crossings).toHaveLength(2);
    expect(crossings.map((c) => c.flags)).toEqual([['crosses-twice'], ['crosses-twice']]);
    expect(crossings[0]!.pairedChainageM).toBe(crossings[1]!.fenceChainageM);
    expect(crossings[1]!.fenceChainageM - crossings[0]!.fenceChainageM).toBeCloseTo(60, 1);
    expect(crossings.map((c) => Math.round(c.flowBearingDeg))).toEqual([0, 180]);
    const apart = findCrossings([fence], [uBend], { crossesTwiceWithinM: 50 }).crossings;
    expect(apart.map((c) => c.flags)).toEqual([[], []]);
  });

  it('reports a fence running 10 m beside a creek for 400 m as runs-along with its chainage range', () => {
    const a = destination(west(onCreek(-300), 200), 0, 0);
    const b = west(onCreek(-200), 10);
    const c = west(onCreek(200), 10);
    const d = west(onCreek(300), 200);
    const fence = { id: 'beside', coordinates: [a, b, c, d] };
    const { crossings, runsAlong } = findCrossings([fence], [NORTH_CREEK]);
    expect(crossings).toEqual([]);
    expect(runsAlong).toHaveLength(1);
    const ab = inverseM(a, b);
    expect(runsAlong[0]).toMatchObject({ kind: 'runs-along', fenceId: 'beside', drainageId: 'creek' });
    expect(runsAlong[0]!.fromChainageM).toBeCloseTo(ab, 1);
    expect(runsAlong[0]!.toChainageM).toBeCloseTo(ab + inverseM(b, c), 1);
    expect(runsAlong[0]!.lengthM).toBeCloseTo(400, 0);
    expect(findCrossings([fence], [NORTH_CREEK], { runsAlongBufferM: 5 }).runsAlong).toEqual([]);
    expect(findCrossings([fence], [NORTH_CREEK], { runsAlongMinLengthM: 500 }).runsAlong).toEqual([]);
  });

  it('finds runs-along beside a zigzag creek through the averaged flow direction', () => {
    const creek = { id: 'zigzag', coordinates: staircase(destination(ORIGIN, 225, 400), [0, 90], 10, 120) };
    const fence = { id: 'beside', coordinates: alongBearing(destination(ORIGIN, 315, 12), 45, [-250, 250]) };
    const { crossings, runsAlong } = findCrossings([fence], [creek]);
    expect(crossings).toEqual([]);
    expect(runsAlong).toHaveLength(1);
    expect(runsAlong[0]!.lengthM).toBeGreaterThan(490);
  });
});

describe('findCrossings: lengths against GeographicLib Inverse (Karney 2013)', () => {
  it('measures chainages on the ellipsoid within 0.1 %', () => {
    const fence = {
      id: 'long',
      coordinates: [destination(ORIGIN, 250, 3000), destination(ORIGIN, 260, 1500), destination(ORIGIN, 275, 400), destination(ORIGIN, 80, 900)],
    };
    const creek = { id: 'creek', coordinates: alongBearing(ORIGIN, 10, range(-2000, 1500, 250)) };
    const [c] = findCrossings([fence], [creek]).crossings;
    const k = c!.fenceSegmentIndex;
    const fenceExpected = lineLengthM(fence.coordinates.slice(0, k + 1)) + inverseM(fence.coordinates[k]!, c!.position);
    expect(Math.abs(c!.fenceChainageM - fenceExpected) / fenceExpected).toBeLessThan(0.001);
    const j = c!.drainageSegmentIndex;
    const creekExpected = lineLengthM(creek.coordinates.slice(0, j + 1)) + inverseM(creek.coordinates[j]!, c!.position);
    expect(Math.abs(c!.drainageChainageM - creekExpected) / creekExpected).toBeLessThan(0.001);
    // Far tighter in fact: the straight-in-degrees chords differ from geodesics by millimetres.
    expect(Math.abs(c!.fenceChainageM - fenceExpected)).toBeLessThan(0.01);
  });

  it('interpolates upstream area by length along the line, and gives null when unknown', () => {
    const at = (bearing: number, creek: DrainageLineInput) => findCrossings([{ id: 1, coordinates: alongBearing(destination(ORIGIN, 0, 250), bearing, [-100, 100]) }], [creek]).crossings[0]!;
    const length = lineLengthM(NORTH_CREEK.coordinates);
    const expected = 100_000 + (200_000 * (500 + 250)) / length;
    expect(Math.abs(at(90, NORTH_CREEK).upstreamAreaM2! - expected) / expected).toBeLessThan(0.001);
    const handDrawn = { id: 'hand', coordinates: NORTH_CREEK.coordinates };
    expect(at(90, handDrawn)).toMatchObject({ upstreamAreaM2: null, streamOrder: null });
  });
});

describe('findCrossings: reuse, purity and bad input', () => {
  it('gives the same answer from a reusable index as from the lines, call after call', () => {
    const creeks = [NORTH_CREEK, { id: 'bend', coordinates: arc(ORIGIN, 200, 200, 340, 7) }];
    const fences = [fenceAt(90, 1), fenceAt(45, 2), fenceAt(300, 3)];
    const index = buildDrainageIndex(creeks);
    const direct = findCrossings(fences, creeks);
    expect(findCrossings(fences, index)).toEqual(direct);
    expect(findCrossings(fences.slice(1), index)).toEqual(findCrossings(fences.slice(1), creeks));
    expect(findCrossings(fences, index)).toEqual(direct);
  });

  it('does not modify its inputs', () => {
    const fences = [fenceAt(60, 'a'), { id: 'b', coordinates: [[142.49, -31.5], [142.51, -31.5]] as [number, number][] }];
    const creeks = [NORTH_CREEK];
    const before = structuredClone({ fences, creeks });
    const options = { flowWindowM: 30 };
    deepFreeze(fences);
    deepFreeze(creeks);
    deepFreeze(options);
    findCrossings(fences, creeks, options);
    expect({ fences, creeks }).toEqual(before);
  });

  it('works on an empty list of fences or of drainage lines', () => {
    expect(findCrossings([], [NORTH_CREEK])).toEqual({ crossings: [], runsAlong: [] });
    expect(findCrossings([fenceAt(90)], [])).toEqual({ crossings: [], runsAlong: [] });
  });

  it('rejects bad input with a message naming the line, the vertex and what was expected', () => {
    const fence = (coordinates: unknown) => [{ id: 'F1', coordinates }] as unknown as FenceLineInput[];
    expect(() => findCrossings(fence([]), [NORTH_CREEK])).toThrow(/fence line "F1" \(index 0\): needs at least two positions, got 0/);
    expect(() => findCrossings(fence([[142.5, -31.5], [142.5, -31.5], [142.6, -31.5]]), [NORTH_CREEK])).toThrow(
      /vertices 0 and 1 are the same point/,
    );
    expect(() => findCrossings(fence([[-31.5, 142.5], [-31.4, 142.5]]), [NORTH_CREEK])).toThrow(/vertex 0: latitude 142.5 is outside/);
    expect(() => findCrossings(fence([[142.5, Number.NaN], [142.6, -31.5]]), [NORTH_CREEK])).toThrow(/finite numbers/);
    expect(() => findCrossings(fence('nope'), [NORTH_CREEK])).toThrow(/coordinates must be an array/);
    expect(() => findCrossings([fenceAt(90, 'x'), fenceAt(45, 'x')], [NORTH_CREEK])).toThrow(/id "x" is used by an earlier fence line/);
    expect(() => findCrossings([fenceAt(90)], [{ ...NORTH_CREEK, streamOrder: 0 }])).toThrow(/streamOrder must be a stream order ≥ 1/);
    expect(() => findCrossings([fenceAt(90)], [{ ...NORTH_CREEK, upstreamAreaEndM2: -1 }])).toThrow(/upstreamAreaEndM2 must be m² ≥ 0/);
    expect(() => findCrossings([fenceAt(90)], [NORTH_CREEK], { goodWithinDeg: 30, fairWithinDeg: 20 })).toThrow(/fairWithinDeg must be a number of degrees between 30 and 90, got 20/);
    expect(() => findCrossings([fenceAt(90)], [NORTH_CREEK], { flowWindowM: -1 })).toThrow(/flowWindowM/);
    expect(() => findCrossings([fenceAt(90)], { kind: 'other' } as never)).toThrow(/buildDrainageIndex/);
  });

  it('still finds crossings on a fence that crosses itself (checkFenceLine reports that)', () => {
    const figureEight = { id: 8, coordinates: [west(onCreek(-100), 100), east(onCreek(100), 100), east(onCreek(-100), 100), west(onCreek(100), 100)] };
    const { crossings } = findCrossings([figureEight], [NORTH_CREEK]);
    expect(crossings.map((c) => c.kind)).toEqual(['crossing', 'crossing']);
  });
});
