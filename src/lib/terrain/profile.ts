/**
 * Ground profiles along a line: heights by bilinear interpolation between cell centres.
 */
import { checkGridTransform, toCell, type GridTransform } from './grid-transform';
import { checkElevationGrid, type ElevationGrid } from './raster';

/** One point of an {@link ElevationProfile}. */
export interface ProfileSample {
  /** Distance along the line from its first vertex, in CRS units (metres for a projected CRS). */
  readonly chainageM: number;
  /** CRS easting of the sample. */
  readonly x: number;
  /** CRS northing of the sample. */
  readonly y: number;
  /** Ground height in metres, or null where the line is off the model or meets nodata (a gap). */
  readonly elevationM: number | null;
}

/** Heights along a polyline, first vertex first. */
export interface ElevationProfile {
  /** Samples in order along the line; every vertex of the line is one of them. */
  readonly samples: ProfileSample[];
  /** For each vertex of the line, the index of its sample in `samples`. */
  readonly vertexSampleIndex: number[];
  /** Length of the line in CRS units (metres for a projected CRS): the last sample's chainage. */
  readonly lengthM: number;
}

/** Sampling of {@link sampleProfile}. */
export interface ProfileOptions {
  /**
   * Largest distance between samples, in CRS units (metres for a projected CRS); default half the
   * smaller cell size of the transform.
   */
  readonly spacingM?: number;
}

/** A profile longer than this many samples is a mistake (a spacing far too small for the line). */
const MAX_SAMPLES = 10_000_000;

/**
 * Ground height at a CRS point by bilinear interpolation between the four surrounding cell
 * centres (the usual bilinear resampling of GDAL and others; a plane is reproduced exactly).
 *
 * Gaps: null when the point is off the model (beyond its outer edge, or not finite) or when a
 * cell with a non-zero weight is nodata. Cells with zero weight are not read, so a point exactly
 * on a cell centre, or on the line joining two centres, keeps its height beside nodata. In the outer half
 * cell, between the edge cells' centres and the model's edge, the height is held at the edge:
 * interpolated along the edge row or column only (nearest valid neighbours across the edge, as
 * GDAL's bilinear resampling does by renormalising its weights there).
 *
 * @param grid - heights in metres, row 0 northmost, NaN = nodata; not modified
 * @param transform - the grid's georeferencing (CRS of `x`, `y`)
 * @param x - CRS easting
 * @param y - CRS northing
 * @returns the height in metres, or null for a gap
 * @throws RangeError when the grid or transform is malformed
 */
export function bilinearElevationM(grid: ElevationGrid, transform: GridTransform, x: number, y: number): number | null {
  checkElevationGrid(grid);
  checkGridTransform(transform);
  return interpolate(grid, transform, x, y);
}

/**
 * Samples the ground along a polyline in the grid's CRS: every vertex, and between vertices
 * evenly spaced points at most `spacingM` apart, each with its chainage, position and height by
 * {@link bilinearElevationM} (null for gaps where the line leaves the model or meets nodata).
 *
 * Chainage is the planar length along the line in CRS units, which is metres along the ground
 * for a projected CRS (the model's own; not for a geographic one). A repeated vertex gives two
 * samples at the same chainage.
 *
 * @param grid - heights in metres, row 0 northmost, NaN = nodata; not modified
 * @param transform - the grid's georeferencing
 * @param line - vertices `[x, y]` (x east, y north) in the grid's CRS, at least two (GeoJSON
 *   positions will do; a third coordinate is ignored); not modified
 * @param options - `spacingM`, the largest step between samples in CRS units
 * @returns the samples, each vertex's sample index, and the line's length
 * @throws RangeError when the grid or transform is malformed, the line has fewer than two vertices
 *   or a non-finite coordinate, the spacing is not a finite positive number, or the profile
 *   would hold more than 10 million samples
 */
