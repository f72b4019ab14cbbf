/**
 * Georeferencing of a GeoTIFF image from its tags, the way GDAL reads it.
 *
 * Sources: OGC GeoTIFF Standard 1.1 (OGC 19-008r4): ModelPixelScale (33550), ModelTiepoint
 * (33922), ModelTransformation (34264), GTModelTypeGeoKey (1024), GTRasterTypeGeoKey (1025;
 * 1 = PixelIsArea, 2 = PixelIsPoint), GeographicTypeGeoKey (2048), ProjectedCSTypeGeoKey (3072),
 * EPSG codes 1024–32766, 32767 = user-defined. GDAL's GeoTIFF driver (GTiffDataset, georeferencing
 * load; behaviour checked against `gdalinfo` in the tests): tie point and pixel scale take
 * precedence over a transformation matrix, and a PixelIsPoint raster is shifted up and left by
 * half a cell so that the origin is the north-west corner of the first cell.
 */
import type { GridTransform } from '../terrain/grid-transform';

/** The GeoTIFF fields read here, as geotiff.js 3 parses them (`getValue(...)`, `getGeoKeys()`). */
export interface GeoTiffGeoFields {
  readonly modelPixelScale?: ArrayLike<number> | null | undefined;
  readonly modelTiepoint?: ArrayLike<number> | null | undefined;
  readonly modelTransformation?: ArrayLike<number> | null | undefined;
  readonly geoKeys?: Readonly<Record<string, unknown>> | null | undefined;
}

/**
 * Position of a north-up raster in its CRS: the terrain core's {@link GridTransform}. Column `c`'s
 * west edge is at `x = originX + c · cellSizeX`; row `r`'s north edge is at
 * `y = originY − r · cellSizeY`. Both sizes are positive, in CRS units (metres or degrees); rows
 * run north to south.
 */
export type RasterTransform = GridTransform;

/** What the GeoTIFF tags say about where the raster is. */
export interface GeoTiffGeoreference extends RasterTransform {
  /** EPSG code of the CRS from ProjectedCSTypeGeoKey or GeographicTypeGeoKey; null when absent or user-defined. */
  readonly epsgCode: number | null;
  /** True when the keys describe a geographic (latitude–longitude) model. */
  readonly isGeographic: boolean;
  /** True for GTRasterTypeGeoKey = 2 (PixelIsPoint); the origin has already been shifted. */
  readonly pixelIsPoint: boolean;
}

/** Why the tags cannot be used, with a message a person can act on. */
export type GeoreferenceProblem = 'no-georeferencing' | 'control-points' | 'rotated' | 'flipped' | 'bad-cell-size' | 'geocentric';

/** Thrown by {@link readGeoTiffGeoreference}; `message` says what is wrong and what to do. */
export class GeoreferenceError extends Error {
  constructor(
    readonly problem: GeoreferenceProblem,
    message: string,
  ) {
    super(message);
    this.name = 'GeoreferenceError';
  }
}

const WARP_HINT = 'Warp it to a north-up grid first, for example with gdalwarp, and upload the result.';
// A transformation matrix written by software as "north-up" may carry rounding noise in its
// rotation terms; accept terms below a billionth of the cell size (2 × 10⁻⁴ cells after 200 000).
const ROTATION_TOLERANCE = 1e-9;

/**
 * Reads the north-up georeferencing and the EPSG code from a GeoTIFF's tags.
 *
 * @param fields - ModelPixelScale, ModelTiepoint, ModelTransformation and the parsed GeoKeys;
 *   not modified
 * @returns origin (north-west corner of cell (0, 0)), positive cell sizes in CRS units, the EPSG
 *   code or null, whether the keys say geographic, and whether the raster was PixelIsPoint
 * @throws GeoreferenceError when the raster has no georeferencing, is placed by control points,
 *   is rotated or sheared, runs south-up, has a zero or non-finite cell size, or is geocentric
 */
