/**
 * The stretch of known ground around a crossing that a cross-section is cut from.
 */
import { groundAtM, type GroundPoint } from './ground-profile';

/**
 * The known ground from `fromM` to `toM` around the crossing, ends interpolated, the crossing
 * itself included, stopping at gaps (with a warning in `warnings`). Internal to
 * `channelCrossSection`: the inputs are already checked and the ground at the crossing is known.
 */
export function knownStretch(
  profile: readonly GroundPoint[],
  crossingM: number,
  fromM: number,
  toM: number,
  warnings: string[],
): { chainageM: number; elevationM: number }[] {
  const candidates: GroundPoint[] = [
    { chainageM: fromM, elevationM: groundAtM(profile, fromM) },
    ...profile.filter((p) => p.chainageM > fromM && p.chainageM < toM),
    { chainageM: toM, elevationM: groundAtM(profile, toM) },
  ];
  // The crossing itself is always a station (it lies on a straight segment, so the shape is unchanged).
  if (!profile.some((p) => p.chainageM === crossingM)) {
    const at = candidates.findIndex((p) => p.chainageM > crossingM);
    candidates.splice(at, 0, { chainageM: crossingM, elevationM: groundAtM(profile, crossingM) });
  }
  // Split at the gaps and keep the run of known ground that holds the crossing.
  let run: { chainageM: number; elevationM: number }[] = [];
  for (const p of candidates) {
    if (p.elevationM === null) {
      if (run.length > 0 && run[run.length - 1]!.chainageM >= crossingM) break;
      run = [];
    } else if (run.length === 0 || run[run.length - 1]!.chainageM !== p.chainageM) {
      run.push({ chainageM: p.chainageM, elevationM: p.elevationM });
    }
  }
  const first = run[0]!;
  const last = run[run.length - 1]!;
  if (first.chainageM > fromM) warnings.push(`The section starts at chainage ${first.chainageM} m, short of ${fromM} m: the profile has a gap or ends there.`);
  if (last.chainageM < toM) warnings.push(`The section ends at chainage ${last.chainageM} m, short of ${toM} m: the profile has a gap or ends there.`);
  return run;
}
