/**
 * Benchmark of the terrain chain (read → fill → flow directions → accumulation → drainage lines)
 * on a generated 4000 × 4000 Float32 elevation model (invented, seeded, deterministic): a tilted
 * surface with sines, value noise, rounding to 1 cm, pits, flat plateaus and nodata holes,
 * written as a GeoTIFF and read back as an upload would be.
 *
 *   npm run bench:terrain -- [size] [seed]
 *
 * Prints wall time, throughput and CPU time per stage, and the peak resident set size. On a
 * shared machine, CPU time well below wall time means the benchmark was waiting for a core.
 * Then it runs the whole chain again in a worker thread, as the server does, and measures how
 * long the main thread's event loop is held up meanwhile (what a request would wait).
 */
import { mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import path from 'node:path';
import { monitorEventLoopDelay, performance as perf } from 'node:perf_hooks';
import { resourceUsage } from 'node:process';
import { readElevationModel } from '../src/lib/server/elevation/read-elevation-model';
import { encodeGeoTiff } from '../src/lib/server/elevation/write-geotiff';
import { createTerrainWorker } from '../src/lib/server/jobs/terrain-jobs';
import { traceDrainageLines } from '../src/lib/terrain/drainage-lines';
import {
  accumulateFlow,
  computeFlowDirections,
  D8_NONE,
  fillDepressions,
  uniformCellSize,
  type ElevationGrid,
} from '../src/lib/terrain/index';
import { createMulberry32 } from '../data-samples/lib/prng';

const size = Number(process.argv[2] ?? 4000);
const seed = Number(process.argv[3] ?? 20261202);


function generateModel(width: number, height: number, seedValue: number): ElevationGrid {
  const random = createMulberry32(seedValue);
  const data = new Float32Array(width * height);
  // Value-noise octaves: random lattice values, smoothly interpolated.
  const octaves = [
    { step: 400, amplitudeM: 18 },
    { step: 97, amplitudeM: 6 },
    { step: 23, amplitudeM: 1.5 },
    { step: 5, amplitudeM: 0.3 },
  ].map(({ step, amplitudeM }) => {
    const lw = Math.ceil(width / step) + 2;
    const lattice = new Float64Array(lw * (Math.ceil(height / step) + 2));
    for (let i = 0; i < lattice.length; i++) lattice[i] = (random() * 2 - 1) * amplitudeM;
    return { step, lw, lattice };
  });
  const smooth = (t: number): number => t * t * (3 - 2 * t);
  for (let y = 0; y < height; y++) {
    for (let x = 0; x < width; x++) {
      let z = 300 - 0.006 * x - 0.004 * y;
      z += 12 * Math.sin((2 * Math.PI * x) / 1500) * Math.sin((2 * Math.PI * y) / 2100);
      z += 5 * Math.sin((2 * Math.PI * (x + 0.6 * y)) / 700) + 2 * Math.cos((2 * Math.PI * (x - y)) / 330);
      for (const { step, lw, lattice } of octaves) {
        const gx = x / step;
        const gy = y / step;
        const ix = Math.floor(gx);
        const iy = Math.floor(gy);
        const tx = smooth(gx - ix);
        const ty = smooth(gy - iy);
        const i = iy * lw + ix;
        const top = lattice[i]! + (lattice[i + 1]! - lattice[i]!) * tx;
        const bottom = lattice[i + lw]! + (lattice[i + lw + 1]! - lattice[i + lw]!) * tx;
        z += top + (bottom - top) * ty;
      }
      z += (random() - 0.5) * 0.04;
      data[y * width + x] = Math.round(z * 100) / 100;
    }
  }
  const disc = (radius: number, apply: (i: number, r: number) => void): void => {
    const cx = Math.floor(random() * width);
    const cy = Math.floor(random() * height);
    for (let y = Math.max(0, cy - radius); y <= Math.min(height - 1, cy + radius); y++) {
      for (let x = Math.max(0, cx - radius); x <= Math.min(width - 1, cx + radius); x++) {
        const r = Math.hypot(x - cx, y - cy);
        if (r <= radius) apply(y * width + x, r / radius);
      }
    }
  };
  const scale = (width * height) / 16e6;
  // Pits (dams, sink holes) and flat plateaus (levelled ground), then nodata holes.
  for (let k = 0; k < 400 * scale; k++) {
    const depthM = 1 + random() * 4;
    disc(3 + Math.floor(random() * 20), (i, r) => (data[i] = data[i]! - depthM * (1 - r)));
  }
  for (let k = 0; k < 80 * scale; k++) {
    const cx = Math.floor(random() * width);
    const cy = Math.floor(random() * height);
    const level = data[cy * width + cx]!;
    const half = 15 + Math.floor(random() * 100);
    for (let y = Math.max(0, cy - half); y <= Math.min(height - 1, cy + half); y++) {
      data.fill(level, y * width + Math.max(0, cx - half), y * width + Math.min(width, cx + half + 1));
    }
  }
  for (let k = 0; k < 6 * scale; k++) disc(20 + Math.floor(random() * 60), (i) => (data[i] = NaN));
  return { width, height, data, ...uniformCellSize(width, height, 5) };
}

async function time<T>(label: string, cells: number, run: () => T | Promise<T>): Promise<T> {
  const start = performance.now();
  const cpuStart = process.cpuUsage();
  const result = await run();
  const seconds = (performance.now() - start) / 1000;
  const cpu = process.cpuUsage(cpuStart);
  console.log(
    `${label.padEnd(16)} ${seconds.toFixed(2).padStart(7)} s  ${(cells / seconds / 1e6).toFixed(2).padStart(7)} Mcells/s` +
      `  (CPU ${((cpu.user + cpu.system) / 1e6).toFixed(2)} s)`,
  );
  return result;
}

const generateStart = performance.now();
const cellCount = size * size;
const work = mkdtempSync(path.join(tmpdir(), 'gullyline-bench-'));
const file = path.join(work, 'model.tif');
const transform = { originX: 500_000, originY: 6_500_000, cellSizeX: 5, cellSizeY: 5 };
// In a function so the generated heights can be collected before the chain is measured.
(function writeModel() {
  const generated = generateModel(size, size, seed);
  const heights = Float32Array.from(generated.data, (z) => (Number.isNaN(z) ? -9999 : z));
  writeFileSync(file, encodeGeoTiff(heights, { width: size, height: size, transform, epsg: 7854, geographic: false, nodata: -9999 }));
})();
console.log(
  `model ${size} × ${size} (${(cellCount / 1e6).toFixed(1)} M cells), seed ${seed}, ` +
    `generated and written as a GeoTIFF in ${((performance.now() - generateStart) / 1000).toFixed(2)} s`,
);
const pipelineStart = performance.now();
const { grid } = await time('read', cellCount, () => readElevationModel(file));
const filled = await time('fill', cellCount, () => fillDepressions(grid));
const directions = await time('flow directions', cellCount, () => computeFlowDirections(filled, grid));
const accumulation = await time('accumulation', cellCount, () => accumulateFlow(directions, grid));
const drainage = await time('drainage lines', cellCount, () => traceDrainageLines(grid, filled, directions, accumulation, transform, { thresholdHa: 5 }));
const totalSeconds = (performance.now() - pipelineStart) / 1000;
console.log(
  `${'total'.padEnd(16)} ${totalSeconds.toFixed(2).padStart(7)} s  ` +
    `${(cellCount / totalSeconds / 1e6).toFixed(2).padStart(7)} Mcells/s  (${drainage.length} drainage lines at 5 ha)`,
);

let valid = 0;
let outletCells = 0;
let raisedCells = 0;
let largest = 0;
for (let i = 0; i < cellCount; i++) {
  if (Number.isNaN(grid.data[i]!)) continue;
  valid++;
  if (filled[i]! > grid.data[i]!) raisedCells++;
  if (directions[i] === D8_NONE) outletCells += accumulation.cells[i]!;
  if (accumulation.cells[i]! > largest) largest = accumulation.cells[i]!;
}
console.log(
  `valid cells ${valid}, raised by fill ${raisedCells}, reaching outlets ${outletCells}, ` +
    `largest catchment ${largest} cells (${(largest * 25 / 1e6).toFixed(2)} km²)`,
);
console.log(`peak RSS ${(resourceUsage().maxRSS / 1024).toFixed(0)} MB`);

// The same chain as the server runs it: in a worker thread, with the main thread free.
const delay = monitorEventLoopDelay({ resolution: 5 });
delay.enable();
const workerStart = perf.now();
await new Promise<void>((resolve, reject) => {
  const worker = createTerrainWorker({ file, outDir: path.join(work, 'run'), thresholdHa: 5, maxCells: 64_000_000 });
  worker.on('message', (message: { type: string; message?: string }) => {
    if (message.type === 'done') void worker.terminate().then(() => resolve());
    if (message.type === 'failed') reject(new Error(message.message));
  });
  worker.on('error', reject);
});
delay.disable();
console.log(
  `worker run with map products ${((perf.now() - workerStart) / 1000).toFixed(2)} s; main-thread event loop delay ` +
    `p50 ${(delay.percentile(50) / 1e6).toFixed(1)} ms, p99 ${(delay.percentile(99) / 1e6).toFixed(1)} ms, max ${(delay.max / 1e6).toFixed(1)} ms`,
);
console.log(`peak RSS after the worker run ${(resourceUsage().maxRSS / 1024).toFixed(0)} MB`);
rmSync(work, { recursive: true, force: true });
