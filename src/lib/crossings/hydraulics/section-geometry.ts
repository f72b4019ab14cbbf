import { checkCrossSection, type CrossSection } from './cross-section';
import { HydraulicsInputError } from './input-error';

/** One stretch of continuous water surface across the section. */
export interface WetStretch {
  /** Where the water surface starts and ends, metres along the section. */
  readonly fromStationM: number;
  readonly toStationM: number;
  /** Deepest water in the stretch, metres. */
  readonly maxDepthM: number;
}

/** Flow geometry of a cross-section at one water level. */
export interface WettedGeometry {
  /** The water level, metres in the section's datum. */
  readonly stageM: number;
  /** Station range measured, metres (the whole profile unless restricted). */
  readonly fromStationM: number;
  readonly toStationM: number;
  /** Flow area A, m². */
  readonly areaM2: number;
  /** Wetted perimeter P along the ground only, metres (vertical dividers at the range limits excluded). */
  readonly wettedPerimeterM: number;
  /** Top width T: total width of water surface, metres. */
  readonly topWidthM: number;
  /** Deepest water in the range, metres (0 when dry). */
  readonly maxDepthM: number;
  /** The separate stretches of water surface (pools), left to right; A, P and T sum over them all. */
  readonly wetStretches: readonly WetStretch[];
  /** True when the water stands above the ground at the left or right limit of the range. */
  readonly leftEndWet: boolean;
  readonly rightEndWet: boolean;
}

/**
 * Flow area, wetted perimeter and top width of an irregular cross-section at a water level: the
 * ground profile (straight between points) is clipped at the water surface, with linear
 * interpolation where a segment is partly wetted. Every point of the ground below the water
 * surface counts, so separate pools are summed (as HEC-RAS does where no levees or ineffective
 * areas are set). Ground exactly at the water level is dry.
 *
 * A station range restricts the measurement to a part of the section (a subdivision for
 * conveyance); the vertical lines at the range limits are water-to-water boundaries and are not
 * wetted perimeter. Method: Chow (1959) Open-Channel Hydraulics, ch. 2 (geometric elements of
 * channel sections); USACE HEC-RAS Hydraulic Reference Manual, cross-section geometry.
 *
 * @param section - the ground profile, metres; not modified
 * @param stageM - water level, metres in the section's datum
 * @param fromStationM - start of the range, metres (default: the first station)
 * @param toStationM - end of the range, metres (default: the last station)
 * @returns A (m²), P (m), T (m), deepest water and the wet stretches
 * @throws HydraulicsInputError for a malformed section, a non-finite stage, or a range whose start lies beyond its end
 */
export function wettedGeometry(
  section: CrossSection,
  stageM: number,
  fromStationM?: number,
  toStationM?: number,
): WettedGeometry {
  checkCrossSection(section);
  if (!Number.isFinite(stageM)) throw new HydraulicsInputError('stageM', 'The water level must be a finite number of metres.');
  const xs = section.stationsM;
  const zs = section.elevationsM;
  const lo = fromStationM ?? xs[0]!;
  const hi = toStationM ?? xs[xs.length - 1]!;
  if (!Number.isFinite(lo) || !Number.isFinite(hi) || lo > hi) {
    throw new HydraulicsInputError(
      'fromStationM',
      `The station range must run from a smaller to a larger station, in metres; got ${lo} to ${hi}.`,
    );
  }

  let areaM2 = 0;
  let wettedPerimeterM = 0;
  let topWidthM = 0;
  // Wet pieces of the ground, left to right, as [from, to, deepest]; joined into stretches below.
  const pieces: [number, number, number][] = [];
  for (let i = 0; i + 1 < xs.length; i++) {
    let x1 = xs[i]!;
    let z1 = zs[i]!;
    let x2 = xs[i + 1]!;
    let z2 = zs[i + 1]!;
    if (x2 <= lo || x1 >= hi) continue;
    // Cut the segment at the range limits, keeping the ground's straight line.
    if (x1 < lo) {
      z1 += ((z2 - z1) * (lo - x1)) / (x2 - x1);
      x1 = lo;
    }
    if (x2 > hi) {
      z2 = z1 + ((z2 - z1) * (hi - x1)) / (x2 - x1);
      x2 = hi;
    }
    const dx = x2 - x1;
    if (!(dx > 0)) continue;
    const d1 = stageM - z1;
    const d2 = stageM - z2;
    if (d1 <= 0 && d2 <= 0) continue;
    const length = Math.hypot(dx, z2 - z1);
    if (d1 > 0 && d2 > 0) {
      areaM2 += 0.5 * (d1 + d2) * dx;
      wettedPerimeterM += length;
      topWidthM += dx;
      pieces.push([x1, x2, Math.max(d1, d2)]);
    } else {
      // Partly wetted: the water's edge lies where the depth along the segment reaches zero.
      const t = d1 / (d1 - d2);
      const wetFraction = d1 > 0 ? t : 1 - t;
      const deep = Math.max(d1, d2);
      areaM2 += 0.5 * deep * wetFraction * dx;
      wettedPerimeterM += wetFraction * length;
      topWidthM += wetFraction * dx;
      const edge = t === 1 ? x2 : x1 + t * dx;
      pieces.push(d1 > 0 ? [x1, edge, deep] : [edge, x2, deep]);
    }
  }
  const wetStretches = joinPieces(pieces);
  const maxDepthM = wetStretches.reduce((deepest, stretch) => Math.max(deepest, stretch.maxDepthM), 0);

  const first = wetStretches[0];
  const last = wetStretches[wetStretches.length - 1];
  return {
    stageM,
    fromStationM: lo,
    toStationM: hi,
    areaM2,
    wettedPerimeterM,
    topWidthM,
    maxDepthM,
    wetStretches,
    leftEndWet: first !== undefined && first.fromStationM === lo && lo < hi,
    rightEndWet: last !== undefined && last.toStationM === hi && lo < hi,
  };
}

/** Joins wet pieces that touch (one ends where the next starts) into stretches of water surface. */
function joinPieces(pieces: readonly [number, number, number][]): WetStretch[] {
  const stretches: WetStretch[] = [];
  let current: [number, number, number] | null = null;
  for (const [from, to, depthM] of pieces) {
    if (current && current[1] === from) {
      current[1] = to;
      current[2] = Math.max(current[2], depthM);
    } else {
      if (current) stretches.push({ fromStationM: current[0], toStationM: current[1], maxDepthM: current[2] });
      current = [from, to, depthM];
    }
  }
  if (current) stretches.push({ fromStationM: current[0], toStationM: current[1], maxDepthM: current[2] });
  return stretches;
}
