import type { FeatureCollection } from 'geojson';
import { z } from 'zod';
import { emailSchema } from './account';
import type { FenceStatus } from './plan';
import { CROSSING_STYLE_NAMES } from './crossing';

export const WORK_ORDER_STATUSES = ['draft', 'sent', 'done', 'cancelled'] as const;
export type WorkOrderStatus = (typeof WORK_ORDER_STATUSES)[number];

export const ITEM_STATES = ['not-started', 'started', 'done', 'blocked'] as const;
export type ItemState = (typeof ITEM_STATES)[number];

/** The words the crew view and the e-mail use for each item state. */
export const ITEM_STATE_LABELS: Record<ItemState, string> = { 'not-started': 'Not started', started: 'Started', done: 'Done', blocked: 'Blocked' };

const id = z.number({ invalid_type_error: 'Ids are whole numbers.' }).int('Ids are whole numbers.').positive('Ids are whole numbers.');

const targetDate = z
  .string()
  .regex(/^\d{4}-\d{2}-\d{2}$/, 'Give the target date as YYYY-MM-DD.')
  .refine((value) => !Number.isNaN(Date.parse(`${value}T00:00:00Z`)) && new Date(`${value}T00:00:00Z`).toISOString().startsWith(value), 'That date does not exist.');

const fields = {
  title: z.string({ required_error: 'Give the work order a title.' }).trim().min(1, 'Give the work order a title.').max(120, 'Keep the title under 120 characters.'),
  notes: z.string().trim().max(4000, 'Keep the notes under 4000 characters.'),
  assigneeUserId: id.nullable(),
  contractorEmail: z.string().pipe(emailSchema).nullable(),
  targetDate: targetDate.nullable(),
  fenceLineIds: z.array(id).max(500, 'A work order holds at most 500 fence lines.'),
  crossingIds: z.array(id).max(500, 'A work order holds at most 500 crossings.'),
};

/** Someone must do the work, and it must be one person: a member or a contractor. */
function oneAssignee(value: { assigneeUserId?: number | null; contractorEmail?: string | null }, ctx: z.RefinementCtx) {
  if (value.assigneeUserId && value.contractorEmail) {
    ctx.addIssue({ code: 'custom', path: ['contractorEmail'], message: 'Choose a member or a contractor, not both.' });
  }
}

function someItems(value: { fenceLineIds?: number[]; crossingIds?: number[] }, ctx: z.RefinementCtx) {
  if ((value.fenceLineIds?.length ?? 0) + (value.crossingIds?.length ?? 0) === 0) {
    ctx.addIssue({ code: 'custom', path: ['fenceLineIds'], message: 'Choose at least one fence line or crossing.' });
  }
}

export const createWorkOrderSchema = z
  .object({
    title: fields.title,
    notes: fields.notes.default(''),
    assigneeUserId: fields.assigneeUserId.default(null),
    contractorEmail: fields.contractorEmail.default(null),
    targetDate: fields.targetDate.default(null),
    fenceLineIds: fields.fenceLineIds.default([]),
    crossingIds: fields.crossingIds.default([]),
  })
  .superRefine((value, ctx) => {
    oneAssignee(value, ctx);
    someItems(value, ctx);
  });
export type CreateWorkOrderInput = z.infer<typeof createWorkOrderSchema>;

/** A change to a draft or sent order; `version` is the one the editor read. */
export const updateWorkOrderSchema = z
  .object({
    version: z.number({ required_error: 'Send the version you read (reload the order).' }).int().positive(),
    title: fields.title.optional(),
    notes: fields.notes.optional(),
    assigneeUserId: fields.assigneeUserId.optional(),
    contractorEmail: fields.contractorEmail.optional(),
    targetDate: fields.targetDate.optional(),
    fenceLineIds: fields.fenceLineIds.optional(),
    crossingIds: fields.crossingIds.optional(),
    status: z.literal('cancelled', { errorMap: () => ({ message: "An order's status changes by sending it, or to 'cancelled' here." }) }).optional(),
    revokeLink: z.literal(true).optional(),
  })
  .strict('Unknown field: only title, notes, assigneeUserId, contractorEmail, targetDate, fenceLineIds, crossingIds, status and revokeLink change.')
  .superRefine(oneAssignee);
