import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { FENCE_STATUSES, type FenceStatus } from '../../../src/lib/schemas/plan';
import { ITEM_STATES, type ItemState } from '../../../src/lib/schemas/work-order';
import { fenceStatusFromWork, orderStatusAfter, summariseProgress } from '../../../src/lib/work-orders/progress';

const states = fc.array(fc.constantFrom(...ITEM_STATES), { maxLength: 30 });

describe('summariseProgress', () => {
  it('counts by state and rounds the share done down, so 100 means all done', () => {
    expect(summariseProgress(['done', 'done', 'started'])).toEqual({ total: 3, notStarted: 0, started: 1, done: 2, blocked: 0, percentDone: 66 });
    expect(summariseProgress([])).toEqual({ total: 0, notStarted: 0, started: 0, done: 0, blocked: 0, percentDone: 0 });
  });

  it('counts every item once and reaches 100 only when every item is done', () => {
    fc.assert(
      fc.property(states, (list) => {
        const p = summariseProgress(list);
        expect(p.notStarted + p.started + p.done + p.blocked).toBe(list.length);
        expect(p.percentDone === 100).toBe(list.length > 0 && list.every((s) => s === 'done'));
      }),
    );
  });

  it('does not change its input', () => {
    const list: ItemState[] = ['done', 'blocked'];
    summariseProgress(list);
    expect(list).toEqual(['done', 'blocked']);
  });
});

describe('orderStatusAfter', () => {
  it('a sent order is done when every item is done, and sent again when one reopens', () => {
    expect(orderStatusAfter('sent', ['done', 'done'])).toBe('done');
    expect(orderStatusAfter('sent', ['done', 'blocked'])).toBe('sent');
    expect(orderStatusAfter('done', ['done', 'started'])).toBe('sent');
  });

  it('drafts and cancelled orders keep their status', () => {
    expect(orderStatusAfter('draft', ['done'])).toBe('draft');
    expect(orderStatusAfter('cancelled', ['done'])).toBe('cancelled');
  });
});

describe('fenceStatusFromWork', () => {
  const whole = (...list: ItemState[]) => ({ wholeFenceOrdered: true, states: list });
  const crossingsOnly = (...list: ItemState[]) => ({ wholeFenceOrdered: false, states: list });

  it('work begun on a planned or approved fence makes it building', () => {
    expect(fenceStatusFromWork('approved', whole('started', 'not-started'))).toBe('building');
    expect(fenceStatusFromWork('planned', crossingsOnly('done'))).toBe('building');
  });

  it('nothing begun, or only blocked items, moves nothing', () => {
    expect(fenceStatusFromWork('approved', whole('not-started', 'not-started'))).toBe('approved');
    expect(fenceStatusFromWork('approved', whole('blocked'))).toBe('approved');
    expect(fenceStatusFromWork('planned', whole())).toBe('planned');
  });

  it('the fence line is built when all its items are done, itself among them', () => {
    expect(fenceStatusFromWork('building', whole('done', 'done'))).toBe('built');
    expect(fenceStatusFromWork('approved', whole('done'))).toBe('built');
    // Finishing the crossings alone does not build the rest of the fence.
    expect(fenceStatusFromWork('building', crossingsOnly('done', 'done'))).toBe('building');
  });

  it('a reopened item puts a built fence back to building, but a repair of its crossings leaves it built', () => {
    expect(fenceStatusFromWork('built', whole('done', 'started'))).toBe('building');
    expect(fenceStatusFromWork('built', crossingsOnly('started'))).toBe('built');
  });

  it('a retired fence never moves, and the answer is always a fence status', () => {
    fc.assert(
      fc.property(fc.constantFrom(...FENCE_STATUSES), fc.boolean(), states, (current: FenceStatus, wholeFenceOrdered, list) => {
        const next = fenceStatusFromWork(current, { wholeFenceOrdered, states: list });
        expect(FENCE_STATUSES).toContain(next);
        if (current === 'retired') expect(next).toBe('retired');
        if (next === 'built' && current !== 'built') expect(wholeFenceOrdered && list.every((s) => s === 'done')).toBe(true);
      }),
    );
  });
});
