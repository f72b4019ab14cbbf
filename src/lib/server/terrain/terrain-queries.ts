import type { ElevationAtPoint } from '../../schemas/queries';
import { createFromWgs84, createToWgs84, roundLonLat } from '../../geo/reproject';
import { delineateCatchment, outletCellNear, type Catchment } from '../../terrain/catchment';
import { bilinearElevationM, sampleProfile } from '../../terrain/profile';
import { db } from '../db';
import { NotFoundError } from '../http';
import { loadRunRasters, loadSourceModel } from './run-rasters';

type Covering = { modelId: number; runId: number; crs: string; storedFile: string; cellSizeM: number };

/**
 * The elevation model to use at a point: of the property's models with a finished run whose
 * extent holds the point, the finest (smallest cells) wins.
 * @throws NotFoundError when no model covers the point
 */
export async function modelCovering(propertyId: number, lonLat: [number, number]): Promise<Covering> {
  const [finest] = await modelsCovering(propertyId, lonLat);
  if (!finest) throw new NotFoundError('elevation model', 'No processed elevation model covers this place. Upload one that does, and let its terrain run finish.');
  return finest;
}

/** The property's models with a finished run whose extent holds the point, finest first (one indexed query). */
async function modelsCovering(propertyId: number, [lon, lat]: [number, number]): Promise<Covering[]> {
  const rows = await db()('elevation_models as m')
    .join('terrain_runs as r', 'r.elevation_model_id', 'm.id')
    .where({ 'm.property_id': propertyId, 'r.status': 'succeeded' })
    .andWhere('m.extent_west', '<=', lon)
    .andWhere('m.extent_east', '>=', lon)
    .andWhere('m.extent_south', '<=', lat)
    .andWhere('m.extent_north', '>=', lat)
    .orderBy([{ column: 'm.cell_size_m', order: 'asc' }, { column: 'r.id', order: 'desc' }])
    .select('m.id as modelId', 'r.id as runId', 'm.crs as crs', 'm.stored_file as storedFile', 'm.cell_size_m as cellSizeM');
  // One model may have several finished runs; its heights are the same in each.
  return (rows as Covering[]).filter((row, i, all) => all.findIndex((other) => other.modelId === row.modelId) === i);
}

/** Converters from WGS84 into each model CRS met, kept: proj4 parses its definition once. */
const fromWgs84ByCrs = new Map<string, (lonLat: readonly [number, number]) => [number, number]>();

/**
 * Ground height at a point, by bilinear interpolation between cell centres (`bilinearElevationM`,
 * as the profiles), from the finest processed model that has a height there: where the finest
 * model is nodata or the point lies in its WGS84 extent but off its grid, the next finest is
 * tried. Off every model: all null. Cheap enough to follow the map cursor: one indexed query,
 * and the model's heights come from the in-memory cache (`loadSourceModel`), read from disk once.
 */
export async function elevationAt(propertyId: number, lonLat: [number, number]): Promise<ElevationAtPoint> {
  const candidates = await modelsCovering(propertyId, lonLat);
  for (const covering of candidates) {
    const model = await loadSourceModel(covering.storedFile, covering.crs);
    let toModel = fromWgs84ByCrs.get(model.crs.proj4);
    if (!toModel) fromWgs84ByCrs.set(model.crs.proj4, (toModel = createFromWgs84(model.crs.proj4)));
    const [x, y] = toModel(lonLat);
    const elevationM = bilinearElevationM(model.grid, model.transform, x, y);
    if (elevationM !== null) return { elevationM, modelId: covering.modelId, cellSizeM: covering.cellSizeM };
  }
  const [finest] = candidates;
  return { elevationM: null, modelId: finest?.modelId ?? null, cellSizeM: finest?.cellSizeM ?? null };
}

/**
 * The figures of the catchment draining to a point (snapped to the channel within `snapM`) that
 * flood formulas need, without tracing its outline (a crossing's design needs only these).
 */
export async function catchmentFiguresAt(propertyId: number, lonLat: [number, number], snapM: number) {
  const { covering, catchment, toWgs84 } = await delineateAt(propertyId, lonLat, snapM, false);
  return {
    elevationModelId: covering.modelId,
    terrainRunId: covering.runId,
    outlet: roundLonLat(toWgs84([catchment.outlet.x, catchment.outlet.y])),
    areaHa: catchment.areaM2 / 10_000,
    areaKm2: catchment.areaM2 / 1_000_000,
    longestFlowPathM: catchment.longestFlowPathM,
    equalAreaSlopeMPerKm: catchment.equalAreaSlope * 1000,
  };
}

