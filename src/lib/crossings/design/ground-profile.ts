/**
 * The ground profile along a fence, and the walks along it that the floodgate design makes:
 * heights between samples, and where the ground crosses a water level.
 *
 * Between two known samples the ground is taken as a straight line (linear interpolation); next
 * to a gap (a null height, where the fence leaves the elevation model) nothing is known.
 */

/** One sample of the ground along a fence line. */
export interface GroundPoint {
  /** Distance along the fence line, in metres. */
  readonly chainageM: number;
  /** Ground height in metres (any datum, the same as the flood level's), or null for a gap. */
  readonly elevationM: number | null;
}

/** Where a {@link walkToLevel} stopped. */
export interface LevelWalk {
  /** Chainage in metres where the walk stopped (the level crossing, or the last known ground). */
  readonly chainageM: number;
  /** `level`: the ground crossed the level; `gap`/`profile-end`: the known ground ran out; `reached`: got to the target. */
  readonly stop: 'level' | 'gap' | 'profile-end' | 'reached';
  /** Lowest ground height met along the walk, start included, in metres. */
  readonly lowestM: number;
  /** Chainage of that lowest ground, in metres. */
  readonly lowestAtM: number;
}

/**
 * Checks a ground profile at the entry of a design function.
 *
 * @param profile - samples sorted by chainage (repeats allowed), heights finite or null
 * @param what - the name used in messages
 * @throws RangeError when the profile is not an array of at least two samples, a chainage or
 *   height is not finite, the chainages go backwards, or fewer than two heights are known
 */
export function checkGroundProfile(profile: readonly GroundPoint[], what = 'profile'): void {
  if (!Array.isArray(profile) || profile.length < 2) {
    throw new RangeError(`${what} must be an array of at least two { chainageM, elevationM } samples`);
  }
  let known = 0;
  for (let i = 0; i < profile.length; i++) {
    const p = profile[i]!;
    if (typeof p !== 'object' || p === null || !Number.isFinite(p.chainageM)) {
      throw new RangeError(`${what}[${i}].chainageM must be a finite distance in metres`);
    }
    if (p.elevationM !== null && !Number.isFinite(p.elevationM)) {
      throw new RangeError(`${what}[${i}].elevationM must be a finite height in metres or null for a gap, got ${p.elevationM}`);
    }
    if (p.elevationM !== null) known++;
    if (i > 0 && p.chainageM < profile[i - 1]!.chainageM) {
      throw new RangeError(`${what} must be sorted by chainage: sample ${i} (${p.chainageM} m) comes before sample ${i - 1} (${profile[i - 1]!.chainageM} m)`);
    }
  }
  if (known < 2) throw new RangeError(`${what} needs at least two known ground heights, got ${known}`);
}

/**
 * Ground height at a chainage by linear interpolation between the neighbouring samples; null
 * off the profile or on a segment that touches a gap. A chainage exactly on a sample takes that
 * sample's height (the first known one when chainages repeat).
 */
export function groundAtM(profile: readonly GroundPoint[], chainageM: number): number | null {
  const n = profile.length;
  if (!(chainageM >= profile[0]!.chainageM && chainageM <= profile[n - 1]!.chainageM)) return null;
  let lo = 0;
  let hi = n - 1;
  // Binary search for the first sample at or beyond the chainage.
  while (lo < hi) {
    const mid = (lo + hi) >> 1;
    if (profile[mid]!.chainageM < chainageM) lo = mid + 1;
    else hi = mid;
  }
  for (let i = lo; i < n && profile[i]!.chainageM === chainageM; i++) {
    if (profile[i]!.elevationM !== null) return profile[i]!.elevationM;
  }
  if (profile[lo]!.chainageM === chainageM) return null;
  const a = profile[lo - 1]!;
  const b = profile[lo]!;
  if (a.elevationM === null || b.elevationM === null) return null;
  const t = (chainageM - a.chainageM) / (b.chainageM - a.chainageM);
  return a.elevationM + t * (b.elevationM - a.elevationM);
}

/**
 * Walks along the profile from `fromM` toward `toM` (either way; ±Infinity for "to the end") and
 * stops where the ground first crosses `levelM`: for `rise`, where it climbs to the level or
 * above (start below it); for `fall`, where it drops below the level (start at or above it).
 * The crossing chainage is interpolated linearly. Stops early, at the last known ground, at a
 * gap or the end of the profile.
 *
 * @throws RangeError when the ground at `fromM` is unknown
 */
export function walkToLevel(
  profile: readonly GroundPoint[],
  fromM: number,
  toM: number,
  levelM: number,
  sense: 'rise' | 'fall',
): LevelWalk {
  const startM = groundAtM(profile, fromM);
  if (startM === null) throw new RangeError(`no ground height known at chainage ${fromM} m`);
  const dir = toM >= fromM ? 1 : -1;
  const crossed = (z: number) => (sense === 'rise' ? z >= levelM : z < levelM);
  let prevC = fromM;
  let prevZ = startM;
  let lowestM = startM;
  let lowestAtM = fromM;
  const n = profile.length;
  let i = dir > 0 ? 0 : n - 1;
  // Skip the samples behind the start (and at it: its height is startM).
  while (i >= 0 && i < n && (profile[i]!.chainageM - fromM) * dir <= 0) i += dir;
  for (; i >= 0 && i < n; i += dir) {
    const p = profile[i]!;
    const beyond = (p.chainageM - toM) * dir > 0;
    const c = beyond ? toM : p.chainageM;
    const z = beyond ? groundAtM(profile, toM) : p.elevationM;
    if (z === null) return { chainageM: prevC, stop: 'gap', lowestM, lowestAtM };
    if (crossed(z)) {
      const t = z === prevZ ? 0 : (levelM - prevZ) / (z - prevZ);
      return { chainageM: prevC + t * (c - prevC), stop: 'level', lowestM, lowestAtM };
    }
    if (z < lowestM) {
      lowestM = z;
      lowestAtM = c;
    }
    if (beyond || c === toM) return { chainageM: c, stop: 'reached', lowestM, lowestAtM };
    prevC = c;
    prevZ = z;
  }
  return { chainageM: prevC, stop: 'profile-end', lowestM, lowestAtM };
}

/** Checks that a number is finite and within [min, max]; the message names it with its unit. */
export function checkNumber(value: unknown, name: string, min: number, max: number, unit: string): number {
  if (typeof value !== 'number' || !Number.isFinite(value) || value < min || value > max) {
    throw new RangeError(`${name} must be a number from ${min} to ${max}${unit ? ` ${unit}` : ''}, got ${String(value)}`);
  }
  return value;
}
