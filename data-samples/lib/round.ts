/** Round to a number of decimals, for stable, compact output files. */
export function roundTo(value: number, decimals: number): number {
  const f = 10 ** decimals;
  const r = Math.round(value * f) / f;
  // Avoid writing "-0".
  return r === 0 ? 0 : r;
}

/** `[x, y]` in metres rounded to 1 cm. */
export function roundXY(p: readonly [number, number]): [number, number] {
  return [roundTo(p[0], 2), roundTo(p[1], 2)];
}

/** `[lon, lat]` in degrees rounded to 7 decimals (about 1 cm). */
export function roundLonLat(p: readonly [number, number]): [number, number] {
  return [roundTo(p[0], 7), roundTo(p[1], 7)];
}
