import type { FloodgateStyle } from './design/floodgate-input';
import { CHECK_STATUS_LABELS, FAILURE_STATUSES, type CheckStatus } from './inspection-statuses';

/** One check of a crossing in one inspection round. */
export type HistoryCheck = {
  readonly roundId: number;
  /** The day the rain fell, YYYY-MM-DD. */
  readonly fellOn: string;
  readonly status: CheckStatus;
};

export type RedesignFlag = {
  /** The style to reconsider the crossing in, or null when it has no design style to swap. */
  readonly suggestedStyle: FloodgateStyle | null;
  /** The rounds (by rain date, oldest first) in which the crossing failed. */
  readonly failedRounds: readonly { roundId: number; fellOn: string; status: CheckStatus }[];
  readonly reason: string;
};

/** Failures in this many different rounds flag a crossing for redesign (our rule, no published source). */
export const FAILED_ROUNDS_FOR_REDESIGN = 2;

const STYLE_WORDS: Record<FloodgateStyle, string> = {
  'continuous-floodgate': 'a continuous swinging floodgate',
  'drop-down-section': 'a separate drop-down section',
};

/**
 * Whether a crossing's inspection history flags it for redesign: damaged, washed out or (a
 * drop-down section) lost in at least {@link FAILED_ROUNDS_FOR_REDESIGN} different rounds. The
 * suggestion is the other style: a floodgate that keeps failing may do better as a section the
 * flood can drop; a section that keeps being lost may do better as a floodgate that swings up.
 * @returns the flag, or null when the crossing is not flagged
 */
export function redesignFlag(history: readonly HistoryCheck[], style: FloodgateStyle | string | null): RedesignFlag | null {
  const byRound = new Map<number, { roundId: number; fellOn: string; status: CheckStatus }>();
  for (const check of history) {
    if (FAILURE_STATUSES.includes(check.status) && !byRound.has(check.roundId)) byRound.set(check.roundId, { roundId: check.roundId, fellOn: check.fellOn, status: check.status });
  }
  if (byRound.size < FAILED_ROUNDS_FOR_REDESIGN) return null;
  const failedRounds = [...byRound.values()].sort((a, b) => a.fellOn.localeCompare(b.fellOn) || a.roundId - b.roundId);
  const listed = failedRounds.map((round) => `${CHECK_STATUS_LABELS[round.status].toLowerCase()} after the rain of ${round.fellOn}`).join('; ');
  const suggestedStyle: FloodgateStyle | null =
    style === 'continuous-floodgate' ? 'drop-down-section' : style === 'drop-down-section' ? 'continuous-floodgate' : null;
  const why =
    style === 'continuous-floodgate'
      ? 'The floodgate keeps failing under the flood: consider building it as a separate drop-down section, which lets go and is re-hung, instead of loading the whole fence.'
      : style === 'drop-down-section'
        ? 'The section keeps being lost or broken: consider a continuous swinging floodgate, which lifts on hung droppers and is re-set by re-tying its breakaway tie.'
        : 'Design this crossing, and choose its style with these failures in mind.';
  return { suggestedStyle, failedRounds, reason: `Failed in ${failedRounds.length} rounds (${listed}). ${why}` };
}

/** The style in words, for the suggestion. */
export function styleInWords(style: FloodgateStyle): string {
  return STYLE_WORDS[style];
}
