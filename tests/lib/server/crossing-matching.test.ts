import { describe, expect, it } from 'vitest';
import { matchingCrossing } from '../../../src/lib/server/crossings/compute-crossing-rows';

const old = [
  { id: 1, fence_line_id: 10, drainage_line_id: 100, chainage_m: 500 },
  { id: 2, fence_line_id: 10, drainage_line_id: null, chainage_m: 1200 },
  { id: 3, fence_line_id: 11, drainage_line_id: null, chainage_m: 500 },
];

describe('a crossing found again', () => {
  it('is the one on the same fence and drainage line within 30 m along the fence', () => {
    expect(matchingCrossing(old, 10, 100, 520)?.id).toBe(1);
    expect(matchingCrossing(old, 10, 100, 531)).toBeUndefined();
    expect(matchingCrossing(old, 10, 101, 500)).toBeUndefined();
  });

  it('after a new terrain run (old link cleared) is the one at the same place on the same fence', () => {
    expect(matchingCrossing(old, 10, 555, 1190)?.id).toBe(2);
    expect(matchingCrossing(old, 11, 555, 480)?.id).toBe(3);
    expect(matchingCrossing(old, 10, 555, 1240)).toBeUndefined();
    expect(matchingCrossing(old, 12, 555, 500)).toBeUndefined();
  });
});
