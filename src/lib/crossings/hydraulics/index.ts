/**
 * Hydraulics of the pure design core: channel geometry, Manning's equation, flood levels from a
 * discharge or a flood mark, and design discharges from rainfall (Rational method). Plain data in,
 * plain data out, SI units (m, m/s, m³/s, mm/h, km²), no I/O.
 */
export { HydraulicsInputError } from './input-error';
export { HYDRAULICS_SOURCES } from './sources';
export { checkCrossSection, copySection, type CrossSection, type SectionLimits } from './cross-section';
export { MANNING_N_CLASSES, roughnessClasses, type ManningNClass, type RoughnessOption } from './manning-n';
export { wettedGeometry, type WetStretch, type WettedGeometry } from './section-geometry';
export { checkManningOptions, type ManningOptions, type SectionRoughness } from './manning-options';
export { manningDischarge, type ConveyancePart, type ManningDischarge } from './manning-discharge';
export {
  solveStageForDischarge,
  type StageFound,
  type StageOvertopped,
  type StageSolution,
  type StageSolveOptions,
} from './solve-stage';
export { rationalPeakDischarge, type RationalInputs } from './rational-method';
export { RUNOFF_COEFFICIENTS, type RunoffCoefficientClass } from './runoff-coefficients';
export { bransbyWilliamsTcMin, kirpichTcMin, pilgrimMcDermottTcMin } from './time-of-concentration';
export { rainfallIntensity, validateIfdTable, type IfdTable } from './ifd';
export {
  designFloodFromRainfall,
  RATIONAL_SCREENING_CAVEAT,
  type DesignFlood,
  type DesignFloodInputs,
  type TcMethod,
} from './design-flood';
export { floodLevelForDischarge, type FloodLevel, type FloodLevelOvertopped, type FloodLevelWithin } from './flood-level';
export { floodLevelFromMark, type FloodLevelFromMark } from './flood-level-from-mark';
