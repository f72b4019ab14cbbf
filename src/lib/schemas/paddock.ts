import { z } from 'zod';
import { checkPaddockRings } from '../geo/check-paddock-rings';

const lonLat = z.tuple([
  z.number().min(-180, 'Longitudes lie between -180 and 180.').max(180, 'Longitudes lie between -180 and 180.'),
  z.number().min(-90, 'Latitudes lie between -90 and 90.').max(90, 'Latitudes lie between -90 and 90.'),
]);

export const MAX_PADDOCK_VERTICES = 5000;
export const MAX_PADDOCK_HOLES = 50;

const ring = z
  .array(lonLat, { invalid_type_error: 'Give each ring as [[lon, lat], …].' })
  .min(3, 'A paddock boundary needs at least three corners.')
  .max(MAX_PADDOCK_VERTICES, `Keep a paddock boundary under ${MAX_PADDOCK_VERTICES} corners.`);

/**
 * A paddock's boundary: the outer ring, then any holes, each `[[lon, lat], …]`, closed or not.
 * The output rings are closed, with repeated corners dropped; a ring with fewer than three
 * distinct corners, crossing itself or enclosing no area is refused ring by ring (`rings.<i>`).
 */
export const paddockRingsSchema = z
  .array(ring, { required_error: 'Give the boundary as rings: [[[lon, lat], …]], the outer ring first.', invalid_type_error: 'Give the boundary as rings: [[[lon, lat], …]], the outer ring first.' })
  .min(1, 'Give at least the outer ring of the boundary.')
  .max(MAX_PADDOCK_HOLES + 1, `A paddock may have at most ${MAX_PADDOCK_HOLES} holes.`)
  .transform((rings, ctx) => {
    const checked = checkPaddockRings(rings);
    for (const { ringIndex, message } of checked.problems) {
      ctx.addIssue({ code: z.ZodIssueCode.custom, path: [ringIndex], message: `${ringIndex === 0 ? 'The boundary' : `Hole ${ringIndex}`}: ${message}.` });
    }
    return checked.problems.length ? z.NEVER : checked.rings;
  });

const name = z.string().trim().min(1, 'Give the paddock a name.').max(120, 'Keep the name under 120 characters.');

export const paddockInputSchema = z.object({ name, rings: paddockRingsSchema });
export type PaddockInput = z.infer<typeof paddockInputSchema>;

export const paddockUpdateSchema = z
  .object({ name: name.optional(), rings: paddockRingsSchema.optional(), version: z.number({ required_error: 'Send the version you read (version).' }).int().positive() })
  .refine((changes) => changes.name !== undefined || changes.rings !== undefined, { message: 'Change the name or the boundary (or both).' });
export type PaddockUpdate = z.infer<typeof paddockUpdateSchema>;

/** Make paddocks from the areas closed off by fence lines; by default every fence line that is not retired. */
export const paddocksFromFencesSchema = z.object({
  fenceLineIds: z.array(z.number().int().positive(), { invalid_type_error: 'Give fenceLineIds as a list of fence line ids.' }).min(1, 'Give at least one fence line, or leave fenceLineIds out to use them all.').max(1000).optional(),
});

export type Paddock = {
  id: number;
  name: string;
  /** Outer ring counterclockwise, holes clockwise (RFC 7946), closed, `[lon, lat]`. */
  rings: [number, number][][];
  /** Geodesic area on WGS84 (GeographicLib), holes subtracted. */
  areaHa: number;
  version: number;
  updatedAt: string;
};

export type PaddocksFromFencesResult = {
  /** The paddocks made, one per enclosed area not already inside a paddock. */
  paddocks: Paddock[];
  /** Enclosed areas found. */
  enclosedAreas: number;
  /** Of those, areas left out because they already lie inside a paddock. */
  alreadyCovered: number;
};
