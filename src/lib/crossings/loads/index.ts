/**
 * Flood loads of the pure design core: drag on a floodgate's wires and debris. SI: m, m/s, N, kN.
 */
export { dragForceN, type DragInput } from './drag';
export { floodgateLoads, type FloodgateLoads, type FloodgateLoadsInput } from './floodgate-loads';
