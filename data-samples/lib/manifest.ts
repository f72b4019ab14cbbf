/**
 * The manifest of the demo scenario (`saltbush-rise.json`): what each file is, where the property
 * is, and the analytic facts tests and the demo can lean on (creek centrelines, constructed
 * crossing angles). Every value is invented.
 */
import type { SubdivisionPlan } from './fence-plan';
import type { TrackFix } from './gps-track';
import { toLonLat } from './projection';
import { roundLonLat, roundTo, roundXY } from './round';
import {
  CELL_SIZE_M,
  CRS_EPSG,
  EXTENT_SIZE_M,
  FILE_NAMES,
  GRID_HEIGHT,
  GRID_WIDTH,
  INVENTED_NOTE,
  NODATA_VALUE,
  ORIGIN_X,
  ORIGIN_Y,
  PROPERTY_NAME,
  PROPERTY_REGION,
  type ProjectedPoint,
} from './scenario-constants';
import { CELL_NOISE_M, type TerrainModel } from './terrain-model';
import { PLAIN_FALL_SOUTH_M_PER_M, VALLEY_SIDE_SLOPE_M_PER_M } from './terrain-shape';

/** Inputs of the manifest. */
export interface ManifestInput {
  readonly model: TerrainModel;
  readonly plan: SubdivisionPlan;
  readonly grid: Float32Array;
  readonly boundaryFixes: readonly TrackFix[];
  readonly creekFixes: readonly TrackFix[];
}

function polylineLengthM(points: readonly ProjectedPoint[]): number {
  let m = 0;
  for (let i = 1; i < points.length; i++) m += Math.hypot(points[i]![0] - points[i - 1]![0], points[i]![1] - points[i - 1]![1]);
  return m;
}

/** West, south, east, north in WGS84 of the model's extent, from its densified edges. */
function lonLatExtent(): [number, number, number, number] {
  const lons: number[] = [];
  const lats: number[] = [];
  for (let i = 0; i <= 30; i++) {
    const s = (EXTENT_SIZE_M * i) / 30;
    const edges: ProjectedPoint[] = [
      [ORIGIN_X + s, ORIGIN_Y],
      [ORIGIN_X + s, ORIGIN_Y - EXTENT_SIZE_M],
      [ORIGIN_X, ORIGIN_Y - s],
      [ORIGIN_X + EXTENT_SIZE_M, ORIGIN_Y - s],
    ];
    for (const p of edges) {
      const [lon, lat] = toLonLat(p);
      lons.push(lon);
      lats.push(lat);
    }
  }
  return [roundTo(Math.min(...lons), 7), roundTo(Math.min(...lats), 7), roundTo(Math.max(...lons), 7), roundTo(Math.max(...lats), 7)];
}

function trackSummary(fixes: readonly TrackFix[], file: string) {
  return {
    file,
    points: fixes.length,
    startTime: new Date(fixes[0]!.timeMs).toISOString().replace(/\.\d{3}Z$/, 'Z'),
    endTime: new Date(fixes[fixes.length - 1]!.timeMs).toISOString().replace(/\.\d{3}Z$/, 'Z'),
  };
}

/** Put runs of plain numbers (coordinate pairs, extents) on one line to keep the file readable. */
function compactNumberArrays(json: string): string {
  return json.replace(/\[\s*(-?\d[\d.eE+-]*(?:,\s*-?\d[\d.eE+-]*)*)\s*\]/g, (_match, body: string) => `[${body.split(/,\s*/).join(', ')}]`);
}

/**
 * The manifest as JSON text (two-space indent, coordinate pairs on one line, final newline).
 *
 * @param input - the built scenario
 */
