import { VectorTile } from '@mapbox/vector-tile';
import fc from 'fast-check';
import Pbf from 'pbf';
import { describe, expect, it } from 'vitest';
import { createDrainageTiles, DRAINAGE_TILE_LAYER, minStreamOrderAt, type DrainageTileLine } from '../../../src/lib/geo/drainage-tiles';

type LonLat = [number, number];

/** Decodes a tile (Mapbox Vector Tile, read with @mapbox/vector-tile and pbf) into its drainage features. */
function decode(bytes: Uint8Array | null, z: number, x: number, y: number) {
  if (!bytes) return [];
  const layer = new VectorTile(new Pbf(bytes)).layers[DRAINAGE_TILE_LAYER];
  if (!layer) return [];
  return Array.from({ length: layer.length }, (_, i) => {
    const feature = layer.feature(i);
    const geometry = feature.toGeoJSON(x, y, z).geometry as { type: string; coordinates: LonLat[] | LonLat[][] };
    return { id: feature.id, properties: feature.properties, type: geometry.type, coordinates: geometry.coordinates };
  });
}

/**
 * Slippy-map tile numbers of a point, as fractions: OpenStreetMap wiki, "Slippy map tilenames"
 * (lon/lat to tile numbers): x = (lon + 180) / 360 · 2^z, y = (1 − asinh(tan(lat)) / π) / 2 · 2^z.
 */
function tileNumbers([lon, lat]: LonLat, z: number): [number, number] {
  const n = 2 ** z;
  const latRad = (lat * Math.PI) / 180;
  return [((lon + 180) / 360) * n, ((1 - Math.asinh(Math.tan(latRad)) / Math.PI) / 2) * n];
}

/** Whether the straight segment a–b (tile numbers) meets the box [x0, x1] × [y0, y1] (Liang–Barsky clipping). */
function segmentMeetsBox(a: [number, number], b: [number, number], [x0, y0, x1, y1]: [number, number, number, number]): boolean {
  let [t0, t1] = [0, 1];
  const [dx, dy] = [b[0] - a[0], b[1] - a[1]];
  for (const [p, q] of [
    [-dx, a[0] - x0],
    [dx, x1 - a[0]],
    [-dy, a[1] - y0],
    [dy, y1 - a[1]],
  ] as const) {
    if (p === 0) {
      if (q < 0) return false;
    } else if (p < 0) t0 = Math.max(t0, q / p);
    else t1 = Math.min(t1, q / p);
  }
  return t0 <= t1;
}

