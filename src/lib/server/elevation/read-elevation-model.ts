/**
 * Reads an uploaded elevation model (a single-band GeoTIFF of ground heights) from disk with
 * geotiff.js, lazily: the header first, the pixels only when asked, a band of rows at a time.
 *
 * Formats: TIFF 6.0 (Adobe 1992) and BigTIFF; OGC GeoTIFF Standard 1.1 (OGC 19-008r4) for the
 * georeferencing; GDAL's GDAL_NODATA tag (42113, ASCII) for nodata. CRS definitions come from the
 * EPSG registry (epsg-index), see `elevation-crs.ts`. Values and georeferencing are checked
 * against GDAL's own tools in the tests.
 */
import { open, stat } from 'node:fs/promises';
import { fromFile, type GeoTIFF, type GeoTIFFImage } from 'geotiff';
import { GeoreferenceError, readGeoTiffGeoreference, type GeoTiffGeoreference, type RasterTransform } from '../../geo/geotiff-georeference';
import type { ElevationGrid } from '../../terrain/raster';
import { checkCoordinatesFit, elevationCellSizeM, EXAMPLE_CRS_CODES, middleCellSizeM, resolveElevationCrs, type CrsExtent, type ElevationModelCrs } from './elevation-crs';
import { ElevationModelError, type ElevationModelProblem } from './elevation-model-error';
import { checkTiffStructure, formatCount, requireInside } from './tiff-structure';

export type { CrsExtent, ElevationModelCrs } from './elevation-crs';
export { ElevationModelError, type ElevationModelProblem } from './elevation-model-error';

/** Largest model read unless the caller sets `maxCells`: 64 million cells (256 MB as Float32). */
export const DEFAULT_MAX_CELLS = 64_000_000;

export interface ElevationModelOptions {
  /** Refuse models whose header declares more cells than this, before reading any pixel. Default {@link DEFAULT_MAX_CELLS}. */
  readonly maxCells?: number;
  /** `EPSG:<code>` the person has given for a model whose file names no CRS. */
  readonly assumeCrs?: string;
  /** Stops the read between bands of rows. */
  readonly signal?: AbortSignal;
  /** Called after each band of rows with the fraction of rows read, 0…1. */
  readonly onProgress?: (fraction: number) => void;
}

/** Sample types read: one band of these. */
export type ElevationSampleType = 'Int16' | 'UInt16' | 'Int32' | 'Float32' | 'Float64';
/** Compressions read. */
export type ElevationCompression = 'none' | 'LZW' | 'Deflate' | 'PackBits';

/** Facts from the header of an elevation model; no pixel has been read. */
export interface ElevationModelHeader {
  readonly width: number;
  readonly height: number;
  readonly cells: number;
  readonly sampleType: ElevationSampleType;
  readonly compression: ElevationCompression;
  readonly tiled: boolean;
  /** Tile size, or the strip width and rows per strip. */
  readonly blockWidth: number;
  readonly blockHeight: number;
  /** The GDAL_NODATA value, or null when the file has none. */
  readonly nodataValue: number | null;
  /** Null when the file names no CRS and none was assumed: ask the person for an EPSG code. */
  readonly crs: ElevationModelCrs | null;
  /** North-up position in the CRS (cell sizes in CRS units). */
  readonly transform: RasterTransform;
  /** Outer edges of the grid in CRS units. */
  readonly extent: CrsExtent;
  /** Whether the file was PixelIsPoint (the transform is already shifted to cell corners). */
  readonly pixelIsPoint: boolean;
  /** Cell size in metres at the middle row; null while the CRS is unknown. */
  readonly cellSizeM: { readonly westEastM: number; readonly northSouthM: number } | null;
}

/** An elevation model read into memory. */
export interface ElevationModel {
  readonly grid: ElevationGrid;
  readonly transform: RasterTransform;
  readonly crs: ElevationModelCrs;
  readonly nodataValue: number | null;
  /** Cells holding a height (not nodata). */
  readonly validCells: number;
  readonly minElevationM: number;
  readonly maxElevationM: number;
}

