export {
  DEFAULT_MAX_CELLS,
  inspectElevationModel,
  readElevationModel,
  type CrsExtent,
  type ElevationCompression,
  type ElevationModel,
  type ElevationModelCrs,
  type ElevationModelHeader,
  type ElevationModelOptions,
  type ElevationSampleType,
} from './read-elevation-model';
export { ElevationModelError, type ElevationModelProblem } from './elevation-model-error';
