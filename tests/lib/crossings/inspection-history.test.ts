import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { redesignFlag, type HistoryCheck } from '../../../src/lib/crossings/inspection-history';
import { CHECK_STATUSES, FAILURE_STATUSES, statusesForStyle } from '../../../src/lib/crossings/inspection-statuses';

const check = (roundId: number, fellOn: string, status: HistoryCheck['status']): HistoryCheck => ({ roundId, fellOn, status });

describe('redesignFlag', () => {
  it('flags a floodgate damaged in two rounds and suggests a drop-down section, naming both rains', () => {
    const flag = redesignFlag([check(1, '2026-01-10', 'damaged'), check(2, '2026-02-03', 'intact'), check(3, '2026-03-21', 'washed-out')], 'continuous-floodgate');
    expect(flag).not.toBeNull();
    expect(flag!.suggestedStyle).toBe('drop-down-section');
    expect(flag!.failedRounds.map((round) => round.roundId)).toEqual([1, 3]);
    expect(flag!.reason).toContain('2026-01-10');
    expect(flag!.reason).toContain('2026-03-21');
    expect(flag!.reason).toMatch(/drop-down section/);
  });

  it('flags a drop-down section lost twice and suggests a continuous floodgate', () => {
    const flag = redesignFlag([check(5, '2026-03-01', 'section-lost'), check(4, '2026-02-01', 'section-lost')], 'drop-down-section');
    expect(flag!.suggestedStyle).toBe('continuous-floodgate');
    // Oldest rain first, whatever the order given.
    expect(flag!.failedRounds.map((round) => round.fellOn)).toEqual(['2026-02-01', '2026-03-01']);
  });

  it('does not flag one failure, nor released ties and re-hung sections however often', () => {
    expect(redesignFlag([check(1, '2026-01-10', 'damaged')], 'continuous-floodgate')).toBeNull();
    expect(redesignFlag([check(1, '2026-01-10', 'tie-reset'), check(2, '2026-02-10', 'tie-reset'), check(3, '2026-03-10', 'tie-reset')], 'continuous-floodgate')).toBeNull();
    expect(redesignFlag([check(1, '2026-01-10', 'section-rehung'), check(2, '2026-02-10', 'section-rehung')], 'drop-down-section')).toBeNull();
    expect(redesignFlag([], null)).toBeNull();
  });

  it('counts rounds, not checks: two failures in the same round are one', () => {
    expect(redesignFlag([check(7, '2026-01-10', 'damaged'), check(7, '2026-01-10', 'washed-out')], 'continuous-floodgate')).toBeNull();
  });

  it('without a design style it still flags, with no style to suggest', () => {
    const flag = redesignFlag([check(1, '2026-01-10', 'damaged'), check(2, '2026-02-10', 'washed-out')], null);
    expect(flag!.suggestedStyle).toBeNull();
    expect(flag!.reason).toMatch(/Design this crossing/);
  });

  it('does not change its input', () => {
    const history = [check(2, '2026-02-01', 'damaged'), check(1, '2026-01-01', 'damaged')];
    const copy = structuredClone(history);
    redesignFlag(history, 'continuous-floodgate');
    expect(history).toEqual(copy);
  });

  it('flags exactly when failures fall in two or more different rounds (property)', () => {
    const arbitraryCheck = fc.record({ roundId: fc.integer({ min: 1, max: 6 }), fellOn: fc.constantFrom('2026-01-01', '2026-02-01', '2026-03-01'), status: fc.constantFrom(...CHECK_STATUSES) });
    fc.assert(
      fc.property(fc.array(arbitraryCheck, { maxLength: 12 }), (history) => {
        const failedRounds = new Set(history.filter((c) => FAILURE_STATUSES.includes(c.status)).map((c) => c.roundId));
        const flag = redesignFlag(history, 'continuous-floodgate');
        expect(flag !== null).toBe(failedRounds.size >= 2);
        if (flag) expect(new Set(flag.failedRounds.map((round) => round.roundId))).toEqual(failedRounds);
      }),
    );
  });
});

describe('statusesForStyle', () => {
  it('offers the tie for a floodgate and the section for a drop-down section, never both', () => {
    expect(statusesForStyle('continuous-floodgate')).toEqual(['intact', 'tie-reset', 'damaged', 'washed-out']);
    expect(statusesForStyle('drop-down-section')).toEqual(['intact', 'section-rehung', 'section-lost', 'damaged', 'washed-out']);
    expect(statusesForStyle(null)).toEqual(['intact', 'damaged', 'washed-out']);
  });
});
