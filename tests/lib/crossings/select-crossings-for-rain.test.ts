import { describe, expect, it } from 'vitest';
import { selectCrossingsForRain, type RainCandidate } from '../../../src/lib/crossings/select-crossings-for-rain';

// Two paddocks side by side, 0.01° square each: West (lon 141.00–141.01) and East (141.01–141.02).
const square = (west: number): [number, number][][] => [[[west, -31], [west + 0.01, -31], [west + 0.01, -30.99], [west, -30.99], [west, -31]]];
const WEST = { id: 1, rings: square(141.0) };
const EAST = { id: 2, rings: square(141.01) };

const candidates: RainCandidate[] = [
  // Point in East, but its catchment reaches back into West: rain in West reaches it.
  { id: 10, position: [141.015, -30.995], catchmentHa: 40, catchmentOutline: [square(141.005)] },
  // Point and catchment wholly in East.
  { id: 11, position: [141.018, -30.995], catchmentHa: 90, catchmentOutline: [square(141.0125).map((ring) => ring.map(([lon, lat]) => [lon + 0.002, lat] as [number, number]))] },
  // No outline: decided by its point, which lies in West.
  { id: 12, position: [141.005, -30.995], catchmentHa: null, catchmentOutline: null },
  // No outline, point outside both paddocks.
  { id: 13, position: [141.05, -30.995], catchmentHa: 500, catchmentOutline: null },
  // Same catchment size as 10: the lower id comes first.
  { id: 9, position: [141.004, -30.996], catchmentHa: 40, catchmentOutline: null },
];

describe('selectCrossingsForRain', () => {
  it('whole property: every crossing, largest catchment first, unknown areas last', () => {
    const picked = selectCrossingsForRain(candidates, { kind: 'property' });
    expect(picked.map((pick) => pick.id)).toEqual([13, 11, 9, 10, 12]);
    expect(new Set(picked.map((pick) => pick.selectedBy))).toEqual(new Set(['property']));
  });

  it('rain on West: the crossing whose catchment reaches into West, and those without an outline whose point lies in West', () => {
    const picked = selectCrossingsForRain(candidates, { kind: 'paddocks', paddocks: [WEST] });
    expect(picked).toEqual([
      { id: 9, catchmentHa: 40, selectedBy: 'point' },
      { id: 10, catchmentHa: 40, selectedBy: 'catchment' },
      { id: 12, catchmentHa: null, selectedBy: 'point' },
    ]);
  });

  it('rain on East: crossings whose catchment meets East, not the one lying outside with no outline', () => {
    const picked = selectCrossingsForRain(candidates, { kind: 'paddocks', paddocks: [EAST] });
    expect(picked.map((pick) => [pick.id, pick.selectedBy])).toEqual([
      [11, 'catchment'],
      [10, 'catchment'],
    ]);
  });

  it('refuses a paddock scope with no paddock', () => {
    expect(() => selectCrossingsForRain(candidates, { kind: 'paddocks', paddocks: [] })).toThrow(/at least one paddock/);
  });

  it('does not change its input', () => {
    const copy = structuredClone(candidates);
    selectCrossingsForRain(candidates, { kind: 'paddocks', paddocks: [WEST, EAST] });
    expect(candidates).toEqual(copy);
  });
});
