/**
 * Materials and costs: what a crossing or a whole fence line needs, and what it costs.
 * Pure: plain data in, plain data out.
 */
export { materialsForCrossing } from './crossing-materials';
export { materialsForFenceLine, type FenceLineInput } from './materials-list';
export { priceMaterials, type LabourRates, type PricedLine, type PricedMaterials, type PriceEntry } from './price-materials';
export { FENCE_SPEC_DEFAULTS, resolveFenceSpec, type MaterialsFenceSpec, type ResolvedFenceSpec } from './fence-spec';
export type { MaterialCode, MaterialItem, MaterialsList, MaterialUnit } from './material-item';
