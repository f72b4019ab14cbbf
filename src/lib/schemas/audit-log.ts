import { z } from 'zod';

/**
 * The change log's groups, by the first part of an entry's action (`fence_line.update` →
 * `fence_line`). A person filters by what they care about, not by table names.
 */
export const CHANGE_GROUPS = {
  plan: { label: 'Fence lines, paddocks and tracks', subjects: ['fence_line', 'paddock', 'track', 'file', 'plan'] },
  designs: { label: 'Crossing designs', subjects: ['crossing'] },
  terrain: { label: 'Elevation models and terrain runs', subjects: ['elevation_model', 'terrain_run'] },
  work: { label: 'Work orders', subjects: ['work_order', 'work_order_item'] },
  inspections: { label: 'Rain events and inspections', subjects: ['rain_event', 'inspection_round', 'inspection_check', 'inspection_photo'] },
  people: { label: 'People and invitations', subjects: ['membership', 'invitation'] },
  property: { label: 'Property and settings', subjects: ['property', 'settings'] },
} as const satisfies Record<string, { label: string; subjects: readonly string[] }>;

export type ChangeGroup = keyof typeof CHANGE_GROUPS;
export const CHANGE_GROUP_KEYS = Object.keys(CHANGE_GROUPS) as ChangeGroup[];

export const CHANGES_PAGE_SIZE = 50;

const emptyToUndefined = (value: unknown) => (value === '' || value === null ? undefined : value);

/** The change log's query string: `?what=plan&who=12&before=345`. */
export const changeLogQuerySchema = z.object({
  what: z.preprocess(emptyToUndefined, z.enum(CHANGE_GROUP_KEYS as [ChangeGroup, ...ChangeGroup[]]).optional()),
  who: z.preprocess(emptyToUndefined, z.coerce.number().int().positive().optional()),
  before: z.preprocess(emptyToUndefined, z.coerce.number().int().positive().optional()),
});
export type ChangeLogQuery = z.infer<typeof changeLogQuerySchema>;

export function groupOfAction(action: string): ChangeGroup | null {
  const subject = action.split('.')[0] ?? '';
  return CHANGE_GROUP_KEYS.find((key) => (CHANGE_GROUPS[key].subjects as readonly string[]).includes(subject)) ?? null;
}

type Detail = Record<string, unknown>;

const text = (value: unknown): string | null => (typeof value === 'string' && value.trim() !== '' ? value : typeof value === 'number' ? String(value) : null);
const quoted = (value: unknown): string => (text(value) ? ` “${text(value)}”` : '');
const count = (value: unknown, one: string, many: string): string | null =>
  typeof value === 'number' ? `${value} ${value === 1 ? one : many}` : null;
const FIELD_WORDS: Record<string, string> = { ifdTable: 'IFD table', wireSpec: 'wire specification', crs: 'CRS', aep: 'AEP' };
const fieldList = (value: unknown): string => {
  const fields = Array.isArray(value) ? value.filter((f): f is string => typeof f === 'string') : [];
  return fields.length ? `: ${fields.map((f) => FIELD_WORDS[f] ?? f.replace(/([A-Z])/g, ' $1').toLowerCase()).join(', ')}` : '';
};
const keysOf = (detail: Detail): string => fieldList(Object.keys(detail));