const SAMPLE_TYPES: Readonly<Record<string, ElevationSampleType>> = {
  '1/16': 'UInt16',
  '2/16': 'Int16',
  '2/32': 'Int32',
  '3/32': 'Float32',
  '3/64': 'Float64',
};
const COMPRESSIONS: Readonly<Record<number, ElevationCompression>> = { 1: 'none', 5: 'LZW', 8: 'Deflate', 32946: 'Deflate', 32773: 'PackBits' };
const OTHER_COMPRESSIONS: Readonly<Record<number, string>> = {
  2: 'CCITT Huffman', 3: 'CCITT fax 3', 4: 'CCITT fax 4', 6: 'old-style JPEG', 7: 'JPEG', 34712: 'JPEG 2000',
  34887: 'LERC', 34925: 'LZMA', 50000: 'Zstandard', 50001: 'WebP',
};
/** About a million cells per read: bands of whole blocks, each block decoded once. */
const CELLS_PER_READ = 1 << 20;
const REEXPORT = 'Export the elevation model again (for example with gdal_translate) and upload the new file.';

/**
 * Reads the header of an elevation model: size, sample type, layout, nodata, CRS and position.
 * No pixel is read.
 *
 * @param path - the GeoTIFF on disk
 * @param options - `maxCells` and `assumeCrs` as for {@link readElevationModel}
 * @returns the header; `crs` is null when the file names no CRS and none was assumed
 * @throws ElevationModelError (422) when the file is not a usable single-band GeoTIFF
 *   (see {@link ElevationModelProblem}); file-system errors (such as a missing path) pass through
 */
export async function inspectElevationModel(path: string, options: ElevationModelOptions = {}): Promise<ElevationModelHeader> {
  return withModel(path, options, async (_image, header) => header);
}

/**
 * Reads an elevation model into an {@link ElevationGrid}: heights as Float32 (Float64 for a
 * Float64 file; Int32 heights are exact in Float32 up to ±16 777 216), nodata and non-finite
 * samples as NaN, cell sizes in metres (the CRS's metres for a projected model; per row on the
 * CRS's ellipsoid for a geographic one). Samples are taken as metres: scale and offset metadata
 * are not applied.
 *
 * @param path - the GeoTIFF on disk
 * @param options - `maxCells` (default 64 000 000), `assumeCrs` for a file without a CRS,
 *   `signal`, `onProgress`
 * @throws ElevationModelError (422) with a message a person can act on: not a TIFF, truncated,
 *   damaged, too large, several bands or colour, unsupported sample type or compression, not
 *   north-up, no CRS (give `assumeCrs`), CRS not usable, all nodata
 */
export async function readElevationModel(path: string, options: ElevationModelOptions = {}): Promise<ElevationModel> {
  return withModel(path, options, async (image, header) => {
    const crs = header.crs;
    if (!crs) {
      throw new ElevationModelError(
        'missing-crs',
        `This elevation model does not say which coordinate reference system its positions are in. Give its EPSG code (${EXAMPLE_CRS_CODES}) and it will be read in that system.`,
      );
    }
    const { width, height, cells, transform } = header;
    const data = header.sampleType === 'Float64' ? new Float64Array(cells) : new Float32Array(cells);
    const stats = await readHeights(image, header, data, options);
    if (stats.validCells === 0) {
      const marked = header.nodataValue === null ? '' : ` (the file marks ${header.nodataValue} as nodata)`;
      throw new ElevationModelError(
        'all-nodata',
        `This elevation model holds no heights: all ${formatCount(cells)} of its cells are nodata${marked}. Check that the right area and band were exported, and upload it again.`,
      );
    }
    const grid: ElevationGrid = { width, height, data, ...elevationCellSizeM(crs, transform, height) };
    return { grid, transform, crs, nodataValue: header.nodataValue, ...stats };
  });
}

