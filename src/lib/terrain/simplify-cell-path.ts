import { lineString, simplify } from '@turf/turf';

/**
 * Lightens a path of cell centres so a drainage line does not zigzag cell by cell, by the
 * Douglas–Peucker algorithm (Douglas & Peucker 1973, The Canadian Cartographer 10(2):112–122,
 * through Turf's `simplify`). The first and last points are always kept, so lines that meet at a
 * confluence still share that vertex.
 *
 * @param path - `[col, row]` positions in cell units, at least two
 * @param toleranceCells - largest allowed offset of a removed point, in cells; 0 keeps all points
 * @returns a new array; the input is not changed
 */
export function simplifyCellPath(path: [number, number][], toleranceCells: number): [number, number][] {
  if (path.length <= 2 || toleranceCells <= 0) return path.map(([col, row]) => [col, row]);
  const simplified = simplify(lineString(path), { tolerance: toleranceCells, highQuality: true });
  return simplified.geometry.coordinates.map(([col, row]) => [col!, row!]);
}
