import { z } from 'zod';
import { CHECK_STATUSES, type CheckStatus } from '../crossings/inspection-statuses';
import type { RedesignFlag } from '../crossings/inspection-history';

const isoDate = z
  .string({ required_error: 'Give the day the rain fell (YYYY-MM-DD).' })
  .regex(/^\d{4}-\d{2}-\d{2}$/, 'Give the day as YYYY-MM-DD.')
  .refine((value) => !Number.isNaN(Date.parse(`${value}T00:00:00Z`)) && new Date(`${value}T00:00:00Z`).toISOString().startsWith(value), 'That day does not exist.');

/** A rain event as recorded by an owner or manager: where the rain fell is the whole property or some paddocks. */
export const rainEventInputSchema = z
  .object({
    fellOn: isoDate,
    rainfallMm: z
      .number({ required_error: 'Give the rainfall in millimetres.', invalid_type_error: 'Give the rainfall as a number of millimetres.' })
      .min(0, 'Rainfall cannot be negative.')
      .max(2000, 'Rainfall over 2000 mm in one event is not plausible: check the figure.'),
    scope: z.enum(['property', 'paddocks'], { errorMap: () => ({ message: 'Choose where the rain fell: the whole property or some paddocks.' }) }),
    paddockIds: z.array(z.number().int().positive()).max(500).default([]),
    note: z.string().trim().max(2000, 'Keep the note under 2000 characters.').default(''),
  })
  .superRefine((value, ctx) => {
    if (value.scope === 'paddocks' && value.paddockIds.length === 0) {
      ctx.addIssue({ code: z.ZodIssueCode.custom, path: ['paddockIds'], message: 'Choose at least one paddock, or the whole property.' });
    }
  });
export type RainEventInput = z.infer<typeof rainEventInputSchema>;

/** A crew member's record of one crossing in a round; `version` is the one read (a stale one is refused with 409). */
export const checkUpdateSchema = z.object({
  status: z.enum(CHECK_STATUSES, { errorMap: () => ({ message: `Choose a status: ${CHECK_STATUSES.join(', ')}.` }) }),
  note: z.string().trim().max(2000, 'Keep the note under 2000 characters.').default(''),
  version: z.number({ required_error: 'Send the version you read (version).' }).int().positive(),
});
export type CheckUpdate = z.infer<typeof checkUpdateSchema>;

/** Closing or reopening a round. */
export const roundUpdateSchema = z.object({
  status: z.enum(['open', 'closed'], { errorMap: () => ({ message: 'A round is open or closed.' }) }),
  version: z.number({ required_error: 'Send the version you read (version).' }).int().positive(),
});
export type RoundUpdate = z.infer<typeof roundUpdateSchema>;

export type PhotoView = {
  id: number;
  checkId: number;
  url: string;
  thumbnailUrl: string;
  contentType: string;
  sizeBytes: number;
  width: number;
  height: number;
  locationKept: boolean;
  uploadedByName: string | null;
  /** Who sent it: they, an owner or a manager may remove it. */
  uploadedById: number | null;
  createdAt: string;
};

export type CheckView = {
  id: number;
  roundId: number;
  crossingId: number | null;
  position: number;
  crossingLabel: string;
  style: string | null;
  catchmentHa: number | null;
  selectedBy: 'property' | 'catchment' | 'point';
  status: CheckStatus;
  note: string;
  checkedByName: string | null;
  checkedAt: string | null;
  version: number;
  /** The statuses that fit the crossing's style. */
  statuses: CheckStatus[];
  /** What to look at, for the crossing's style. */
  guide: string[];
  /** The crossing's position, [lon, lat], when it still exists. */
  lonLat: [number, number] | null;
  photos: PhotoView[];
};

export type RoundProgress = { total: number; checked: number; failed: number };

export type RainEventView = {
  id: number;
  fellOn: string;
  rainfallMm: number;
  scope: 'property' | 'paddocks';
  paddockIds: number[];
  paddockNames: string[];
  note: string;
  recordedByName: string | null;
  createdAt: string;
  round: { id: number; status: 'open' | 'closed'; version: number; progress: RoundProgress };
};

export type RoundView = {
  id: number;
  status: 'open' | 'closed';
  version: number;
  createdAt: string;
  closedAt: string | null;
  rainEvent: Omit<RainEventView, 'round'>;
  checks: CheckView[];
  progress: RoundProgress;
};

/** One row of a crossing's inspection history. */
export type HistoryEntry = {
  roundId: number;
  checkId: number;
  fellOn: string;
  rainfallMm: number;
  status: CheckStatus;
  note: string;
  checkedAt: string | null;
  checkedByName: string | null;
  photos: PhotoView[];
};

export type CrossingInspectionsView = { history: HistoryEntry[]; redesign: RedesignFlag | null };
