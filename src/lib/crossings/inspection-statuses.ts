import type { FloodgateStyle } from './design/floodgate-input';

/** Every status a check of a crossing in an inspection round can have. */
export const CHECK_STATUSES = ['not-checked', 'intact', 'tie-reset', 'section-rehung', 'section-lost', 'damaged', 'washed-out'] as const;
export type CheckStatus = (typeof CHECK_STATUSES)[number];

/** The words shown for each status. */
export const CHECK_STATUS_LABELS: Record<CheckStatus, string> = {
  'not-checked': 'Not checked',
  intact: 'Intact',
  'tie-reset': 'Tie released and re-set',
  'section-rehung': 'Section dropped and re-hung',
  'section-lost': 'Section lost (to replace)',
  damaged: 'Damaged',
  'washed-out': 'Washed out',
};

/** Statuses that mean the crossing failed in the flood (they count towards a redesign). */
export const FAILURE_STATUSES: readonly CheckStatus[] = ['damaged', 'washed-out', 'section-lost'];

/**
 * The statuses a crew can record for a crossing of a style (besides "not checked"):
 * a continuous floodgate releases its breakaway tie, a drop-down section drops and is re-hung or
 * lost; both can be damaged or washed out. A crossing without a design gets the common ones.
 */
export function statusesForStyle(style: FloodgateStyle | string | null): CheckStatus[] {
  if (style === 'continuous-floodgate') return ['intact', 'tie-reset', 'damaged', 'washed-out'];
  if (style === 'drop-down-section') return ['intact', 'section-rehung', 'section-lost', 'damaged', 'washed-out'];
  return ['intact', 'damaged', 'washed-out'];
}

/** What the crew looks at at a crossing of a style, in the trade's words (DESIGN.md, rules of thumb). */
export function checkGuide(style: FloodgateStyle | string | null): string[] {
  const safety = 'Never enter floodwater: wait until the channel is safe to walk.';
  const ends = 'Look at the end strainers and the flex runs either side: posts upright, wires strained, no wire broken.';
  if (style === 'continuous-floodgate') {
    return [
      'Continuous swinging floodgate: see whether the breakaway tie at the lowest post let go; if it did, clear the debris off the wires and re-set the tie.',
      'Check that the hung droppers still swing on their links and hang down to the ground.',
      safety,
      ends,
    ];
  }
  if (style === 'drop-down-section') {
    return [
      'Separate drop-down section: see whether the section dropped. Stock can get through until it is re-hung: re-hang it, or replace it if it is lost or broken.',
      'Clear the debris from the section and its hangers.',
      safety,
      // The fence ends on its own assemblies each side: no long flex runs to look along.
      'Look at the end assemblies on both banks: posts upright and stays firm, the fence strained up to them.',
    ];
  }
  return ['No design yet: look at the fence across the channel for debris, leaning posts and broken wire.', safety, ends];
}
