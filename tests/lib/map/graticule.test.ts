import { describe, expect, it } from 'vitest';
import { AUSTRALIA_BBOX_WGS84, createGraticule, graticuleBboxFor } from '../../../src/components/map/graticule';
import { createExtentFeatures, toUsableExtent } from '../../../src/components/map/extent';

describe('createGraticule', () => {
  it('draws a line every 0.01° over a small box, by hand: 142.00…142.03 E, 31.02…31.00 S', () => {
    const { features } = createGraticule([142, -31.02, 142.03, -31]);
    const meridians = features.filter((f) => f.properties.axis === 'meridian');
    const parallels = features.filter((f) => f.properties.axis === 'parallel');
    expect(meridians.map((f) => f.properties.label)).toEqual(['142° E', '142.01° E', '142.02° E', '142.03° E']);
    expect(parallels.map((f) => f.properties.label)).toEqual(['31.02° S', '31.01° S', '31° S']);
    expect(meridians.map((f) => f.properties.rank)).toEqual(['degree', 'hundredth', 'hundredth', 'hundredth']);
    expect(meridians[1]?.geometry.coordinates).toEqual([[142.01, -31.02], [142.01, -31]]);
    expect(parallels[1]?.geometry.coordinates).toEqual([[142, -31.01], [142.03, -31.01]]);
  });

  it('ranks lines every 5°, 1° and 0.1°, with labels at matching precision', () => {
    const { features } = createGraticule([139.9, -0.05, 140.1, 0.05]);
    const byLabel = new Map(features.map((f) => [f.properties.label, f.properties.rank]));
    expect(byLabel.get('140° E')).toBe('five');
    expect(byLabel.get('139.9° E')).toBe('tenth');
    expect(byLabel.get('140.01° E')).toBe('hundredth');
    expect(byLabel.get('0°')).toBe('five');
    expect(byLabel.get('0.01° N')).toBe('hundredth');
    expect(byLabel.get('0.01° S')).toBe('hundredth');
  });

  it('has no floating-point drift: every position is a whole number of hundredths', () => {
    for (const f of createGraticule([141.5, -32.5, 142.5, -31.5]).features) {
      const value = f.properties.axis === 'meridian' ? f.geometry.coordinates[0]?.[0] : f.geometry.coordinates[0]?.[1];
      expect(value).toBe(Math.round((value ?? NaN) * 100) / 100);
    }
  });

  it('covers Australia by default with a manageable number of lines', () => {
    const { features } = createGraticule();
    const [west, south, east, north] = AUSTRALIA_BBOX_WGS84;
    expect(features).toHaveLength((east - west) * 100 + 1 + (north - south) * 100 + 1);
  });

  it('rejects boxes that are inverted, not finite, or outside Web Mercator', () => {
    expect(() => createGraticule([143, -31, 142, -30])).toThrow(RangeError);
    expect(() => createGraticule([142, -30, 143, -31])).toThrow(RangeError);
    expect(() => createGraticule([Number.NaN, -31, 142, -30])).toThrow(RangeError);
    expect(() => createGraticule([0, -89, 1, -80])).toThrow(RangeError);
  });
});

describe('graticuleBboxFor', () => {
  it('keeps the Australian graticule for an Australian property, and a padded box elsewhere', () => {
    expect(graticuleBboxFor(null)).toBe(AUSTRALIA_BBOX_WGS84);
    expect(graticuleBboxFor([142.1, -31.2, 142.2, -31.1])).toBe(AUSTRALIA_BBOX_WGS84);
    expect(graticuleBboxFor([172.5, -43.6, 172.7, -43.4])).toEqual([171.5, -44.6, 173.7, -42.4]);
  });
});

describe('extent helpers', () => {
  it('accepts a proper [west, south, east, north] and rejects the rest', () => {
    expect(toUsableExtent([142.1, -31.2, 142.2, -31.1])).toEqual([142.1, -31.2, 142.2, -31.1]);
    expect(toUsableExtent(null)).toBeNull();
    expect(toUsableExtent([142.2, -31.2, 142.1, -31.1])).toBeNull();
    expect(toUsableExtent([142.1, -31.1, 142.2, -31.2])).toBeNull();
    expect(toUsableExtent([Number.NaN, -31.2, 142.2, -31.1])).toBeNull();
    expect(toUsableExtent([142.1, -89, 142.2, -31.1])).toBeNull();
  });

  it('builds a closed counter-clockwise box and a centre point, both named, without touching the input', () => {
    const extent = [142.1, -31.2, 142.2, -31.1] as const;
    const copy = [...extent];
    const { features } = createExtentFeatures(extent, 'Saltbush Rise');
    expect(features.map((f) => f.geometry.type)).toEqual(['Polygon', 'Point']);
    expect(features.every((f) => f.properties.name === 'Saltbush Rise')).toBe(true);
    const polygon = features[0]?.geometry;
    const ring = polygon?.type === 'Polygon' ? polygon.coordinates[0] ?? [] : [];
    expect(ring[0]).toEqual(ring[ring.length - 1]);
    // Shoelace sum is positive for a counter-clockwise ring (RFC 7946 §3.1.6).
    let twiceArea = 0;
    for (let i = 0; i + 1 < ring.length; i++) {
      const [x1 = 0, y1 = 0] = ring[i] ?? [];
      const [x2 = 0, y2 = 0] = ring[i + 1] ?? [];
      twiceArea += x1 * y2 - x2 * y1;
    }
    expect(twiceArea).toBeGreaterThan(0);
    const [centreLon = NaN, centreLat = NaN] = features[1]?.geometry.type === 'Point' ? features[1].geometry.coordinates : [];
    expect(centreLon).toBeCloseTo(142.15, 12);
    expect(centreLat).toBeCloseTo(-31.15, 12);
    expect([...extent]).toEqual(copy);
  });
});