export type UpdateWorkOrderInput = z.infer<typeof updateWorkOrderSchema>;

export const sendWorkOrderSchema = z.object({ version: z.number({ required_error: 'Send the version you read (reload the order).' }).int().positive() });

export const setItemStateSchema = z
  .object({
    state: z.enum(ITEM_STATES, { errorMap: () => ({ message: "The state is 'not-started', 'started', 'done' or 'blocked'." }) }),
    note: z.string().trim().max(1000, 'Keep the note under 1000 characters.').default(''),
  })
  .superRefine((value, ctx) => {
    if (value.state === 'blocked' && !value.note) ctx.addIssue({ code: 'custom', path: ['note'], message: 'Say what is in the way, so whoever comes next knows.' });
  });
export type SetItemStateInput = z.infer<typeof setItemStateSchema>;

/** One fence line or crossing of an order, as every view shows it. */
export type WorkOrderItem = {
  id: number;
  kind: 'fence-line' | 'crossing';
  fenceLineId: number;
  fenceName: string;
  fenceStatus: FenceStatus;
  crossingId: number | null;
  /** `F3 X2` for a crossing, the fence's name for a fence line. */
  label: string;
  /** 'continuous-floodgate' or 'drop-down-section' for a designed crossing. */
  style: string | null;
  lengthM: number | null;
  position: [number, number] | null;
  state: ItemState;
  note: string;
  stateByName: string | null;
  stateAt: string | null;
};

export type WorkOrderProgress = { total: number; notStarted: number; started: number; done: number; blocked: number; percentDone: number };

export type WorkOrder = {
  id: number;
  propertyId: number;
  title: string;
  notes: string;
  assigneeUserId: number | null;
  assigneeName: string | null;
  contractorEmail: string | null;
  targetDate: string | null;
  status: WorkOrderStatus;
  version: number;
  sentAt: string | null;
  link: { expiresAt: string; revoked: boolean; expired: boolean } | null;
  createdByName: string | null;
  updatedByName: string | null;
  createdAt: string;
  updatedAt: string;
  items: WorkOrderItem[];
  progress: WorkOrderProgress;
};

/** What a crew builds for each crossing style, in the words the order's e-mail and pages use. */
export const CROSSING_STYLE_WORDS: Record<string, { name: string; build: string }> = {
  'continuous-floodgate': {
    name: CROSSING_STYLE_NAMES['continuous-floodgate'],
    build: 'The fence wires run unbroken through the crossing; the floodgate swings up on hung droppers, held down at its lowest post by a breakaway tie. End strainers stand on dry ground with long flex runs either side.',
  },
  'drop-down-section': {
    name: CROSSING_STYLE_NAMES['drop-down-section'],
    build: 'Not a continuous floodgate: the fence is terminated at an end strainer on each bank, and a separate section hangs between them, held by breakaway ties so it drops away in a flood and is re-hung after. The end assemblies carry the fence strain on their own.',
  },
};

/** The materials of an order: priced lines merged by code and unit, and the totals. */
export type WorkOrderMaterials = {
  lines: { code: string; description: string; unit: string; quantity: number; unitPriceCents: number; totalCents: number }[];
  unpriced: { code: string; description: string; unit: string; quantity: number }[];
  materialsCents: number;
  labourCents: number;
  labourDays: number;
  totalCents: number;
  complete: boolean;
};

/** Everything the crew view, the print page and the contractor's link show of an order. */
export type WorkOrderSheet = {
  propertyName: string;
  /** The property's extent [west, south, east, north], WGS84, for the map's frame. */
  propertyExtentWgs84: [number, number, number, number] | null;
  order: WorkOrder;
  materials: WorkOrderMaterials;
  cautions: string[];
  /** The order's fence lines, crossings and layout points (the plan GeoJSON export, scoped to the order). */
  map: FeatureCollection;
  layoutPointCount: number;
};

/** The fence lines, crossings and people the create form offers. */
export type WorkOrderChoices = {
  fenceLines: { id: number; label: string; status: FenceStatus; lengthM: number }[];
  crossings: { id: number; label: string; style: string | null }[];
  people: { userId: number; name: string; role: string }[];
};
