/**
 * Fixture: an invented corner of the demo property ("Saltbush Rise") as GeoJSON in
 * `fixtures/find-crossings/in/`, its crossings in `out/` (vitest file snapshot; regenerate only
 * on purpose with `vitest -u` and review the diff on a map). Numbers are rounded to a millimetre
 * and 1e-9° so that the snapshot does not hang on the last bits of floating point.
 */
import { readFileSync } from 'node:fs';
import { dirname, join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { describe, expect, it } from 'vitest';
import { findCrossings, type DrainageLineInput, type FenceLineInput, type Position } from '../../../../src/lib/crossings/geometry/index';

const FIXTURES = join(dirname(fileURLToPath(import.meta.url)), 'fixtures', 'find-crossings');

interface LineFeature {
  properties: { role: 'fence' | 'drainage'; id: string; streamOrder?: number; upstreamAreaStartM2?: number; upstreamAreaEndM2?: number };
  geometry: { type: 'LineString'; coordinates: Position[] };
}

/** Rounds every number: metres, m² and degree fields to 0.001, positions to 1e-9°. */
function rounded(value: unknown, digits = 9): unknown {
  if (typeof value === 'number') return Number(value.toFixed(digits));
  if (Array.isArray(value)) return value.map((v) => rounded(v, digits));
  if (value !== null && typeof value === 'object') {
    return Object.fromEntries(Object.entries(value).map(([k, v]) => [k, rounded(v, /(M|M2|Deg)$/.test(k) ? 3 : digits)]));
  }
  return value;
}

describe('findCrossings fixtures', () => {
  it('saltbush-corner: a creek with a bend and a tributary, a hand-drawn soak, five fences', async () => {
    const { features } = JSON.parse(readFileSync(join(FIXTURES, 'in', 'saltbush-corner.geojson'), 'utf8')) as { features: LineFeature[] };
    const fences: FenceLineInput[] = features.filter((f) => f.properties.role === 'fence').map((f) => ({ id: f.properties.id, coordinates: f.geometry.coordinates }));
    const drainage: DrainageLineInput[] = features
      .filter((f) => f.properties.role === 'drainage')
      .map(({ properties: { id, streamOrder, upstreamAreaStartM2, upstreamAreaEndM2 }, geometry }) => ({
        id,
        coordinates: geometry.coordinates,
        streamOrder: streamOrder ?? null,
        upstreamAreaStartM2: upstreamAreaStartM2 ?? null,
        upstreamAreaEndM2: upstreamAreaEndM2 ?? null,
      }));
    const result = findCrossings(fences, drainage);
    await expect(JSON.stringify(rounded(result), null, 1) + '\n').toMatchFileSnapshot(join(FIXTURES, 'out', 'saltbush-corner.json'));
  });
});