async function withModel<T>(
  path: string,
  options: ElevationModelOptions,
  use: (image: GeoTIFFImage, header: ElevationModelHeader) => Promise<T>,
): Promise<T> {
  const maxCells = options.maxCells ?? DEFAULT_MAX_CELLS;
  if (!(Number.isInteger(maxCells) && maxCells > 0 && maxCells <= 0x7fffffff)) {
    throw new RangeError(`maxCells must be an integer from 1 to 2^31 − 1, got ${maxCells}`);
  }
  const fileSize = (await stat(path)).size;
  const handle = await open(path, 'r');
  try {
    await checkTiffStructure(handle, fileSize);
  } finally {
    await handle.close();
  }
  // fromFile opens a file descriptor that only the GeoTIFF it returns can close; with the
  // signature checked above, its own header parsing has nothing left to fail on in between.
  let tiff: GeoTIFF | undefined;
  try {
    tiff = await fromFile(path);
    // geotiff.js 3.0.5 reads lazily loaded tag arrays (strip and tile offsets beyond the first
    // 1 KB of the directory) as little-endian whatever the file's byte order, so a big-endian file
    // would decode from the wrong offsets. Eager parsing reads them with the file's byte order.
    tiff.parser.eager = true;
    const image = await tiff.getImage(0);
    const header = await readHeader(image, fileSize, maxCells, options.assumeCrs);
    return await use(image, header);
  } catch (error) {
    throw asElevationModelError(error, options.signal);
  } finally {
    await tiff?.close();
  }
}

async function readHeader(image: GeoTIFFImage, fileSize: number, maxCells: number, assumeCrs: string | undefined): Promise<ElevationModelHeader> {
  const directory = image.getFileDirectory();
  const width = image.getWidth();
  const height = image.getHeight();
  if (!(width > 0 && height > 0)) {
    throw new ElevationModelError('damaged', `This GeoTIFF declares an empty image of ${width} × ${height} cells. ${REEXPORT}`);
  }
  const cells = width * height;
  if (cells > maxCells) {
    throw new ElevationModelError(
      'too-large',
      `This elevation model is too large: its header declares ${formatCount(width)} × ${formatCount(height)} = ${formatCount(cells)} cells, and the limit is ${formatCount(maxCells)} cells. Clip it to the property (gdal_translate -projwin) or resample it to larger cells (gdalwarp -tr), and upload it again.`,
    );
  }
  checkSingleBand(image.getSamplesPerPixel(), directory.getValue('PhotometricInterpretation'));
  const sampleType = readSampleType(image.getSampleFormat(0), image.getBitsPerSample(0));
  const compression = readCompression(directory.getValue('Compression') ?? 1);
  const tiled = image.isTiled;
  const blockWidth = image.getTileWidth();
  const blockHeight = image.getTileHeight();
  if (!(blockWidth > 0 && blockHeight > 0)) {
    throw new ElevationModelError('damaged', `This GeoTIFF is damaged: its ${tiled ? 'tile' : 'strip'} size is missing. ${REEXPORT}`);
  }
  const blocks = Math.ceil(height / blockHeight) * (tiled ? Math.ceil(width / blockWidth) : 1);
  await checkBlocksInside(image, tiled, blocks, fileSize);
  const nodataValue = parseNodata(directory.getValue('GDAL_NODATA'));

  const georeference = readGeoreference(image);
  const crs = resolveElevationCrs(georeference.epsgCode, assumeCrs);
  const transform: RasterTransform = {
    originX: georeference.originX,
    originY: georeference.originY,
    cellSizeX: georeference.cellSizeX,
    cellSizeY: georeference.cellSizeY,
  };
  const extent = {
    minX: transform.originX,
    minY: transform.originY - height * transform.cellSizeY,
    maxX: transform.originX + width * transform.cellSizeX,
    maxY: transform.originY,
  };
  if (crs) checkCoordinatesFit(crs, extent, transform);
  const cellSizeM = crs ? middleCellSizeM(crs, transform, extent) : null;
  const pixelIsPoint = georeference.pixelIsPoint;
  return { width, height, cells, sampleType, compression, tiled, blockWidth, blockHeight, nodataValue, crs, transform, extent, pixelIsPoint, cellSizeM };
}

