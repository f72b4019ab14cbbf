/**
 * Small seeded random numbers for the demo generator. No `Math.random`: every value is a pure
 * function of the seed, so the demo files come out byte-identical on every run.
 */

/** A stream of uniform numbers in [0, 1). */
export type UniformSource = () => number;

/**
 * The mulberry32 generator (Tommy Ettinger's 32-bit generator, public domain; widely copied in
 * JavaScript). Good enough for jitter and shape parameters; not for anything that needs strength.
 *
 * @param seed - any integer; only its low 32 bits are used
 * @returns a function that yields the next uniform number in [0, 1) on each call
 */
export function createMulberry32(seed: number): UniformSource {
  let state = seed >>> 0;
  return () => {
    state = (state + 0x6d2b79f5) >>> 0;
    let t = state;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
}

/**
 * A standard normal deviate from two uniforms (Box–Muller transform, Box & Muller 1958).
 *
 * @param next - the uniform source to draw from (two draws per call)
 * @returns a number with mean 0 and standard deviation 1
 */
export function drawNormal(next: UniformSource): number {
  // 1 - u keeps the logarithm's argument in (0, 1].
  const u1 = 1 - next();
  const u2 = next();
  return Math.sqrt(-2 * Math.log(u1)) * Math.cos(2 * Math.PI * u2);
}

/**
 * A uniform number in [0, 1) that depends only on two integers and a seed, so any raster cell's
 * noise can be recomputed on its own (no stream to replay). Hashes the inputs into a mulberry32
 * seed and takes its first output.
 *
 * @param a - first integer key (for example the column)
 * @param b - second integer key (for example the row)
 * @param seed - the scenario seed
 */
export function hashToUnit(a: number, b: number, seed: number): number {
  let h = Math.imul(a | 0, 0x27d4eb2d) ^ Math.imul(b | 0, 0x165667b1) ^ Math.imul(seed | 0, 0x9e3779b1);
  h = Math.imul(h ^ (h >>> 16), 0x85ebca6b);
  h = Math.imul(h ^ (h >>> 13), 0xc2b2ae35);
  h ^= h >>> 16;
  return createMulberry32(h)();
}
