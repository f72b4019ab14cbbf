/**
 * Floodgate layouts: extent, end strainers, posts, stays, droppers, breakaway ties, plain wires.
 *
 * Outside references used here:
 * - Rules of thumb from DESIGN.md ("Rules of thumb the design engine starts from"): common
 *   practice, no published source. Each check of one says so beside it.
 * - NSW DPI Primefact 681 "Building a floodgate" (2009): a separate section on its own end
 *   assemblies (the drop-down style).
 * - Floodplain fencing specification, Northumberland National Park and Tweed Forum (UK, 2012):
 *   posts 4–5 m apart (the default spacing).
 * - Manning's equation, v = (1/n) R^(2/3) S^(1/2) (Chow 1959, Open-Channel Hydraulics), with R
 *   taken as the local depth: with n = 0.04 and S = 0.0016 it is v = d^(2/3) (derived).
 * - Analytic: the V of ./fixtures.ts with level 1.2 m has its wet zone at 88–112 m.
 */
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import {
  chooseDropperLink,
  FENCING_CAUTIONS,
  layoutFloodgate,
  localVelocityMs,
  type FloodgateInput,
  type FloodgateLayout,
} from '../../../../src/lib/crossings/design/index';
import { deepFreeze, groundAt, V_INPUT, V_PROFILE } from './fixtures';

const V = layoutFloodgate(V_INPUT);
const { flexRunEachSideM: _flex, ...NO_FLEX_RUN } = V_INPUT;
const gatePosts = (l: FloodgateLayout) => l.posts.filter((p) => p.role === 'floodgate');

/** Random profiles (lowest point at the crossing) with a random flood and settings. */
const inputArb = fc
  .record({
    steps: fc.array(fc.double({ min: 1, max: 15, noNaN: true }), { minLength: 6, maxLength: 40 }),
    heights: fc.array(fc.double({ min: 0, max: 6, noNaN: true }), { minLength: 41, maxLength: 41 }),
    bedAt: fc.nat(),
    floodLevelM: fc.double({ min: -0.5, max: 6, noNaN: true }),
    freeboardM: fc.double({ min: 0, max: 1, noNaN: true }),
    strainerSetbackM: fc.double({ min: 1, max: 30, noNaN: true }),
    postSpacingM: fc.double({ min: 1, max: 8, noNaN: true }),
    style: fc.constantFrom('continuous-floodgate' as const, 'drop-down-section' as const),
  })
  .map(({ steps, heights, bedAt, floodLevelM, freeboardM, strainerSetbackM, postSpacingM, style }): FloodgateInput => {
    let c = 0;
    const profile = [0, ...steps].map((s, i) => ({ chainageM: (c += i === 0 ? 0 : s), elevationM: heights[i]! }));
    const bed = 1 + (bedAt % (profile.length - 2));
    profile[bed] = { chainageM: profile[bed]!.chainageM, elevationM: -1 };
    return { ...V_INPUT, profile, crossingChainageM: profile[bed]!.chainageM, floodLevelM, style, settings: { freeboardM, strainerSetbackM, postSpacingM } };
  });

