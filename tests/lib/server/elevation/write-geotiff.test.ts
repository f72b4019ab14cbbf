import { execFileSync } from 'node:child_process';
import { mkdtempSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import path from 'node:path';
import { describe, expect, it } from 'vitest';
import { encodeGeoTiff } from '../../../../src/lib/server/elevation/write-geotiff';

// The reference reader is GDAL (Debian gdal-bin): gdalinfo and gdallocationinfo.
function gdal(command: string, args: string[]): string {
  try {
    return execFileSync(command, args, { encoding: 'utf8' });
  } catch (error) {
    if ((error as NodeJS.ErrnoException).code === 'ENOENT') throw new Error(`${command} is missing: install GDAL's tools (Debian: apt-get install gdal-bin)`);
    throw error;
  }
}

const dir = mkdtempSync(path.join(tmpdir(), 'gullyline-geotiff-'));
const transform = { originX: 560_000, originY: 6_523_000, cellSizeX: 5, cellSizeY: 5 };

describe('encodeGeoTiff', () => {
  it.each([
    ['Float32', new Float32Array(300 * 200).map((_, i) => 100 + i / 1000), 'Float32'],
    ['Float64', new Float64Array(300 * 200).map((_, i) => 100 + i / 3), 'Float64'],
    ['Uint8', new Uint8Array(300 * 200).map((_, i) => i % 251), 'Byte'],
    ['Uint32', new Uint32Array(300 * 200).map((_, i) => i * 7), 'UInt32'],
  ] as const)('writes a %s raster that GDAL reads with the same values, georeferencing and nodata', (_label, samples, gdalType) => {
    const file = path.join(dir, `${gdalType}.tif`);
    writeFileSync(file, encodeGeoTiff(samples, { width: 300, height: 200, transform, epsg: 7854, geographic: false, nodata: 0, description: 'Gullyline test raster' }));
    const info = JSON.parse(gdal('gdalinfo', ['-json', file])) as {
      size: number[];
      geoTransform: number[];
      bands: { type: string; noDataValue: number }[];
      stac?: { 'proj:epsg'?: number };
    };
    expect(info.size).toEqual([300, 200]);
    expect(info.geoTransform).toEqual([560_000, 5, 0, 6_523_000, 0, -5]);
    expect(info.bands[0]!.type).toBe(gdalType);
    expect(info.bands[0]!.noDataValue).toBe(0);
    expect(info.stac?.['proj:epsg']).toBe(7854);
    for (const [col, row] of [[0, 0], [299, 0], [150, 100], [7, 199], [299, 199]] as const) {
      const value = Number(gdal('gdallocationinfo', ['-valonly', file, String(col), String(row)]).trim());
      expect(value).toBeCloseTo(samples[row * 300 + col]!, 3);
    }
  });

  it('writes a geographic raster with its GeographicTypeGeoKey', () => {
    const file = path.join(dir, 'geographic.tif');
    const geographic = { originX: 141.6, originY: -31.4, cellSizeX: 1 / 3600, cellSizeY: 1 / 3600 };
    writeFileSync(file, encodeGeoTiff(new Float32Array(40 * 30), { width: 40, height: 30, transform: geographic, epsg: 7844, geographic: true }));
    const info = JSON.parse(gdal('gdalinfo', ['-json', file])) as { stac?: { 'proj:epsg'?: number }; coordinateSystem: { wkt: string } };
    expect(info.stac?.['proj:epsg']).toBe(7844);
    expect(info.coordinateSystem.wkt).toContain('GDA2020');
  });

  it('refuses a sample count that does not match the size', () => {
    expect(() => encodeGeoTiff(new Float32Array(5), { width: 2, height: 2, transform, epsg: 7854, geographic: false })).toThrow(/expected 4 samples/);
  });
});
