/**
 * Settings of `findCrossings`, with their defaults. The defaults are our choice for open grazing
 * country (no published source); every one can be changed by the user.
 */
export interface FindCrossingsOptions {
  /** Half-length of the window along the drainage line over which the flow direction is averaged, metres (≥ 0). Default 40. */
  readonly flowWindowM?: number;
  /** Half-length of the window along the fence for its direction, metres (≥ 0); 0 = the segment at the crossing. Default 0. */
  readonly fenceWindowM?: number;
  /** A crossing within this many degrees of square is `good` (0…90). Default 20. */
  readonly goodWithinDeg?: number;
  /** A crossing within this many degrees of square (but not good) is `fair`, worse is `poor` (goodWithinDeg…90). Default 45. */
  readonly fairWithinDeg?: number;
  /** Two crossings of the same fence and drainage line this close along the fence are flagged `crosses-twice`, metres (≥ 0). Default 100. */
  readonly crossesTwiceWithinM?: number;
  /** A fence stretch within this distance of a drainage line may be `runs-along`, metres (> 0). Default 20. */
  readonly runsAlongBufferM?: number;
  /** …when the stretch is longer than this, metres (≥ 0). Default 100. */
  readonly runsAlongMinLengthM?: number;
  /** …and the fence is within this many degrees of parallel to the averaged flow (0…90). Default 25. */
  readonly runsAlongMaxAngleDeg?: number;
  /**
   * How candidate drainage segments are found: `index` (a flatbush R-tree over segment bounding
   * boxes) or `all-pairs` (every segment, for checking the index). Same results. Default `index`.
   */
  readonly search?: 'index' | 'all-pairs';
}

export type CrossingSettings = Required<FindCrossingsOptions>;

export const DEFAULT_CROSSING_OPTIONS: CrossingSettings = {
  flowWindowM: 40,
  fenceWindowM: 0,
  goodWithinDeg: 20,
  fairWithinDeg: 45,
  crossesTwiceWithinM: 100,
  runsAlongBufferM: 20,
  runsAlongMinLengthM: 100,
  runsAlongMaxAngleDeg: 25,
  search: 'index',
};

/**
 * Fills in defaults and checks every setting.
 * @throws RangeError naming the setting, its allowed range and the value given
 */
export function resolveCrossingOptions(options: FindCrossingsOptions = {}): CrossingSettings {
  const settings: CrossingSettings = { ...DEFAULT_CROSSING_OPTIONS };
  for (const [key, value] of Object.entries(options) as [keyof CrossingSettings, unknown][]) {
    if (value !== undefined) Object.assign(settings, { [key]: value });
  }
  const inRange = (name: keyof CrossingSettings, min: number, max: number, unit: string, open = false): void => {
    const value = settings[name];
    if (typeof value !== 'number' || !Number.isFinite(value) || value < min || value > max || (open && value === min)) {
      const bound = max === Infinity ? `${open ? '>' : '≥'} ${min}` : `between ${min} and ${max}`;
      throw new RangeError(`${name} must be a number of ${unit} ${bound}, got ${String(value)}`);
    }
  };
  inRange('flowWindowM', 0, Infinity, 'metres');
  inRange('fenceWindowM', 0, Infinity, 'metres');
  inRange('goodWithinDeg', 0, 90, 'degrees');
  inRange('fairWithinDeg', settings.goodWithinDeg, 90, 'degrees');
  inRange('crossesTwiceWithinM', 0, Infinity, 'metres');
  inRange('runsAlongBufferM', 0, Infinity, 'metres', true);
  inRange('runsAlongMinLengthM', 0, Infinity, 'metres');
  inRange('runsAlongMaxAngleDeg', 0, 90, 'degrees');
  if (settings.search !== 'index' && settings.search !== 'all-pairs') {
    throw new RangeError(`search must be 'index' or 'all-pairs', got ${String(settings.search)}`);
  }
  return settings;
}
