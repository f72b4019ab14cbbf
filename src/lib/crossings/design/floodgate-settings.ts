/**
 * The settings of a floodgate layout, their defaults and where each default comes from.
 * Every one is a starting point the user can change; most are common practice with no
 * published source, and say so.
 */
import { checkNumber } from './ground-profile';

/** Settings of {@link layoutFloodgate}; every field has a default in {@link DEFAULT_FLOODGATE_SETTINGS}. */
export interface FloodgateSettings {
  /**
   * Margin above the design flood level that still counts as wet, metres. Default 0.3 m:
   * common practice, no published source — it covers the surface riding up against a debris mat
   * and the fence, small waves, and the error of a screening flood estimate.
   */
  readonly freeboardM: number;
  /**
   * How far beyond the wet zone's edge each end strainer stands, metres. Default 15 m: the lower
   * end of the "roughly 15–20 m" rule of thumb in DESIGN.md (common practice, no published source).
   */
  readonly strainerSetbackM: number;
  /**
   * Largest distance between posts, metres. Default 4 m: common practice, and the lower end of the
   * "posts 4–5 m apart" of the floodplain fencing specification of Northumberland National Park and
   * Tweed Forum (UK, 2012).
   */
  readonly postSpacingM: number;
  /**
   * A post in flood water deeper than this is stayed, metres. Default 0.5 m: common practice and
   * judgement, no published source. A 4 m panel caught with a 0.5 m deep debris mat at 1 m/s
   * takes F = ½ρC_dAV² = ½ · 1000 · 2.0 · 2 m² · 1² ≈ 2 kN (C_d = 2.0 for a flat plate, FEMA P-55
   * Eq. 8.8), more than a light unstayed line post in wet ground holds (judgement).
   */
  readonly braceDepthM: number;
  /**
   * A post in flow faster than this is stayed, m/s. Default 1.0 m/s: judgement, no published
   * source — drag grows with V², and around 1 m/s flowing water starts to scour bare fine soil from
   * around a post (permissible velocities for fine soils are below about 0.8 m/s, Fortier &
   * Scobey 1926, from memory).
   */
  readonly braceVelocityMs: number;
  /**
   * The local-depth velocity at a post is capped at this multiple of the flood's mean velocity.
   * Default 1.5: judgement (from memory: the depth-averaged velocity at the deepest vertical of a
   * natural section is seldom more than about 1.5 times the section mean).
   */
  readonly velocityCapFactor: number;
  /** Least depth of strainer and floodgate posts in the ground, metres. Default 1.2 m (DESIGN.md, common practice). */
  readonly minEmbedmentM: number;
  /** Preferred depth of strainer and floodgate posts in the ground, metres. Default 1.5 m (DESIGN.md, common practice). */
  readonly preferredEmbedmentM: number;
  /** Least size of the heavy strainer and floodgate posts, mm. Default 75 mm steel (DESIGN.md, common practice). */
  readonly heavyPostMinSizeMm: number;
}

/** The defaults of {@link FloodgateSettings}, each justified on its field. */
export const DEFAULT_FLOODGATE_SETTINGS: FloodgateSettings = Object.freeze({
  freeboardM: 0.3,
  strainerSetbackM: 15,
  postSpacingM: 4,
  braceDepthM: 0.5,
  braceVelocityMs: 1.0,
  velocityCapFactor: 1.5,
  minEmbedmentM: 1.2,
  preferredEmbedmentM: 1.5,
  heavyPostMinSizeMm: 75,
});

/**
 * Fills the defaults into partial settings and checks every value.
 *
 * @param settings - the user's settings, any subset; not modified
 * @returns complete settings
 * @throws RangeError naming the setting when it is unknown or its value makes no sense (negative
 *   freeboard, zero spacing, a preferred embedment shallower than the least, absurd sizes)
 */
export function resolveFloodgateSettings(settings: Partial<FloodgateSettings> = {}): FloodgateSettings {
  if (typeof settings !== 'object' || settings === null) throw new RangeError('settings must be an object of floodgate settings');
  for (const key of Object.keys(settings)) {
    if (!(key in DEFAULT_FLOODGATE_SETTINGS)) {
      throw new RangeError(`unknown floodgate setting "${key}"; known: ${Object.keys(DEFAULT_FLOODGATE_SETTINGS).join(', ')}`);
    }
  }
  const s = { ...DEFAULT_FLOODGATE_SETTINGS, ...withoutUndefined(settings) };
  checkNumber(s.freeboardM, 'settings.freeboardM', 0, 5, 'm');
  checkNumber(s.strainerSetbackM, 'settings.strainerSetbackM', 1, 500, 'm');
  checkNumber(s.postSpacingM, 'settings.postSpacingM', 0.5, 30, 'm');
  checkNumber(s.braceDepthM, 'settings.braceDepthM', 0, 20, 'm');
  checkNumber(s.braceVelocityMs, 'settings.braceVelocityMs', 0, 20, 'm/s');
  checkNumber(s.velocityCapFactor, 'settings.velocityCapFactor', 1, 5, '');
  checkNumber(s.minEmbedmentM, 'settings.minEmbedmentM', 0.3, 5, 'm');
  checkNumber(s.preferredEmbedmentM, 'settings.preferredEmbedmentM', s.minEmbedmentM, 5, 'm (and not less than minEmbedmentM)');
  checkNumber(s.heavyPostMinSizeMm, 'settings.heavyPostMinSizeMm', 10, 1000, 'mm');
  return s;
}

function withoutUndefined(settings: Partial<FloodgateSettings>): Partial<FloodgateSettings> {
  return Object.fromEntries(Object.entries(settings).filter(([, v]) => v !== undefined));
}
