import { DRAFT_COLOURS, DRAFT_SHOWS_POINTS } from '../../../src/components/map/draft-style';
import { TRACK_PADDOCK_COLOURS, paddockEdgeLayer, paddockFillLayer, trackCasingLayer, trackLineLayer } from '../../../src/components/map/track-layers';
import { simulate, type Deficiency } from '@bjornlu/colorblind';
import { converter, differenceCiede2000, formatHex, interpolate, wcagContrast } from 'culori';
import { describe, expect, it } from 'vitest';
import { crossingDotLayer, crossingRedesignLayer, crossingRingLayer } from '../../../src/components/map/crossing-layers';
import { fenceCasingLayer, fenceStatusPaint, realignCasingLayer, realignLineLayer } from '../../../src/components/map/fence-layers';
import { propertyExtentFill } from '../../../src/components/map/layers';
import { LAYOUT_ICON_COLOURS, layoutMarkerLayer, layoutPostLayer } from '../../../src/components/map/layout-layers';
import { FENCE_STATUS_STYLES, PLAN_COLOURS } from '../../../src/components/map/plan-style';
import { TERRAIN_COLOURS, contourLineLayer, drainageCasingLayer, drainageLineLayer } from '../../../src/components/map/terrain-layers';
import { MAP_COLOURS } from '../../../src/components/map/theme';
import type { FenceStatus } from '../../../src/lib/schemas/plan';

/*
 * The map's colours, checked for people with colour vision deficiency with a simulator rather
 * than by eye.
 *
 * Simulation: @bjornlu/colorblind 1.0.3. Its README says it follows Jim Schmitz's "Color
 * Blindness Simulation Research" (ixora.io, 2016, with its Processing library); its code shows
 * the method: linear RGB → LMS (Hunt–Pointer–Estevez, normalised to D65) → projection onto one
 * plane per deficiency → back. That single-plane projection is Viénot, Brettel & Mollon (1999)
 * "Digital video colourmaps for checking the legibility of displays by dichromats", Color
 * Research & Application 24(4), not the two half-planes of Brettel, Viénot & Mollon (1997,
 * JOSA A 14(10)). Viénot 1999 treats protanopia and deuteranopia; the same single plane for
 * tritanopia is a rougher approximation (from memory), so the tritan results are a guide only.
 * The README says the library makes no assumption about gamma; Schmitz's method removes the
 * sRGB gamma first, so colours are linearised here before and re-encoded after. The library
 * rounds its input and output to whole numbers (0–255), in linear light here: in the darkest
 * colours that moves a channel by up to about 2 sRGB steps, well under a ΔE2000 of 1.
 *
 * Apart within a group: CIEDE2000 ΔE ≥ 10 (culori's differenceCiede2000) for every pair, in
 * normal vision and in each simulation. 10 is common practice for colours that must be told
 * apart at a glance as small marks, with no single published source; a just-noticeable
 * difference is about 1–2 (from memory). Pairs that the map tells apart by shape instead (dash
 * pattern, line width, symbol) are listed with the difference, which is checked against the
 * layer definitions, and the list must stay minimal: a pair that passes on colour is not listed.
 *
 * Against the background: WCAG 2.1 Success Criterion 1.4.11 "Non-text Contrast" (W3C, 2018)
 * asks for a contrast ratio of at least 3:1 between graphical objects needed to understand
 * content and the colours next to them (culori's wcagContrast, WCAG 2.1 relative luminance).
 * Each mark is checked against what it is drawn on: the pale-clay ground and the same ground
 * under the property's ochre wash, or the pale casing its layer draws beneath it; where a mark
 * has a dark outline that carries the contrast (its fill need not then, per the criterion's
 * Understanding document), the outline is checked instead. Also in each simulation.
 */

const DELTA_E_MIN = 10;
const CONTRAST_MIN = 3;

type View = 'normal' | Exclude<Deficiency, 'achromatopsia'>;
const VIEWS: View[] = ['normal', 'protanopia', 'deuteranopia', 'tritanopia'];

const toLinear = converter('lrgb');
const toRgb = converter('rgb');

/** The colour as a person with this kind of vision sees it, as `#rrggbb`. */
function seenBy(hex: string, view: View): string {
  if (view === 'normal') return hex;
  const linear = toLinear(hex);
  if (!linear) throw new Error(`not a colour: ${hex}`);
  const out = simulate({ r: linear.r * 255, g: linear.g * 255, b: linear.b * 255 }, view);
  return formatHex(toRgb({ mode: 'lrgb', r: out.r / 255, g: out.g / 255, b: out.b / 255 }));
}

const deltaE2000 = differenceCiede2000();

