import { describe, expect, it } from 'vitest';
import type { DesignedCrossingView, FloodgatePostView } from '../../../src/lib/schemas/crossing-view';
import { buildProfileChart, describeProfileChart, formatOffset, groundAt } from '../../../src/components/workspace/crossing/profile-chart-data';

/**
 * A V-shaped channel you can check by hand: 1 m samples from chainage 0 to 100, the bed at
 * chainage 50 at 100 m, banks rising 0.1 m per metre. A flood level of 101 m stands from
 * chainage 40 to 60 (20 m of water, 1 m deep); with 0.5 m of freeboard the wet zone runs from
 * 35 to 65. The crossing is at chainage 52, so the bed is 2 m before it.
 */
const CROSSING_CHAINAGE_M = 52;
const profile = Array.from({ length: 101 }, (_, i) => ({ chainageM: i, elevationM: 100 + Math.abs(i - 50) * 0.1 }));

function post(chainageM: number, extra: Partial<FloodgatePostView> = {}): FloodgatePostView {
  return {
    chainageM,
    groundM: 100 + Math.abs(chainageM - 50) * 0.1,
    role: 'floodgate',
    floodDepthM: 0,
    velocityMs: 0,
    heavy: true,
    braced: false,
    hungDropper: null,
    breakawayTie: false,
    reasons: [],
    ...extra,
  };
}

// Only the parts of a design the chart reads; the rest of the view is not needed here.
const design = {
  status: 'designed',
  profile,
  layout: {
    floodLevelM: 101,
    designLevelM: 101.5,
    wetZone: { startChainageM: 35, endChainageM: 65, lengthM: 30, maxDepthM: 1 },
    floodgate: { startChainageM: 34, endChainageM: 66, lengthM: 32, reason: '' },
    endStrainers: [
      { side: 'start', chainageM: 20, groundM: 103, setbackFromWetZoneM: 15, onDryGround: true, reasons: [], warnings: [] },
      { side: 'end', chainageM: 80, groundM: 103, setbackFromWetZoneM: 15, onDryGround: true, reasons: [], warnings: [] },
    ],
    posts: [post(30, { role: 'line' }), post(45), post(50, { braced: true, breakawayTie: true }), post(55)],
    breakawayTies: [{ chainageM: 50, at: 'lowest-post', reason: '' }],
  },
} as unknown as DesignedCrossingView;

describe('buildProfileChart', () => {
  const chart = buildProfileChart(design, CROSSING_CHAINAGE_M)!;

  it('measures from the crossing and frames the end strainers with a margin', () => {
    // Strainers 60 m apart: a margin of max(10, 0.15 × 60) = 10 m each side.
    expect(chart.xRangeM).toEqual([10 - 52, 90 - 52]);
    expect(chart.strainersM).toEqual([-32, 28]);
    expect(chart.wetZoneM).toEqual([-17, 13]);
    expect(chart.floodgateM).toEqual([-18, 14]);
  });

  it('finds the water between the points where the ground meets the flood level', () => {
    expect(chart.floodWidthM).toBeCloseTo(20, 9);
    expect(chart.floodDepthM).toBe(1);
    const wet = chart.xM.filter((_, i) => chart.floodM[i] !== null);
    expect(wet[0]).toBeCloseTo(40 - 52, 9);
    expect(wet[wet.length - 1]).toBeCloseTo(60 - 52, 9);
    // The freeboard line spans the wet zone exactly.
    const freeboard = chart.xM.filter((_, i) => chart.designM[i] !== null);
    expect([freeboard[0], freeboard[freeboard.length - 1]]).toEqual([-17, 13]);
  });

  it('puts the marks on the ground, stayed posts and the tie apart', () => {
    expect(chart.marks.map((mark) => [mark.kind, mark.xM, mark.inFloodgate])).toEqual([
      ['end-strainer', -32, true],
      ['end-strainer', 28, true],
      ['post', -22, false],
      ['post', -7, true],
      ['stayed-post', -2, true],
      ['post', 3, true],
      ['breakaway-tie', -2, true],
    ]);
    expect(chart.marks.find((mark) => mark.kind === 'breakaway-tie')!.groundM).toBeCloseTo(100, 9);
  });

  it('keeps a gap in the elevation model as a gap', () => {
    const gappy = { ...design, profile: profile.map((point) => (point.chainageM === 70 ? { ...point, elevationM: null } : point)) };
    const withGap = buildProfileChart(gappy, CROSSING_CHAINAGE_M)!;
    expect(withGap.groundM[withGap.xM.indexOf(70 - 52)]).toBeNull();
  });

  it('does not change the design it reads', () => {
    const before = JSON.stringify(design);
    buildProfileChart(design, CROSSING_CHAINAGE_M);
    expect(JSON.stringify(design)).toBe(before);
  });

  it('gives up on fewer than two known heights', () => {
    expect(buildProfileChart({ ...design, profile: [profile[0]!] }, CROSSING_CHAINAGE_M)).toBeNull();
  });

  it('says in one sentence what the chart shows', () => {
    expect(describeProfileChart(chart, 'South cross fence')).toBe(
      'Ground profile along South cross fence across the channel: flood 20 m wide, 1.0 m deep; floodgate 32 m; end strainers at \u221232 m and +28 m from the crossing.',
    );
  });
});

describe('groundAt', () => {
  it('interpolates between samples and is null beside a gap or off the profile', () => {
    const points = [
      { chainageM: 0, elevationM: 10 },
      { chainageM: 2, elevationM: 12 },
      { chainageM: 4, elevationM: null },
    ];
    expect(groundAt(points, 1)).toBe(11);
    expect(groundAt(points, 2)).toBe(12);
    expect(groundAt(points, 3)).toBeNull();
    expect(groundAt(points, 5)).toBeNull();
  });
});

describe('formatOffset', () => {
  it('writes the sign with a true minus', () => {
    expect([formatOffset(-31.4), formatOffset(27.6), formatOffset(0)]).toEqual(['\u221231 m', '+28 m', '0 m']);
  });
});
