/**
 * nodeFenceLines on invented lines near 31.44° S; distances measured with GeographicLib
 * (geographiclib-geodesic) to place the ends, the rest plain geometry.
 */
import { describe, expect, it } from 'vitest';
import { NODE_EPS_M, nodeFenceLines } from '../../../src/lib/geo/node-fence-lines';
import { deepFreeze, destination } from '../crossings/geometry/helpers';

const O: [number, number] = [141.64, -31.44];
const east = destination(O, 90, 100);
const north = destination(O, 0, 100);

describe('nodeFenceLines', () => {
  it('splits two crossing lines where they cross: five nodes, four edges', () => {
    const { nodes, edges } = nodeFenceLines([[O, destination(east, 0, 100)], [east, north]], 5);
    expect(nodes).toHaveLength(5);
    expect(edges).toHaveLength(4);
    // The crossing is the middle of both diagonals of the 100 m square: 70.7 m from each corner.
    const [cx, cy] = nodes[edges.flat().find((n) => edges.flat().filter((m) => m === n).length === 4)!]!;
    const [ox, oy] = nodes[0]!;
    expect(Math.hypot(cx - ox, cy - oy)).toBeCloseTo(Math.SQRT2 * 50, 0);
  });

  it('joins two ends 3 m apart into one node, leaves two 8 m apart', () => {
    const gap = (m: number) => nodeFenceLines([[O, east], [destination(east, 0, m), destination(east, 0, 100)]], 5);
    expect(gap(3).nodes).toHaveLength(3);
    expect(gap(8).nodes).toHaveLength(4);
  });

  it('moves an end 3 m short of a line onto it, splitting that line', () => {
    const { nodes, edges } = nodeFenceLines([[O, east], [destination(destination(O, 90, 50), 0, 3), destination(destination(O, 90, 50), 0, 80)]], 5);
    expect(nodes).toHaveLength(4);
    expect(edges).toHaveLength(3);
  });

  it('makes overlapping stretches one edge', () => {
    const { edges } = nodeFenceLines([[O, east], [destination(O, 90, 20), destination(O, 90, 60)]], 5);
    // O–20 m, 20–60 m (both lines), 60–100 m.
    expect(edges).toHaveLength(3);
  });

  it('keeps nodes at least 5 mm apart', () => {
    const { nodes } = nodeFenceLines([[O, east, destination(east, 0, 0.003), north]], 0);
    expect(NODE_EPS_M).toBe(0.005);
    for (let i = 0; i < nodes.length; i++) {
      for (let j = i + 1; j < nodes.length; j++) expect(Math.hypot(nodes[i]![0] - nodes[j]![0], nodes[i]![1] - nodes[j]![1])).toBeGreaterThan(NODE_EPS_M);
    }
  });

  it('does not modify its input, and says which vertex is not a position', () => {
    expect(() => nodeFenceLines(deepFreeze([[[...O], [...east]]]), 5)).not.toThrow();
    expect(() => nodeFenceLines([[O, [200, 0]]], 5)).toThrow(/fence line 0, vertex 1: longitude 200 is outside/);
    expect(() => nodeFenceLines([[O, east]], Number.NaN)).toThrow(/snapM must be a distance in metres/);
  });
});