export function sampleProfile(
  grid: ElevationGrid,
  transform: GridTransform,
  line: readonly (readonly number[])[],
  options: ProfileOptions = {},
): ElevationProfile {
  checkElevationGrid(grid);
  checkGridTransform(transform);
  const spacingM = options.spacingM ?? Math.min(transform.cellSizeX, transform.cellSizeY) / 2;
  if (!(Number.isFinite(spacingM) && spacingM > 0)) {
    throw new RangeError(`profile spacingM must be a finite distance > 0 in CRS units, got ${spacingM}`);
  }
  const vertices = line.length;
  if (vertices < 2) throw new RangeError(`a profile line needs at least two vertices, got ${vertices}`);
  const xs = new Float64Array(vertices);
  const ys = new Float64Array(vertices);
  const segmentM = new Float64Array(vertices - 1);
  const steps = new Float64Array(vertices - 1);
  let total = 1;
  for (let i = 0; i < vertices; i++) {
    const [x, y] = line[i]!;
    if (!(Number.isFinite(x) && Number.isFinite(y))) {
      throw new RangeError(`profile line vertex ${i} must be finite [x, y] in the grid's CRS, got [${x}, ${y}]`);
    }
    xs[i] = x!;
    ys[i] = y!;
    if (i === 0) continue;
    segmentM[i - 1] = Math.hypot(xs[i]! - xs[i - 1]!, ys[i]! - ys[i - 1]!);
    steps[i - 1] = Math.max(1, Math.ceil(segmentM[i - 1]! / spacingM));
    total += steps[i - 1]!;
  }
  if (total > MAX_SAMPLES) {
    throw new RangeError(`profile would hold ${total} samples at ${spacingM} spacing (at most ${MAX_SAMPLES})`);
  }

  const samples: ProfileSample[] = [];
  const vertexSampleIndex: number[] = [];
  const push = (chainageM: number, x: number, y: number) =>
    samples.push({ chainageM, x, y, elevationM: interpolate(grid, transform, x, y) });
  let chainageM = 0;
  for (let i = 0; i < vertices; i++) {
    vertexSampleIndex.push(samples.length);
    push(chainageM, xs[i]!, ys[i]!);
    if (i === vertices - 1) break;
    // Evenly spaced points strictly between this vertex and the next.
    const n = steps[i]!;
    const dx = xs[i + 1]! - xs[i]!;
    const dy = ys[i + 1]! - ys[i]!;
    for (let j = 1; j < n; j++) {
      const t = j / n;
      push(chainageM + segmentM[i]! * t, xs[i]! + dx * t, ys[i]! + dy * t);
    }
    chainageM += segmentM[i]!;
  }
  return { samples, vertexSampleIndex, lengthM: chainageM };
}

/** {@link bilinearElevationM} without the entry checks, for use in loops. */
function interpolate(grid: ElevationGrid, transform: GridTransform, x: number, y: number): number | null {
  const { width, height, data } = grid;
  const [col, row] = toCell(transform, x, y);
  // Written so that NaN coordinates also land here.
  if (!(col >= -0.5 && col <= width - 0.5 && row >= -0.5 && row <= height - 0.5)) return null;
  // The outer half cell is held at the edge row or column.
  const c = Math.min(Math.max(col, 0), width - 1);
  const r = Math.min(Math.max(row, 0), height - 1);
  const c0 = Math.floor(c);
  const r0 = Math.floor(r);
  const fx = c - c0;
  const fy = r - r0;
  let elevationM = 0;
  for (let k = 0; k < 4; k++) {
    const dc = k & 1;
    const dr = k >> 1;
    const weight = (dc ? fx : 1 - fx) * (dr ? fy : 1 - fy);
    if (weight === 0) continue;
    const z = data[(r0 + dr) * width + c0 + dc]!;
    if (Number.isNaN(z)) return null;
    elevationM += weight * z;
  }
  return elevationM;
}
