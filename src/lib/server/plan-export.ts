import { groundAtM } from '../crossings/design/ground-profile';
import type { PlanCrossing, PlanForExport, PlanLayoutPoint } from '../geo/plan-data';
import { planToGeoJson } from '../geo/plan-geojson';
import { planToGpx } from '../geo/plan-gpx';
import { planToKml } from '../geo/plan-kml';
import type { CrossingFloodsView, LayoutPointView } from '../schemas/crossing-view';
import type { Role } from '../schemas/roles';
import { createHash } from 'node:crypto';
import { listCrossingsWithDesignText } from './repos/crossings';
import { keptValue } from './read-cache';
import { listFenceLines } from './repos/fence-lines';
import { getProperty } from './repos/properties';
import { listPaddocks } from './repos/paddocks';

export const PLAN_EXPORT_KINDS = ['geojson', 'kml', 'gpx'] as const;
export type PlanExportKind = (typeof PLAN_EXPORT_KINDS)[number];

const FORMATS: Record<PlanExportKind, { contentType: string; suffix: string; write: (plan: PlanForExport) => string }> = {
  // RFC 7946 §12 registers application/geo+json.
  geojson: { contentType: 'application/geo+json', suffix: 'plan.geojson', write: (plan) => JSON.stringify(planToGeoJson(plan)) },
  kml: { contentType: 'application/vnd.google-earth.kml+xml', suffix: 'plan.kml', write: planToKml },
  gpx: { contentType: 'application/gpx+xml', suffix: 'waypoints.gpx', write: planToGpx },
};

type StoredDesign = { status?: string; floods?: CrossingFloodsView; positions?: LayoutPointView[]; profile?: { chainageM: number; elevationM: number | null }[] };

/**
 * A property's fence lines, paddocks and crossings (with the layout points of designed ones), as the
 * exporters take them. Gathering reads every stored design; the result is kept until the plan
 * changes (read-cache.ts), so repeated exports of an unchanged plan only write the file.
 */
export async function gatherPlan(propertyId: number, role: Role, now: Date = new Date()): Promise<PlanForExport> {
  const plan = await keptValue('plan-export', propertyId, 'plan', () => gatherPlanNow(propertyId, role), (gathered) => JSON.stringify(gathered).length);
  return { ...plan, exportedAt: now.toISOString() };
}

async function gatherPlanNow(propertyId: number, role: Role): Promise<Omit<PlanForExport, 'exportedAt'>> {
  const [property, fenceLines, paddocks, crossings] = await Promise.all([
    getProperty(propertyId, role),
    listFenceLines(propertyId),
    listPaddocks(propertyId),
    listCrossingsWithDesignText(propertyId),
  ]);
  return {
    propertyName: property.name,
    fenceLines,
    paddocks,
    crossings: crossings.map((crossing): PlanCrossing => {
      const { flood, layoutPoints } = designParts(crossing.id, crossing.designText);
      return {
        id: crossing.id,
        fenceLineId: crossing.fenceLineId,
        drainageLineId: crossing.drainageLineId,
        kind: crossing.kind,
        position: crossing.position,
        chainageM: crossing.chainageM,
        angleDeg: crossing.angleDeg,
        angleClass: crossing.angleClass,
        streamOrder: crossing.streamOrder,
        catchmentHa: crossing.upstreamAreaHa,
        designStatus: crossing.designStatus,
        style: crossing.style,
        flood,
        layoutPoints,
      };
    }),
  };
}

type DesignParts = Pick<PlanCrossing, 'flood' | 'layoutPoints'>;

/**
 * What the export takes from each stored design, by crossing, with a digest of the design text it
 * came from: after a fence edit only that line's crossings are parsed again, not every design of
 * the station. Bounded by count; a crossing re-designed gets a new digest and is parsed afresh.
 */
const partsByCrossing = new Map<number, { digest: string; parts: DesignParts }>();
const MAX_KEPT_PARTS = 20_000;

function designParts(crossingId: number, designText: string | null): DesignParts {
  if (!designText) return { flood: null, layoutPoints: [] };
  const digest = createHash('sha1').update(designText).digest('base64');
  const kept = partsByCrossing.get(crossingId);
  if (kept?.digest === digest) return kept.parts;
  const design = JSON.parse(designText) as StoredDesign;
  const floods = design.floods;
  const parts: DesignParts = {
    flood: floods ? { levelM: floods.levelM ?? null, maxDepthM: floods.maxDepthM ?? null, widthM: floods.wettedWidthM ?? null } : null,
    layoutPoints: design.status === 'designed' ? layoutPointsOf(design) : [],
  };
  partsByCrossing.delete(crossingId);
  partsByCrossing.set(crossingId, { digest, parts });
  if (partsByCrossing.size > MAX_KEPT_PARTS) partsByCrossing.delete(partsByCrossing.keys().next().value!);
  return parts;
}

function layoutPointsOf(design: StoredDesign): PlanLayoutPoint[] {
  const profile = design.profile && design.profile.length >= 2 ? design.profile : null;
  return (design.positions ?? []).map((point) => ({
    kind: point.kind,
    label: point.label,
    chainageM: point.chainageM,
    position: point.position,
    braced: point.braced ?? false,
    hungDropperLink: point.link ?? null,
    beyondFence: point.beyondFence ?? false,
    elevationM: profile ? groundAtM(profile, point.chainageM) : null,
  }));
}

/** The property's name as a file name: letters, digits and dashes only. */
export function exportFileName(propertyName: string, propertyId: number, kind: PlanExportKind): string {
  const slug = propertyName
    .normalize('NFKD')
    .replace(/[\u0300-\u036f]/g, '')
    .toLowerCase()
    .replace(/[^a-z0-9]+/g, '-')
    .replace(/^-+|-+$/g, '')
    .slice(0, 60)
    .replace(/-+$/, '');
  return `${slug || `property-${propertyId}`}-${FORMATS[kind].suffix}`;
}

/** The plan file of one kind, as a download: body, content type and file name. */
export async function exportPlan(propertyId: number, role: Role, kind: PlanExportKind) {
  const plan = await gatherPlan(propertyId, role);
  const format = FORMATS[kind];
  return { body: format.write(plan), contentType: format.contentType, fileName: exportFileName(plan.propertyName, propertyId, kind) };
}

/** The plan file as a download (`Content-Disposition: attachment` with the property's name). */
export async function planDownload(propertyId: number, role: Role, kind: PlanExportKind): Promise<Response> {
  const file = await exportPlan(propertyId, role, kind);
  return new Response(file.body, {
    headers: { 'Content-Type': file.contentType, 'Content-Disposition': `attachment; filename="${file.fileName}"`, 'Cache-Control': 'no-store' },
  });
}