/** `top` at `opacity` over `base`, blended in sRGB as the map's WebGL drawing does. */
const over = (base: string, top: string, opacity: number): string => formatHex(interpolate([base, top], 'rgb')(opacity));

// ---- reading the layer definitions ------------------------------------------------------

type Paint = Record<string, unknown>;
const paintOf = (layer: { paint?: unknown }): Paint => (layer.paint ?? {}) as Paint;

/** The output values of a paint value: a number, or the outputs of an `interpolate` or `case` expression. */
function outputsOf(value: unknown): unknown[] {
  if (!Array.isArray(value)) return [value];
  const [op, ...rest] = value as unknown[];
  if (op === 'interpolate') return rest.slice(2).filter((_, i) => i % 2 === 1).flatMap(outputsOf);
  if (op === 'case') return rest.filter((_, i) => i % 2 === 1 || i === rest.length - 1).flatMap(outputsOf);
  return [value];
}
const numbersOf = (value: unknown) => outputsOf(value).filter((output): output is number => typeof output === 'number');
const statusLayer = (status: FenceStatus) => ({ paint: fenceStatusPaint(status) });
const filterText = (layer: { filter?: unknown }) => JSON.stringify(layer.filter ?? null);

// ---- backgrounds ------------------------------------------------------------------------

const GROUND = MAP_COLOURS.ground;
/** Inside the property: the ground under the extent's ochre wash, at the layer's opacity. */
const WASHED_GROUND = over(GROUND, MAP_COLOURS.extentFill, paintOf(propertyExtentFill)['fill-opacity'] as number);

/** A line layer's casing as it shows over the ground and over the washed ground. */
function casingOf(layer: { paint?: unknown }): string[] {
  const paint = paintOf(layer);
  const colour = paint['line-color'] as string;
  const opacity = (paint['line-opacity'] as number | undefined) ?? 1;
  return [over(GROUND, colour, opacity), over(WASHED_GROUND, colour, opacity)];
}

// ---- what must be told apart ------------------------------------------------------------

type Mark = {
  name: string;
  colour: string;
  /** What the mark is seen against: the colours beside it on the map, for the 3:1 check; `holds` checks the why. */
  against: { colours: string[]; why: string; holds?: boolean } | { exempt: string };
  /** A dark outline that carries the mark's contrast with the ground instead of its fill. */
  outline?: { colour: string; drawn: boolean; why: string };
};

type ShapePair = { pair: [string, string]; how: string; holds: boolean };

type Group = { name: string; marks: Mark[]; apartByShape: ShapePair[] };

const onGround = { colours: [GROUND, WASHED_GROUND], why: 'drawn straight on the ground' };

/** A casing shows on both sides of its line only where it is wider at every stop. */
function casingWider(casing: { paint?: unknown }, line: { paint?: unknown }): boolean {
  const casingWidths = numbersOf(paintOf(casing)['line-width']);
  const lineWidths = numbersOf(paintOf(line)['line-width']);
  return casingWidths.length === lineWidths.length && casingWidths.every((width, i) => width > lineWidths[i]!);
}

const fenceDash = (status: FenceStatus) => JSON.stringify(paintOf(statusLayer(status))['line-dasharray'] ?? 'solid');
const minFenceWidthPx = Math.min(...(Object.keys(FENCE_STATUS_STYLES) as FenceStatus[]).flatMap((status) => numbersOf(paintOf(statusLayer(status))['line-width'])));
const contour = contourLineLayer(1, 5);
const maxContourWidthPx = Math.max(...numbersOf(paintOf(contour)['line-width']));

