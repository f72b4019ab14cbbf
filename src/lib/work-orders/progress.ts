/**
 * The rules by which work on an order moves: its progress, the order's own status, and the
 * status of each fence line it touches. Pure: plain data in, plain data out.
 */
import type { FenceStatus } from '../schemas/plan';
import type { ItemState, WorkOrderProgress, WorkOrderStatus } from '../schemas/work-order';

/**
 * Counts of an order's items by state, and the share done as a whole percent (rounded down, so
 * 100 means every item is done).
 * @param states - the state of each item; not modified
 */
export function summariseProgress(states: readonly ItemState[]): WorkOrderProgress {
  const count = (state: ItemState) => states.filter((s) => s === state).length;
  const done = count('done');
  return {
    total: states.length,
    notStarted: count('not-started'),
    started: count('started'),
    done,
    blocked: count('blocked'),
    percentDone: states.length === 0 ? 0 : Math.floor((done * 100) / states.length),
  };
}

/**
 * The order's status after an item changes: a sent order whose every item is done is done, and a
 * done order with an item reopened is sent again. Drafts and cancelled orders keep their status
 * (their items cannot change).
 */
export function orderStatusAfter(current: WorkOrderStatus, states: readonly ItemState[]): WorkOrderStatus {
  if (current !== 'sent' && current !== 'done') return current;
  return states.length > 0 && states.every((s) => s === 'done') ? 'done' : 'sent';
}

/** The work on one fence line across the live (sent or done) orders of its property. */
export type FenceWork = {
  /** Some live order holds the fence line itself, not only crossings on it. */
  readonly wholeFenceOrdered: boolean;
  /** States of every live item on the fence: the fence line items and those of its crossings. */
  readonly states: readonly ItemState[];
};

/**
 * The status a fence line takes from the work on it:
 * - work begun (any item started or done) on a `planned` or `approved` fence makes it `building`
 *   (a crew that has started is the fact on the ground, approved or not; the audit log keeps the jump);
 * - every item done, and the fence line itself among them, makes it `built`: finishing a crossing
 *   alone does not build the rest of the fence;
 * - a `built` fence goes back to `building` only when an order holds the whole fence line and not
 *   all of it is done (an item reopened); work on its crossings alone (a repair) leaves it built;
 * - blocked items alone move nothing (the work may not have begun), and a `retired` fence never moves.
 * @returns the new status, or the current one when nothing changes
 */
export function fenceStatusFromWork(current: FenceStatus, work: FenceWork): FenceStatus {
  if (current === 'retired' || work.states.length === 0) return current;
  const begun = work.states.some((s) => s === 'started' || s === 'done');
  if (!begun) return current;
  if (work.wholeFenceOrdered && work.states.every((s) => s === 'done')) return 'built';
  if (current === 'built' && !work.wholeFenceOrdered) return current;
  return 'building';
}
