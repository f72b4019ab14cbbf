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
