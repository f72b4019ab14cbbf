/**
 * Benchmark of the terrain conditioning pipeline (fill → flow directions → accumulation) on a
 * generated 4000 × 4000 Float32 elevation model (invented, seeded, deterministic): a tilted
 * surface with sines, value noise, rounding to 1 cm, pits, flat plateaus and nodata holes.
 *
 *   npx tsx scripts/bench-terrain.ts [size] [seed]
 *
 * Prints wall time, throughput and CPU time per stage, and the peak resident set size. On a
 * shared machine, CPU time well below wall time means the benchmark was waiting for a core.
 */
import { resourceUsage } from 'node:process';
import {
  accumulateFlow,
  computeFlowDirections,
  D8_NONE,
  fillDepressions,
  uniformCellSize,
  type ElevationGrid,
} from '../src/lib/terrain/index';

const size = Number(process.argv[2] ?? 4000);
const seed = Number(process.argv[3] ?? 20261202);

/** mulberry32: a small seeded PRNG, uniform in [0, 1). */
function makeRandom(seedValue: number): () => number {
  let a = seedValue >>> 0;
  return () => {
    a = (a + 0x6d2b79f5) >>> 0;
    let t = a;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
}

function generateModel(width: number, height: number, seedValue: number): ElevationGrid {
  const random = makeRandom(seedValue);
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

function time<T>(label: string, cells: number, run: () => T): T {
  const start = performance.now();
  const cpuStart = process.cpuUsage();
  const result = run();
  const seconds = (performance.now() - start) / 1000;
  const cpu = process.cpuUsage(cpuStart);
  console.log(
    `${label.padEnd(16)} ${seconds.toFixed(2).padStart(7)} s  ${(cells / seconds / 1e6).toFixed(2).padStart(7)} Mcells/s` +
      `  (CPU ${((cpu.user + cpu.system) / 1e6).toFixed(2)} s)`,
  );
  return result;
}

const generateStart = performance.now();
const grid = generateModel(size, size, seed);
const cellCount = size * size;
console.log(
  `model ${size} × ${size} (${(cellCount / 1e6).toFixed(1)} M cells), seed ${seed}, ` +
    `generated in ${((performance.now() - generateStart) / 1000).toFixed(2)} s`,
);
const pipelineStart = performance.now();
const filled = time('fill', cellCount, () => fillDepressions(grid));
const directions = time('flow directions', cellCount, () => computeFlowDirections(filled, grid));
const accumulation = time('accumulation', cellCount, () => accumulateFlow(directions, grid));
const totalSeconds = (performance.now() - pipelineStart) / 1000;
console.log(
  `${'total'.padEnd(16)} ${totalSeconds.toFixed(2).padStart(7)} s  ` +
    `${(cellCount / totalSeconds / 1e6).toFixed(2).padStart(7)} Mcells/s`,
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
