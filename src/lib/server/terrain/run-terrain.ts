import { mkdir, writeFile } from 'node:fs/promises';
import path from 'node:path';
import { createToWgs84, roundLonLat, type ToWgs84 } from '../../geo/reproject';
import { accumulateFlow } from '../../terrain/flow-accumulation';
import { chooseContourIntervalM, traceContours } from '../../terrain/contours';
import { computeFlowDirections } from '../../terrain/flow-direction';
import { fillDepressions } from '../../terrain/fill-depressions';
import { cellCentre, type GridTransform } from '../../terrain/grid-transform';
import { computeHillshade } from '../../terrain/hillshade';
import { traceDrainageLines, type DrainageSegment } from '../../terrain/drainage-lines';
import { readElevationModel, type ElevationModelCrs } from '../elevation/read-elevation-model';
import { encodeGeoTiff } from '../elevation/write-geotiff';
import { encodeHillshadePng } from './hillshade-png';

/** The stages of a terrain run, in order, with their share of the progress bar. */
export const TERRAIN_STAGES = [
  { stage: 'read', label: 'Reading the elevation model', weight: 15 },
  { stage: 'fill', label: 'Filling depressions', weight: 25 },
  { stage: 'directions', label: 'Working out flow directions', weight: 20 },
  { stage: 'accumulation', label: 'Accumulating flow', weight: 10 },
  { stage: 'drainage', label: 'Tracing drainage lines', weight: 10 },
  { stage: 'map', label: 'Drawing hillshade and contours', weight: 20 },
] as const;
export type TerrainStage = (typeof TERRAIN_STAGES)[number]['stage'];

/** Default channel threshold: 5 ha (55 cells of a 30 m model, 2000 of a 5 m one) finds the gullies a fence must cross without every rill. */
export const DEFAULT_THRESHOLD_HA = 5;

export interface TerrainRunInput {
  readonly file: string;
  readonly outDir: string;
  readonly thresholdHa?: number;
  readonly assumeCrs?: string;
  readonly maxCells?: number;
  /** Whether to write the CLI's extra rasters (accumulation, hillshade) as GeoTIFFs; filled and flowdir are always written. */
  readonly writeRasters?: boolean;
}

export interface TerrainRunSummary {
  readonly crs: ElevationModelCrs;
  readonly width: number;
  readonly height: number;
  readonly transform: GridTransform;
  readonly validCells: number;
  readonly minElevationM: number;
  readonly maxElevationM: number;
  readonly thresholdHa: number;
  /** Outer corners in WGS84, clockwise from the north-west: where the hillshade image goes on the map. */
  readonly cornersWgs84: [number, number][];
  readonly boundsWgs84: [number, number, number, number];
  readonly contourIntervalM: number;
  readonly drainage: DrainageSegment[];
  /** The same lines as `drainage`, in WGS84 `[lon, lat]`. */
  readonly drainageWgs84: [number, number][][];
  readonly stageTimesMs: Partial<Record<TerrainStage, number>>;
}

export type ProgressReport = (stage: TerrainStage, percent: number) => void;

/**
 * Runs the terrain chain on one elevation model file: read → fill → flow directions →
 * accumulation → drainage lines → map products (hillshade image, contours). Writes its files
 * into `outDir`; the caller stores the drainage lines.
 *
 * @throws ElevationModelError for a file that cannot be used; RangeError from the core on bad shapes
 */
