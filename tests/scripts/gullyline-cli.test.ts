import { execFileSync, spawnSync } from 'node:child_process';
import { existsSync, mkdtempSync, readFileSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import path from 'node:path';
import { describe, expect, it } from 'vitest';

const DEMO = 'data-samples/saltbush-rise-dem.tif';
const work = mkdtempSync(path.join(tmpdir(), 'gullyline-cli-'));
const cli = (...args: string[]) => spawnSync(process.execPath, ['--import', 'tsx', 'scripts/gullyline.ts', ...args], { encoding: 'utf8' });
// Reference reader: GDAL (Debian gdal-bin).
const gdal = (tool: string, args: string[]) => execFileSync(tool, args, { encoding: 'utf8' });

describe('npm run gullyline -- terrain', () => {
  it('writes GeoTIFFs in the model’s CRS that GDAL reads, drainage lines, and the time of each stage', () => {
    const out = path.join(work, 'terrain');
    const result = cli('terrain', DEMO, '--out', out, '--threshold-ha', '5');
    expect(result.status, result.stderr).toBe(0);
    for (const stage of ['Reading the elevation model', 'Filling depressions', 'Working out flow directions', 'Accumulating flow', 'Tracing drainage lines']) {
      expect(result.stdout).toMatch(new RegExp(`${stage}\\s+\\d+\\.\\d\\d s`));
    }
    for (const [name, type] of [['filled.tif', 'Float32'], ['flowdir.tif', 'Byte'], ['accumulation.tif', 'UInt32'], ['hillshade.tif', 'Byte']] as const) {
      const info = JSON.parse(gdal('gdalinfo', ['-json', path.join(out, name)])) as { size: number[]; bands: { type: string }[]; stac?: { 'proj:epsg'?: number } };
      expect(info.size, name).toEqual([600, 600]);
      expect(info.bands[0]!.type, name).toBe(type);
      expect(info.stac?.['proj:epsg'], name).toBe(7854);
    }
    // The filled surface is never below the ground (Priority-Flood): check cells against GDAL's reading of both files.
    for (const [col, row] of [[100, 100], [300, 450], [590, 10]]) {
      const ground = Number(gdal('gdallocationinfo', ['-valonly', DEMO, String(col), String(row)]));
      const filled = Number(gdal('gdallocationinfo', ['-valonly', path.join(out, 'filled.tif'), String(col), String(row)]));
      expect(filled).toBeGreaterThanOrEqual(ground - 1e-4);
    }
    const drainage = JSON.parse(readFileSync(path.join(out, 'drainage.geojson'), 'utf8')) as { features: unknown[] };
    expect(drainage.features.length).toBeGreaterThan(10);
    expect(gdal('ogrinfo', ['-so', '-al', path.join(out, 'drainage.geojson')])).toMatch(/EPSG",7854/);
    expect(existsSync(path.join(out, 'hillshade.png'))).toBe(true);
  }, 60_000);

  it('explains a file that is not a GeoTIFF, without a stack trace', () => {
    const result = cli('terrain', 'README.md', '--out', path.join(work, 'bad'));
    expect(result.status).toBe(1);
    expect(result.stderr).toMatch(/not a GeoTIFF/);
    expect(result.stderr).not.toMatch(/\n\s+at /);
  });

  it('prints usage for a missing argument', () => {
    const result = cli('terrain', DEMO);
    expect(result.status).toBe(2);
    expect(result.stderr).toMatch(/Usage:/);
  });
});

describe('npm run gullyline -- profile', () => {
  it('prints the ground under a line as CSV, equal to GDAL’s cell values at cell centres', () => {
    // From the centre of cell (100, 200) to the centre of cell (160, 200), in the model's CRS.
    const x = (col: number) => 560_000 + (col + 0.5) * 5;
    const y = 6_523_000 - 200.5 * 5;
    const line = path.join(work, 'line.geojson');
    writeFileSync(line, JSON.stringify({ type: 'LineString', crs: { type: 'name', properties: { name: 'urn:ogc:def:crs:EPSG::7854' } }, coordinates: [[x(100), y], [x(160), y]] }));
    const result = cli('profile', DEMO, '--line', line, '--spacing-m', '5');
    expect(result.status, result.stderr).toBe(0);
    const rows = result.stdout.trim().split('\n');
    expect(rows[0]).toBe('chainage_m,x,y,elevation_m');
    expect(rows).toHaveLength(62);
    const last = rows.at(-1)!.split(',').map(Number);
    expect(last[0]).toBeCloseTo(300, 6);
    for (const [row, col] of [[1, 100], [31, 130], [61, 160]] as const) {
      const expected = Number(gdal('gdallocationinfo', ['-valonly', DEMO, String(col), '200']));
      expect(Number(rows[row]!.split(',')[3])).toBeCloseTo(expected, 3);
    }
  });
});

describe('npm run gullyline -- design', () => {
  it('finds the normal depth of a rectangular channel given its discharge (Ponce, SDSU CIVE 530 midterm 1 problem 4, 2008)', () => {
    // b = 6 m, n = 0.015, S = 0.0025, Q = 32.91 m³/s → y = 1.6 m; walls 5 m high, near vertical.
    const csv = path.join(work, 'rectangle.csv');
    writeFileSync(csv, ['chainage_m,elevation_m', '0,105', '46.999,105', '47,100', '53,100', '53.001,105', '100,105'].join('\n'));
    const result = cli('design', '--profile', csv, '--discharge', '32.91', '--slope', '0.0025', '--n', '0.015', '--crossing-chainage', '50');
    expect(result.status, result.stderr).toBe(0);
    const design = JSON.parse(result.stdout) as { status: string; floods: { chosen: string; levelM: number; maxDepthM: number }; layout: { wires: { mustBePlain: boolean }[] } };
    expect(design.status).toBe('designed');
    expect(design.floods.chosen).toBe('discharge');
    expect(design.floods.maxDepthM).toBeCloseTo(1.6, 2);
    expect(design.layout.wires.length).toBeGreaterThan(0);
  });

  it('refuses a roughness of 0 with a message saying why', () => {
    const csv = path.join(work, 'rectangle.csv');
    const result = cli('design', '--profile', csv, '--discharge', '10', '--slope', '0.0025', '--n', '0');
    expect(result.status).toBe(2);
    expect(result.stderr).toMatch(/Manning's n below 0.01/);
  });
});

describe('npm run gullyline -- crossings', () => {
  it('finds a square crossing of two lines at 90° (analytic case)', () => {
    const fences = path.join(work, 'fences.geojson');
    const drainage = path.join(work, 'drainage.geojson');
    const line = (name: string, coordinates: number[][]) => ({ type: 'Feature', properties: { name }, geometry: { type: 'LineString', coordinates } });
    writeFileSync(fences, JSON.stringify({ type: 'FeatureCollection', features: [line('East–west fence', [[141.64, -31.44], [141.66, -31.44]])] }));
    writeFileSync(drainage, JSON.stringify({ type: 'FeatureCollection', features: [line('Creek', [[141.65, -31.43], [141.65, -31.45]])] }));
    const result = cli('crossings', '--fences', fences, '--drainage', drainage);
    expect(result.status, result.stderr).toBe(0);
    const found = JSON.parse(result.stdout) as { crossings: { fenceId: string; crossingAngleDeg: number; angleClass: string; fenceChainageM: number }[] };
    expect(found.crossings).toHaveLength(1);
    expect(found.crossings[0]!.crossingAngleDeg).toBeCloseTo(90, 3);
    expect(found.crossings[0]!.angleClass).toBe('good');
    // Half of 0.02° of longitude at 31.44° S: about 950.8 m (the fence's geodesic length is checked
    // against GeographicLib in the geometry core's tests).
    expect(found.crossings[0]!.fenceChainageM).toBeGreaterThan(940);
    expect(found.crossings[0]!.fenceChainageM).toBeLessThan(960);
  });
});