/** Plain words for each known action; an unknown action still reads sensibly (see describeChange). */
const DESCRIBE: Record<string, (detail: Detail, entityId: string | null, subject: string) => string> = {
  'property.create': (d) => `Created the property${quoted(d.name)}`,
  'property.update': (d) => `Changed the property${keysOf(d)}`,
  'settings.update': (d) => `Changed the property's settings${fieldList(d.parts)}`,
  'fence_line.create': (d) => `Drew fence line${quoted(d.name)}`,
  'fence_line.update': (d, id) => `Changed fence line ${id ?? ''}${fieldList(d.fields)}`.replace('  ', ' '),
  'fence_line.delete': (d) => `Deleted fence line${quoted(d.name)}`,
  'paddock.create': (d) => `Drew paddock${quoted(d.name)}`,
  'paddock.update': (d) => `Changed paddock${quoted(d.name)}`,
  'paddock.delete': (d) => `Deleted paddock${quoted(d.name)}`,
  'paddock.from_fences': (d) => `Made paddock${quoted(d.name)} from fence lines`,
  'track.delete': (d) => `Removed GPS track${quoted(d.name)}`,
  'file.import': (d) =>
    `Imported ${text(d.sourceFile) ?? 'a file'}${[count(d.tracks, 'track', 'tracks'), count(d.paddocks, 'paddock', 'paddocks')].filter(Boolean).map((p, i) => (i ? `, ${p}` : ` (${p}`)).join('')}${d.tracks != null || d.paddocks != null ? ')' : ''}`,
  'plan.import': (d) =>
    `Imported the plan ${text(d.sourceFile) ?? ''}${[count(d.fenceLines, 'fence line', 'fence lines'), count(d.paddocks, 'paddock', 'paddocks')].filter(Boolean).map((p, i) => (i ? `, ${p}` : ` (${p}`)).join('')}${d.fenceLines != null || d.paddocks != null ? ')' : ''}`,
  'crossing.inputs': (d, id) => `Changed what is known about crossing ${id ?? ''}${keysOf(d)}`,
  'fence_line.status': (d) => `Fence line${quoted(d.name)} went from ${text(d.from) ?? '?'} to ${text(d.to) ?? '?'}${text(d.workOrderId) ? ` (work order ${text(d.workOrderId)})` : ''}`,
  'work_order.create': (d) => `Made work order${quoted(d.title)}`,
  'work_order.update': (d, id) => `Changed work order ${id ?? ''}${fieldList(d.fields)}`,
  'work_order.cancel': (_d, id) => `Cancelled work order ${id ?? ''}`.trim(),
  'work_order.delete': (d) => `Deleted work order${quoted(d.title)}`,
  'work_order.send': (d, id) => `${d.resent ? 'Sent again' : 'Sent'} work order ${id ?? ''}${typeof d.to === 'string' ? ` to ${d.to}` : ''}`,
  'work_order.item_state': (d) =>
    `Marked ${text(d.label) ?? 'an item'} ${text(d.to) ?? ''}${text(d.workOrderId) ? ` (work order ${text(d.workOrderId)})` : ''}${text(d.note) ? `: “${text(d.note)}”` : ''}`,
  'rain_event.create': (d) =>
    `Recorded ${text(d.rainfallMm) ?? '?'} mm of rain on ${text(d.fellOn) ?? 'a day'}${d.scope === 'paddocks' ? ' over chosen paddocks' : ''}${Array.isArray(d.crossingIds) ? `: ${count(d.crossingIds.length, 'crossing', 'crossings')} to inspect` : ''}`,
  'inspection_check.update': (d) => `Inspected crossing ${text(d.crossingId) ?? ''}: ${(text(d.from) ?? '?').replace(/-/g, ' ')} → ${(text(d.to) ?? '?').replace(/-/g, ' ')}`,
  'inspection_round.close': (_d, id) => `Closed inspection round ${id ?? ''}`.trim(),
  'inspection_round.reopen': (_d, id) => `Opened inspection round ${id ?? ''} again`,
  'inspection_photo.create': (d) => `Added a photo to an inspection${d.locationKept ? ' (with its location)' : ''}`,
  'inspection_photo.delete': () => 'Removed a photo from an inspection',
  'elevation_model.upload': (d) => `Uploaded elevation model${quoted(d.name)}`,
  'elevation_model.delete': (d) => `Deleted elevation model${quoted(d.name)}`,
  'terrain_run.start': () => 'Started a terrain run',
  'terrain_run.cancel': () => 'Cancelled a terrain run',
  'terrain_run.succeed': (d) => `Terrain run finished${count(d.drainageLines, 'drainage line', 'drainage lines') ? `: ${count(d.drainageLines, 'drainage line', 'drainage lines')}` : ''}`,
  'membership.add': (d, _id, who) => `Added ${who}${text(d.role) ? ` as ${text(d.role)}` : ''}`,
  'membership.change_role': (d, _id, who) => `Changed ${who}'s role${text(d.from) && text(d.to) ? ` from ${text(d.from)} to ${text(d.to)}` : ''}`,
  'membership.remove': (d, _id, who) => `Removed ${who}${text(d.role) ? ` (was ${text(d.role)})` : ''}`,
  'invitation.create': (d) => `Invited ${text(d.email) ?? 'someone'}${text(d.role) ? ` as ${text(d.role)}` : ''}`,
  'invitation.accept': (d) => `${text(d.email) ?? 'Someone'} accepted an invitation${text(d.role) ? ` as ${text(d.role)}` : ''}`,
  'invitation.revoke': (d) => `Withdrew the invitation to ${text(d.email) ?? 'someone'}`,
};

/** One sentence for a change-log row; `subjectName` is the person a membership entry is about. */
export function describeChange(action: string, detail: Detail, entityId: string | null, subjectName: string | null = null): string {
  const known = DESCRIBE[action];
  if (known) return known(detail, entityId, subjectName ?? 'a person');
  // A newer action without its own words: "work_order.send" → "Work order: send".
  const [subject = action, verb = 'change'] = action.split('.');
  const subjectWords = subject.replace(/_/g, ' ');
  return `${subjectWords.charAt(0).toUpperCase()}${subjectWords.slice(1)}${entityId ? ` ${entityId}` : ''}: ${verb.replace(/_/g, ' ')}${quoted(detail.name ?? detail.title)}`;
}
