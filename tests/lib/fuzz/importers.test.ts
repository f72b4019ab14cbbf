// Every importer's pure parser against damaged and hostile files: it answers or throws our own
// error type with a message, never anything else, and never takes long. Files are made by the
// seeded generator in tests/helpers/fuzz-corpus.ts; a failure names its seed and case, and
// FUZZ_SEED=<seed> (with FC_SEED=<seed> for the property tests) replays it.
import { mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import fc from 'fast-check';
import { afterAll, describe, expect, it } from 'vitest';
import { validateIfdTable } from '../../../src/lib/crossings/hydraulics/ifd';
import { ImportError, importLines } from '../../../src/lib/geo/import-lines';
import { importPlan } from '../../../src/lib/geo/import-plan';
import { designSettingsSchema, ifdTableSchema } from '../../../src/lib/schemas/crossing';
import { priceListSchema } from '../../../src/lib/schemas/price-list';
import { parsePriceListCsv } from '../../../src/lib/schemas/price-list-csv';
import { ElevationModelError, inspectElevationModel, readElevationModel } from '../../../src/lib/server/elevation/index';
import { oversizedTiff } from '../../helpers/elevation-fixtures';
import { runGdal } from '../../helpers/gdal';
import { fuzzSeed, hostileXml, mutate, sampleGpx, sampleIfdTable, sampleKml, samplePlanGeoJson, samplePlanKml, samplePriceCsv, smallGeoTiff, text, utf8 } from '../../helpers/fuzz-corpus';

const SEED = fuzzSeed();
const FC = { seed: Number(process.env.FC_SEED ?? SEED), numRuns: 150 };
/** Longest any one case may take on a busy two-core machine (the slowest takes under 1 s on an idle one). */
const CASE_MS = 5000;

/** Runs one case: it either returns or throws `allowed`; anything else fails with the case's label. */
async function expectOwnErrorOnly(label: string, allowed: (error: unknown) => boolean, run: () => unknown): Promise<'ok' | 'refused'> {
  const started = performance.now();
  let outcome: 'ok' | 'refused' = 'ok';
  try {
    await run();
  } catch (error) {
    if (!allowed(error)) throw new Error(`${label} (replay with FUZZ_SEED=${SEED}): threw ${(error as Error)?.constructor?.name}: ${(error as Error)?.message}`, { cause: error });
    expect((error as Error).message.length, label).toBeGreaterThan(10);
    expect((error as Error).message, label).not.toMatch(/\bat .+:\d+:\d+|undefined|\[object Object\]/);
    outcome = 'refused';
  }
  const took = performance.now() - started;
  expect(took, `${label} (replay with FUZZ_SEED=${SEED}) took ${Math.round(took)} ms`).toBeLessThan(CASE_MS);
  return outcome;
}

const isImportError = (error: unknown) => error instanceof ImportError;

describe('GeoTIFF reading of damaged files', () => {
  const dir = mkdtempSync(join(tmpdir(), 'gullyline-fuzz-tiff-'));
  afterAll(() => rmSync(dir, { recursive: true, force: true }));
  const isModelError = (error: unknown) => error instanceof ElevationModelError;
  const options = { maxCells: 1_000_000 };

  /** The small GeoTIFF compressed by GDAL (Debian gdal-bin's gdal_translate), so damaged compressed pixels reach the decoders. */
  const compressed = (options: string[]) => {
    const source = join(dir, 'small.tif');
    const target = join(dir, `small-${options.join('-').replace(/\W/g, '')}.tif`);
    writeFileSync(source, smallGeoTiff());
    runGdal('gdal_translate', ['-q', ...options.flatMap((o) => ['-co', o]), source, target]);
    return new Uint8Array(readFileSync(target));
  };

  it.each([
    ['a small Float32 GeoTIFF', () => smallGeoTiff(), 60],
    ['an oversized header', () => oversizedTiff(), 30],
    ['an LZW-compressed GeoTIFF', () => compressed(['COMPRESS=LZW']), 30],
    ['a tiled Deflate GeoTIFF', () => compressed(['COMPRESS=DEFLATE', 'TILED=YES', 'BLOCKXSIZE=16', 'BLOCKYSIZE=16']), 30],
    ['a PackBits GeoTIFF', () => compressed(['COMPRESS=PACKBITS']), 20],
  ])('%s, truncated, bit-flipped, overwritten and grown: read or refused with an elevation model error', async (name, make, count) => {
    const base = make();
    let refused = 0;
    for (const [i, { label, bytes }] of mutate(base, count, SEED, { headerBytes: 400, growTo: 200_000 }).entries()) {
      const file = join(dir, `${name.length}-${i}.tif`);
      writeFileSync(file, bytes);
      const header = await expectOwnErrorOnly(`${name}: ${label}`, isModelError, () => inspectElevationModel(file, options));
      const body = await expectOwnErrorOnly(`${name}: ${label}`, isModelError, () => readElevationModel(file, { ...options, assumeCrs: 'EPSG:7854' }));
      if (header === 'refused' || body === 'refused') refused += 1;
    }
    // The generator damages: most cases must be refused, or the test is not exercising anything.
    expect(refused).toBeGreaterThan(count / 3);
  }, 120_000);
});

describe('GPX and KML reading', () => {
  it.each([
    ['GPX', sampleGpx()],
    ['KML', sampleKml()],
  ])('reads damaged %s files or refuses them with an import error', async (name, base) => {
    expect(importLines(base).lines.length).toBeGreaterThan(0);
    let refused = 0;
    for (const { label, bytes } of mutate(utf8(base), 150, SEED, { growTo: 400_000 })) {
      if ((await expectOwnErrorOnly(`${name}: ${label}`, isImportError, () => importLines(text(bytes)))) === 'refused') refused += 1;
    }
    expect(refused).toBeGreaterThan(20);
  }, 120_000);

  it.each(hostileXml().map((c) => [c.label, c.text] as const))('%s: no entity is expanded or fetched and the file is read or refused quickly', async (label, xml) => {
    let result: ReturnType<typeof importLines> | undefined;
    await expectOwnErrorOnly(label, isImportError, () => {
      result = importLines(xml);
    });
    const everything = JSON.stringify(result ?? {});
    expect(everything).not.toContain('root:');
    expect(everything).not.toContain('lollollol');
    expect(everything.length).toBeLessThan(20_000_000);
  }, 30_000);

  it('refuses a file within the upload limit but too detailed to parse, before building it in memory', async () => {
    for (const [label, xml] of [
      ['a GPX of 40 000 points (2.5 MB)', sampleGpx(40_000)],
      ['a KML coordinate string of 250 000 positions', hostileXml({ depth: 1, hugeCoordinates: 250_000 }).find((c) => c.label.startsWith('a coordinate string'))!.text],
    ] as const) {
      const started = performance.now();
      expect(() => importLines(xml), label).toThrow(/too detailed/);
      expect(performance.now() - started, label).toBeLessThan(500);
    }
    // Just inside the budget is read.
    expect(importLines(sampleGpx(35_000)).lines[0]!.coordinates.length).toBe(35_000);
  }, 60_000);

  it('never throws anything but an import error for arbitrary text and XML-like text', () => {
    const xmlish = fc.array(fc.constantFrom('<kml>', '</kml>', '<gpx>', '<Placemark>', '<LineString>', '<coordinates>', '1,2 3,4', '&amp;', '&lol;', '<![CDATA[', ']]>', '<!DOCTYPE x [', ']>', '<trkpt lat="1" lon="2"/>', '"', '<'), { maxLength: 40 }).map((parts) => parts.join(''));
    fc.assert(
      fc.property(fc.oneof(fc.string(), fc.string({ unit: 'binary' }), xmlish), (input) => {
        try {
          importLines(input);
        } catch (error) {
          if (!(error instanceof ImportError)) throw error;
        }
      }),
      FC,
    );
  });
});

describe('plan import', () => {
  it.each([
    ['GeoJSON', samplePlanGeoJson()],
    ['KML', samplePlanKml()],
  ])('reads damaged %s plan files or refuses them with an import error', async (name, base) => {
    expect(importPlan(base).fenceLines.length).toBeGreaterThan(0);
    let refused = 0;
    for (const { label, bytes } of mutate(utf8(base), 150, SEED, { growTo: 400_000 })) {
      if ((await expectOwnErrorOnly(`${name} plan: ${label}`, isImportError, () => importPlan(text(bytes)))) === 'refused') refused += 1;
    }
    expect(refused).toBeGreaterThan(20);
  }, 120_000);

  it('refuses any JSON that is not a plan with an import error, never another error', () => {
    const feature = fc.record({ type: fc.constant('Feature'), geometry: fc.jsonValue(), properties: fc.oneof(fc.constant(null), fc.dictionary(fc.constantFrom('featureType', 'name', 'status', 'wireSpec', 'x'), fc.oneof(fc.jsonValue(), fc.constantFrom('fence-line', 'paddock', 'crossing')))) });
    const collection = fc.record({ type: fc.constant('FeatureCollection'), features: fc.array(feature, { maxLength: 5 }), gullylineExport: fc.option(fc.record({ formatVersion: fc.jsonValue() }), { nil: undefined }) });
    fc.assert(
      fc.property(fc.oneof(fc.jsonValue(), collection), (value) => {
        try {
          importPlan(JSON.stringify(value) ?? 'null');
        } catch (error) {
          if (!(error instanceof ImportError)) throw error;
        }
      }),
      FC,
    );
  });

  it('refuses a GeoJSON plan within the upload limit but too detailed to check, before parsing it', () => {
    const plan = (lines: number) => {
      const coordinates = Array.from({ length: 4000 }, (_, i) => [141.5 + i * 0.00001, -31.5 + (i % 2) * 0.00001]);
      const features = Array.from({ length: lines }, (_, k) => ({ type: 'Feature', geometry: { type: 'LineString', coordinates }, properties: { featureType: 'fence-line', name: `Line ${k}`, status: 'planned' } }));
      return JSON.stringify({ type: 'FeatureCollection', features });
    };
    const detailed = plan(180);
    const started = performance.now();
    expect(() => importPlan(detailed)).toThrow(/too detailed/);
    expect(performance.now() - started).toBeLessThan(500);
    expect(importPlan(plan(60)).fenceLines).toHaveLength(60);
  }, 60_000);

  it('reads deeply nested JSON arrays without overflowing the stack', async () => {
    const deep = `{"type":"FeatureCollection","features":[{"type":"Feature","geometry":{"type":"LineString","coordinates":${'['.repeat(100_000)}${']'.repeat(100_000)}},"properties":{"featureType":"fence-line","name":"Deep"}}]}`;
    await expectOwnErrorOnly('deep JSON', isImportError, () => importPlan(deep));
  });
});

describe('fast-check mutations of good files (shrinking to the smallest change that breaks a reader)', () => {
  /** Edits at positions scaled to the file: flip a bit, set a byte, delete a run, or cut the file there. */
  const edits = fc.array(
    fc.record({ at: fc.double({ min: 0, max: 1, noNaN: true }), op: fc.constantFrom('flip', 'set', 'delete', 'cut'), value: fc.integer({ min: 0, max: 255 }), length: fc.integer({ min: 1, max: 16 }) }),
    { minLength: 1, maxLength: 6 },
  );
  const apply = (base: Uint8Array, changes: { at: number; op: string; value: number; length: number }[]) => {
    let bytes = new Uint8Array(base);
    for (const { at, op, value, length } of changes) {
      const i = Math.min(bytes.length - 1, Math.floor(at * bytes.length));
      if (i < 0) break;
      if (op === 'flip') bytes[i]! ^= 1 << (value % 8);
      else if (op === 'set') bytes[i] = value;
      else if (op === 'delete') bytes = new Uint8Array([...bytes.subarray(0, i), ...bytes.subarray(i + length)]);
      else bytes = bytes.slice(0, i);
    }
    return text(bytes);
  };
  const readers: [string, string, (input: string) => unknown][] = [
    ['GPX', sampleGpx(20), importLines],
    ['KML', sampleKml(), importLines],
    ['GeoJSON plan', samplePlanGeoJson(), importPlan],
    ['KML plan', samplePlanKml(), importPlan],
  ];
  it.each(readers)('%s: any few edits are read or refused with an import error', (_name, base, read) => {
    const bytes = utf8(base);
    fc.assert(
      fc.property(edits, (changes) => {
        try {
          read(apply(bytes, changes));
        } catch (error) {
          if (!(error instanceof ImportError)) throw error;
        }
      }),
      FC,
    );
  });

  it('price list CSV: any few edits give an error in words or rows, never a throw', () => {
    const bytes = utf8(samplePriceCsv());
    fc.assert(
      fc.property(edits, (changes) => {
        const result = parsePriceListCsv(apply(bytes, changes));
        expect(result.ok ? Array.isArray(result.rows) : result.error.length > 10).toBe(true);
      }),
      FC,
    );
  });
});

describe('price list CSV', () => {
  it('never throws for damaged files: an error in words or rows with their problems', () => {
    for (const { label, bytes } of mutate(utf8(samplePriceCsv()), 200, SEED, { growTo: 300_000 })) {
      const started = performance.now();
      let result;
      try {
        result = parsePriceListCsv(text(bytes));
      } catch (error) {
        throw new Error(`${label} (replay with FUZZ_SEED=${SEED}): threw ${(error as Error).message}`);
      }
      expect(performance.now() - started, label).toBeLessThan(CASE_MS);
      if (!result.ok) expect(result.error.length, label).toBeGreaterThan(10);
      else for (const row of result.rows) expect(row.item !== null || row.problems.length > 0, label).toBe(true);
    }
  });

  it('never throws for any text, and every item it accepts is a valid price list entry', () => {
    const cell = fc.oneof(fc.string(), fc.constantFrom('each', 'm', 'roll', 'kg', '12.50', '$1,250.00', '-1', '1e9', '""', '"a,b"', 'NaN', '0.001'));
    const csvish = fc.array(fc.array(cell, { maxLength: 7 }).map((cells) => cells.join(fc.sample(fc.constantFrom(',', ';', '\t'), 1)[0])), { maxLength: 8 }).map((rows) => ['id,name,unit,price', ...rows].join('\n'));
    fc.assert(
      fc.property(fc.oneof(fc.string(), fc.string({ unit: 'binary' }), csvish), (input) => {
        const result = parsePriceListCsv(input);
        if (!result.ok) {
          expect(result.error.length).toBeGreaterThan(10);
          return;
        }
        const items = result.rows.flatMap((row) => (row.item ? [row.item] : []));
        if (items.length) expect(priceListSchema.safeParse(items).success).toBe(true);
      }),
      FC,
    );
  });
});

describe('IFD tables and settings JSON', () => {
  it('checks any value as an IFD table without throwing, and never passes one the schema refuses', () => {
    const base = sampleIfdTable();
    const numberish = fc.oneof(fc.double(), fc.integer(), fc.constantFrom(0, -1, 1e308, Number.NaN, Infinity), fc.jsonValue());
    const table = fc.record({
      aepPercent: fc.oneof(fc.array(numberish, { maxLength: 5 }), fc.constant(base.aepPercent), fc.jsonValue()),
      durationsMin: fc.oneof(fc.array(numberish, { maxLength: 6 }), fc.constant(base.durationsMin), fc.jsonValue()),
      intensitiesMmH: fc.oneof(fc.array(fc.array(numberish, { maxLength: 6 }), { maxLength: 5 }), fc.constant(base.intensitiesMmH), fc.jsonValue()),
    });
    expect(validateIfdTable(base)).toEqual([]);
    fc.assert(
      fc.property(fc.oneof(table, fc.jsonValue()), (value) => {
        const problems = validateIfdTable(value as never);
        expect(Array.isArray(problems)).toBe(true);
        const parsed = ifdTableSchema.safeParse(value);
        if (parsed.success && problems.length === 0) {
          expect(parsed.data.intensitiesMmH.length).toBe(parsed.data.aepPercent.length);
          for (const row of parsed.data.intensitiesMmH) expect(row.length).toBe(parsed.data.durationsMin.length);
        }
      }),
      FC,
    );
  });

  it('settings schemas take any JSON without throwing', () => {
    fc.assert(
      fc.property(fc.jsonValue(), fc.dictionary(fc.string(), fc.jsonValue()), (value, record) => {
        for (const schema of [designSettingsSchema, priceListSchema, ifdTableSchema]) {
          expect(() => schema.safeParse(value)).not.toThrow();
          expect(() => schema.safeParse(record)).not.toThrow();
        }
      }),
      FC,
    );
  });
});
