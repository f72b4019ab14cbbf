import type { Knex } from 'knex';
import type { DrainageSegment } from '../../terrain/drainage-lines';
import { db } from '../db';

type DrainageRow = {
  id: number;
  property_id: number;
  terrain_run_id: number | null;
  geometry: string;
  stream_order: number;
  upstream_area_start_m2: number;
  upstream_area_end_m2: number;
  length_m: number;
  mean_slope: number;
};

/**
 * Stores a terrain run's drainage lines and drops those of earlier runs over the same elevation
 * model, inside the caller's transaction (a run's lines appear all at once or not at all).
 * Returns the ids of those earlier runs.
 */
export async function replaceDrainageLines(
  trx: Knex,
  input: { propertyId: number; runId: number; elevationModelId: number; segments: DrainageSegment[]; wgs84: [number, number][][] },
): Promise<number[]> {
  const earlierRuns = (await trx('terrain_runs').select('id').where({ elevation_model_id: input.elevationModelId }).whereNot({ id: input.runId })).map((row: { id: number }) => row.id);
  await trx('drainage_lines').whereIn('terrain_run_id', earlierRuns).delete();
  const rows = input.segments.map((segment, index) => {
    const line = input.wgs84[index]!;
    const lons = line.map(([lon]) => lon);
    const lats = line.map(([, lat]) => lat);
    return {
      property_id: input.propertyId,
      terrain_run_id: input.runId,
      geometry: JSON.stringify({ type: 'LineString', coordinates: line }),
      geometry_crs: JSON.stringify({ type: 'LineString', coordinates: segment.coordinates }),
      stream_order: segment.order,
      upstream_area_start_m2: segment.upstreamAreaStartM2,
      upstream_area_end_m2: segment.upstreamAreaEndM2,
      length_m: segment.lengthM,
      mean_slope: segment.meanSlope,
      segment_index: segment.id,
      downstream_index: segment.downstreamId,
      min_lon: Math.min(...lons),
      min_lat: Math.min(...lats),
      max_lon: Math.max(...lons),
      max_lat: Math.max(...lats),
    };
  });
  // SQLite allows a limited number of bound values per statement: insert in chunks.
  await trx.batchInsert('drainage_lines', rows, 200);
  return earlierRuns;
}

/**
 * The property's drainage lines as GeoJSON text in WGS84 (RFC 7946), built around the stored geometry text instead of parsing
 * and printing it again: a big station has tens of thousands of lines, and this is a first load.
 */
export async function drainageLinesGeoJsonText(propertyId: number, trx: Knex = db()): Promise<string> {
  const rows = await trx<DrainageRow>('drainage_lines')
    .where({ property_id: propertyId })
    .orderBy('id')
    .select('id', 'terrain_run_id', 'geometry', 'stream_order', 'upstream_area_start_m2', 'upstream_area_end_m2', 'length_m', 'mean_slope');
  const features = rows.map((row) => {
    const properties = JSON.stringify({
      id: row.id,
      terrainRunId: row.terrain_run_id,
      streamOrder: row.stream_order,
      upstreamAreaStartHa: round(row.upstream_area_start_m2 / 10_000, 3),
      upstreamAreaEndHa: round(row.upstream_area_end_m2 / 10_000, 3),
      lengthM: round(row.length_m, 1),
      meanSlope: round(row.mean_slope, 5),
    });
    return `{"type":"Feature","id":${row.id},"properties":${properties},"geometry":${row.geometry}}`;
  });
  return `{"type":"FeatureCollection","features":[${features.join(',')}]}`;
}

function round(value: number, digits: number): number {
  const factor = 10 ** digits;
  return Math.round(value * factor) / factor;
}