function checkSingleBand(samplesPerPixel: number, photometric: unknown): void {
  const colour = photometric === 2 ? 'an RGB colour image' : photometric === 3 ? 'a picture with a colour table' : photometric !== undefined && photometric !== 0 && photometric !== 1 ? 'a colour image' : null;
  if (samplesPerPixel === 1 && colour === null) return;
  const what = colour === null ? `an image of ${samplesPerPixel} bands` : samplesPerPixel > 1 ? `${colour} of ${samplesPerPixel} bands` : colour;
  throw new ElevationModelError(
    'not-single-band',
    `This file is ${what}, not an elevation model: an elevation model has a single band of ground heights. Upload the elevation model itself (the DEM as delivered), not a picture of it; if the heights are one band of this file, extract that band with gdal_translate -b <band>.`,
  );
}

function readSampleType(format: number, bits: number): ElevationSampleType {
  const type = SAMPLE_TYPES[`${format}/${bits}`];
  if (type) return type;
  const kind = format === 1 ? 'unsigned integer' : format === 2 ? 'signed integer' : format === 3 ? 'floating-point' : format === 5 || format === 6 ? 'complex-number' : 'untyped';
  const why = bits <= 8 && (format === 1 || format === 2) ? ` (${bits} bits hold only ${2 ** bits} different heights)` : '';
  throw new ElevationModelError(
    'unsupported-sample-type',
    `This GeoTIFF stores ${bits}-bit ${kind} samples${why}, which are not read as ground heights. Heights are read from one band of Int16, UInt16, Int32, Float32 or Float64 samples: convert the file, for example with gdal_translate -ot Float32, and upload it again.`,
  );
}

function readCompression(code: number): ElevationCompression {
  const compression = COMPRESSIONS[code];
  if (compression) return compression;
  const name = OTHER_COMPRESSIONS[code] ?? `an unknown method (code ${code})`;
  throw new ElevationModelError(
    'unsupported-compression',
    `This GeoTIFF is compressed with ${name}, which is not read here. Save it uncompressed or with LZW, Deflate or PackBits compression, for example with gdal_translate -co COMPRESS=DEFLATE, and upload it again.`,
  );
}

async function checkBlocksInside(image: GeoTIFFImage, tiled: boolean, blocks: number, fileSize: number): Promise<void> {
  const directory = image.getFileDirectory();
  const offsets = toNumbers(await directory.loadValue(tiled ? 'TileOffsets' : 'StripOffsets'));
  const counts = toNumbers(await directory.loadValue(tiled ? 'TileByteCounts' : 'StripByteCounts'));
  if (!offsets || !counts || offsets.length < blocks || counts.length < blocks) {
    throw new ElevationModelError('damaged', `This GeoTIFF is damaged: the list of where its ${tiled ? 'tiles' : 'strips'} are stored is missing or short. ${REEXPORT}`);
  }
  for (let i = 0; i < blocks; i++) {
    if (counts[i]! > 0) requireInside(offsets[i]! + counts[i]!, fileSize);
  }
}

function toNumbers(value: unknown): number[] | null {
  if (typeof value === 'number') return [value];
  if (value && typeof value === 'object' && 'length' in value) return Array.from(value as ArrayLike<number | bigint>, Number);
  return null;
}

