import { describe, expect, it } from 'vitest';
import { snapToPlan, type Project } from '../../../src/lib/geo/snap-to-plan';

// A plain linear "projection" of 100 000 px per degree keeps the expected answers analytic.
const project: Project = (lon, lat) => ({ x: lon * 100_000, y: -lat * 100_000 });
const at = (lon: number, lat: number) => project(lon, lat);

describe('snapToPlan', () => {
  const fenceEnds: [number, number][] = [[141.6400, -31.4400]];
  const tracks: [number, number][][] = [[[141.6000, -31.4000], [141.6100, -31.4000]]];

  it('snaps to a fence end within the tolerance, exactly', () => {
    expect(snapToPlan({ x: at(141.64, -31.44).x + 5, y: at(141.64, -31.44).y - 3 }, { fenceEnds, tracks }, project, 10)).toEqual([141.64, -31.44]);
  });

  it('prefers a fence end over a nearer track vertex', () => {
    const near: [number, number][][] = [[[141.64003, -31.44], [141.65, -31.44]]];
    // Pointer 2 px from the track vertex and 4 px from the fence end: the end still wins.
    const pointer = { x: at(141.64, -31.44).x + 4, y: at(141.64, -31.44).y };
    expect(snapToPlan({ x: pointer.x + 1, y: pointer.y }, { fenceEnds, tracks: near }, project, 10)).toEqual([141.64, -31.44]);
  });

  it('snaps to a track vertex before a point along the track', () => {
    const pointer = { x: at(141.6, -31.4).x + 6, y: at(141.6, -31.4).y + 2 };
    expect(snapToPlan(pointer, { fenceEnds: [], tracks }, project, 10)).toEqual([141.6, -31.4]);
  });

  it('snaps to the foot of the perpendicular on a track segment', () => {
    // Halfway along the track, 4 px off it: the foot is the midpoint (analytic).
    const pointer = { x: at(141.605, -31.4).x, y: at(141.605, -31.4).y + 4 };
    const snapped = snapToPlan(pointer, { fenceEnds: [], tracks }, project, 10)!;
    expect(snapped[0]).toBeCloseTo(141.605, 9);
    expect(snapped[1]).toBeCloseTo(-31.4, 9);
  });

  it('leaves the pointer free when nothing is within the tolerance', () => {
    const pointer = { x: at(141.605, -31.4).x, y: at(141.605, -31.4).y + 25 };
    expect(snapToPlan(pointer, { fenceEnds, tracks }, project, 10)).toBeUndefined();
  });
});
