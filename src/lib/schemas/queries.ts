import { z } from 'zod';

const lon = z.coerce.number({ invalid_type_error: 'Give lon as a number of degrees.' }).min(-180, 'lon must be between -180 and 180.').max(180, 'lon must be between -180 and 180.');
const lat = z.coerce.number({ invalid_type_error: 'Give lat as a number of degrees.' }).min(-90, 'lat must be between -90 and 90.').max(90, 'lat must be between -90 and 90.');

export const catchmentQuerySchema = z.object({
  lon,
  lat,
  snapM: z.coerce.number().min(0, 'snapM must be 0 or more metres.').max(500, 'Keep snapM under 500 m.').default(30),
});

export const profileRequestSchema = z.object({
  line: z.array(z.tuple([lon, lat]), { required_error: 'Give the line as [[lon, lat], …].' }).min(2, 'A line needs at least two points.').max(10_000, 'Keep the line under 10 000 points.'),
  spacingM: z.number().positive('spacingM must be more than 0 m.').max(1000).optional(),
});

/** A query parameter in degrees: missing, empty or not a number is refused (not read as 0). */
const degrees = (name: 'lon' | 'lat', limit: number) =>
  z.preprocess(
    (value) => (value === undefined || value === '' ? undefined : Number(value)),
    z
      .number({ required_error: `Give ${name}=… in degrees.`, invalid_type_error: `Give ${name} as a number of degrees.` })
      .min(-limit, `${name} must be between -${limit} and ${limit}.`)
      .max(limit, `${name} must be between -${limit} and ${limit}.`),
  );

export const elevationQuerySchema = z.object({ lon: degrees('lon', 180), lat: degrees('lat', 90) });

/** Ground height at a point and the elevation model it came from (all null off every model). */
export type ElevationAtPoint = { elevationM: number | null; modelId: number | null; cellSizeM: number | null };

/**
 * `?version=` on a DELETE: the version the caller read, so a deletion made on stale data is
 * refused (409). Left out, the deletion goes ahead whatever the version.
 */
export const deleteVersionQuerySchema = z.object({
  version: z.preprocess(
    (value) => (value === undefined ? undefined : value === '' ? Number.NaN : Number(value)),
    z
      .number({ invalid_type_error: 'Give version as a whole number: the version you read.' })
      .int('Give version as a whole number: the version you read.')
      .positive('Give version as a whole number: the version you read.')
      .optional(),
  ),
});
