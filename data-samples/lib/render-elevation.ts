/**
 * Render the demo terrain model into the elevation model's grid.
 */
import { GRID_HEIGHT, GRID_WIDTH, NODATA_VALUE } from './scenario-constants';
import type { TerrainModel } from './terrain-model';

/**
 * Every cell of the elevation model, row-major `data[row * width + col]`, row 0 northmost, as
 * Float32 metres; nodata cells hold {@link NODATA_VALUE}.
 *
 * @param model - the terrain model
 */
export function renderElevationGrid(model: TerrainModel): Float32Array {
  const data = new Float32Array(GRID_WIDTH * GRID_HEIGHT);
  for (let row = 0; row < GRID_HEIGHT; row++) {
    for (let col = 0; col < GRID_WIDTH; col++) {
      data[row * GRID_WIDTH + col] = model.isNodataCell(col, row) ? NODATA_VALUE : model.cellElevationM(col, row);
    }
  }
  return data;
}
