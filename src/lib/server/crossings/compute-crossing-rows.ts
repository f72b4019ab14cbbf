import { designCrossing, type CrossingDesign } from '../../crossings/design-crossing';
import { findCrossings } from '../../crossings/geometry/find-crossings';
import type { Crossing } from '../../crossings/geometry/types';
import { crossingInputsSchema, DEFAULT_DESIGN_SETTINGS, type CrossingInputs } from '../../schemas/crossing';
import type { FenceLine } from '../../schemas/plan';
import { db } from '../db';
import { NotFoundError } from '../http';
import { listFenceLines } from '../repos/fence-lines';
import { getPropertySettings } from '../repos/property-settings';
import { catchmentFiguresAt, profileAlong } from '../terrain/terrain-queries';
import { positionsOfLayout, type LayoutPositions } from '../../crossings/layout-positions';
import { crossingRow, runsAlongRow } from './crossing-row';

type DrainageRow = { id: number; property_id: number; geometry: string; stream_order: number; upstream_area_start_m2: number; upstream_area_end_m2: number; mean_slope: number };
type OldCrossing = { id: number; fence_line_id: number; drainage_line_id: number | null; kind: string; chainage_m: number; inputs: string };
export type StoredCrossingPlace = Pick<OldCrossing, 'id' | 'fence_line_id' | 'drainage_line_id' | 'chainage_m'>;

/** A stored design: the core's design plus what the map and exports need. */
export type StoredDesign = CrossingDesign & {
  profile?: { chainageM: number; elevationM: number | null }[];
  positions?: LayoutPositions;
  catchment?: { areaHa: number; longestFlowPathM: number; equalAreaSlopeMPerKm: number; outlet: [number, number] } | null;
};

/** The rows to store for the analysed fence lines, and the crossings they had before. */
export type ComputedCrossings = { rows: Record<string, unknown>[]; designed: number; old: StoredCrossingPlace[] };

/**
 * The same crossing found again keeps its id — and so what the person entered for it, its work
 * order items and its inspection history: the same fence and drainage line within 30 m along the
 * fence, or, once a new terrain run has replaced the drainage lines (which clears the old
 * crossings' link), the same fence within 30 m.
 */
export function matchingCrossing<T extends StoredCrossingPlace>(old: T[], fenceId: number, drainageId: number, chainageM: number): T | undefined {
  const near = (row: T) => row.fence_line_id === fenceId && Math.abs(row.chainage_m - chainageM) < 30;
  return old.find((row) => near(row) && row.drainage_line_id === drainageId) ?? old.find((row) => near(row) && row.drainage_line_id === null);
}

/**
 * Finds and designs the crossings of a property's fence lines (all, or the ones named): reads the
 * plan, the drainage lines and the terrain, and returns the rows without writing them. This is the
 * CPU-heavy part of an analysis; the server runs it in a worker thread (analysis-worker.ts).
 */