describe('layoutFloodgate: the V by hand', () => {
  it('spans the wet zone 88–112 m (flood 1.0 m + freeboard 0.2 m on 0.1 m/m sides)', () => {
    expect(V.floodgate.startChainageM).toBeCloseTo(88, 9);
    expect(V.floodgate.endChainageM).toBeCloseTo(112, 9);
    expect(V.designLevelM).toBeCloseTo(1.2, 12);
    expect(V.overtopsProfile).toBe(false);
    expect(V.floodgate.reason).toMatch(/freeboard/);
  });

  it('sets the end strainers out of the wet zone by the 15 m set-back, on dry ground (common practice, no published source)', () => {
    const [start, end] = V.endStrainers;
    expect(start.chainageM).toBeCloseTo(73, 9);
    expect(end.chainageM).toBeCloseTo(127, 9);
    expect(start.setbackFromWetZoneM).toBeCloseTo(15, 9);
    expect(start.groundM).toBeCloseTo(2.7, 9);
    expect(start.onDryGround && end.onDryGround).toBe(true);
    expect(V.span.lengthM).toBeCloseTo(54, 9);
    expect(V.warnings).toEqual([]);
  });

  it('puts floodgate posts 4 m apart from edge to edge, one on the bed, with depth and local velocity', () => {
    const gate = gatePosts(V);
    expect(gate.map((p) => p.chainageM)).toEqual([88, 92, 96, 100, 104, 108, 112].map((c) => expect.closeTo(c, 9)));
    expect(gate.map((p) => p.floodDepthM)).toEqual([0, 0.2, 0.6, 1, 0.6, 0.2, 0].map((d) => expect.closeTo(d, 9)));
    // v = d^(2/3) with n = 0.04, S = 0.0016 (Manning with R = d, derived).
    expect(gate.map((p) => p.velocityMs)).toEqual([0, 0.2 ** (2 / 3), 0.6 ** (2 / 3), 1, 0.6 ** (2 / 3), 0.2 ** (2 / 3), 0].map((v) => expect.closeTo(v, 9)));
    expect(gate.every((p) => p.heavy)).toBe(true);
    // Set-back: 15 m in 4 intervals of 3.75 m each side, ordinary posts on dry ground.
    const line = V.posts.filter((p) => p.role === 'line');
    expect(line.map((p) => p.chainageM)).toEqual([76.75, 80.5, 84.25, 115.75, 119.5, 123.25].map((c) => expect.closeTo(c, 9)));
    expect(line.every((p) => !p.heavy && p.hungDropper === null && !p.braced)).toBe(true);
  });

  it('stays only the posts deeper than 0.5 m or faster than 1.0 m/s (common practice, no published source)', () => {
    expect(V.posts.filter((p) => p.braced).map((p) => p.chainageM)).toEqual([96, 100, 104].map((c) => expect.closeTo(c, 9)));
    const edge = gatePosts(V)[0]!;
    expect(edge.reasons.join(' ')).toMatch(/low rises between channels need none/);
  });

  it('opens the hanger link only at the low point (common practice, no published source)', () => {
    expect(gatePosts(V).map((p) => p.hungDropper?.link)).toEqual(['closed', 'closed', 'closed', 'open', 'closed', 'closed', 'closed']);
  });

  it('puts the breakaway tie at the lowest post (common practice, no published source)', () => {
    expect(V.posts.filter((p) => p.breakawayTie).map((p) => p.chainageM)).toEqual([100]);
    expect(V.breakawayTies).toEqual([expect.objectContaining({ chainageM: 100, at: 'lowest-post' })]);
  });

  it('makes plain every wire below flood level + freeboard at the lowest post; the top wire stays barbed (common practice, no published source)', () => {
    // Lowest post ground 0 m, level 1.2 m: wires at 0.2, 0.5, 0.8, 1.1 m sit in the flow, 1.4 m does not.
    expect(V.wires.map((w) => w.kind)).toEqual(['plain', 'plain', 'plain', 'plain', 'barbed']);
    expect(V.wires.map((w) => w.mustBePlain)).toEqual([true, true, true, true, false]);
    expect(V.wires[3]!.lowestElevationM).toBeCloseTo(1.1, 12);
    expect(V.wires[4]!.reason).toMatch(/barbed as specified/);
  });

  it('runs the wires through a continuous floodgate between flex runs (common practice, no published source)', () => {
    const d = V.styleDetail;
    expect(d.wiresRunThrough).toBe(true);
    expect(d.flexRunEachSideM).toBe(60);
    expect(d.flexRunStrainers.map((s) => s.chainageM)).toEqual([expect.closeTo(13, 9), expect.closeTo(187, 9)]);
    expect(d.wireRunM).toBeCloseTo(54 + 120, 9);
    // 24 m floodgate: max(50, 2.5 × 24) = 60 m recommended, so 60 m draws no warning.
    expect(d.recommendedMinFlexRunM).toBeCloseTo(60, 9);
    expect(d.sacrificialSection).toBeNull();
    expect(d.staysPerEndStrainer).toBe(2);
  });

  it('gives heavy posts 1.2 m deep at least, 1.5 m preferred, and the usual cautions (common practice, no published source)', () => {
    expect(V.heavyPosts).toMatchObject({ minSizeMm: 75, minEmbedmentM: 1.2, preferredEmbedmentM: 1.5 });
    expect(V.cautions).toBe(FENCING_CAUTIONS);
    const text = V.cautions.join(' ');
    for (const words of [/floodwater/, /buried services/, /eye and hand protection/, /permits for works in watercourses/]) expect(text).toMatch(words);
  });

  it('gives every post a reason in plain words', () => {
    expect(V.posts.every((p) => p.reasons.length > 0 && p.reasons.every((r) => r.length > 10))).toBe(true);
    expect(gatePosts(V)[1]!.reasons.join(' ')).toMatch(/approximation/);
  });
});

