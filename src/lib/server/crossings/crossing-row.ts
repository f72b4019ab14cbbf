import type { Crossing } from '../../crossings/geometry/types';

type DesignLike = {
  status: string;
  catchment?: { areaHa: number } | null;
  provisional?: boolean;
  floods?: { levelM?: number | null } | null;
  layout?: { style?: string; floodgate?: { lengthM?: number } | null } | null;
} & Record<string, unknown>;

/**
 * The `crossings` row of one found crossing and its design (or none): the analysis writes these,
 * and so does the map benchmark's generated property. With no design the status says why.
 */
export function crossingRow(input: { propertyId: number; crossing: Crossing; design: DesignLike | null; inputs: unknown; computedAt: string }) {
  const { propertyId, crossing, design, inputs, computedAt } = input;
  const extras = { flowBearingDeg: crossing.flowBearingDeg, fenceSegmentIndex: crossing.fenceSegmentIndex, touchReason: crossing.touchReason };
  return {
    property_id: propertyId,
    fence_line_id: Number(crossing.fenceId),
    drainage_line_id: Number(crossing.drainageId),
    kind: crossing.flags.includes('crosses-twice') ? 'crosses-twice' : crossing.kind,
    lon: crossing.position[0],
    lat: crossing.position[1],
    chainage_m: crossing.fenceChainageM,
    angle_deg: crossing.crossingAngleDeg,
    angle_class: crossing.angleClass,
    // The catchment traced at the crossing beats the drainage line's area interpolated by length.
    upstream_area_m2: design?.catchment ? design.catchment.areaHa * 10_000 : crossing.upstreamAreaM2,
    stream_order: crossing.streamOrder,
    inputs: JSON.stringify(inputs),
    design: JSON.stringify(design ? { ...design, ...extras } : extras),
    design_status: design?.status ?? (crossing.kind === 'touch' ? 'touch' : 'no-terrain'),
    // Copies of the figures the crossing list shows, so listing never parses whole designs.
    design_provisional: Boolean(design?.provisional),
    design_style: design?.layout?.style ?? null,
    design_flood_level_m: design?.floods?.levelM ?? null,
    design_floodgate_length_m: design?.layout?.floodgate?.lengthM ?? null,
    computed_at: computedAt,
  };
}

/**
 * The `crossings` row of a stretch where a fence runs along a drainage line (no design): with the
 * same columns as a designed crossing's, so rows can be inserted together.
 */
export function runsAlongRow(input: {
  propertyId: number;
  fenceLineId: number;
  drainageLineId: number;
  at: [number, number];
  along: { fromChainageM: number; toChainageM: number; lengthM: number };
  computedAt: string;
}) {
  const { propertyId, fenceLineId, drainageLineId, at, along, computedAt } = input;
  return {
    property_id: propertyId,
    fence_line_id: fenceLineId,
    drainage_line_id: drainageLineId,
    kind: 'runs-along',
    lon: at[0],
    lat: at[1],
    chainage_m: along.fromChainageM,
    inputs: '{}',
    design: JSON.stringify({ fromChainageM: along.fromChainageM, toChainageM: along.toChainageM, lengthM: along.lengthM }),
    design_status: 'runs-along',
    computed_at: computedAt,
    design_provisional: false,
    design_style: null,
    design_flood_level_m: null,
    design_floodgate_length_m: null,
  };
}
