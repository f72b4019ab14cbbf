/**
 * Shaded relief by Horn's method, grey for grey as GDAL's `gdaldem hillshade`.
 */
import { hornDifferences, type HornOptions } from './slope';
import type { ElevationGrid } from './raster';

/** Light and exaggeration for {@link computeHillshade}; the defaults are gdaldem's. */
export interface HillshadeOptions extends HornOptions {
  /** Direction the light comes from, degrees clockwise from north (default 315, the north-west). */
  readonly azimuthDeg?: number;
  /** Height of the light above the horizon, degrees (default 45). */
  readonly altitudeDeg?: number;
  /** Vertical exaggeration applied to the heights (default 1). */
  readonly zFactor?: number;
}

/**
 * Grey shaded relief for every cell: 1 (facing away from the light) to 255 (facing it), 0 =
 * nodata, equal to `gdaldem hillshade` (GDAL 3.6, default Horn algorithm, `-s 1`) on a projected
 * model, with the same azimuth, altitude and `-z`, and `computeEdges` as `-compute_edges`.
 *
 * With the Horn differences x = (west − east) / cell width and y = (north − south) / cell height
 * (see {@link hornDifferences}), z' = zFactor / 8, azimuth A and altitude h, gdaldem's formula is
 *
 *   c = 254 · (sin h − z' cos h · (y cos A − x sin A)) / √(1 + z'² (x² + y²)),
 *   grey = c ≤ 0 ? 1 : 1 + c, rounded half up to a byte,
 *
 * the cosine of the angle between the ground's normal and the light, scaled to 1..255 (so flat
 * ground is 1 + 254 sin h: 181 at h = 45°). Edge cells and cells next to nodata are nodata (0)
 * unless `computeEdges`. The cell width is taken per row (`cellWidthM[row]`), so a geographic
 * model's narrowing cells are honoured, which gdaldem's single `-s` scale does not do.
 *
 * Method: Horn (1981), "Hill shading and the reflectance map", Proceedings of the IEEE 69(1):14–47;
 * formula and conventions of GDAL `apps/gdaldem_lib.cpp` (`GDALHillshadeAlg`).
 *
 * @param grid - heights in metres, row 0 northmost, NaN = nodata; not modified
 * @param options - light direction and height in degrees, vertical exaggeration, edge handling
 * @returns a new Uint8Array of `width × height` greys, row-major, 0 = nodata
 * @throws RangeError when the grid's shape is inconsistent or an option is not finite
 */
export function computeHillshade(grid: ElevationGrid, options: HillshadeOptions = {}): Uint8Array {
  const { azimuthDeg = 315, altitudeDeg = 45, zFactor = 1 } = options;
  for (const [name, value] of [
    ['azimuthDeg', azimuthDeg],
    ['altitudeDeg', altitudeDeg],
    ['zFactor', zFactor],
  ] as const) {
    if (!Number.isFinite(value)) throw new RangeError(`${name} must be a finite number, got ${value}`);
  }
  const { westMinusEastM, southMinusNorthM } = hornDifferences(grid, options);
  const { width, height, cellWidthM, cellHeightM } = grid;

  // gdaldem's precomputed factors (GDALCreateHillshadeData).
  const toRad = Math.PI / 180;
  const zScale = zFactor / 8;
  const cosAltZ = Math.cos(altitudeDeg * toRad) * zScale;
  const sinAlt254 = 254 * Math.sin(altitudeDeg * toRad);
  const cosAzCosAltZ254 = 254 * Math.cos(azimuthDeg * toRad) * cosAltZ;
  const sinAzCosAltZ254 = 254 * Math.sin(azimuthDeg * toRad) * cosAltZ;
  const squareZ = zScale * zScale;
  // gdaldem divides by the geotransform's north–south size, negative for a north-up grid.
  const invNs = 1 / -cellHeightM;

  const grey = new Uint8Array(width * height);
  for (let row = 0; row < height; row++) {
    const invEw = 1 / cellWidthM[row]!;
    for (let i = row * width; i < (row + 1) * width; i++) {
      const wme = westMinusEastM[i]!;
      if (Number.isNaN(wme)) continue; // 0 = nodata
      const x = wme * invEw;
      const y = southMinusNorthM[i]! * invNs;
      const c254 = (sinAlt254 - (y * cosAzCosAltZ254 - x * sinAzCosAltZ254)) / Math.sqrt(1 + squareZ * (x * x + y * y));
      const shade = c254 <= 0 ? 1 : 1 + c254;
      // gdaldem returns a float and GDAL writes it to the Byte band rounding half up.
      grey[i] = Math.min(255, Math.floor(Math.fround(Math.fround(shade) + 0.5)));
    }
  }
  return grey;
}