describe('layoutFloodgate: styles', () => {
  const drop = layoutFloodgate({ ...NO_FLEX_RUN, style: 'drop-down-section' });

  it('drop-down: terminates the fence on both end assemblies with no flex run (NSW DPI Primefact 681, 2009)', () => {
    const d = drop.styleDetail;
    expect(d.wiresRunThrough).toBe(false);
    expect(d.flexRunEachSideM).toBe(0);
    expect(d.flexRunStrainers).toEqual([]);
    expect(d.sacrificialSection).toEqual(drop.span);
    expect(d.wireRunM).toBeCloseTo(54, 9);
    expect(d.staysPerEndStrainer).toBe(1);
    expect(drop.breakawayTies.map((t) => t.at)).toEqual(['lowest-post', 'end-assembly', 'end-assembly']);
    expect(drop.warnings).toEqual([]);
  });

  it('shares everything but the style detail with the continuous layout, so the two compare', () => {
    expect(drop.posts).toEqual(V.posts);
    expect(drop.endStrainers).toEqual(V.endStrainers);
    expect(drop.wires).toEqual(V.wires);
  });

  it('continuous: needs the flex run, and warns when it is short of the rule of thumb (common practice, no published source)', () => {
    expect(() => layoutFloodgate(NO_FLEX_RUN)).toThrow(/flexRunEachSideM/);
    const short = layoutFloodgate({ ...V_INPUT, flexRunEachSideM: 40 });
    expect(short.warnings.some((w) => /flex run of 40 m/.test(w) && /60 m/.test(w))).toBe(true);
  });
});

describe('layoutFloodgate: awkward ground', () => {
  it('moves a strainer out past a second low area within the set-back, and says so', () => {
    // A dip to 0.9 m at chainage 76, inside the 15 m set-back from the wet zone edge at 88 m.
    const profile = [
      { chainageM: 0, elevationM: 3 },
      { chainageM: 74, elevationM: 3 },
      { chainageM: 76, elevationM: 0.9 },
      { chainageM: 78, elevationM: 3 },
      { chainageM: 80, elevationM: 2 },
      ...V_PROFILE.slice(1),
    ];
    const l = layoutFloodgate({ ...V_INPUT, profile });
    const start = l.endStrainers[0];
    // The dip is below 1.2 m from 74 + 1.8/2.1 × 2 to 76 + 0.3/2.1 × 2 (analytic).
    const outerEdge = 74 + (1.8 / 2.1) * 2;
    expect(start.chainageM).toBeCloseTo(outerEdge - 15, 9);
    expect(start.onDryGround).toBe(true);
    expect(start.reasons.join(' ')).toMatch(/moved out/);
    expect(l.endStrainers[1].chainageM).toBeCloseTo(127, 9);
  });

  it('still returns a layout when the flood overtops the whole profile, flagged and warned', () => {
    const l = layoutFloodgate({ ...V_INPUT, floodLevelM: 12 });
    expect(l.overtopsProfile).toBe(true);
    expect(l.warnings.some((w) => /too short to contain the flood/.test(w))).toBe(true);
    expect(l.endStrainers.map((s) => s.onDryGround)).toEqual([false, false]);
    expect(l.endStrainers.map((s) => s.chainageM)).toEqual([-15, 215]);
    expect(l.endStrainers.map((s) => s.groundM)).toEqual([null, null]);
    expect(l.endStrainers.every((s) => s.warnings.length > 0)).toBe(true);
    expect(l.wires.every((w) => w.mustBePlain)).toBe(true);
  });

  it('warns when the profile ends inside the set-back', () => {
    const l = layoutFloodgate({ ...V_INPUT, profile: [{ chainageM: 80, elevationM: 2 }, ...V_PROFILE.slice(1)] });
    expect(l.endStrainers[0].onDryGround).toBe(false);
    expect(l.endStrainers[0].warnings.join(' ')).toMatch(/profile ends at 80 m/);
  });

  it('warns about an oblique crossing (common practice, no published source)', () => {
    const l = layoutFloodgate({ ...V_INPUT, crossingAngleDeg: 40 });
    expect(l.warnings.some((w) => /right angle/.test(w))).toBe(true);
  });

  it('gives a tiny gully one post between its edges for the breakaway tie', () => {
    const l = layoutFloodgate({ ...V_INPUT, floodLevelM: 0.05, settings: { freeboardM: 0.05 } });
    expect(l.wetZone.lengthM).toBeCloseTo(2, 9);
    expect(gatePosts(l).map((p) => p.chainageM)).toEqual([99, 100, 101].map((c) => expect.closeTo(c, 9)));
    expect(l.breakawayTies[0]!.chainageM).toBeCloseTo(100, 9);
  });
});

