/**
 * Cases follow the OGC GeoTIFF Standard 1.1 (OGC 19-008r4) tags and GDAL's reading of them
 * (GDAL GeoTIFF driver: tie point and pixel scale before a transformation matrix; PixelIsPoint
 * shifted by half a cell). The GDAL behaviour itself is checked against gdalinfo in
 * tests/lib/server/elevation/read-elevation-model.test.ts.
 */
import { describe, expect, it } from 'vitest';
import { cellCentreToCrs, GeoreferenceError, readGeoTiffGeoreference, type GeoTiffGeoFields } from '../../../src/lib/geo/geotiff-georeference';

const MGA54 = { GTModelTypeGeoKey: 1, GTRasterTypeGeoKey: 1, ProjectedCSTypeGeoKey: 7854 };
const demo: GeoTiffGeoFields = { modelPixelScale: [5, 5, 0], modelTiepoint: [0, 0, 0, 560000, 6523000, 0], geoKeys: MGA54 };

function problemOf(fields: GeoTiffGeoFields): string {
  try {
    readGeoTiffGeoreference(fields);
  } catch (error) {
    if (error instanceof GeoreferenceError) return `${error.problem}: ${error.message}`;
    throw error;
  }
  return 'no error';
}

describe('readGeoTiffGeoreference', () => {
  it('reads a tie point at the north-west corner and a 5 m pixel scale', () => {
    expect(readGeoTiffGeoreference(demo)).toEqual({
      originX: 560000,
      originY: 6523000,
      cellSizeX: 5,
      cellSizeY: 5,
      epsgCode: 7854,
      isGeographic: false,
      pixelIsPoint: false,
    });
  });

  it('moves a tie point at raster (10, 4) back to the corner of cell (0, 0)', () => {
    const georef = readGeoTiffGeoreference({ ...demo, modelTiepoint: [10, 4, 0, 560050, 6522980, 0] });
    expect([georef.originX, georef.originY]).toEqual([560000, 6523000]);
  });

  it('shifts a PixelIsPoint raster up and left by half a cell, as GDAL does', () => {
    const georef = readGeoTiffGeoreference({
      ...demo,
      modelTiepoint: [0, 0, 0, 560002.5, 6522997.5, 0],
      geoKeys: { ...MGA54, GTRasterTypeGeoKey: 2 },
    });
    expect(georef).toMatchObject({ originX: 560000, originY: 6523000, pixelIsPoint: true });
  });

  it('reads a north-up ModelTransformation', () => {
    const georef = readGeoTiffGeoreference({
      modelTransformation: [2, 0, 0, 300000, 0, -3, 0, 7000000, 0, 0, 0, 0, 0, 0, 0, 1],
      geoKeys: MGA54,
    });
    expect(georef).toMatchObject({ originX: 300000, originY: 7000000, cellSizeX: 2, cellSizeY: 3 });
  });

  it('prefers the tie point and pixel scale over a transformation matrix, as GDAL does', () => {
    const georef = readGeoTiffGeoreference({
      ...demo,
      modelTransformation: [2, 0, 0, 0, 0, -2, 0, 0, 0, 0, 0, 0, 0, 0, 0, 1],
    });
    expect(georef.cellSizeX).toBe(5);
  });

  it('reads a geographic model from GeographicTypeGeoKey', () => {
    const georef = readGeoTiffGeoreference({
      modelPixelScale: [arcSecondsDeg(1), arcSecondsDeg(1), 0],
      modelTiepoint: [0, 0, 0, 141.6, -31.4, 0],
      geoKeys: { GTModelTypeGeoKey: 2, GTRasterTypeGeoKey: 1, GeographicTypeGeoKey: 7844 },
    });
    expect(georef).toMatchObject({ epsgCode: 7844, isGeographic: true });
  });

  it('gives no code for missing, user-defined and private CRS keys', () => {
    expect(readGeoTiffGeoreference({ ...demo, geoKeys: null }).epsgCode).toBeNull();
    expect(readGeoTiffGeoreference({ ...demo, geoKeys: { ...MGA54, ProjectedCSTypeGeoKey: 32767 } }).epsgCode).toBeNull();
    expect(readGeoTiffGeoreference({ ...demo, geoKeys: { ProjectedCSTypeGeoKey: 40000 } }).epsgCode).toBeNull();
    // A user-defined projection on GDA2020: 7844 names the base CRS, not the projected coordinates.
    expect(readGeoTiffGeoreference({ ...demo, geoKeys: { GTModelTypeGeoKey: 1, ProjectedCSTypeGeoKey: 32767, GeographicTypeGeoKey: 7844 } }).epsgCode).toBeNull();
  });

  it('refuses rotated, sheared and flipped grids, control points, geocentric models and missing georeferencing', () => {
    const rotated = [4.9, 0.5, 0, 560000, 0.5, -4.9, 0, 6523000, 0, 0, 0, 0, 0, 0, 0, 1];
    expect(problemOf({ modelTransformation: rotated, geoKeys: MGA54 })).toMatch(/^rotated: .*rotated or sheared.*only north-up grids.*gdalwarp/);
    const sheared = [5, 0.01, 0, 560000, 0, -5, 0, 6523000, 0, 0, 0, 0, 0, 0, 0, 1];
    expect(problemOf({ modelTransformation: sheared, geoKeys: MGA54 })).toMatch(/^rotated:/);
    expect(problemOf({ ...demo, modelPixelScale: [5, -5, 0] })).toMatch(/^flipped: .*rows run south to north/);
    expect(problemOf({ modelTiepoint: [0, 0, 0, 560000, 6523000, 0, 600, 600, 0, 563000, 6520000, 0], geoKeys: MGA54 })).toMatch(/^control-points: .*ground control points/);
    expect(problemOf({ ...demo, geoKeys: { GTModelTypeGeoKey: 3 } })).toMatch(/^geocentric:/);
    expect(problemOf({ geoKeys: MGA54 })).toMatch(/^no-georeferencing: .*no georeferencing/);
    expect(problemOf({ ...demo, modelPixelScale: [5, Number.NaN, 0] })).toMatch(/^bad-cell-size:/);
  });

  it('accepts rotation terms of rounding size only', () => {
    const nearlyNorthUp = [5, 1e-12, 0, 560000, -1e-12, -5, 0, 6523000, 0, 0, 0, 0, 0, 0, 0, 1];
    expect(readGeoTiffGeoreference({ modelTransformation: nearlyNorthUp, geoKeys: MGA54 }).cellSizeX).toBe(5);
  });

  it('does not modify its inputs', () => {
    const fields = { modelPixelScale: Object.freeze([5, 5, 0]), modelTiepoint: Object.freeze([0, 0, 0, 560000, 6523000, 0]), geoKeys: Object.freeze({ ...MGA54 }) };
    readGeoTiffGeoreference(fields);
    expect(fields.modelTiepoint).toEqual([0, 0, 0, 560000, 6523000, 0]);
  });
});

describe('cellCentreToCrs', () => {
  it('puts the centre of cell (0, 0) half a cell in from the north-west corner', () => {
    const transform = { originX: 560000, originY: 6523000, cellSizeX: 5, cellSizeY: 5 };
    expect(cellCentreToCrs(transform, 0, 0)).toEqual([560002.5, 6522997.5]);
    expect(cellCentreToCrs(transform, 599, 599)).toEqual([562997.5, 6520002.5]);
  });
});

function arcSecondsDeg(seconds: number): number {
  return seconds / 3600;
}
