/**
 * Crossing geometry, part of the pure design core: where fence lines meet drainage lines, how
 * square each crossing is, a dog-leg to square a bad one, and checks of a fence line's shape.
 * Positions are `[lon, lat]` WGS84 degrees; lengths are metres on the ellipsoid; angles degrees.
 */
export type {
  AngleClass,
  Crossing,
  CrossingFlag,
  CrossingsResult,
  DrainageLineInput,
  FenceLineInput,
  Position,
  RunsAlong,
  TouchReason,
} from './types';
export { findCrossings } from './find-crossings';
export { buildDrainageIndex, type DrainageIndex, type IndexedDrainageLine } from './drainage-index';
export { DEFAULT_CROSSING_OPTIONS, type FindCrossingsOptions } from './crossing-options';
export { classifyCrossingAngle, type AngleTolerances } from './classify-crossing-angle';
export {
  suggestRealignment,
  type Realignment,
  type RealignmentOptions,
  type RealignmentResult,
} from './suggest-realignment';
export { checkFenceLine, cleanFenceLine, type FenceProblem } from './fence-checks';
export { findSelfCrossings, type SelfCrossing } from './self-crossings';