describe('layoutFloodgate: bad input', () => {
  it('rejects negative or absurd settings with clear messages', () => {
    expect(() => layoutFloodgate({ ...V_INPUT, settings: { postSpacingM: 0 } })).toThrow(/settings.postSpacingM/);
    expect(() => layoutFloodgate({ ...V_INPUT, settings: { freeboardM: -0.1 } })).toThrow(/settings.freeboardM/);
    expect(() => layoutFloodgate({ ...V_INPUT, settings: { strainerSetbackM: -5 } })).toThrow(/settings.strainerSetbackM/);
    expect(() => layoutFloodgate({ ...V_INPUT, settings: { minEmbedmentM: 1.5, preferredEmbedmentM: 1.2 } })).toThrow(/preferredEmbedmentM/);
    expect(() => layoutFloodgate({ ...V_INPUT, settings: { braceDepthM: Number.NaN } })).toThrow(/braceDepthM/);
    expect(() => layoutFloodgate({ ...V_INPUT, settings: { freebord: 0.3 } as never })).toThrow(/unknown floodgate setting "freebord"/);
  });

  it('rejects bad flood and fence input', () => {
    expect(() => layoutFloodgate({ ...V_INPUT, manningN: 0 })).toThrow(/manningN/);
    expect(() => layoutFloodgate({ ...V_INPUT, energySlope: -0.01 })).toThrow(/energySlope/);
    expect(() => layoutFloodgate({ ...V_INPUT, meanVelocityMs: -1 })).toThrow(/meanVelocityMs/);
    expect(() => layoutFloodgate({ ...V_INPUT, style: 'swing' as never })).toThrow(/style/);
    expect(() => layoutFloodgate({ ...V_INPUT, fence: { wireHeightsM: [0.2, 0.5], wireKinds: ['plain'] } })).toThrow(/one kind per wire/);
    expect(() => layoutFloodgate({ ...V_INPUT, fence: { wireHeightsM: [0.5, 0.2], wireKinds: ['plain', 'plain'] } })).toThrow(/bottom to top/);
    expect(() => layoutFloodgate({ ...V_INPUT, fence: { wireHeightsM: [0.2], wireKinds: ['electric' as never] } })).toThrow(/plain' or 'barbed/);
  });

  it('rejects a flood below the crossing: no wet zone', () => {
    expect(() => layoutFloodgate({ ...V_INPUT, floodLevelM: -1 })).toThrow(/no wet zone/);
  });

  it('does not mutate its input', () => {
    const input = deepFreeze(structuredClone(V_INPUT));
    expect(layoutFloodgate(input)).toEqual(V);
    expect(input).toEqual(V_INPUT);
  });
});

