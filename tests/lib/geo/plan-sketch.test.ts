import type { FeatureCollection } from 'geojson';
import { describe, expect, it } from 'vitest';
import { sketchPlan } from '../../../src/lib/geo/plan-sketch';
import { planToGeoJson } from '../../../src/lib/geo/plan-geojson';
import { samplePlan } from '../../helpers/plan-fixture';

const line = (coordinates: number[][]): FeatureCollection => ({
  type: 'FeatureCollection',
  features: [{ type: 'Feature', geometry: { type: 'LineString', coordinates }, properties: { featureType: 'fence-line', status: 'planned', name: 'East–west' } }],
});

describe('sketchPlan', () => {
  it('draws an east–west line across the middle of the box, with a round scale bar (by hand)', () => {
    // 0.01° of longitude on the equator: 0.01 × 6 371 008.8 × π / 180 = 1 111.95 m, fitted into the
    // 200 px between the paddings: 0.179865 px/m; the line is 1 m tall at least, so it sits at y ≈ 60.
    const sketch = sketchPlan(line([[0, 0], [0.01, 0]]), 220, 120, 10);
    expect(sketch.lines).toEqual([{ points: '10,59.9 210,59.9', status: 'planned', name: 'East–west' }]);
    // A quarter of the width is 55 px = 305.8 m; the largest 1, 2, 5 × 10ⁿ below it is 200 m = 36.0 px.
    expect(sketch.scaleBar).toEqual({ lengthM: 200, lengthPx: 36 });
  });

  it('keeps one scale for both axes, north up, inside the padding', () => {
    const sketch = sketchPlan(planToGeoJson(samplePlan()), 400, 300, 20);
    const xs = [...sketch.crossings, ...sketch.layoutPoints].map((p) => p.x);
    const ys = [...sketch.crossings, ...sketch.layoutPoints].map((p) => p.y);
    expect(Math.min(...xs)).toBeGreaterThanOrEqual(20);
    expect(Math.max(...xs)).toBeLessThanOrEqual(380);
    expect(Math.min(...ys)).toBeGreaterThanOrEqual(20);
    expect(Math.max(...ys)).toBeLessThanOrEqual(280);
    expect(sketch.crossings.map((c) => c.tag)).toEqual(['F1 X1', 'F1 X2']);
    expect(sketch.layoutPoints).toHaveLength(8);
  });

  it('gives an empty sketch for nothing, refuses a box smaller than its padding, and does not change its input', () => {
    expect(sketchPlan({ type: 'FeatureCollection', features: [] }, 100, 100).lines).toEqual([]);
    expect(() => sketchPlan(line([[0, 0], [1, 1]]), 30, 100, 16)).toThrow(RangeError);
    const input = line([[141.6, -31.4], [141.7, -31.5]]);
    const copy = structuredClone(input);
    sketchPlan(input, 300, 200);
    expect(input).toEqual(copy);
  });
});