const GROUPS: Group[] = [
  {
    name: 'crossings on their creek',
    marks: [
      ...(['good', 'fair', 'poor'] as const).map((angleClass) => ({
        name: angleClass,
        colour: PLAN_COLOURS.angle[angleClass],
        against: onGround,
        ...(angleClass !== 'good' && {
          outline: {
            colour: paintOf(crossingRingLayer)['circle-stroke-color'] as string,
            drawn: filterText(crossingRingLayer).includes(`"${angleClass}"`),
            why: 'fair and poor crossings carry a dark ring',
          },
        }),
      })),
      { name: 'no angle', colour: PLAN_COLOURS.angleNone, against: onGround },
      { name: 'redesign ring', colour: paintOf(crossingRedesignLayer)['circle-stroke-color'] as string, against: onGround },
      { name: 'drainage', colour: TERRAIN_COLOURS.drainage, against: { colours: casingOf(drainageCasingLayer(1)), why: 'drainage lines run on a wider pale casing', holds: casingWider(drainageCasingLayer(1), drainageLineLayer(1)) } },
    ],
    apartByShape: [
      {
        pair: ['good', 'drainage'],
        how: 'a crossing is a disc with a pale rim sitting on the line of its creek',
        holds: crossingDotLayer.type === 'circle' && drainageLineLayer(1).type === 'line' && outputsOf(paintOf(crossingDotLayer)['circle-stroke-color']).includes(MAP_COLOURS.casing),
      },
    ],
  },
  {
    name: 'lines on the map: fence statuses, realignment preview, drainage and contours',
    marks: [
      ...(Object.keys(FENCE_STATUS_STYLES) as FenceStatus[]).map((status) => ({
        name: status,
        colour: FENCE_STATUS_STYLES[status].colour,
        against: { colours: casingOf(fenceCasingLayer), why: 'every fence line runs on a wider pale casing', holds: casingWider(fenceCasingLayer, statusLayer(status)) },
      })),
      { name: 'realignment', colour: paintOf(realignLineLayer)['line-color'] as string, against: { colours: casingOf(realignCasingLayer), why: 'the preview runs on its own wider casing', holds: casingWider(realignCasingLayer, realignLineLayer) } },
      { name: 'drainage', colour: TERRAIN_COLOURS.drainage, against: { colours: casingOf(drainageCasingLayer(1)), why: 'drainage lines run on a wider pale casing', holds: casingWider(drainageCasingLayer(1), drainageLineLayer(1)) } },
      { name: 'GPS track', colour: TRACK_PADDOCK_COLOURS.track, against: { colours: casingOf(trackCasingLayer), why: 'tracks run on a wider pale casing', holds: casingWider(trackCasingLayer, trackLineLayer) } },
      { name: 'paddock edge', colour: TRACK_PADDOCK_COLOURS.paddockEdge, against: onGround },
      { name: 'shape being drawn', colour: DRAFT_COLOURS.line, against: onGround },
      {
        name: 'contour',
        colour: TERRAIN_COLOURS.contour,
        against: { exempt: 'contours are faint on purpose (55 % opacity hairlines, labelled with their heights) so they stay behind the plan' },
      },
    ],
    apartByShape: [
      { pair: ['building', 'built'], how: 'dash-dot against solid', holds: fenceDash('building') !== fenceDash('built') },
      {
        pair: ['building', 'paddock edge'],
        how: 'a paddock edge is a fine line with no casing, fences wide lines on a casing',
        holds: Math.max(...numbersOf(paintOf(paddockEdgeLayer)['line-width'])) < minFenceWidthPx,
      },
      {
        pair: ['paddock edge', 'contour'],
        how: 'a paddock edge is opaque and borders a tinted fill holding its name and area; contours are translucent hairlines',
        holds: (paintOf(paddockFillLayer)['fill-opacity'] as number) > 0 && (paintOf(paddockEdgeLayer)['line-opacity'] ?? 1) === 1 && (paintOf(contour)['line-opacity'] as number) < 1,
      },
      {
        pair: ['GPS track', 'paddock edge'],
        how: 'a track is a row of dots on a casing, a paddock edge a fine solid line',
        holds: Array.isArray(paintOf(trackLineLayer)['line-dasharray']) && paintOf(paddockEdgeLayer)['line-dasharray'] === undefined,
      },
      { pair: ['built', 'shape being drawn'], how: 'a shape being drawn shows a ring at every point, and only while it is drawn', holds: DRAFT_SHOWS_POINTS },
      {
        pair: ['approved', 'contour'],
        how: 'fences are wide lines on a casing, contours translucent hairlines',
        holds: maxContourWidthPx < minFenceWidthPx && (paintOf(contour)['line-opacity'] as number) < 1,
      },
    ],
  },
  {
    name: 'layout symbols',
    marks: [
      {
        name: 'end strainer',
        colour: LAYOUT_ICON_COLOURS.endStrainer.fill,
        against: { colours: [LAYOUT_ICON_COLOURS.endStrainer.rim], why: 'the square stands on a pale rim' },
      },
      ...(['floodgate post', 'stayed post'] as const).map((name) => ({
        name,
        colour: PLAN_COLOURS.ink,
        against: { colours: [paintOf(layoutPostLayer)['circle-stroke-color'] as string], why: 'posts have a pale rim' },
      })),
      { name: 'line post', colour: PLAN_COLOURS.linePost, against: { colours: [paintOf(layoutPostLayer)['circle-stroke-color'] as string], why: 'posts have a pale rim' } },
      {
        name: 'breakaway tie',
        colour: LAYOUT_ICON_COLOURS.breakawayTie.fill,
        against: { colours: [LAYOUT_ICON_COLOURS.breakawayTie.rim], why: 'the diamond stands on a pale rim' },
        outline: { colour: LAYOUT_ICON_COLOURS.breakawayTie.outline, drawn: true, why: 'the diamond has a dark outline' },
      },
    ],
    apartByShape: [
      ...(['floodgate post', 'stayed post'] as const).map((post) => ({
        pair: ['end strainer', post] as [string, string],
        how: 'a square icon against a round post',
        holds: filterText(layoutMarkerLayer).includes('"end-strainer"') && layoutPostLayer.type === 'circle' && filterText(layoutPostLayer).includes('"floodgate-post"'),
      })),
      {
        pair: ['floodgate post', 'stayed post'],
        how: 'a stayed post is larger with a wider pale rim',
        holds: new Set(outputsOf(paintOf(layoutPostLayer)['circle-stroke-width'])).size > 1,
      },
    ],
  },
];