describe('layoutFloodgate: properties', () => {
  it('stands every end strainer on ground at or above flood level + freeboard, or warns (common practice, no published source)', () => {
    fc.assert(
      fc.property(inputArb, (input) => {
        const l = layoutFloodgate(input);
        for (const s of l.endStrainers) {
          if (s.warnings.length === 0) {
            expect(s.onDryGround).toBe(true);
            expect(s.groundM!).toBeGreaterThanOrEqual(l.designLevelM - 1e-9);
            expect(s.setbackFromWetZoneM).toBeGreaterThanOrEqual(l.settings.strainerSetbackM - 1e-9);
            // And all the ground within the set-back on the crossing's side of it is dry (from the
            // wet zone's edge, unless it was moved out past another low area).
            const setback = l.settings.strainerSetbackM;
            // The inner end is a level crossing, so only samples strictly inside it count (by more
            // than rounding: chainages are sums of floats).
            const within = (c: number) => (s.side === 'start' ? c >= s.chainageM && c < s.chainageM + setback - 1e-9 : c > s.chainageM - setback + 1e-9 && c <= s.chainageM);
            for (const p of input.profile) if (within(p.chainageM)) expect(p.elevationM!).toBeGreaterThanOrEqual(l.designLevelM);
            if (!s.reasons.join(' ').includes('moved out')) expect(s.setbackFromWetZoneM).toBeCloseTo(setback, 9);
          } else {
            expect(l.warnings).toEqual(expect.arrayContaining(s.warnings));
          }
        }
      }),
    );
  });

  it('never shortens the floodgate when the flood rises', () => {
    fc.assert(
      fc.property(inputArb, fc.double({ min: 0, max: 3, noNaN: true }), (input, rise) => {
        const a = layoutFloodgate(input);
        const b = layoutFloodgate({ ...input, floodLevelM: input.floodLevelM + rise });
        expect(b.floodgate.lengthM).toBeGreaterThanOrEqual(a.floodgate.lengthM - 1e-9);
        expect(b.floodgate.startChainageM).toBeLessThanOrEqual(a.floodgate.startChainageM + 1e-9);
      }),
    );
  });

  it('keeps posts within the spacing, opens links only at low points, stays only past the thresholds, ties the lowest post', () => {
    fc.assert(
      fc.property(inputArb, (input) => {
        const l = layoutFloodgate(input);
        const chain = [l.endStrainers[0].chainageM, ...l.posts.map((p) => p.chainageM), l.endStrainers[1].chainageM];
        for (let i = 1; i < chain.length; i++) {
          expect(chain[i]! - chain[i - 1]!).toBeLessThanOrEqual(l.settings.postSpacingM + 1e-9);
          expect(chain[i]!).toBeGreaterThanOrEqual(chain[i - 1]!);
        }
        const ground = (c: number) => (c >= input.profile[0]!.chainageM && c <= input.profile[input.profile.length - 1]!.chainageM ? groundAt(input.profile, c) : null);
        l.posts.forEach((p, i) => {
          expect(p.braced).toBe(p.floodDepthM > l.settings.braceDepthM || p.velocityMs > l.settings.braceVelocityMs);
          if (p.hungDropper) {
            const [a, b] = [ground(chain[i]!), ground(chain[i + 2]!)];
            if (a !== null && b !== null && p.groundM !== null) {
              const chord = a + ((p.chainageM - chain[i]!) / (chain[i + 2]! - chain[i]!)) * (b - a);
              if (p.hungDropper.link === 'open') expect(p.groundM).toBeLessThan(chord);
              else expect(p.groundM).toBeGreaterThanOrEqual(chord - 1e-6);
            }
          }
          if (p.groundM !== null) expect(p.velocityMs).toBeLessThanOrEqual(l.settings.velocityCapFactor * input.meanVelocityMs + 1e-12);
        });
        const gate = gatePosts(l).filter((p) => p.groundM !== null);
        const tied = l.posts.filter((p) => p.breakawayTie);
        expect(tied).toHaveLength(gate.length > 0 ? 1 : 0);
        if (tied[0]) expect(tied[0].groundM).toBe(Math.min(...gate.map((p) => p.groundM!)));
        for (const w of l.wires) {
          const inFlow = l.posts.some((p) => p.groundM !== null && p.groundM + w.heightM < l.designLevelM);
          expect(w.mustBePlain).toBe(inFlow);
        }
      }),
    );
  });
});

describe('localVelocityMs and chooseDropperLink', () => {
  it('gives Manning with R = d, capped (derived: n = 0.04, S = 0.0016, d = 1 → 1 m/s)', () => {
    expect(localVelocityMs(1, 0.04, 0.0016, 5)).toEqual({ velocityMs: expect.closeTo(1, 12), capped: false });
    expect(localVelocityMs(8, 0.04, 0.0016, 1.5)).toEqual({ velocityMs: 1.5, capped: true });
    expect(localVelocityMs(0, 0.04, 0.0016, 1.5)).toEqual({ velocityMs: 0, capped: false });
  });

  it('opens only below the chord (common practice, no published source)', () => {
    expect(chooseDropperLink({ chainageM: 0, groundM: 1 }, { chainageM: 4, groundM: 0.4 }, { chainageM: 8, groundM: 0 }).link).toBe('open');
    expect(chooseDropperLink({ chainageM: 0, groundM: 1 }, { chainageM: 4, groundM: 0.5 }, { chainageM: 8, groundM: 0 }).link).toBe('closed');
    expect(chooseDropperLink({ chainageM: 0, groundM: 1 }, { chainageM: 4, groundM: 0.6 }, { chainageM: 8, groundM: 0 }).link).toBe('closed');
    expect(chooseDropperLink({ chainageM: 0, groundM: null }, { chainageM: 4, groundM: 0 }, { chainageM: 8, groundM: 0 }).link).toBe('closed');
  });
});
