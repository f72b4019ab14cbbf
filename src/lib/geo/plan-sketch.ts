import type { FeatureCollection } from 'geojson';

/** A plan drawn to a box in pixels, ready for SVG: lines as `points` strings, marks as x/y. */
export interface PlanSketch {
  readonly widthPx: number;
  readonly heightPx: number;
  readonly lines: readonly { readonly points: string; readonly status: string; readonly name: string }[];
  readonly crossings: readonly { readonly x: number; readonly y: number; readonly tag: string }[];
  readonly layoutPoints: readonly { readonly x: number; readonly y: number; readonly kind: string }[];
  /** A round length of ground and its width on the sketch, for a scale bar. */
  readonly scaleBar: { readonly lengthM: number; readonly lengthPx: number };
}

/** Metres per degree on the WGS84 sphere of mean radius 6 371 008.8 m (IUGG mean Earth radius, Moritz 2000). */
const METRES_PER_DEGREE = (6_371_008.8 * Math.PI) / 180;

/**
 * Draws the fence lines, crossings and layout points of a plan GeoJSON (as `planToGeoJson` writes
 * it) into a `widthPx` × `heightPx` box, north up, one scale for both axes. The projection is a
 * local equirectangular one about the middle latitude (longitudes shrunk by its cosine), which
 * over the few kilometres of a work order is within a fraction of a percent of true distances;
 * good for a printed sketch, not for setting out (the GPX file is for that).
 *
 * @param collection - features with `[lon, lat]` WGS84 positions and a `featureType` property; not modified
 * @param widthPx - box width, pixels (> 2 × paddingPx)
 * @param heightPx - box height, pixels (> 2 × paddingPx)
 * @param paddingPx - margin kept clear on every side
 * @throws RangeError when the box is too small for its padding
 */
export function sketchPlan(collection: FeatureCollection, widthPx: number, heightPx: number, paddingPx = 16): PlanSketch {
  if (!(widthPx > 2 * paddingPx && heightPx > 2 * paddingPx)) throw new RangeError(`the sketch box ${widthPx} × ${heightPx} px leaves no room inside a ${paddingPx} px padding`);
  const positions: number[][] = [];
  for (const feature of collection.features) {
    if (feature.geometry.type === 'Point') positions.push(feature.geometry.coordinates);
    else if (feature.geometry.type === 'LineString') positions.push(...feature.geometry.coordinates);
  }
  const empty = { widthPx, heightPx, lines: [], crossings: [], layoutPoints: [], scaleBar: { lengthM: 0, lengthPx: 0 } };
  if (positions.length === 0) return empty;
  const lons = positions.map((p) => p[0]!);
  const lats = positions.map((p) => p[1]!);
  const [west, east, south, north] = [Math.min(...lons), Math.max(...lons), Math.min(...lats), Math.max(...lats)];
  const cosLat = Math.cos((((south + north) / 2) * Math.PI) / 180);
  const spanXM = Math.max((east - west) * cosLat * METRES_PER_DEGREE, 1);
  const spanYM = Math.max((north - south) * METRES_PER_DEGREE, 1);
  const pxPerM = Math.min((widthPx - 2 * paddingPx) / spanXM, (heightPx - 2 * paddingPx) / spanYM);
  const offsetX = (widthPx - spanXM * pxPerM) / 2;
  const offsetY = (heightPx - spanYM * pxPerM) / 2;
  const project = (p: number[]) => ({
    x: Number((offsetX + (p[0]! - west) * cosLat * METRES_PER_DEGREE * pxPerM).toFixed(1)),
    y: Number((offsetY + (north - p[1]!) * METRES_PER_DEGREE * pxPerM).toFixed(1)),
  });
  const lines: { points: string; status: string; name: string }[] = [];
  const crossings: { x: number; y: number; tag: string }[] = [];
  const layoutPoints: { x: number; y: number; kind: string }[] = [];
  for (const feature of collection.features) {
    const props = feature.properties ?? {};
    if (feature.geometry.type === 'LineString' && props.featureType === 'fence-line') {
      lines.push({ points: feature.geometry.coordinates.map((p) => `${project(p).x},${project(p).y}`).join(' '), status: String(props.status), name: String(props.name) });
    } else if (feature.geometry.type === 'Point' && props.featureType === 'crossing') {
      crossings.push({ ...project(feature.geometry.coordinates), tag: String(props.tag) });
    } else if (feature.geometry.type === 'Point' && props.featureType === 'layout-point') {
      layoutPoints.push({ ...project(feature.geometry.coordinates), kind: String(props.kind) });
    }
  }
  // The largest 1, 2 or 5 × 10ⁿ m that fits in a quarter of the width.
  const maxM = (widthPx / 4) / pxPerM;
  const magnitude = 10 ** Math.floor(Math.log10(maxM));
  const lengthM = [5, 2, 1].map((k) => k * magnitude).find((m) => m <= maxM) ?? magnitude;
  return { widthPx, heightPx, lines, crossings, layoutPoints, scaleBar: { lengthM, lengthPx: Number((lengthM * pxPerM).toFixed(1)) } };
}
