/** planarFaces on small hand-drawn graphs whose faces can be counted and measured by eye (analytic). */
import { describe, expect, it } from 'vitest';
import { planarFaces } from '../../../src/lib/geo/planar-faces';
import { deepFreeze } from '../crossings/geometry/helpers';

// A 2 × 2 square with corners 0..3 and its centre 4.
const SQUARE: [number, number][] = [[0, 0], [2, 0], [2, 2], [0, 2], [1, 1]];
const RING: [number, number][] = [[0, 1], [1, 2], [2, 3], [3, 0]];

describe('planarFaces', () => {
  it('finds the one face of a square, counterclockwise and closed, area 4', () => {
    const faces = planarFaces(SQUARE, RING);
    expect(faces).toHaveLength(1);
    expect(faces[0]!.area).toBe(4);
    expect(faces[0]!.outer).toEqual([0, 1, 2, 3, 0]);
    expect(faces[0]!.holes).toEqual([]);
  });

  it('splits a square along a diagonal into two triangles of area 2', () => {
    const faces = planarFaces(SQUARE, [...RING, [0, 2]]);
    expect(faces.map((f) => f.area)).toEqual([2, 2]);
  });

  it('ignores a stub into the square and a line leading away from it', () => {
    const nodes: [number, number][] = [...SQUARE, [5, 5]];
    const faces = planarFaces(nodes, [...RING, [0, 4], [2, 5]]);
    expect(faces.map((f) => f.area)).toEqual([4]);
    expect(faces[0]!.outer).not.toContain(4);
  });

  it('drops a bridge joining two squares, keeping both squares', () => {
    const nodes: [number, number][] = [...SQUARE.slice(0, 4), [4, 0], [6, 0], [6, 2], [4, 2]];
    const faces = planarFaces(nodes, [...RING, [4, 5], [5, 6], [6, 7], [7, 4], [1, 4]]);
    expect(faces.map((f) => f.area)).toEqual([4, 4]);
  });

  it('makes a free-standing square inside another a hole of it, and a face of its own', () => {
    const nodes: [number, number][] = [[0, 0], [10, 0], [10, 10], [0, 10], [4, 4], [6, 4], [6, 6], [4, 6]];
    const faces = planarFaces(nodes, [...RING, [4, 5], [5, 6], [6, 7], [7, 4]]);
    expect(faces.map((f) => f.area)).toEqual([96, 4]);
    expect(faces[0]!.holes).toHaveLength(1);
    expect(faces[1]!.holes).toEqual([]);
  });

  it('finds nothing in a path or a tree, and ignores repeated edges and self-loops', () => {
    expect(planarFaces(SQUARE, [[0, 1], [1, 2], [1, 4]])).toEqual([]);
    expect(planarFaces(SQUARE, [...RING, [1, 0], [3, 3]]).map((f) => f.area)).toEqual([4]);
  });

  it('does not modify its input, and refuses an edge to a node that does not exist', () => {
    expect(() => planarFaces(deepFreeze(SQUARE.map((p) => [...p] as [number, number])), deepFreeze(RING.map((e) => [...e] as [number, number])))).not.toThrow();
    expect(() => planarFaces(SQUARE, [[0, 9]])).toThrow(/edge \[0, 9\] names a node outside 0…4/);
  });
});