async function delineateAt(propertyId: number, lonLat: [number, number], snapM: number, outline: boolean) {
  const covering = await modelCovering(propertyId, lonLat);
  const rasters = await loadRunRasters(covering.runId, covering.crs);
  const toWgs84 = createToWgs84(rasters.crs.proj4);
  const point = createFromWgs84(rasters.crs.proj4)(lonLat);
  const delineate = () => delineateCatchment(rasters.grid, rasters.filled, rasters.directions, rasters.accumulation, rasters.transform, point, snapM, { outline });
  let catchment: Catchment | null;
  if (outline) {
    catchment = delineate();
  } else {
    const outlet = outletCellNear(rasters.grid, rasters.accumulation.areaM2, rasters.transform, point, snapM);
    catchment = outlet < 0 ? null : keptFigures(`${covering.runId}:${outlet}`, delineate);
  }
  if (!catchment) throw new NotFoundError('catchment', 'This place lies outside the elevation model or on nodata.');
  return { covering, catchment, toWgs84 };
}

/**
 * Catchments without outline, by terrain run and outlet cell. Walking every upslope cell was most
 * of a fence edit's design work, and an edit that moves a crossing a few metres almost always
 * snaps to the same outlet: the same catchment. A run's rasters never change, so nothing goes stale.
 * Kept without the flow path's vertices (catchmentFiguresAt reads only the figures).
 */
const figuresByOutlet = new Map<string, Catchment | null>();
const KEPT_FIGURES = 5_000;

function keptFigures(key: string, delineate: () => Catchment | null): Catchment | null {
  if (figuresByOutlet.has(key)) return figuresByOutlet.get(key)!;
  const traced = delineate();
  // Only the figures are kept: the flow path's vertices (hundreds of points) are not read from here.
  const catchment = traced && { ...traced, longestFlowPath: [], polygon: [] };
  figuresByOutlet.set(key, catchment);
  if (figuresByOutlet.size > KEPT_FIGURES) figuresByOutlet.delete(figuresByOutlet.keys().next().value!);
  return catchment;
}

/** The catchment draining to a point (snapped to the channel within `snapM`), in WGS84, with the figures flood formulas need. */
export async function catchmentAt(propertyId: number, lonLat: [number, number], snapM: number) {
  const { covering, catchment, toWgs84 } = await delineateAt(propertyId, lonLat, snapM, true);
  return {
    elevationModelId: covering.modelId,
    terrainRunId: covering.runId,
    outlet: roundLonLat(toWgs84([catchment.outlet.x, catchment.outlet.y])),
    outletElevationM: catchment.outlet.elevationM,
    areaM2: catchment.areaM2,
    areaHa: catchment.areaM2 / 10_000,
    areaKm2: catchment.areaM2 / 1_000_000,
    longestFlowPathM: catchment.longestFlowPathM,
    equalAreaSlope: catchment.equalAreaSlope,
    equalAreaSlopeMPerKm: catchment.equalAreaSlope * 1000,
    method: 'D8 upslope cells of the snapped outlet; equal-area slope of the longest flow path (ARR 1987 Book IV)',
    polygon: { type: 'MultiPolygon' as const, coordinates: catchment.polygon.map((poly) => poly.map((ring) => ring.map((xy) => roundLonLat(toWgs84(xy))))) },
    longestFlowPath: { type: 'LineString' as const, coordinates: catchment.longestFlowPath.map((xy) => roundLonLat(toWgs84(xy))) },
  };
}

/**
 * Ground heights along a line given in WGS84, from the finest model covering its midpoint,
 * sampled by bilinear interpolation (default half a cell apart); gaps where the line leaves the
 * model or meets nodata. Chainage is along the line in the model's projected metres.
 */
export async function profileAlong(propertyId: number, line: [number, number][], spacingM?: number) {
  const middle = line[Math.floor(line.length / 2)]!;
  const covering = await modelCovering(propertyId, middle);
  const model = await loadSourceModel(covering.storedFile, covering.crs);
  const toModel = createFromWgs84(model.crs.proj4);
  const toWgs84 = createToWgs84(model.crs.proj4);
  const profile = sampleProfile(model.grid, model.transform, line.map(toModel), spacingM === undefined ? {} : { spacingM });
  return {
    elevationModelId: covering.modelId,
    lengthM: profile.lengthM,
    samples: profile.samples.map((sample) => ({
      chainageM: sample.chainageM,
      position: roundLonLat(toWgs84([sample.x, sample.y])),
      elevationM: sample.elevationM,
    })),
  };
}