export async function runTerrain(input: TerrainRunInput, report: ProgressReport = () => {}): Promise<TerrainRunSummary> {
  const thresholdHa = input.thresholdHa ?? DEFAULT_THRESHOLD_HA;
  const times: Partial<Record<TerrainStage, number>> = {};
  let done = 0;
  const stage = async <T>(name: TerrainStage, work: (progress: (fraction: number) => void) => Promise<T> | T): Promise<T> => {
    const weight = TERRAIN_STAGES.find((s) => s.stage === name)!.weight;
    report(name, Math.round(done));
    const started = performance.now();
    const result = await work((fraction) => report(name, Math.round(done + weight * fraction)));
    times[name] = Math.round(performance.now() - started);
    done += weight;
    // Give the event loop a turn so progress messages leave a worker between heavy stages.
    await new Promise((resolve) => setImmediate(resolve));
    return result;
  };

  await mkdir(input.outDir, { recursive: true });
  const model = await stage('read', (progress) =>
    readElevationModel(input.file, { maxCells: input.maxCells, assumeCrs: input.assumeCrs, onProgress: progress }),
  );
  const { grid, transform, crs } = model;
  const epsg = Number(crs.code.split(':')[1]);
  const tiff = { width: grid.width, height: grid.height, transform, epsg, geographic: crs.geographic };

  const filled = await stage('fill', () => fillDepressions(grid));
  const directions = await stage('directions', () => computeFlowDirections(filled, grid));
  const accumulation = await stage('accumulation', () => accumulateFlow(directions, grid));
  const drainage = await stage('drainage', () => traceDrainageLines(grid, filled, directions, accumulation, transform, { thresholdHa }));

  const toWgs84 = createToWgs84(crs.proj4);
  const contourIntervalM = chooseContourIntervalM(model.minElevationM, model.maxElevationM);
  await stage('map', async (progress) => {
    const hillshade = computeHillshade(grid);
    await writeFile(path.join(input.outDir, 'hillshade.png'), encodeHillshadePng(hillshade, grid.width, grid.height));
    progress(0.4);
    const levels = traceContours(grid, { intervalM: contourIntervalM });
    await writeFile(path.join(input.outDir, 'contours.geojson'), JSON.stringify(contoursToGeoJson(levels, transform, toWgs84)));
    progress(0.7);
    await writeFile(path.join(input.outDir, 'drainage.geojson'), JSON.stringify(drainageToGeoJson(drainage, crs.code)));
    // The conditioned surface and the directions are kept for catchment queries after the run.
    const nanTo = (values: Float64Array) => Float32Array.from(values, (z) => (Number.isNaN(z) ? -9999 : z));
    await writeFile(path.join(input.outDir, 'filled.tif'), encodeGeoTiff(nanTo(filled), { ...tiff, nodata: -9999 }));
    await writeFile(path.join(input.outDir, 'flowdir.tif'), encodeGeoTiff(directions, { ...tiff, nodata: 255, description: 'D8: 0 E, 1 SE, 2 S, 3 SW, 4 W, 5 NW, 6 N, 7 NE; 255 outlet or nodata' }));
    if (input.writeRasters) {
      await writeFile(path.join(input.outDir, 'accumulation.tif'), encodeGeoTiff(accumulation.cells, { ...tiff, nodata: 0, description: 'Upstream cells, the cell itself included' }));
      await writeFile(path.join(input.outDir, 'hillshade.tif'), encodeGeoTiff(hillshade, { ...tiff, nodata: 0 }));
    }
  });

  const { originX, originY, cellSizeX, cellSizeY } = transform;
  const east = originX + grid.width * cellSizeX;
  const south = originY - grid.height * cellSizeY;
  const cornersWgs84 = ([[originX, originY], [east, originY], [east, south], [originX, south]] as [number, number][]).map((xy) => roundLonLat(toWgs84(xy)));
  const lons = cornersWgs84.map(([lon]) => lon);
  const lats = cornersWgs84.map(([, lat]) => lat);
  return {
    crs,
    width: grid.width,
    height: grid.height,
    transform,
    validCells: model.validCells,
    minElevationM: model.minElevationM,
    maxElevationM: model.maxElevationM,
    thresholdHa,
    cornersWgs84,
    boundsWgs84: [Math.min(...lons), Math.min(...lats), Math.max(...lons), Math.max(...lats)],
    contourIntervalM,
    drainage,
    drainageWgs84: drainage.map((segment) => segment.coordinates.map((xy) => roundLonLat(toWgs84(xy)))),
    stageTimesMs: times,
  };
}

function contoursToGeoJson(levels: ReturnType<typeof traceContours>, transform: GridTransform, toWgs84: ToWgs84) {
  return {
    type: 'FeatureCollection',
    features: levels
      .filter((level) => level.lines.length > 0)
      .map((level) => ({
        type: 'Feature',
        properties: { elevationM: level.elevationM },
        geometry: {
          type: 'MultiLineString',
          coordinates: level.lines.map((line) => line.map(([col, row]) => roundLonLat(toWgs84(cellCentre(transform, col, row))))),
        },
      })),
  };
}

/** Drainage lines in the model's own CRS, named the way GDAL reads a GeoJSON CRS. */
function drainageToGeoJson(drainage: DrainageSegment[], crsCode: string) {
  return {
    type: 'FeatureCollection',
    crs: { type: 'name', properties: { name: `urn:ogc:def:crs:EPSG::${crsCode.split(':')[1]}` } },
    features: drainage.map(({ coordinates, ...properties }) => ({
      type: 'Feature',
      properties,
      geometry: { type: 'LineString', coordinates },
    })),
  };
}
