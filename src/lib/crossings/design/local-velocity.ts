/**
 * Flow velocity at one post of a floodgate, from the local depth there.
 */

/** The velocity at a post and whether the cap bit. */
export interface LocalVelocity {
  /** Depth-averaged velocity at the post, m/s. */
  readonly velocityMs: number;
  /** The uncapped local-depth value was above the cap, so the cap was used. */
  readonly capped: boolean;
}

/**
 * Approximate depth-averaged velocity at a point of a flooded section from the depth there, by
 * Manning's equation with the hydraulic radius taken as the local depth (the wide-channel
 * approximation, R ≈ d): v = (1/n) d^(2/3) S^(1/2), SI units (Manning's equation as in Chow 1959,
 * *Open-Channel Hydraulics*; applying it per vertical is an approximation, not a published method
 * for this use). It overstates the velocity where the channel is narrow beside its depth, so it
 * is capped at `capMs` (the layout uses a multiple of the section's mean velocity).
 *
 * @param depthM - water depth at the point, metres (≤ 0 gives 0)
 * @param manningN - Manning's roughness n, s/m^(1/3) (> 0)
 * @param energySlope - slope of the energy line, m/m (≥ 0)
 * @param capMs - largest velocity to report, m/s (≥ 0)
 */
export function localVelocityMs(depthM: number, manningN: number, energySlope: number, capMs: number): LocalVelocity {
  if (!(depthM > 0)) return { velocityMs: 0, capped: false };
  const v = (1 / manningN) * Math.pow(depthM, 2 / 3) * Math.sqrt(energySlope);
  return v > capMs ? { velocityMs: capMs, capped: true } : { velocityMs: v, capped: false };
}
