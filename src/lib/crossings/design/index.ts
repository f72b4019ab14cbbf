/**
 * Floodgate design: the channel's cross-section at a crossing, the wet zone, and the layout of
 * the floodgate across it. Pure: plain data in, plain data out.
 */
export { channelCrossSection, NoChannelError, type ChannelCrossSection, type CrossSectionOptions, type SectionPoint } from './cross-section';
export { findWetZone, type WetZone, type WetZoneEdge } from './wet-zone';
export { layoutFloodgate, type BreakawayTie, type FloodgateLayout, type Stretch, type StyleDetail } from './floodgate-layout';
export { checkFenceWires, type FloodgateInput, type FloodgateStyle } from './floodgate-input';
export { DEFAULT_FLOODGATE_SETTINGS, resolveFloodgateSettings, type FloodgateSettings } from './floodgate-settings';
export type { FloodgatePost } from './floodgate-posts';
export type { EndStrainer } from './end-strainer';
export type { DropperLink } from './dropper-link';
export { chooseDropperLink } from './dropper-link';
export { localVelocityMs, type LocalVelocity } from './local-velocity';
export { requiredWireKinds, type FenceWires, type WireKind, type WireRequirement } from './wire-kinds';
export { FENCING_CAUTIONS } from './cautions';
export type { GroundPoint } from './ground-profile';
