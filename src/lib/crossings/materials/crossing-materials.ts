/**
 * The materials of one crossing, counted from its floodgate layout.
 */
import { FENCING_CAUTIONS } from '../design/cautions';
import type { FloodgateLayout } from '../design/floodgate-layout';
import { countRun, droppersInPanel, item, tieWireItem, wireItems } from './counting';
import { resolveFenceSpec, type MaterialsFenceSpec } from './fence-spec';
import type { MaterialItem, MaterialsList } from './material-item';

/**
 * Counts the materials of one crossing from its layout. The crossing's footprint is from end
 * strainer to end strainer for a drop-down section, and from flex-run strainer to flex-run
 * strainer for a continuous floodgate (its wires run unbroken over that length, so a wire that
 * must be plain is plain all the way): everything on that footprint is counted here, and
 * {@link materialsForFenceLine} counts only the fence outside it.
 *
 * Counts: strainer assemblies (end strainers, and flex-run strainers when continuous); stays (per
 * end strainer as the style needs, 2 per flex-run strainer, 1 per braced post); heavy floodgate
 * posts; ordinary line posts (set-back and flex runs); hung droppers and their open and closed
 * links; ordinary droppers between posts; wire by kind in metres and rolls; clips (one per wire
 * per ordinary post; hung-dropper posts carry the wires on the dropper); tie wire (each hung
 * dropper tied to each wire, firmly — common practice); breakaway ties.
 *
 * @param layout - from `layoutFloodgate`; not modified
 * @param fence - the fence as built, with the same wires the layout was made for; not modified
 * @returns the crossing's items, its footprint length as `fenceLengthM`, and the cautions
 * @throws RangeError when the fence spec is malformed or its wires differ from the layout's
 */
export function materialsForCrossing(layout: FloodgateLayout, fence: MaterialsFenceSpec): MaterialsList {
  const spec = resolveFenceSpec(fence);
  if (typeof layout !== 'object' || layout === null || !Array.isArray(layout.posts) || !Array.isArray(layout.wires) || !layout.styleDetail) {
    throw new RangeError('layout must be a floodgate layout from layoutFloodgate');
  }
  const sameWires = layout.wires.length === spec.wireHeightsM.length && layout.wires.every((w, i) => w.heightM === spec.wireHeightsM[i]);
  if (!sameWires) {
    throw new RangeError(`the layout was made for wires at [${layout.wires.map((w) => w.heightM).join(', ')}] m but the fence has wires at [${spec.wireHeightsM.join(', ')}] m: lay the floodgate out again for this fence`);
  }
  const detail = layout.styleDetail;
  const wireCount = spec.wireHeightsM.length;
  const { posts } = layout;
  const heavy = posts.filter((p) => p.heavy).length;
  const hung = posts.filter((p) => p.hungDropper !== null);
  const open = hung.filter((p) => p.hungDropper?.link === 'open').length;
  const braced = posts.filter((p) => p.braced).length;
  const spanOrdinary = posts.length - heavy;
  const flex = countRun(detail.flexRunEachSideM, spec);
  const flexRuns = detail.flexRunStrainers.length;
  const chain = [layout.endStrainers[0].chainageM, ...posts.map((p) => p.chainageM), layout.endStrainers[1].chainageM];
  let spanDroppers = 0;
  for (let i = 1; i < chain.length; i++) spanDroppers += droppersInPanel(chain[i]! - chain[i - 1]!, spec);
  const metresByKind = { plain: 0, barbed: 0 };
  for (const w of layout.wires) metresByKind[w.kind] += detail.wireRunM;
  const continuous = detail.wiresRunThrough;

  const items: MaterialItem[] = [
    ...item('STRAINER_ASSEMBLY', 'Strainer assembly, heavy strainer post', 2,
      `Floodgate end strainers on dry ground beyond the wet zone: heavy posts (about ${layout.heavyPosts.minSizeMm} mm steel or more), ${layout.heavyPosts.minEmbedmentM} m deep at least, ${layout.heavyPosts.preferredEmbedmentM} m preferred (common practice).`),
    ...item('STRAINER_ASSEMBLY', 'Strainer assembly, heavy strainer post', flexRuns,
      'Strainers at the far ends of the flex runs, where the wires running unbroken through the floodgate are strained.'),
    ...item('STAY', 'Stay for a strainer or post', 2 * detail.staysPerEndStrainer,
      continuous ? 'Floodgate end strainers are stayed both ways: the wires pass through them (judgement).' : 'Each terminating end assembly is stayed toward the fence it holds (judgement).'),
    ...item('STAY', 'Stay for a strainer or post', 2 * flexRuns, 'Flex-run strainers are stayed both ways, with fence on each side (judgement).'),
    ...item('STAY', 'Stay for a strainer or post', braced, 'Floodgate posts in flow deeper or faster than the thresholds are stayed against the push of the flow (common practice and judgement).'),
    ...item('HEAVY_POST', `Heavy post (about ${layout.heavyPosts.minSizeMm} mm steel or more), ${layout.heavyPosts.preferredEmbedmentM} m in the ground`, heavy,
      'Floodgate posts in the wet zone are heavy and set deep (common practice).'),
    ...item('LINE_POST', 'Line post', spanOrdinary + flexRuns * flex.posts,
      'Ordinary line posts on dry ground between the wet zone and the end strainers, and along the flex runs.'),
    ...item('HUNG_DROPPER', 'Hung dropper', hung.length, 'One dropper hung from the top of each floodgate post so the fence can swing up (common practice).'),
    ...item('LINK_OPEN', 'Hanger link, open at the bottom', open, 'Open links at low points, where the wires pull the dropper upward (common practice).'),
    ...item('LINK_CLOSED', 'Hanger link, closed', hung.length - open, 'Closed links at the other hung droppers (common practice).'),
    ...item('DROPPER', 'Dropper', spanDroppers + flexRuns * flex.droppers, 'Ordinary droppers between posts at the fence\'s dropper spacing.'),
    ...item('CLIP', 'Wire clip', wireCount * (spanOrdinary + flexRuns * flex.posts), 'One clip per wire on each ordinary post.'),
    ...item('BREAKAWAY_TIE', 'Breakaway tie', layout.breakawayTies.length,
      continuous ? 'A light tie holds the floodgate down at its lowest post and lets go under flood load (common practice).' : 'Light ties at the lowest post and at each end assembly let the section drop under flood load.'),
    ...wireItems(metresByKind, spec, continuous
      ? 'Each wire runs unbroken from flex-run strainer to flex-run strainer; wires in the flow are plain all the way.'
      : 'Each wire runs across the drop-down section from end assembly to end assembly; wires in the flow are plain.'),
  ];
  const ties = tieWireItem(hung.length * wireCount, spec, 'Each hung dropper tied firmly to each wire so it does not slide (common practice).');
  if (ties) items.push(ties);
  return { items, fenceLengthM: detail.wireRunM, crossingCount: 1, warnings: [...layout.warnings], cautions: FENCING_CAUTIONS };
}
