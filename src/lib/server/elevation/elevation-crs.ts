/**
 * The coordinate reference system of an elevation model: the EPSG code from the file or from the
 * person, resolved to a definition in the EPSG registry (epsg-index, through {@link lookupCrs}),
 * and the ground size of the model's cells in that system.
 */
import proj4 from 'proj4';
import { geographicCellSizeM, type Ellipsoid } from '../../geo/ellipsoid-cell-size';
import type { RasterTransform } from '../../geo/geotiff-georeference';
import type { CellSize } from '../../terrain/raster';
import { lookupCrs, type CrsDefinition } from '../crs-registry';
import { ElevationModelError } from './elevation-model-error';

/** The model's coordinate reference system, from the EPSG registry. */
export interface ElevationModelCrs {
  /** e.g. `EPSG:7854` */
  readonly code: string;
  /** e.g. `GDA2020 / MGA zone 54` */
  readonly name: string;
  readonly proj4: string;
  /** True for a latitude–longitude CRS (cells in degrees). */
  readonly geographic: boolean;
  /** Whether the file names the CRS or the caller assumed it (`assumeCrs`). */
  readonly source: 'file' | 'assumed';
}

/** Outer edges of a grid in its CRS units. */
export interface CrsExtent {
  readonly minX: number;
  readonly minY: number;
  readonly maxX: number;
  readonly maxY: number;
}

/** Codes to show a person who is asked for one. */
export const EXAMPLE_CRS_CODES = 'for example EPSG:7854 for GDA2020 / MGA zone 54, or EPSG:7844 for GDA2020 latitude and longitude';

/**
 * The CRS of a model from the code in its file and the code the person gave (`assumeCrs`).
 *
 * @returns the file's CRS; the assumed one when the file names none; null when neither is known
 * @throws ElevationModelError `unknown-crs`, `unsupported-crs` (not metres or degrees) or
 *   `crs-conflict` (the file and the person name different codes)
 */
export function resolveElevationCrs(epsgCode: number | null, assumeCrs: string | undefined): ElevationModelCrs | null {
  const assumed = assumeCrs === undefined ? null : usableCrs(assumeCrs, 'assumed');
  if (epsgCode === null) return assumed;
  const declared = usableCrs(`EPSG:${epsgCode}`, 'file');
  if (assumed && assumed.code !== declared.code) {
    throw new ElevationModelError(
      'crs-conflict',
      `This elevation model says it is in ${declared.code} (${declared.name}), but ${assumed.code} (${assumed.name}) was given. Leave the coordinate system to the file, or fix the file's CRS (gdal_edit.py -a_srs) if it is wrong.`,
    );
  }
  return declared;
}

function usableCrs(code: string, source: ElevationModelCrs['source']): ElevationModelCrs {
  const definition: CrsDefinition | undefined = lookupCrs(code);
  if (!definition) {
    const message =
      source === 'file'
        ? `This elevation model says it is in ${code}, which is not in the EPSG registry. Reproject it to a known system, for example with gdalwarp -t_srs EPSG:7854, and upload it again.`
        : `"${code.slice(0, 40)}" is not a code in the EPSG registry. Give the code as EPSG: and a number, ${EXAMPLE_CRS_CODES}.`;
    throw new ElevationModelError('unknown-crs', message);
  }
  if (definition.kind === 'CRS-PROJCRS' && definition.unit === 'metre') {
    return { code, name: definition.name, proj4: definition.proj4, geographic: false, source };
  }
  if (definition.kind.startsWith('CRS-GEOG') && definition.unit.startsWith('degree')) {
    return { code, name: definition.name, proj4: definition.proj4, geographic: true, source };
  }
  const what = definition.kind === 'CRS-PROJCRS' ? `a map projection in ${definition.unit}, not in metres` : 'neither a map projection in metres nor a latitude–longitude system';
  const message =
    source === 'file'
      ? `This elevation model is in ${code} (${definition.name}), ${what}. Reproject it, for example with gdalwarp -t_srs EPSG:7854, and upload it again.`
      : `${code} (${definition.name}) is ${what}. Give the code of a metre grid or of latitude and longitude, ${EXAMPLE_CRS_CODES}.`;
  throw new ElevationModelError('unsupported-crs', message);
}

/**
 * Checks that the model's positions make sense in its CRS: degrees within ±90° latitude for a
 * geographic CRS, cells of at least a millimetre for a projected one.
 *
 * @throws ElevationModelError `crs-conflict`
 */
export function checkCoordinatesFit(crs: ElevationModelCrs, extent: CrsExtent, transform: RasterTransform): void {
  const tolerance = 1e-9;
  const range = `x from ${extent.minX} to ${extent.maxX}, y from ${extent.minY} to ${extent.maxY}`;
  if (crs.geographic && (extent.minY < -90 - tolerance || extent.maxY > 90 + tolerance || extent.minX < -360 || extent.maxX > 360)) {
    throw new ElevationModelError(
      'crs-conflict',
      `The positions in this elevation model (${range}) are not longitudes and latitudes in degrees, yet ${crs.code} (${crs.name}) is a latitude–longitude system. Check the EPSG code.`,
    );
  }
  if (!crs.geographic && Math.min(transform.cellSizeX, transform.cellSizeY) < 0.001) {
    throw new ElevationModelError(
      'crs-conflict',
      `In ${crs.code} (${crs.name}) the cells of this elevation model would be less than a millimetre across (${transform.cellSizeX} × ${transform.cellSizeY} m); its positions (${range}) look like degrees. Check the EPSG code.`,
    );
  }
}

/**
 * Cell sizes in metres for every row: the CRS's metres for a projected model; for a geographic
 * model, metres on the CRS's ellipsoid (see {@link geographicCellSizeM}).
 *
 * @throws ElevationModelError `unsupported-crs` when the ellipsoid cannot be read
 */
export function elevationCellSizeM(crs: ElevationModelCrs, transform: RasterTransform, height: number): CellSize {
  if (!crs.geographic) {
    return { cellWidthM: new Float64Array(height).fill(transform.cellSizeX), cellHeightM: transform.cellSizeY };
  }
  const rowLatitudesDeg = new Float64Array(height);
  for (let row = 0; row < height; row++) rowLatitudesDeg[row] = transform.originY - (row + 0.5) * transform.cellSizeY;
  return geographicCellSizeM(rowLatitudesDeg, transform.cellSizeX, transform.cellSizeY, ellipsoidOf(crs));
}

/** West–east and north–south cell size in metres at the middle of the grid. */
export function middleCellSizeM(crs: ElevationModelCrs, transform: RasterTransform, extent: CrsExtent): { westEastM: number; northSouthM: number } {
  if (!crs.geographic) return { westEastM: transform.cellSizeX, northSouthM: transform.cellSizeY };
  const middleLatitudeDeg = (extent.minY + extent.maxY) / 2;
  const size = geographicCellSizeM([middleLatitudeDeg], transform.cellSizeX, transform.cellSizeY, ellipsoidOf(crs));
  return { westEastM: size.cellWidthM[0]!, northSouthM: size.cellHeightM };
}

function ellipsoidOf(crs: ElevationModelCrs): Ellipsoid {
  const projection = new proj4.Proj(crs.proj4);
  const a = Number(projection.a);
  const b = Number(projection.b);
  if (!(a > 0 && b > 0 && b <= a)) {
    throw new ElevationModelError('unsupported-crs', `The ellipsoid of ${crs.code} (${crs.name}) could not be read from its definition. Reproject the model to a map grid in metres (gdalwarp -t_srs EPSG:7854).`);
  }
  return { a, f: (a - b) / a };
}
