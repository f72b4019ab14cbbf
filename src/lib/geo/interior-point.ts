/**
 * A point inside a polygon (not on its edge, not in a hole), for telling which other areas hold
 * it; the centroid will not do, as a bent paddock's centroid can lie outside it.
 *
 * Method: the horizontal line through the middle of the polygon's latitude range is cut by every
 * ring (even–odd rule), and the middle of the widest stretch inside is taken, as GEOS's
 * InteriorPointArea does (from memory). Computed in degrees: a straight-in-degrees edge is how
 * the polygon is stored, and only inside or outside matters.
 *
 * @param rings - outer ring then holes, closed, `[lon, lat]` degrees, a valid polygon; not modified
 * @returns `[lon, lat]` degrees strictly inside the polygon
 * @throws RangeError when the outer ring has fewer than four positions (a closed triangle) or encloses nothing
 */
export function interiorPoint(rings: readonly (readonly (readonly [number, number])[])[]): [number, number] {
  const outer = rings[0];
  if (!outer || outer.length < 4) throw new RangeError('expected a polygon: a closed outer ring of at least three corners');
  let [south, north] = [Infinity, -Infinity];
  for (const [, lat] of outer) [south, north] = [Math.min(south, lat), Math.max(north, lat)];
  const y = (south + north) / 2;
  const crossings: number[] = [];
  for (const ring of rings) {
    for (let k = 1; k < ring.length; k++) {
      const [ax, ay] = ring[k - 1]!;
      const [bx, by] = ring[k]!;
      if (ay > y !== by > y) crossings.push(ax + ((y - ay) * (bx - ax)) / (by - ay));
    }
  }
  crossings.sort((a, b) => a - b);
  let best: [number, number] | null = null;
  for (let k = 1; k < crossings.length; k += 2) {
    const width = crossings[k]! - crossings[k - 1]!;
    if (width > 0 && (!best || width > best[1] - best[0])) best = [crossings[k - 1]!, crossings[k]!];
  }
  if (!best) throw new RangeError('the polygon encloses nothing along its middle latitude');
  return [(best[0] + best[1]) / 2, y];
}
