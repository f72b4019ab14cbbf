import type { Feature, FeatureCollection, LineString, Point, Polygon } from 'geojson';
import { orientRing } from './measure';
import { checkPlan, PLAN_EXPORT_FORMAT_VERSION, scopedParts, type PlanForExport, type PlanScope } from './plan-data';
import { numberPlan } from './plan-numbering';

/** What a feature of a plan export is; every feature's properties carry it as `featureType`. */
export type PlanFeatureType = 'fence-line' | 'paddock' | 'crossing' | 'layout-point';

/** The foreign member (RFC 7946 §6.1) that marks a file as a Gullyline plan export. */
export type PlanExportHeader = { formatVersion: number; property: string; exportedAt: string };

export type PlanFeatureCollection = FeatureCollection<LineString | Polygon | Point> & { gullylineExport: PlanExportHeader };

const round = (value: number | null, digits: number) => (value === null ? null : Number(value.toFixed(digits)));

/**
 * A property's plan as an RFC 7946 GeoJSON FeatureCollection: fence lines (LineString), paddocks
 * (Polygon, exterior ring counter-clockwise and holes clockwise, §3.1.6), crossings (Point) and
 * the layout points of each designed crossing (Point). Properties are flat, so GIS programs show
 * them as columns; `featureType` tells the four apart (the README's "Plan exports" lists every
 * property and its unit). Positions are `[lon, lat]` WGS84, written as given (no rounding), so an
 * import gives back the same coordinates. The top-level `gullylineExport` member holds the format
 * version, the property's name and the export time.
 *
 * @param plan - the plan, with the export time from the caller's clock
 * @param scope - only these fence lines and crossings (a work order's), no paddocks; numbered as in the whole plan
 * @throws RangeError when the plan holds a position out of range or an open paddock ring
 */
export function planToGeoJson(plan: PlanForExport, scope?: PlanScope): PlanFeatureCollection {
  checkPlan(plan);
  const numbering = numberPlan(plan);
  const parts = scopedParts(plan, scope);
  const fenceNames = new Map(plan.fenceLines.map((fence) => [fence.id, fence.name]));
  const features: Feature<LineString | Polygon | Point>[] = [];

  for (const fence of parts.fenceLines) {
    features.push({
      type: 'Feature',
      geometry: { type: 'LineString', coordinates: fence.coordinates.map(([lon, lat]) => [lon, lat]) },
      properties: {
        featureType: 'fence-line',
        id: fence.id,
        fenceNo: numbering.fenceNo(fence.id),
        name: fence.name,
        status: fence.status,
        lengthM: round(fence.lengthM, 2),
        wireSpec: structuredClone(fence.wireSpec),
        version: fence.version,
      },
    });
  }

  for (const paddock of parts.paddocks) {
    features.push({
      type: 'Feature',
      geometry: { type: 'Polygon', coordinates: paddock.rings.map((ring, i) => orientRing(ring, i === 0)) },
      properties: { featureType: 'paddock', id: paddock.id, name: paddock.name, areaHa: round(paddock.areaHa, 4) },
    });
  }

  for (const crossing of parts.crossings) {
    features.push({
      type: 'Feature',
      geometry: { type: 'Point', coordinates: [crossing.position[0], crossing.position[1]] },
      properties: {
        featureType: 'crossing',
        id: crossing.id,
        tag: numbering.crossingTag(crossing),
        fenceLineId: crossing.fenceLineId,
        fenceName: fenceNames.get(crossing.fenceLineId) ?? null,
        drainageLineId: crossing.drainageLineId,
        kind: crossing.kind,
        chainageM: round(crossing.chainageM, 2),
        angleDeg: round(crossing.angleDeg, 1),
        angleClass: crossing.angleClass,
        streamOrder: crossing.streamOrder,
        catchmentHa: round(crossing.catchmentHa, 2),
        designStatus: crossing.designStatus,
        style: crossing.style,
        floodLevelM: round(crossing.flood?.levelM ?? null, 2),
        floodMaxDepthM: round(crossing.flood?.maxDepthM ?? null, 2),
        floodWidthM: round(crossing.flood?.widthM ?? null, 2),
      },
    });
  }

  for (const crossing of parts.crossings) {
    for (const point of numbering.namedPoints(crossing)) {
      features.push({
        type: 'Feature',
        geometry: { type: 'Point', coordinates: [point.position[0], point.position[1]] },
        properties: {
          featureType: 'layout-point',
          kind: point.kind,
          waypoint: point.shortName,
          label: point.label,
          crossingId: crossing.id,
          fenceLineId: crossing.fenceLineId,
          chainageM: round(point.chainageM, 2),
          braced: point.braced,
          hungDropperLink: point.hungDropperLink,
          elevationM: round(point.elevationM, 2),
          beyondFence: point.beyondFence,
        },
      });
    }
  }

  return {
    type: 'FeatureCollection',
    gullylineExport: { formatVersion: PLAN_EXPORT_FORMAT_VERSION, property: plan.propertyName, exportedAt: plan.exportedAt },
    features,
  };
}
