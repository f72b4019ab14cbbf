import { z } from 'zod';

export const FENCE_STATUSES = ['planned', 'approved', 'building', 'built', 'retired'] as const;
export type FenceStatus = (typeof FENCE_STATUSES)[number];

/** The wires and spacings of a fence line. Defaults are common practice for a five-wire stock fence, not a published standard. */
export const wireSpecSchema = z.object({
  wireHeightsM: z.array(z.number().min(0.02).max(2.5)).min(1, 'A fence needs at least one wire.').max(12).default([0.2, 0.4, 0.6, 0.8, 1.05]),
  wireKinds: z.array(z.enum(['plain', 'barbed'])).min(1).max(12).default(['plain', 'plain', 'plain', 'barbed', 'barbed']),
  plainWireTypeId: z.string().min(1).max(60).default('ht-2.50-plain'),
  barbedWireTypeId: z.string().min(1).max(60).default('lt-12.5ga-barbed-2strand'),
  postSpacingM: z.number().min(1).max(30).default(10),
  dropperSpacingM: z.number().min(0.5).max(10).default(2.5),
});
export type WireSpec = z.infer<typeof wireSpecSchema>;

const lonLat = z.tuple([
  z.number().min(-180, 'Longitudes lie between -180 and 180.').max(180, 'Longitudes lie between -180 and 180.'),
  z.number().min(-90, 'Latitudes lie between -90 and 90.').max(90, 'Latitudes lie between -90 and 90.'),
]);

/** Most vertices in one fence line unless the server's MAX_FENCE_VERTICES says otherwise. */
export const MAX_FENCE_VERTICES = 5000;

/** The schemas of a new fence line and of a change to one, for a given vertex limit. */
export function fenceLineSchemas(maxVertices: number = MAX_FENCE_VERTICES) {
  const input = z.object({
    name: z.string().trim().min(1, 'Give the fence line a name.').max(120, 'Keep the name under 120 characters.'),
    status: z.enum(FENCE_STATUSES).default('planned'),
    coordinates: z
      .array(lonLat, { required_error: 'Give the fence line as [[lon, lat], …].' })
      .min(2, 'A fence line needs at least two points.')
      .max(maxVertices, `Keep a fence line under ${maxVertices} points.`),
    wireSpec: wireSpecSchema.default({}),
  });
  return { input, update: input.partial().extend({ version: z.number().int().positive() }) };
}

const defaultSchemas = fenceLineSchemas();
export const fenceLineInputSchema = defaultSchemas.input;
export type FenceLineInput = z.infer<typeof fenceLineInputSchema>;

export const fenceLineUpdateSchema = defaultSchemas.update;

export type FenceLine = {
  id: number;
  name: string;
  status: FenceStatus;
  coordinates: [number, number][];
  lengthM: number;
  wireSpec: WireSpec;
  version: number;
  updatedAt: string;
};
