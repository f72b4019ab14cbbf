import { D8_UNRESOLVED } from './flat-codes';

/**
 * Gives a D8 direction to every flat cell (code {@link D8_UNRESOLVED}) of a depression-filled
 * surface, in place. A flat is a connected set (8-neighbourhood) of equal-height cells with no
 * lower neighbour; its low edges are the equal-height cells next to it that already drain, its
 * high edges the flat cells next to higher ground. Each flat cell gets a gradient made of two
 * breadth-first distances inside its flat, `2 × towards − away`: towards the low edges (counted
 * twice) and away from the high edges. A cell next to a low edge drains into it; any other drains
 * to the flat neighbour with the smallest gradient, which is always strictly smaller, so the
 * directions form no cycle and every flat cell reaches a low edge.
 *
 * Method: Barnes, Lehman & Mulla (2014), "An efficient assignment of drainage direction over flat
 * surfaces in raster digital elevation models", Computers & Geosciences 62:128–135. Their
 * gradient is `2 × towards + (flatHeight − away)`; within a flat it differs from ours by the
 * constant flatHeight, so the directions are the same and the flats need no numbering. Distances
 * are set when a cell is first reached.
 *
 * Flat cells never lie on the grid's edge or next to nodata (those drain out of the model), so
 * their eight neighbours always exist and are valid; only low edges need bounds checks.
 *
 * @param filled - filled heights in metres, row-major, NaN = nodata; not mutated
 * @param width - columns
 * @param height - rows
 * @param directions - D8 codes with {@link D8_UNRESOLVED} on flat cells; updated in place
 * @param unresolvedCount - number of cells coded {@link D8_UNRESOLVED}
 * @throws RangeError when a flat has no low edge, i.e. the surface was not depression-filled
 */
export function resolveFlats(
  filled: Float64Array,
  width: number,
  height: number,
  directions: Uint8Array,
  unresolvedCount: number,
): void {
  const n = width * height;
  // Gradients are stored shifted by unresolvedCount + 1 so that they stay above LOW_EDGE.
  if (3 * unresolvedCount + 3 > 0x7fffffff) throw new RangeError('too many flat cells (at most 715 million)');
  const shift = unresolvedCount + 1;
  const offsets = new Int32Array([1, width + 1, width, width - 1, -1, -width - 1, -width, -width + 1]);
  const dxs = new Int32Array([1, 1, 0, -1, -1, -1, 0, 1]);
  const dys = new Int32Array([0, 1, 1, 1, 0, -1, -1, -1]);
  // mask: 0 not reached; −away after the first search; the shifted gradient after the second;
  // LOW_EDGE on low edges.
  const mask = new Int32Array(n);
  const flats = new Int32Array(unresolvedCount);
  const lowEdges = new Int32Array(Math.min(n, 8 * unresolvedCount));
  const queue = new Int32Array(unresolvedCount + lowEdges.length);
  let lowCount = 0;
  let tail = 0;
  for (let c = 0, f = 0; c < n; c++) {
    if (directions[c] !== D8_UNRESOLVED) continue;
    flats[f++] = c;
    const zc = filled[c]!;
    let high = false;
    for (let k = 0; k < 8; k++) {
      const nb = c + offsets[k]!;
      const zn = filled[nb]!;
      if (zn > zc) high = true;
      else if (zn === zc && mask[nb] === 0 && directions[nb] !== D8_UNRESOLVED) {
        mask[nb] = LOW_EDGE;
        lowEdges[lowCount++] = nb;
      }
    }
    // High edges start the search away from higher ground at distance 1.
    if (high) {
      mask[c] = -1;
      queue[tail++] = c;
    }
  }

  // Away from higher ground, through flat cells of the same height.
  for (let head = 0; head < tail; head++) {
    const c = queue[head]!;
    const away = mask[c]! - 1;
    const zc = filled[c]!;
    for (let k = 0; k < 8; k++) {
      const nb = c + offsets[k]!;
      if (mask[nb] !== 0 || directions[nb] !== D8_UNRESOLVED || filled[nb] !== zc) continue;
      mask[nb] = away;
      queue[tail++] = nb;
    }
  }

  // Towards the low edges (distance 1), level by level, combined into the shifted gradient.
  queue.set(lowEdges.subarray(0, lowCount));
  tail = lowCount;
  for (let head = 0, levelEnd = tail, t = 2; head < tail; head++) {
    if (head === levelEnd) {
      t++;
      levelEnd = tail;
    }
    const c = queue[head]!;
    const zc = filled[c]!;
    const x = head < lowCount ? c % width : 1;
    const y = head < lowCount ? (c - x) / width : 1;
    for (let k = 0; k < 8; k++) {
      const nx = x + dxs[k]!;
      const ny = y + dys[k]!;
      if (nx < 0 || ny < 0 || nx >= width || ny >= height) continue;
      const nb = c + offsets[k]!;
      const negativeAway = mask[nb]!;
      if (negativeAway > 0 || directions[nb] !== D8_UNRESOLVED || filled[nb] !== zc) continue;
      mask[nb] = 2 * t + negativeAway + shift;
      queue[tail++] = nb;
    }
  }

  // Drain each flat cell to its equal-height neighbour with the smallest gradient (a low edge
  // where there is one).
  for (let f = 0; f < unresolvedCount; f++) {
    const c = flats[f]!;
    const zc = filled[c]!;
    let best = D8_UNRESOLVED;
    let bestMask = mask[c]!;
    for (let k = 0; k < 8; k++) {
      const nb = c + offsets[k]!;
      if (filled[nb] === zc && mask[nb]! < bestMask) {
        bestMask = mask[nb]!;
        best = k;
      }
    }
    if (bestMask <= 0 || best === D8_UNRESOLVED) {
      const x = c % width;
      throw new RangeError(
        `cell (col ${x}, row ${(c - x) / width}) has no downslope path out of the model: ` +
          'fill depressions (fillDepressions) before computing flow directions',
      );
    }
    directions[c] = best;
  }
}

/** Mask value of a low edge: below every shifted gradient, which is at least 5. */
const LOW_EDGE = 1;
