/**
 * The materials of a whole fence line: ordinary fence between strainers, plus its crossings.
 * (`materialsForCrossing` lives in `crossing-materials.ts` and is re-exported here.)
 */
import { FENCING_CAUTIONS } from '../design/cautions';
import type { FloodgateLayout } from '../design/floodgate-layout';
import { checkNumber } from '../design/ground-profile';
import { countRun, item, mergeItems, tieWireItem, wireItems } from './counting';
import { materialsForCrossing } from './crossing-materials';
import { resolveFenceSpec, type MaterialsFenceSpec } from './fence-spec';
import type { MaterialItem, MaterialsList } from './material-item';

export { materialsForCrossing } from './crossing-materials';

/** A fence line to count. Metres along the line from its first vertex. */
export interface FenceLineInput {
  /** Length of the fence line, metres. */
  readonly lengthM: number;
  /** Its interior vertices: chainage, metres, and how far the line turns there, degrees (either sign). */
  readonly vertices: readonly { readonly chainageM: number; readonly deflectionDeg: number }[];
  /** The floodgate layouts of its crossings, laid out on this line's chainage. */
  readonly crossings: readonly FloodgateLayout[];
  /** The fence as built. */
  readonly fence: MaterialsFenceSpec;
}

/**
 * Counts the materials of a fence line. Strainer assemblies stand at both ends (1 stay each), at
 * every vertex turning more than `cornerDeflectionDeg` (corners, 2 stays), and on long straights
 * every `strainerIntervalM` at most (evenly spaced, 2 stays; common practice). Each crossing's
 * footprint (see `materialsForCrossing`) is counted from its layout and left out of the ordinary
 * fence; no intermediate strainer is put inside a footprint, which would break a flex run. The
 * ordinary fence between strainers gets line posts at most `postSpacingM` apart (evenly), droppers
 * between them, one clip per wire per post, and wire of the specified kinds. Wire and tie wire are
 * summed over the whole line before rounding up to rolls.
 *
 * @param input - see {@link FenceLineInput}; not modified
 * @returns the merged items, the line's length, warnings (corners or overlaps inside crossings), cautions
 * @throws RangeError on malformed input, or a crossing laid out for other wires
 */
