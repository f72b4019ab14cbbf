/**
 * Build every file of the invented Saltbush Rise demo scenario in memory, from the seed alone:
 * no clock, no `Math.random`, no file or network access. `generate.ts` writes them out.
 */
import { buildSubdivisionPlan, BOUNDARY_INSET_M } from './fence-plan';
import { formatGpx, type GpxPoint } from './gpx-format';
import { encodeElevationGeoTiff } from './geotiff-encode';
import { simulateGpsTrack, type TrackFix } from './gps-track';
import { formatSubdivisionKml } from './kml-format';
import { formatManifest } from './manifest';
import { createMulberry32 } from './prng';
import { toLonLat } from './projection';
import { renderElevationGrid } from './render-elevation';
import { roundLonLat } from './round';
import { EXTENT_SIZE_M, FILE_NAMES, INVENTED_NOTE, ORIGIN_X, ORIGIN_Y, PROPERTY_NAME, type ProjectedPoint } from './scenario-constants';
import { createTerrainModel } from './terrain-model';

/** One output file: its name in `data-samples/` and its bytes. */
export interface ScenarioFile {
  readonly name: string;
  readonly bytes: Uint8Array;
}

/** Start of the boundary drive: 2026-03-14 06:40 local (UTC+10:30), a fixed invented time. */
const BOUNDARY_DRIVE_START_MS = Date.UTC(2026, 2, 13, 20, 10, 0);
/** Start of the creek walk: 2026-03-15 07:30 local (UTC+10:30), a fixed invented time. */
const CREEK_WALK_START_MS = Date.UTC(2026, 2, 14, 21, 0, 0);
/** The boundary drive leaves this gap, metres each side, where the main creek leaves the property. */
const CREEK_GAP_HALF_M = 60;

const encoder = new TextEncoder();

function toGpxPoints(fixes: readonly TrackFix[]): GpxPoint[] {
  return fixes.map((fix) => {
    const [lon, lat] = roundLonLat(toLonLat([fix.x, fix.y]));
    return { lon, lat, eleM: fix.eleM, timeMs: fix.timeMs };
  });
}

/**
 * All files of the demo scenario, in a fixed order.
 *
 * @param seed - the scenario seed
 */
export function buildDemoScenario(seed: number): ScenarioFile[] {
  const model = createTerrainModel(seed);
  const plan = buildSubdivisionPlan(model.network);
  const grid = renderElevationGrid(model);
  const tiff = encodeElevationGeoTiff(
    grid,
    `${PROPERTY_NAME} elevation model, metres, EPSG:7854, 5 m cells, seed ${seed}. ${INVENTED_NOTE}`,
  );

  const main = model.network.creeks[0];
  const exitX = main.points[main.points.length - 1]![0];
  const west = ORIGIN_X + BOUNDARY_INSET_M;
  const east = ORIGIN_X + EXTENT_SIZE_M - BOUNDARY_INSET_M;
  const south = ORIGIN_Y - EXTENT_SIZE_M + BOUNDARY_INSET_M;
  const north = ORIGIN_Y - BOUNDARY_INSET_M;
  const boundaryPath: ProjectedPoint[] = [
    [exitX + CREEK_GAP_HALF_M, south],
    [east, south],
    [east, north],
    [west, north],
    [west, south],
    [exitX - CREEK_GAP_HALF_M, south],
  ];
  const boundaryFixes = simulateGpsTrack(
    boundaryPath,
    {
      startTimeMs: BOUNDARY_DRIVE_START_MS,
      intervalS: 5,
      meanSpeedMPerS: 6,
      speedSpreadMPerS: 1.5,
      horizontalErrorM: 2.5,
      verticalErrorM: 2,
      groundElevationM: model.surfaceElevationM,
    },
    createMulberry32(seed + 1),
  );
  const creekFixes = simulateGpsTrack(
    main.points,
    {
      startTimeMs: CREEK_WALK_START_MS,
      intervalS: 10,
      meanSpeedMPerS: 1.2,
      speedSpreadMPerS: 0.3,
      horizontalErrorM: 3,
      verticalErrorM: 3,
      groundElevationM: model.surfaceElevationM,
    },
    createMulberry32(seed + 2),
  );

  const boundaryGpx = formatGpx({
    name: `${PROPERTY_NAME} — old boundary fence`,
    desc: `Old boundary fence of ${PROPERTY_NAME}, driven anticlockwise from the south fence east of the main creek, leaving out the creek crossing. ${INVENTED_NOTE}`,
    trackName: 'Old boundary fence (driven)',
    trackDesc: `Vehicle GPS, a fix every 5 s, simulated jitter. ${INVENTED_NOTE}`,
    points: toGpxPoints(boundaryFixes),
  });
  const creekGpx = formatGpx({
    name: `${PROPERTY_NAME} — main creek walk`,
    desc: `Walk along the bed of the main creek of ${PROPERTY_NAME}, from the north boundary downstream to the south boundary. ${INVENTED_NOTE}`,
    trackName: 'Main creek bed (walked)',
    trackDesc: `Handheld GPS, a fix every 10 s, simulated jitter. ${INVENTED_NOTE}`,
    points: toGpxPoints(creekFixes),
  });

  const creekName = (id: string) => model.network.creeks.find((c) => c.id === id)?.name ?? id;
  const kml = formatSubdivisionKml({
    name: `${PROPERTY_NAME} — planned paddock subdivision`,
    description: `Planned fence lines and paddocks for ${PROPERTY_NAME}. ${INVENTED_NOTE}`,
    fenceFolderName: 'Planned fence lines',
    fences: plan.fences.map((fence) => ({
      id: fence.id,
      name: fence.name,
      description:
        `Planned fence line. Built to cross the ${creekName(fence.crossing.creekId).toLowerCase()} at ` +
        `${fence.crossing.angleDeg}° to the downstream flow direction, at ` +
        `${fence.crossing.point[0].toFixed(2)} E, ${fence.crossing.point[1].toFixed(2)} N (EPSG:7854). ${INVENTED_NOTE}`,
      data: { status: 'planned', crossesCreek: fence.crossing.creekId, crossingAngleDeg: String(fence.crossing.angleDeg) },
      coordinates: fence.points.map((p) => roundLonLat(toLonLat(p))),
    })),
    paddockFolderName: 'Planned paddocks',
    paddocks: plan.paddocks.map((paddock) => ({
      id: paddock.id,
      name: paddock.name,
      description: `Planned paddock, about ${paddock.areaHa.toFixed(1)} ha. ${INVENTED_NOTE}`,
      data: { areaHa: paddock.areaHa.toFixed(1) },
      coordinates: paddock.ring.map((p) => roundLonLat(toLonLat(p))),
    })),
  });

  const manifest = formatManifest({ model, plan, grid, boundaryFixes, creekFixes });

  return [
    { name: FILE_NAMES.elevationModel, bytes: new Uint8Array(tiff) },
    { name: FILE_NAMES.boundaryTrack, bytes: encoder.encode(boundaryGpx) },
    { name: FILE_NAMES.creekTrack, bytes: encoder.encode(creekGpx) },
    { name: FILE_NAMES.subdivision, bytes: encoder.encode(kml) },
    { name: FILE_NAMES.manifest, bytes: encoder.encode(manifest) },
  ];
}
