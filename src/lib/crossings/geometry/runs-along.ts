import type { CrossingSettings } from './crossing-options';
import type { DrainageIndex } from './drainage-index';
import { SNAP_M, type AlongInterval } from './scan-fence';
import type { RunsAlong } from './types';

/**
 * Joins the pieces of one fence found near and parallel to each drainage line (`scanFence`) into
 * stretches, and keeps those longer than `runsAlongMinLengthM` as `runs-along` reports. Pieces
 * that overlap or touch (within 1 mm of chainage) join; a stretch is measured along the fence
 * (geodesic chainage). A very oblique crossing can also show as a runs-along stretch around it:
 * both are reported.
 *
 * @returns stretches ordered by start chainage, then drainage line order
 */
export function collectRunsAlong(
  intervals: readonly AlongInterval[],
  fenceId: string | number,
  index: DrainageIndex,
  settings: CrossingSettings,
): RunsAlong[] {
  const sorted = [...intervals].sort((a, b) => a.line - b.line || a.fromM - b.fromM);
  const stretches: RunsAlong[] = [];
  const keep = (line: number, fromM: number, toM: number): void => {
    if (toM - fromM > settings.runsAlongMinLengthM) {
      stretches.push({
        kind: 'runs-along',
        fenceId,
        drainageId: index.lines[line]!.id,
        fromChainageM: fromM,
        toChainageM: toM,
        lengthM: toM - fromM,
      });
    }
  };
  let current: { line: number; fromM: number; toM: number } | null = null;
  for (const { line, fromM, toM } of sorted) {
    if (current !== null && current.line === line && fromM <= current.toM + SNAP_M) {
      current.toM = Math.max(current.toM, toM);
      continue;
    }
    if (current !== null) keep(current.line, current.fromM, current.toM);
    current = { line, fromM, toM };
  }
  if (current !== null) keep(current.line, current.fromM, current.toM);
  const lineOrder = new Map(index.lines.map((l, k) => [l.id, k]));
  return stretches.sort(
    (a, b) => a.fromChainageM - b.fromChainageM || lineOrder.get(a.drainageId)! - lineOrder.get(b.drainageId)!,
  );
}