export async function computeCrossingRows(propertyId: number, fenceLineIds?: number[]): Promise<ComputedCrossings> {
  const settings = { ...DEFAULT_DESIGN_SETTINGS, ...(await getPropertySettings(propertyId)).designSettings };
  const ifd = (await getPropertySettings(propertyId)).ifdTable;
  const fences = (await listFenceLines(propertyId)).filter((fence) => fence.status !== 'retired' && (!fenceLineIds || fenceLineIds.includes(fence.id)));
  const drainageRows = await db()<DrainageRow>('drainage_lines').where({ property_id: propertyId });
  const drainage = drainageRows.map((row) => ({
    id: row.id,
    coordinates: (JSON.parse(row.geometry) as { coordinates: [number, number][] }).coordinates,
    streamOrder: row.stream_order,
    upstreamAreaStartM2: row.upstream_area_start_m2,
    upstreamAreaEndM2: row.upstream_area_end_m2,
  }));
  const slopeOf = new Map(drainageRows.map((row) => [row.id, row.mean_slope]));
  const found = fences.length && drainage.length ? findCrossings(fences, drainage, { goodWithinDeg: settings.goodWithinDeg, fairWithinDeg: settings.fairWithinDeg }) : { crossings: [], runsAlong: [] };

  const fenceIds = fences.map((fence) => fence.id);
  const old = fenceIds.length ? await db()<OldCrossing>('crossings').whereIn('fence_line_id', fenceIds).select('id', 'fence_line_id', 'drainage_line_id', 'kind', 'chainage_m', 'inputs') : [];
  const matchOf = (fenceId: number, drainageId: number, chainageM: number) => matchingCrossing(old, fenceId, drainageId, chainageM);
  const inputsFor = (crossing: Crossing): CrossingInputs => {
    const match = matchOf(Number(crossing.fenceId), Number(crossing.drainageId), crossing.fenceChainageM);
    const parsed = crossingInputsSchema.safeParse(match ? JSON.parse(match.inputs) : {});
    return parsed.success ? parsed.data : {};
  };

  const rows: Record<string, unknown>[] = [];
  let designed = 0;
  for (const fence of fences) {
    const own = found.crossings.filter((crossing) => crossing.fenceId === fence.id);
    const profile = own.some((crossing) => crossing.kind === 'crossing') ? await fenceProfile(propertyId, fence) : null;
    for (const crossing of own) {
      // Each design is a few milliseconds of arithmetic; between them the server answers others.
      await new Promise((resolve) => setImmediate(resolve));
      const inputs = inputsFor(crossing);
      const design =
        crossing.kind === 'crossing' && profile
          ? await designAt(propertyId, fence, crossing, inputs, profile, slopeOf.get(Number(crossing.drainageId)) ?? 0, settings, ifd).catch(
              (error: unknown): StoredDesign => {
                // One crossing that cannot be designed must not stop the others: it says why.
                if (!(error instanceof RangeError)) console.error(`[gullyline] crossing on fence ${fence.id} at ${crossing.fenceChainageM.toFixed(0)} m:`, error);
                return { status: 'failed', problem: error instanceof RangeError ? error.message : 'This crossing could not be designed because of an error on our side.', cautions: [] };
              },
            )
          : null;
      if (design?.status === 'designed') designed += 1;
      rows.push(crossingRow({ propertyId, crossing, design, inputs, computedAt: new Date().toISOString() }));
    }
  }
  for (const along of found.runsAlong) {
    const fence = fences.find((f) => f.id === along.fenceId)!;
    const at = fence.coordinates[0]!;
    rows.push(runsAlongRow({ propertyId, fenceLineId: fence.id, drainageLineId: Number(along.drainageId), at, along, computedAt: new Date().toISOString() }));
  }
  return { rows, designed, old: old.map(({ id, fence_line_id, drainage_line_id, chainage_m }) => ({ id, fence_line_id, drainage_line_id, chainage_m })) };
}

type FenceProfile = { samples: { chainageM: number; position: [number, number]; elevationM: number | null }[] } | null;

async function fenceProfile(propertyId: number, fence: FenceLine): Promise<FenceProfile> {
  try {
    return await profileAlong(propertyId, fence.coordinates, 1);
  } catch (error) {
    if (error instanceof NotFoundError) return null; // no processed model covers the fence
    throw error;
  }
}

async function designAt(
  propertyId: number,
  fence: FenceLine,
  crossing: Crossing,
  inputs: CrossingInputs,
  profile: NonNullable<FenceProfile>,
  channelSlope: number,
  settings: typeof DEFAULT_DESIGN_SETTINGS,
  ifd: Awaited<ReturnType<typeof getPropertySettings>>['ifdTable'],
): Promise<StoredDesign> {
  // The crossing's chainage on the profile: the sample nearest the crossing point.
  const [lon, lat] = crossing.position;
  let nearest = profile.samples[0]!;
  for (const sample of profile.samples) {
    if (Math.hypot(sample.position[0] - lon, sample.position[1] - lat) < Math.hypot(nearest.position[0] - lon, nearest.position[1] - lat)) nearest = sample;
  }
  // A little wider than the section's half-width, so the section is never cut short by the window.
  const window = profile.samples.filter((s) => Math.abs(s.chainageM - nearest.chainageM) <= settings.profileHalfWidthM + 5);
  const catchment = await catchmentFiguresAt(propertyId, crossing.position, 30).catch(() => null);
  const design = designCrossing({
    profile: window.map(({ chainageM, elevationM }) => ({ chainageM, elevationM })),
    crossingChainageM: nearest.chainageM,
    crossingAngleDeg: crossing.crossingAngleDeg,
    channelSlope,
    catchment: catchment && { areaKm2: catchment.areaKm2, mainStreamLengthKm: catchment.longestFlowPathM / 1000, equalAreaSlopeMPerKm: catchment.equalAreaSlopeMPerKm },
    ifd,
    fence: fence.wireSpec,
    inputs,
    settings,
  });
  return {
    ...design,
    profile: window.map(({ chainageM, elevationM }) => ({ chainageM, elevationM })),
    positions: design.status === 'designed' ? positionsOfLayout(design.layout, profile.samples) : undefined,
    catchment: catchment && { areaHa: catchment.areaHa, longestFlowPathM: catchment.longestFlowPathM, equalAreaSlopeMPerKm: catchment.equalAreaSlopeMPerKm, outlet: catchment.outlet },
  };
}