function parseNodata(tag: unknown): number | null {
  if (typeof tag !== 'string') return null;
  const text = tag.replace(/\0/g, '').trim();
  if (text === '') return null;
  if (/^[+-]?nan$/i.test(text)) return Number.NaN;
  const value = Number(text);
  if (Number.isNaN(value)) {
    throw new ElevationModelError('damaged', `This GeoTIFF's nodata tag (GDAL_NODATA) holds "${text.slice(0, 40)}", which is not a number. Set a numeric nodata value (gdal_edit.py -a_nodata -9999) and upload it again.`);
  }
  return value;
}

function readGeoreference(image: GeoTIFFImage): GeoTiffGeoreference {
  const directory = image.getFileDirectory();
  try {
    return readGeoTiffGeoreference({
      modelPixelScale: directory.getValue('ModelPixelScale'),
      modelTiepoint: directory.getValue('ModelTiepoint'),
      modelTransformation: directory.getValue('ModelTransformation'),
      geoKeys: image.getGeoKeys(),
    });
  } catch (error) {
    if (!(error instanceof GeoreferenceError)) throw error;
    const problem: ElevationModelProblem =
      error.problem === 'no-georeferencing' ? 'no-georeferencing' : error.problem === 'geocentric' ? 'unsupported-crs' : error.problem === 'bad-cell-size' ? 'damaged' : 'not-north-up';
    throw new ElevationModelError(problem, error.message);
  }
}

async function readHeights(
  image: GeoTIFFImage,
  header: ElevationModelHeader,
  data: Float32Array | Float64Array,
  { signal, onProgress }: ElevationModelOptions,
): Promise<{ validCells: number; minElevationM: number; maxElevationM: number }> {
  const { width, height, blockHeight, nodataValue, sampleType } = header;
  // Samples are compared with nodata in the file's own type, as GDAL does.
  const nodata = nodataValue === null ? null : sampleType === 'Float32' ? Math.fround(nodataValue) : nodataValue;
  const rowsPerRead = blockHeight * Math.max(1, Math.floor(CELLS_PER_READ / (width * blockHeight)));
  let validCells = 0;
  let minElevationM = Number.POSITIVE_INFINITY;
  let maxElevationM = Number.NEGATIVE_INFINITY;
  for (let firstRow = 0; firstRow < height; firstRow += rowsPerRead) {
    signal?.throwIfAborted();
    const endRow = Math.min(height, firstRow + rowsPerRead);
    const band = await image.readRasters({ window: [0, firstRow, width, endRow], samples: [0], interleave: true, signal });
    if (band.length !== (endRow - firstRow) * width) {
      throw new ElevationModelError('damaged', `This GeoTIFF is damaged: rows ${firstRow + 1}–${endRow} did not decode to ${width} cells each. ${REEXPORT}`);
    }
    const start = firstRow * width;
    for (let i = 0; i < band.length; i++) {
      const sample = band[i]!;
      if (sample === nodata || !Number.isFinite(sample)) {
        data[start + i] = Number.NaN;
        continue;
      }
      data[start + i] = sample;
      const heightM = data[start + i]!;
      validCells++;
      if (heightM < minElevationM) minElevationM = heightM;
      if (heightM > maxElevationM) maxElevationM = heightM;
    }
    onProgress?.(endRow / height);
  }
  return { validCells, minElevationM, maxElevationM };
}

/** Anything thrown while decoding that is not already an ElevationModelError means a damaged file. */
function asElevationModelError(error: unknown, signal: AbortSignal | undefined): unknown {
  if (error instanceof ElevationModelError) return error;
  if (signal?.aborted) return signal.reason;
  // Out of memory for the grid is the server's problem, not the file's.
  if (error instanceof RangeError && /allocation failed/i.test(error.message)) return error;
  const code = error instanceof Error ? (error as NodeJS.ErrnoException).code : undefined;
  if (typeof code === 'string' && /^E[A-Z]+$/.test(code)) return error; // a file-system failure, not the file's content
  return new ElevationModelError('damaged', `This GeoTIFF could not be decoded: its contents are damaged or laid out in a way this reader does not know. ${REEXPORT}`);
}
