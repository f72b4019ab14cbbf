/**
 * The invented Saltbush Rise terrain as one pure model: ground height at any point, and the exact
 * value written into any cell of the elevation model. Tests call it to check the GeoTIFF.
 */
import { buildCreekNetwork, type CreekNetwork } from './creek-centrelines';
import { createPolylineNearest } from './polyline-nearest';
import { createMulberry32, hashToUnit } from './prng';
import { CELL_SIZE_M, EXTENT_SIZE_M, GRID_HEIGHT, ORIGIN_X, ORIGIN_Y } from './scenario-constants';
import {
  channelIncisionM,
  flatWeight,
  plainElevationM,
  riseHeightM,
  smoothstep,
  type FlatArea,
  type LowRise,
} from './terrain-shape';

/** The terrain model of the demo property. */
export interface TerrainModel {
  readonly seed: number;
  readonly network: CreekNetwork;
  readonly rise: LowRise;
  readonly flats: readonly FlatArea[];
  /** Smooth ground height (no per-cell noise) at `[x, y]` in EPSG:7854, metres. */
  readonly surfaceElevationM: (x: number, y: number) => number;
  /** The height written into cell (col, row), row 0 northmost: the surface at the cell centre plus cell noise. */
  readonly cellElevationM: (col: number, row: number) => number;
  /** True for the few cells in the south-west corner that are left as nodata. */
  readonly isNodataCell: (col: number, row: number) => boolean;
}

/** Per-cell noise: uniform within ± this many metres ("a few cm"). */
export const CELL_NOISE_M = 0.02;
/** Gentle undulation: a smooth seeded lattice of ± this many metres, at the spacing below. */
const UNDULATION_M = 0.05;
const UNDULATION_SPACING_M = 250;
/** Cells whose column plus distance (in rows) from the south edge is below this are nodata. */
const NODATA_CORNER_CELLS = 8;

const RISE: LowRise = { name: 'Low rise between the main creek and the east tributary', centreEastM: 2250, centreNorthM: 2400, heightM: 1.5, spreadM: 200 };
const FLATS: readonly FlatArea[] = [
  { name: 'Claypan (shallow closed pan)', centreEastM: 2450, centreNorthM: 650, radiusEastM: 260, radiusNorthM: 160, levelOffsetM: -0.5 },
  { name: 'North-west flat', centreEastM: 650, centreNorthM: 2450, radiusEastM: 220, radiusNorthM: 180, levelOffsetM: 0 },
];

/**
 * Build the terrain model from the seed. Ground = plain (fall to the south, shallow valley along
 * the main creek) + low rise + gentle undulation, levelled on the flats, minus the deepest channel
 * incision of the three creeks.
 *
 * @param seed - the scenario seed
 */
export function createTerrainModel(seed: number): TerrainModel {
  const network = buildCreekNetwork(seed);
  const channels = network.creeks.map((creek) => ({ creek, nearest: createPolylineNearest(creek.points, creek.profile.reachM) }));
  // Undulation lattice drawn from its own stream so the creek shape does not shift with it.
  const next = createMulberry32(seed ^ 0x5eed);
  const latticeSide = Math.ceil(EXTENT_SIZE_M / UNDULATION_SPACING_M) + 1;
  const lattice = Array.from({ length: latticeSide * latticeSide }, () => (2 * next() - 1) * UNDULATION_M);
  const undulationM = (eastM: number, northM: number): number => {
    const gx = Math.min(Math.max(eastM / UNDULATION_SPACING_M, 0), latticeSide - 1.000001);
    const gy = Math.min(Math.max(northM / UNDULATION_SPACING_M, 0), latticeSide - 1.000001);
    const ix = Math.floor(gx);
    const iy = Math.floor(gy);
    const tx = smoothstep(0, 1, gx - ix);
    const ty = smoothstep(0, 1, gy - iy);
    const v = (i: number, j: number) => lattice[j * latticeSide + i]!;
    const south = v(ix, iy) + (v(ix + 1, iy) - v(ix, iy)) * tx;
    const north = v(ix, iy + 1) + (v(ix + 1, iy + 1) - v(ix, iy + 1)) * tx;
    return south + (north - south) * ty;
  };
  const plainAt = (eastM: number, northM: number) => plainElevationM(northM, eastM - network.mainCreekEastM(northM));
  const flatLevels = FLATS.map((flat) => plainAt(flat.centreEastM, flat.centreNorthM) + flat.levelOffsetM);

  /** Height without cell noise, and how level-flat the point is (1 = inside a flat). */
  const shapeAt = (x: number, y: number): { elevationM: number; flatness: number } => {
    const eastM = x - ORIGIN_X;
    const northM = y - (ORIGIN_Y - EXTENT_SIZE_M);
    let z = plainAt(eastM, northM) + riseHeightM(eastM, northM, RISE);
    let flatness = 0;
    FLATS.forEach((flat, i) => {
      const w = flatWeight(eastM, northM, flat);
      if (w > 0) {
        z += (flatLevels[i]! - z) * w;
        flatness = Math.max(flatness, w);
      }
    });
    z += undulationM(eastM, northM) * (1 - flatness);
    let incisionM = 0;
    for (const { creek, nearest } of channels) {
      const hit = nearest(x, y);
      if (!hit) continue;
      const depthM = creek.depthUpstreamM + (creek.depthDownstreamM - creek.depthUpstreamM) * hit.alongFraction;
      incisionM = Math.max(incisionM, channelIncisionM(hit.distanceM, depthM, creek.profile));
    }
    return { elevationM: z - incisionM, flatness };
  };

  return {
    seed,
    network,
    rise: RISE,
    flats: FLATS,
    surfaceElevationM: (x, y) => shapeAt(x, y).elevationM,
    cellElevationM: (col, row) => {
      const { elevationM, flatness } = shapeAt(ORIGIN_X + (col + 0.5) * CELL_SIZE_M, ORIGIN_Y - (row + 0.5) * CELL_SIZE_M);
      return elevationM + (2 * hashToUnit(col, row, seed) - 1) * CELL_NOISE_M * (1 - flatness);
    },
    isNodataCell: (col, row) => col + (GRID_HEIGHT - 1 - row) < NODATA_CORNER_CELLS,
  };
}
