import { z } from 'zod';

export const TERRAIN_RUN_STATUSES = ['queued', 'running', 'succeeded', 'failed', 'cancelled'] as const;
export type TerrainRunStatus = (typeof TERRAIN_RUN_STATUSES)[number];

/** The drainage threshold a person may set, hectares. */
export const thresholdHaSchema = z.coerce
  .number({ invalid_type_error: 'Give the drainage threshold in hectares, e.g. 2.' })
  .min(0.05, 'Use a drainage threshold of at least 0.05 ha.')
  .max(100_000, 'Use a drainage threshold under 100 000 ha.');

export const uploadQuerySchema = z.object({
  name: z
    .string({ required_error: 'Give the file name (name=…).' })
    .trim()
    .min(1, 'Give the file name (name=…).')
    .max(200, 'Keep the file name under 200 characters.'),
  crs: z
    .string()
    .trim()
    .toUpperCase()
    .regex(/^EPSG:\d{4,6}$/, 'Write the coordinate system as an EPSG code, like EPSG:7854.')
    .optional(),
  thresholdHa: thresholdHaSchema.optional(),
});

export const rerunSchema = z.object({ elevationModelId: z.number().int().positive(), thresholdHa: thresholdHaSchema.optional() });

export type TerrainRun = {
  id: number;
  elevationModelId: number;
  status: TerrainRunStatus;
  stage: string | null;
  stageLabel: string | null;
  percent: number;
  message: string | null;
  thresholdHa: number;
  createdAt: string;
  startedAt: string | null;
  finishedAt: string | null;
  summary: TerrainRunSummaryView | null;
};

/** What a finished run tells the map and the panels. */
export type TerrainRunSummaryView = {
  cornersWgs84: [number, number][];
  boundsWgs84: [number, number, number, number];
  contourIntervalM: number;
  minElevationM: number;
  maxElevationM: number;
  drainageLineCount: number;
  stageTimesMs: Record<string, number>;
};

export type ElevationModelView = {
  id: number;
  name: string;
  sizeBytes: number;
  crs: string;
  crsName: string;
  width: number;
  height: number;
  cellSizeM: number;
  boundsWgs84: [number, number, number, number];
  createdAt: string;
  /** The newest run, whatever its state (drives the progress bar). */
  latestRun: TerrainRun | null;
  /** The newest run that finished: its drainage lines and map are the ones shown. */
  currentRun: TerrainRun | null;
};