export function readGeoTiffGeoreference(fields: GeoTiffGeoFields): GeoTiffGeoreference {
  const keys = fields.geoKeys ?? {};
  const modelType = keys['GTModelTypeGeoKey'];
  if (modelType === 3) {
    throw new GeoreferenceError('geocentric', `The file is in a geocentric (earth-centred x, y, z) system, not on a map. ${WARP_HINT}`);
  }
  const pixelIsPoint = keys['GTRasterTypeGeoKey'] === 2;
  const affine = readAffine(fields);
  const [x0, sx, rx, y0, ry, sy] = affine;
  if (!affine.every(Number.isFinite)) {
    throw new GeoreferenceError('bad-cell-size', 'The georeferencing tags hold numbers that are not finite. Re-export the elevation model.');
  }
  if (sx === 0 || sy === 0) {
    throw new GeoreferenceError('bad-cell-size', 'The georeferencing gives the cells a size of zero. Re-export the elevation model with its cell size.');
  }
  const tolerance = ROTATION_TOLERANCE * Math.min(Math.abs(sx), Math.abs(sy));
  if (Math.abs(rx) > tolerance || Math.abs(ry) > tolerance) {
    throw new GeoreferenceError('rotated', `The grid is rotated or sheared against its coordinate system; only north-up grids are read. ${WARP_HINT}`);
  }
  if (sy > 0 || sx < 0) {
    throw new GeoreferenceError('flipped', `The grid is flipped: ${sy > 0 ? 'its rows run south to north' : 'its columns run east to west'}; only north-up grids are read. ${WARP_HINT}`);
  }
  const cellSizeX = sx;
  const cellSizeY = -sy;
  // GDAL's PixelIsPoint convention: the tie point names the centre of the first cell.
  const originX = pixelIsPoint ? x0 - cellSizeX / 2 : x0;
  const originY = pixelIsPoint ? y0 + cellSizeY / 2 : y0;
  const { epsgCode, isGeographic } = readCrsCode(keys, modelType);
  return { originX, originY, cellSizeX, cellSizeY, epsgCode, isGeographic, pixelIsPoint };
}

/**
 * Centre of a cell in the raster's CRS.
 *
 * @param transform - a north-up {@link RasterTransform}
 * @param col - column, 0 westmost (fractions allowed)
 * @param row - row, 0 northmost (fractions allowed)
 * @returns `[x, y]` of the centre of cell (col, row) in the raster's CRS units
 */
export function cellCentreToCrs(transform: RasterTransform, col: number, row: number): [x: number, y: number] {
  return [transform.originX + (col + 0.5) * transform.cellSizeX, transform.originY - (row + 0.5) * transform.cellSizeY];
}

/** GDAL-style geotransform [x0, sx, rx, y0, ry, sy]: x = x0 + sx·col + rx·row, y = y0 + ry·col + sy·row. */
type Affine = readonly [number, number, number, number, number, number];

function readAffine({ modelPixelScale: scale, modelTiepoint: tie, modelTransformation: matrix }: GeoTiffGeoFields): Affine {
  if (scale && scale.length >= 2 && tie && tie.length >= 6 && scale[0] !== 0 && scale[1] !== 0) {
    const sx = scale[0]!;
    const sy = -scale[1]!;
    return [tie[3]! - tie[0]! * sx, sx, 0, tie[4]! - tie[1]! * sy, 0, sy];
  }
  if (matrix && matrix.length === 16) {
    return [matrix[3]!, matrix[0]!, matrix[1]!, matrix[7]!, matrix[4]!, matrix[5]!];
  }
  if (tie && tie.length >= 6) {
    throw new GeoreferenceError('control-points', `The file is placed by ground control points, not by a regular grid. ${WARP_HINT}`);
  }
  throw new GeoreferenceError(
    'no-georeferencing',
    'The file has no georeferencing: nothing says where its cells lie on the ground. Export the elevation model as a GeoTIFF with its position and coordinate system.',
  );
}

function readCrsCode(keys: Readonly<Record<string, unknown>>, modelType: unknown): { epsgCode: number | null; isGeographic: boolean } {
  const projected = keys['ProjectedCSTypeGeoKey'];
  const geographic = keys['GeographicTypeGeoKey'];
  if (isEpsgCode(projected)) return { epsgCode: projected, isGeographic: false };
  // A projected model on a user-defined projection names only its base geographic CRS, whose
  // code does not describe the projected coordinates.
  if (modelType !== 1 && isEpsgCode(geographic)) return { epsgCode: geographic, isGeographic: true };
  return { epsgCode: null, isGeographic: modelType === 2 };
}

function isEpsgCode(value: unknown): value is number {
  return typeof value === 'number' && Number.isInteger(value) && value >= 1024 && value <= 32766;
}
