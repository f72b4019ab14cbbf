/**
 * Wire mechanics of the pure design core: the wire table, cable lengths, and the flex run a
 * floodgate needs. SI throughout: metres, newtons; wire diameters in mm, areas in mm², E in GPa.
 */
export {
  WIRE_TYPES,
  findWireType,
  type FigureBasis,
  type FigureSource,
  type WireFigure,
  type WireGrade,
  type WireType,
} from './wire-types';
export { parabolaArcLengthM } from './parabola-arc-length';
export { parabolaExtraLengthM } from './parabola-extra-length';
export { cableLength, type CableLength } from './cable-length';
export { sagForExtraLength, type SagForExtraLength } from './sag-for-extra-length';
export { wireTensionAfterDeflection, type WireTensionCheck, type WireTensionInput } from './wire-tension';
export { requiredFlexRun, type FlexRun, type FlexRunInput } from './flex-run';