describe('createDrainageTiles', () => {
  // One line along 31.4° S from 141.58° E to 141.62° E, worked by hand with the slippy-map
  // formula (OSM wiki "Slippy map tilenames"), zoom 12, n = 4096:
  //   x(141.58) = 321.58 / 360 · 4096 = 3658.87 → tile 3658;  x(141.62) = 321.62 / 360 · 4096 = 3659.32 → tile 3659
  //   y(−31.4): tan(−0.548033 rad) = −0.610403, asinh = −0.577727, (1 + 0.577727 / π) / 2 · 4096 = 2424.62 → tile 2424
  const creek: DrainageTileLine = { id: 7, streamOrder: 3, coordinates: [[141.58, -31.4], [141.62, -31.4]] };

  it('puts a known line in the tiles it crosses, and in no other, with its id and stream order', () => {
    const tiles = createDrainageTiles([creek]);
    for (const x of [3658, 3659]) {
      const [feature, ...others] = decode(tiles.tile(12, x, 2424), 12, x, 2424);
      expect(others).toEqual([]);
      expect(feature).toMatchObject({ id: 7, properties: { streamOrder: 3 }, type: 'LineString' });
    }
    expect(tiles.tile(12, 3657, 2424)).toBeNull();
    expect(tiles.tile(12, 3660, 2424)).toBeNull();
    expect(tiles.tile(12, 3659, 2423)).toBeNull();
    expect(tiles.tile(12, 3659, 2425)).toBeNull();
  });

  it('keeps the line where it is: its end decodes back to 141.62° E, 31.4° S within a tile unit', () => {
    const [feature] = decode(createDrainageTiles([creek]).tile(12, 3659, 2424), 12, 3659, 2424);
    const points = feature!.coordinates as LonLat[];
    // A tile unit at zoom 12 is 360 / 4096 / 4096 degrees of longitude (about 2 m here).
    const unitDeg = 360 / 4096 / 4096;
    const end = points.find(([lon]) => Math.abs(lon - 141.62) < unitDeg);
    expect(end).toBeDefined();
    expect(Math.abs(end![1] - -31.4)).toBeLessThan(unitDeg);
    // Clipped at the tile's buffer to the west: 64 of 4096 units past the tile's west edge, 3659 / 4096 · 360 − 180.
    const westEdge = (3659 / 4096) * 360 - 180;
    expect(Math.min(...points.map(([lon]) => lon))).toBeCloseTo(westEdge - (64 / 4096) * (360 / 4096), 5);
  });

  it('leaves out the stream orders a zoom hides: order 2 from zoom 12, order 1 from 13', () => {
    const gully = (id: number, streamOrder: number): DrainageTileLine => ({ ...creek, id, streamOrder });
    const tiles = createDrainageTiles([gully(1, 1), gully(2, 2), gully(3, 3)]);
    const idsAt = (z: number) => {
      const [x, y] = tileNumbers([141.6, -31.4], z).map(Math.floor) as [number, number];
      return decode(tiles.tile(z, x, y), z, x, y).map((f) => f.id).sort();
    };
    expect(idsAt(10)).toEqual([3]);
    expect(idsAt(11)).toEqual([3]);
    expect(idsAt(12)).toEqual([2, 3]);
    expect(idsAt(13)).toEqual([1, 2, 3]);
    expect(idsAt(14)).toEqual([1, 2, 3]);
    expect([0, 11.9, 12, 12.5, 13, 20].map(minStreamOrderAt)).toEqual([3, 3, 2, 2, 1, 1]);
  });

  it('holds exactly the segments that cross a tile (up to its 64-unit buffer)', () => {
    const z = 13;
    const [tx, ty] = tileNumbers([141.6, -31.4], z).map(Math.floor) as [number, number];
    const point = fc.tuple(fc.double({ min: 141.55, max: 141.65, noNaN: true }), fc.double({ min: -31.45, max: -31.35, noNaN: true }));
    // Straight segments of at least ~50 m (never dropped as specks), order 3 and up (shown at every zoom).
    const segment = fc
      .tuple(point, fc.double({ min: 0, max: 2 * Math.PI, noNaN: true }), fc.double({ min: 0.0005, max: 0.03, noNaN: true }), fc.integer({ min: 3, max: 5 }))
      .map(([[lon, lat], heading, lengthDeg, streamOrder]) => ({
        streamOrder,
        coordinates: [[lon, lat], [lon + lengthDeg * Math.cos(heading), lat + lengthDeg * Math.sin(heading)]] as LonLat[],
      }));
    fc.assert(
      fc.property(fc.array(segment, { minLength: 1, maxLength: 40 }), (segments) => {
        const lines = segments.map((s, i) => ({ id: i + 1, ...s }));
        const ids = new Set(decode(createDrainageTiles(lines).tile(z, tx, ty), z, tx, ty).map((f) => f.id));
        const unit = 1 / 4096;
        const crosses = (line: (typeof lines)[number], margin: number) =>
          segmentMeetsBox(tileNumbers(line.coordinates[0]!, z), tileNumbers(line.coordinates[1]!, z), [tx - margin, ty - margin, tx + 1 + margin, ty + 1 + margin]);
        for (const line of lines) {
          // Well inside the tile: must be there; beyond the buffer: must not.
          if (crosses(line, -8 * unit)) expect(ids.has(line.id), `line ${line.id} crosses the tile`).toBe(true);
          if (!crosses(line, 65 * unit)) expect(ids.has(line.id), `line ${line.id} is off the tile`).toBe(false);
        }
        for (const feature of decode(createDrainageTiles(lines).tile(z, tx, ty), z, tx, ty)) {
          expect(feature.properties.streamOrder).toBe(lines[Number(feature.id) - 1]!.streamOrder);
        }
      }),
      { numRuns: 60 },
    );
  });

  it('does not change the lines it is given', () => {
    const lines: DrainageTileLine[] = [structuredClone(creek), { id: 8, streamOrder: 1, coordinates: [[141.6, -31.41], [141.61, -31.39]] }];
    const before = structuredClone(lines);
    const tiles = createDrainageTiles(lines);
    tiles.tile(12, 3659, 2424);
    tiles.tile(13, 7318, 4849);
    expect(lines).toEqual(before);
  });

  it('refuses tile numbers off the map and lines it cannot draw', () => {
    const tiles = createDrainageTiles([creek]);
    expect(() => tiles.tile(-1, 0, 0)).toThrow(RangeError);
    expect(() => tiles.tile(25, 0, 0)).toThrow(/0 to 24/);
    expect(() => tiles.tile(2, 4, 0)).toThrow(/0 to 3/);
    expect(() => tiles.tile(2, 1.5, 0)).toThrow(RangeError);
    expect(createDrainageTiles([]).tile(12, 3659, 2424)).toBeNull();
    expect(() => createDrainageTiles([{ id: 1, streamOrder: 1, coordinates: [[141.6, -31.4]] }])).toThrow(/two points/);
    expect(() => createDrainageTiles([{ id: 1, streamOrder: 1, coordinates: [[141.6, -31.4], [NaN, 0]] }])).toThrow(TypeError);
  });
});
