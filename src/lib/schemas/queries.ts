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
