import { createPropertyExpression, latest, validateStyleMin, type StylePropertySpecification } from '@maplibre/maplibre-gl-style-spec';
import { describe, expect, it } from 'vitest';
import { fenceLineLayer, fenceStatusPaint } from '../../../src/components/map/fence-layers';
import { FENCE_LINES_SOURCE_ID, FENCE_STATUS_STYLES } from '../../../src/components/map/plan-style';
import type { FenceStatus } from '../../../src/lib/schemas/plan';

const STATUSES = Object.keys(FENCE_STATUS_STYLES) as FenceStatus[];

/**
 * A property of the one fence layer evaluated the way MapLibre does (its own style-spec
 * expression engine), for a feature of one status at one zoom.
 */
function evaluate(group: 'paint' | 'layout', property: string, status: FenceStatus, zoom: number): unknown {
  const value = (fenceLineLayer[group] as Record<string, unknown>)[property];
  const spec = (latest as unknown as Record<string, Record<string, StylePropertySpecification>>)[`${group}_line`]![property]!;
  const parsed = createPropertyExpression(value, spec);
  if (parsed.result !== 'success') throw new Error(`${property}: ${parsed.value.map((e) => e.message).join('; ')}`);
  const feature = { type: 'LineString' as const, properties: { status }, geometry: [] };
  return parsed.value.evaluate({ zoom }, feature as never);
}

describe('the fence line layer: every status in one layer', () => {
  it('is a valid layer by the MapLibre style specification', () => {
    const style = {
      version: 8 as const,
      sources: { [FENCE_LINES_SOURCE_ID]: { type: 'geojson' as const, data: { type: 'FeatureCollection' as const, features: [] } } },
      layers: [fenceLineLayer],
    };
    expect(validateStyleMin(style)).toEqual([]);
  });

  it.each(STATUSES)('draws a %s fence as that status is described (colour, width, dashes)', (status) => {
    const described = fenceStatusPaint(status);
    const colour = evaluate('paint', 'line-color', status, 12) as { toString(): string };
    expect(colour.toString()).toBe(latestColour(described['line-color']));
    // The width stops of the description, at both ends of the zoom ramp.
    const widths = (described['line-width'] as unknown[]).filter((_, i) => i >= 3 && i % 2 === 0) as number[];
    expect(evaluate('paint', 'line-width', status, 10)).toBeCloseTo(widths[0]!, 6);
    expect(evaluate('paint', 'line-width', status, 16)).toBeCloseTo(widths[1]!, 6);
    const dashes = evaluate('paint', 'line-dasharray', status, 12);
    if ('line-dasharray' in described) expect(dashes).toEqual(described['line-dasharray']);
    // An unbroken line: a dash with no gap.
    else expect(dashes).toEqual([1, 0]);
  });

  it('ends dashed lines square and a built fence round; mitres corners at station scale, rounds them close up', () => {
    for (const status of STATUSES) {
      expect(evaluate('layout', 'line-cap', status, 12)).toBe(FENCE_STATUS_STYLES[status].dash.length ? 'butt' : 'round');
      expect(evaluate('layout', 'line-join', status, 10)).toBe('miter');
      expect(evaluate('layout', 'line-join', status, 15)).toBe('round');
    }
  });

  it('tells every status apart by its dash pattern alone (status reads without colour)', () => {
    const patterns = STATUSES.map((status) => JSON.stringify(evaluate('paint', 'line-dasharray', status, 12)));
    expect(new Set(patterns).size).toBe(STATUSES.length);
  });
});

/** A CSS hex colour as the style-spec Color prints it. */
function latestColour(hex: unknown): string {
  const value = String(hex);
  const [r, g, b] = [1, 3, 5].map((i) => parseInt(value.slice(i, i + 2), 16));
  return `rgba(${r},${g},${b},1)`;
}
