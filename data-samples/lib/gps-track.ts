/**
 * Simulate a GPS logger moved along a path: fixes at a fixed interval, a seeded, slowly
 * wandering position error (as real receivers show), and a noisy height.
 */
import { drawNormal, type UniformSource } from './prng';
import type { ProjectedPoint } from './scenario-constants';

/** How the logger was carried. */
export interface TrackOptions {
  /** Time of the first fix, milliseconds since 1970-01-01T00:00:00Z (a fixed value, not the clock). */
  readonly startTimeMs: number;
  /** Seconds between fixes. */
  readonly intervalS: number;
  /** Mean speed and how much it wanders, metres per second. */
  readonly meanSpeedMPerS: number;
  readonly speedSpreadMPerS: number;
  /** Standard deviation of the horizontal and vertical errors, metres. */
  readonly horizontalErrorM: number;
  readonly verticalErrorM: number;
  /** Ground height at `[x, y]`, metres, for the logged elevation. */
  readonly groundElevationM: (x: number, y: number) => number;
}

/** One logged fix: the logged (jittered) position in EPSG:7854, height and time. */
export interface TrackFix {
  readonly x: number;
  readonly y: number;
  readonly eleM: number;
  readonly timeMs: number;
}

/** Correlation between successive errors (first-order autoregressive wander). */
const ERROR_CORRELATION = 0.85;

/**
 * Fixes logged along a path from its first vertex to its last.
 *
 * @param path - vertices `[x, y]` in EPSG:7854, at least two
 * @param options - how the logger was carried
 * @param next - seeded uniform source (consumed)
 * @throws Error if the path has fewer than two vertices
 */
export function simulateGpsTrack(path: readonly ProjectedPoint[], options: TrackOptions, next: UniformSource): TrackFix[] {
  if (path.length < 2) throw new Error(`a track path needs at least 2 vertices, got ${path.length}`);
  const innovation = Math.sqrt(1 - ERROR_CORRELATION ** 2);
  const fixes: TrackFix[] = [];
  let ex = drawNormal(next) * options.horizontalErrorM;
  let ey = drawNormal(next) * options.horizontalErrorM;
  let ez = drawNormal(next) * options.verticalErrorM;
  let speed = options.meanSpeedMPerS;
  let segment = 0;
  let alongM = 0;
  for (let k = 0; ; k++) {
    const a = path[segment]!;
    const b = path[segment + 1]!;
    const lenM = Math.hypot(b[0] - a[0], b[1] - a[1]);
    const t = lenM === 0 ? 0 : alongM / lenM;
    const x = a[0] + (b[0] - a[0]) * t;
    const y = a[1] + (b[1] - a[1]) * t;
    fixes.push({
      x: x + ex,
      y: y + ey,
      eleM: options.groundElevationM(x, y) + ez,
      timeMs: options.startTimeMs + k * options.intervalS * 1000,
    });
    ex = ERROR_CORRELATION * ex + innovation * options.horizontalErrorM * drawNormal(next);
    ey = ERROR_CORRELATION * ey + innovation * options.horizontalErrorM * drawNormal(next);
    ez = ERROR_CORRELATION * ez + innovation * options.verticalErrorM * drawNormal(next);
    speed += (options.meanSpeedMPerS - speed) * 0.3 + options.speedSpreadMPerS * 0.5 * drawNormal(next);
    speed = Math.min(options.meanSpeedMPerS + 2 * options.speedSpreadMPerS, Math.max(0.2 * options.meanSpeedMPerS, speed));
    alongM += speed * options.intervalS;
    while (segment < path.length - 1) {
      const p = path[segment]!;
      const q = path[segment + 1]!;
      const segLenM = Math.hypot(q[0] - p[0], q[1] - p[1]);
      if (alongM <= segLenM) break;
      alongM -= segLenM;
      segment++;
    }
    if (segment >= path.length - 1) break;
  }
  return fixes;
}
