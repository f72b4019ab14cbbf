/**
 * The default-style rule. Its thresholds are common practice and judgement, no published source
 * (DESIGN.md); the drop-down section itself is NSW DPI Primefact 681 "Building a floodgate" (2009)
 * and WA Water and Rivers Commission Water Note WN19 (2000), as listed in references.md.
 */
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { chooseStyle, type ChooseStyleInput, type DebrisLevel } from '../../../../src/lib/crossings/design/choose-style';
import { DEFAULT_DESIGN_SETTINGS } from '../../../../src/lib/schemas/crossing';
import { deepFreeze } from './fixtures';

const THRESHOLDS = { dropDownWidthM: 30, dropDownDepthM: 1.2, dropDownVelocityMs: 1.5, dropDownDebris: 'heavy' as const };
const calm: ChooseStyleInput = { wetZoneWidthM: 12, maxDepthM: 0.6, velocityMs: 0.9, debris: 'light', thresholds: THRESHOLDS };
const RANK: Record<DebrisLevel, number> = { light: 0, moderate: 1, heavy: 2 };

describe('chooseStyle by hand', () => {
  it('keeps a narrow, shallow, slow, light-debris crossing continuous, with the figures in the reason', () => {
    const choice = chooseStyle(calm);
    expect(choice).toMatchObject({ style: 'continuous-floodgate', recommended: 'continuous-floodgate', chosenBy: 'rule' });
    expect(choice.reasons[0]).toMatch(/12\.0 m.*0\.60 m.*0\.90 m\/s.*light debris/);
    expect(choice.basis).toMatch(/common practice/);
    expect(choice.basis).toMatch(/Primefact 681/);
  });

  it.each([
    ['width', { wetZoneWidthM: 30.5 }, /30\.5 m wide, more than 30 m/],
    ['depth', { maxDepthM: 1.25 }, /1\.25 m deep, more than 1\.2 m/],
    ['velocity', { velocityMs: 1.6 }, /1\.60 m\/s, faster than 1\.5 m\/s/],
    ['debris', { debris: 'heavy' as const }, /heavy debris is expected/],
  ])('switches to a drop-down section when the %s passes its threshold', (_what, change, reason) => {
    const choice = chooseStyle({ ...calm, ...change });
    expect(choice.style).toBe('drop-down-section');
    expect(choice.reasons[0]).toMatch(reason);
  });

  it('stays continuous exactly at a threshold (the rule says "more than")', () => {
    expect(chooseStyle({ ...calm, wetZoneWidthM: 30, maxDepthM: 1.2, velocityMs: 1.5, debris: 'moderate' }).style).toBe('continuous-floodgate');
  });

  it('depth-at-threshold-after-rounding: a 1.2 m mark computed as 1.2000000000000028 m stays at the threshold', () => {
    expect(chooseStyle({ ...calm, maxDepthM: 1.2000000000000028 }).style).toBe('continuous-floodgate');
  });

  it('lets moderate debris switch when the setting says so', () => {
    expect(chooseStyle({ ...calm, debris: 'moderate', thresholds: { ...THRESHOLDS, dropDownDebris: 'moderate' } }).style).toBe('drop-down-section');
  });

  it("lets the planner's style win and records it, keeping the rule's recommendation", () => {
    const choice = chooseStyle({ ...calm, debris: 'heavy', plannerStyle: 'continuous-floodgate' });
    expect(choice).toMatchObject({ style: 'continuous-floodgate', chosenBy: 'planner', recommended: 'drop-down-section' });
    expect(choice.reasons.at(-1)).toMatch(/Chosen by the planner/);
  });

  it('uses the default settings as its thresholds', () => {
    const d = DEFAULT_DESIGN_SETTINGS;
    const atDefaults = { dropDownWidthM: d.dropDownWidthM, dropDownDepthM: d.dropDownDepthM, dropDownVelocityMs: d.dropDownVelocityMs, dropDownDebris: d.dropDownDebris };
    expect(chooseStyle({ ...calm, debris: d.debris, thresholds: atDefaults }).style).toBe('continuous-floodgate');
  });

  it('does not modify its input', () => {
    const input = deepFreeze({ ...calm, thresholds: { ...THRESHOLDS } });
    expect(() => chooseStyle(input)).not.toThrow();
  });

  it.each([
    [{ maxDepthM: -1 }, /maxDepthM/],
    [{ velocityMs: Number.NaN }, /velocityMs/],
    [{ debris: 'lots' as DebrisLevel }, /debris must be/],
  ])('refuses bad input with a message naming it', (change, message) => {
    expect(() => chooseStyle({ ...calm, ...change })).toThrow(message);
  });
});

describe('chooseStyle is monotonic (property)', () => {
  const flood = fc.record({
    wetZoneWidthM: fc.double({ min: 0, max: 200, noNaN: true }),
    maxDepthM: fc.double({ min: 0, max: 5, noNaN: true }),
    velocityMs: fc.double({ min: 0, max: 5, noNaN: true }),
    debris: fc.constantFrom<DebrisLevel>('light', 'moderate', 'heavy'),
  });
  const rise = fc.record({
    width: fc.double({ min: 0, max: 100, noNaN: true }),
    depth: fc.double({ min: 0, max: 3, noNaN: true }),
    velocity: fc.double({ min: 0, max: 3, noNaN: true }),
    debris: fc.nat({ max: 2 }),
  });
  const levels: DebrisLevel[] = ['light', 'moderate', 'heavy'];

  it('raising width, depth, velocity or debris never moves the choice from drop-down back to continuous', () => {
    fc.assert(
      fc.property(flood, rise, fc.constantFrom<'moderate' | 'heavy'>('moderate', 'heavy'), (f, r, dropDownDebris) => {
        const thresholds = { ...THRESHOLDS, dropDownDebris };
        const before = chooseStyle({ ...f, thresholds });
        const after = chooseStyle({
          wetZoneWidthM: f.wetZoneWidthM + r.width,
          maxDepthM: f.maxDepthM + r.depth,
          velocityMs: f.velocityMs + r.velocity,
          debris: levels[Math.min(2, RANK[f.debris] + r.debris)]!,
          thresholds,
        });
        return before.style === 'continuous-floodgate' || after.style === 'drop-down-section';
      }),
      { seed: 8 },
    );
  });

  it('recommends drop-down exactly when some threshold is passed (an oracle written apart)', () => {
    fc.assert(
      fc.property(flood, (f) => {
        const expected = f.wetZoneWidthM > 30 || f.maxDepthM > 1.2 || f.velocityMs > 1.5 || f.debris === 'heavy';
        return chooseStyle({ ...f, thresholds: THRESHOLDS }).style === (expected ? 'drop-down-section' : 'continuous-floodgate');
      }),
      { seed: 8 },
    );
  });
});