export function materialsForFenceLine(input: FenceLineInput): MaterialsList {
  if (typeof input !== 'object' || input === null) throw new RangeError('materialsForFenceLine needs { lengthM, vertices, crossings, fence }');
  const spec = resolveFenceSpec(input.fence);
  const lengthM = checkNumber(input.lengthM, 'lengthM', Number.MIN_VALUE, 1e7, 'm');
  if (!Array.isArray(input.vertices) || !Array.isArray(input.crossings)) throw new RangeError('vertices and crossings must be arrays (empty if none)');
  const crossings: readonly FloodgateLayout[] = input.crossings;
  const vertices: FenceLineInput['vertices'] = input.vertices;
  vertices.forEach((v, i) => {
    checkNumber(v?.chainageM, `vertices[${i}].chainageM`, 0, lengthM, 'm');
    checkNumber(v?.deflectionDeg, `vertices[${i}].deflectionDeg`, -180, 180, 'degrees');
  });
  const warnings: string[] = [];
  const fmt = (m: number) => `${Number(m.toFixed(1))} m`;

  const crossingLists = crossings.map((layout) => materialsForCrossing(layout, input.fence));
  const footprints = crossings
    .map((c) => {
      const d = c.styleDetail;
      const [a, b] = d.flexRunStrainers.length === 2 ? [d.flexRunStrainers[0]!.chainageM, d.flexRunStrainers[1]!.chainageM] : [c.span.startChainageM, c.span.endChainageM];
      return { a, b, at: c.crossingChainageM };
    })
    .sort((x, y) => x.a - y.a);
  footprints.forEach((f, i) => {
    if (f.a < 0 || f.b > lengthM) warnings.push(`The crossing at ${fmt(f.at)} reaches from ${fmt(f.a)} to ${fmt(f.b)}, past the end of the ${fmt(lengthM)} fence line: check its strainers and flex runs.`);
    const next = footprints[i + 1];
    if (next && next.a < f.b) warnings.push(`The crossings at ${fmt(f.at)} and ${fmt(next.at)} overlap (${fmt(next.a)} to ${fmt(f.b)}): materials there are counted for both; design them as one crossing or move a strainer.`);
  });
  const corners = vertices.filter((v) => Math.abs(v.deflectionDeg) > spec.cornerDeflectionDeg).map((v) => v.chainageM);
  for (const c of corners) {
    const inside = footprints.find((f) => c > f.a && c < f.b);
    if (inside) warnings.push(`The corner at ${fmt(c)} lies within the crossing at ${fmt(inside.at)} (${fmt(inside.a)} to ${fmt(inside.b)}): its strainer would cut the flex run or floodgate; move the corner or the crossing.`);
  }

  // Ordinary fence: [0, length] less the footprints, cut at the corners into runs between strainers.
  const cuts = [0, lengthM, ...corners, ...footprints.flatMap((f) => [f.a, f.b])].map((c) => Math.min(lengthM, Math.max(0, c)));
  const stops = [...new Set(cuts)].sort((x, y) => x - y);
  let ordinaryM = 0;
  let intermediates = 0;
  let posts = 0;
  let droppers = 0;
  for (let i = 1; i < stops.length; i++) {
    const [a, b] = [stops[i - 1]!, stops[i]!];
    if (footprints.some((f) => (a + b) / 2 > f.a && (a + b) / 2 < f.b)) continue;
    const runs = Math.max(1, Math.ceil((b - a) / spec.strainerIntervalM - 1e-9));
    const run = countRun((b - a) / runs, spec);
    ordinaryM += b - a;
    intermediates += runs - 1;
    posts += runs * run.posts;
    droppers += runs * run.droppers;
  }
  const wireCount = spec.wireHeightsM.length;
  const metresByKind = { plain: 0, barbed: 0 };
  spec.wireKinds.forEach((k) => (metresByKind[k] += ordinaryM));
  crossings.forEach((c) => c.wires.forEach((w) => (metresByKind[w.kind] += c.styleDetail.wireRunM)));
  const ties = crossings.reduce((n, c) => n + c.posts.filter((p) => p.hungDropper !== null).length * wireCount, 0);

  const strainer = 'Strainer assembly, heavy strainer post';
  const stay = 'Stay for a strainer or post';
  const items: MaterialItem[] = [
    ...item('STRAINER_ASSEMBLY', strainer, 2, 'End assemblies at both ends of the fence line.'),
    ...item('STAY', stay, 2, 'One stay on each end assembly, toward the fence.'),
    ...item('STRAINER_ASSEMBLY', strainer, corners.length, `Corner assemblies where the line turns more than ${spec.cornerDeflectionDeg}° (common practice).`),
    ...item('STAY', stay, 2 * corners.length, 'Two stays on each corner assembly, one along each leg.'),
    ...item('STRAINER_ASSEMBLY', strainer, intermediates, `Intermediate strainers so no straight run is longer than ${spec.strainerIntervalM} m (common practice, no published source).`),
    ...item('STAY', stay, 2 * intermediates, 'Two stays on each intermediate strainer, one each way.'),
    ...item('LINE_POST', 'Line post', posts, `Ordinary line posts at most ${spec.postSpacingM} m apart, evenly spaced between strainers.`),
    ...item('DROPPER', 'Dropper', droppers, 'Ordinary droppers between posts at the fence\'s dropper spacing.'),
    ...item('CLIP', 'Wire clip', posts * wireCount, 'One clip per wire on each ordinary post.'),
    ...crossingLists.flatMap((l) => l.items.filter((it) => it.code !== 'WIRE_PLAIN' && it.code !== 'WIRE_BARBED' && it.code !== 'TIE_WIRE')),
  ];
  const merged = mergeItems(items);
  merged.push(...wireItems(metresByKind, spec, `${Math.round(ordinaryM)} m of ordinary fence × ${wireCount} wires as specified, and each crossing's wire run with its plain wires.`));
  const tieWire = tieWireItem(ties, spec, 'Each hung dropper of the crossings tied firmly to each wire (common practice).');
  if (tieWire) merged.push(tieWire);
  crossingLists.forEach((l, i) => l.warnings.forEach((w) => warnings.push(`Crossing at ${fmt(crossings[i]!.crossingChainageM)}: ${w}`)));
  return { items: merged, fenceLengthM: lengthM, crossingCount: crossings.length, warnings, cautions: FENCING_CAUTIONS };
}