const pairsOf = <T,>(items: T[]): [T, T][] => items.flatMap((a, i) => items.slice(i + 1).map((b): [T, T] => [a, b]));
const samePair = (a: [string, string], b: [string, string]) => (a[0] === b[0] && a[1] === b[1]) || (a[0] === b[1] && a[1] === b[0]);

describe.each(GROUPS)('$name', ({ marks, apartByShape }) => {
  const shapeFor = (pair: [string, string]) => apartByShape.find((entry) => samePair(entry.pair, pair));

  it.each(VIEWS)('every pair stays apart by colour (ΔE2000 ≥ 10) or is drawn apart by shape, in %s vision', (view) => {
    const tooClose = pairsOf(marks)
      .map(([a, b]) => ({ pair: [a.name, b.name] as [string, string], deltaE: deltaE2000(seenBy(a.colour, view), seenBy(b.colour, view)) }))
      .filter(({ pair, deltaE }) => deltaE < DELTA_E_MIN && !shapeFor(pair))
      .map(({ pair, deltaE }) => `${pair.join(' / ')}: ΔE2000 ${deltaE.toFixed(1)}`);
    expect(tooClose).toEqual([]);
  });

  it.each(apartByShape.map((entry) => [entry.pair.join(' / '), entry] as const))('%s: drawn apart by shape, and needs to be', (_name, entry) => {
    expect(entry.holds, entry.how).toBe(true);
    const [a, b] = entry.pair.map((name) => marks.find((mark) => mark.name === name)!);
    const closest = Math.min(...VIEWS.map((view) => deltaE2000(seenBy(a!.colour, view), seenBy(b!.colour, view))));
    // Listed only while colour alone would not do: a pair that passes on colour leaves the list.
    expect(closest, `${entry.pair.join(' / ')} passes on colour: remove it from the shape list`).toBeLessThan(DELTA_E_MIN);
  });

  it.each(VIEWS)('every mark stands out from what it is drawn on (WCAG 2.1 SC 1.4.11, 3:1), in %s vision', (view) => {
    const weak: string[] = [];
    for (const mark of marks) {
      if ('exempt' in mark.against) continue;
      expect(mark.against.holds ?? true, `${mark.name}: ${mark.against.why}`).toBe(true);
      if (mark.outline) expect(mark.outline.drawn, `${mark.name}: ${mark.outline.why}`).toBe(true);
      const edge = mark.outline?.colour ?? mark.colour;
      for (const background of mark.against.colours) {
        const ratio = wcagContrast(seenBy(edge, view), seenBy(background, view));
        if (ratio < CONTRAST_MIN) weak.push(`${mark.name} (${edge}) on ${background}: ${ratio.toFixed(2)}:1`);
      }
    }
    expect(weak).toEqual([]);
  });
});

describe('drainage stream orders', () => {
  it('are told apart by width in one colour, so there is no colour to check between them', () => {
    expect(paintOf(drainageLineLayer(1))['line-color']).toBe(TERRAIN_COLOURS.drainage);
    expect(new Set(numbersOf(paintOf(drainageLineLayer(1))['line-width'])).size).toBeGreaterThan(1);
  });
});

describe('the simulation', () => {
  it('keeps greys grey and confuses the classic pairs (a check that it runs as intended)', () => {
    // A neutral lies on every dichromat's projection plane, so it is unchanged (within rounding).
    for (const view of VIEWS) expect(deltaE2000(seenBy('#808080', view), '#808080')).toBeLessThan(1);
    // Red and green of equal lightness, the protan and deutan confusion; blue and green the tritan one.
    expect(deltaE2000(seenBy('#cc3300', 'protanopia'), seenBy('#669900', 'protanopia'))).toBeLessThan(deltaE2000('#cc3300', '#669900') / 3);
    expect(deltaE2000(seenBy('#cc3300', 'deuteranopia'), seenBy('#669900', 'deuteranopia'))).toBeLessThan(deltaE2000('#cc3300', '#669900') / 3);
    expect(deltaE2000(seenBy('#0072B2', 'tritanopia'), seenBy('#009E73', 'tritanopia'))).toBeLessThan(deltaE2000('#0072B2', '#009E73'));
  });
});