export function formatManifest(input: ManifestInput): string {
  const { model, plan, grid } = input;
  let min = Infinity;
  let max = -Infinity;
  let nodataCells = 0;
  for (const v of grid) {
    if (v === NODATA_VALUE) nodataCells++;
    else {
      min = Math.min(min, v);
      max = Math.max(max, v);
    }
  }
  const local = (eastM: number, northM: number): ProjectedPoint => [ORIGIN_X + eastM, ORIGIN_Y - EXTENT_SIZE_M + northM];
  const mainCreek = model.network.creeks[0];
  const manifest = {
    name: PROPERTY_NAME,
    invented: INVENTED_NOTE,
    region: PROPERTY_REGION,
    crs: `EPSG:${CRS_EPSG}`,
    crsName: 'GDA2020 / MGA zone 54',
    seed: model.seed,
    generator: 'data-samples/generate.ts (npm run demo:generate)',
    files: FILE_NAMES,
    cellSizeM: CELL_SIZE_M,
    extent: {
      epsg7854: [ORIGIN_X, ORIGIN_Y - EXTENT_SIZE_M, ORIGIN_X + EXTENT_SIZE_M, ORIGIN_Y],
      wgs84: lonLatExtent(),
      order: '[west, south, east, north]',
    },
    elevationModel: {
      file: FILE_NAMES.elevationModel,
      width: GRID_WIDTH,
      height: GRID_HEIGHT,
      dataType: 'Float32',
      originNorthWestXY: [ORIGIN_X, ORIGIN_Y],
      pixelIsArea: true,
      nodata: NODATA_VALUE,
      nodataCells,
      nodataWhere: 'a small triangle of cells in the south-west corner',
      elevationRangeM: [roundTo(min, 3), roundTo(max, 3)],
    },
    terrain: {
      plainFallToSouthMPerKm: PLAIN_FALL_SOUTH_M_PER_M * 1000,
      valleySideSlopeMPerKm: VALLEY_SIDE_SLOPE_M_PER_M * 1000,
      cellNoiseM: CELL_NOISE_M,
      lowRise: { name: model.rise.name, crestXY: roundXY(local(model.rise.centreEastM, model.rise.centreNorthM)), heightM: model.rise.heightM },
      flats: model.flats.map((flat) => ({
        name: flat.name,
        centreXY: roundXY(local(flat.centreEastM, flat.centreNorthM)),
        radiiM: [flat.radiusEastM, flat.radiusNorthM],
        levelRelativeToPlainM: flat.levelOffsetM,
      })),
    },
    creeks: model.network.creeks.map((creek) => ({
      id: creek.id,
      name: creek.name,
      joins: creek.id === 'main-creek' ? null : { creekId: mainCreek.id, atXY: roundXY(creek.points[creek.points.length - 1]!) },
      lengthM: roundTo(polylineLengthM(creek.points), 1),
      bedDepthBelowPlainM: { upstream: creek.depthUpstreamM, downstream: creek.depthDownstreamM },
      channelProfileM: creek.profile,
      order: 'upstream to downstream',
      centrelineXY: creek.points.map(roundXY),
      centrelineLonLat: creek.points.map((p) => roundLonLat(toLonLat(p))),
    })),
    fenceLines: plan.fences.map((fence) => ({
      id: fence.id,
      name: fence.name,
      status: 'planned',
      lengthM: roundTo(polylineLengthM(fence.points), 1),
      crossing: {
        creekId: fence.crossing.creekId,
        constructedAngleDeg: fence.crossing.angleDeg,
        angleMeaning: 'angle between the fence and the downstream flow direction of the creek segment it crosses; 90 = square',
        pointXY: roundXY(fence.crossing.point),
        pointLonLat: roundLonLat(toLonLat(fence.crossing.point)),
        creekSegmentIndex: fence.crossing.creekSegment,
      },
      pointsXY: fence.points.map(roundXY),
      pointsLonLat: fence.points.map((p) => roundLonLat(toLonLat(p))),
    })),
    paddocks: plan.paddocks.map((paddock) => ({
      id: paddock.id,
      name: paddock.name,
      areaHa: roundTo(paddock.areaHa, 2),
      ringXY: paddock.ring.map(roundXY),
      ringLonLat: paddock.ring.map((p) => roundLonLat(toLonLat(p))),
    })),
    tracks: {
      oldBoundary: trackSummary(input.boundaryFixes, FILE_NAMES.boundaryTrack),
      mainCreekWalk: trackSummary(input.creekFixes, FILE_NAMES.creekTrack),
    },
  };
  return `${compactNumberArrays(JSON.stringify(manifest, null, 2))}\n`;
}
