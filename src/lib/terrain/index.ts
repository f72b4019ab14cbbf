/**
 * The pure raster core of Gullyline: typed arrays in, typed arrays out, no I/O.
 * Conditioning pipeline: `fillDepressions` → `computeFlowDirections` → `accumulateFlow`.
 */
export {
  checkElevationGrid,
  uniformCellSize,
  D8_DX,
  D8_DY,
  D8_EAST,
  D8_NONE,
  D8_NORTH,
  D8_NORTH_EAST,
  D8_NORTH_WEST,
  D8_SOUTH,
  D8_SOUTH_EAST,
  D8_SOUTH_WEST,
  D8_WEST,
  type CellSize,
  type ElevationGrid,
} from './raster';
export { fillDepressions } from './fill-depressions';
export { computeFlowDirections } from './flow-direction';
export { accumulateFlow, type FlowAccumulation } from './flow-accumulation';
export { computeSlope, hornDifferences, type HornDifferences, type HornOptions } from './slope';
export { computeHillshade, type HillshadeOptions } from './hillshade';
export {
  chooseContourIntervalM,
  traceContours,
  type ContourLevel,
  type ContourLine,
  type ContourOptions,
} from './contours';
export { cellCentre, checkGridTransform, toCell, type GridTransform } from './grid-transform';
export {
  bilinearElevationM,
  sampleProfile,
  type ElevationProfile,
  type ProfileOptions,
  type ProfileSample,
} from './profile';
