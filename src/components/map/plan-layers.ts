// The plan's map layers, in groups: fences (with the realignment preview), crossings, and the
// selected crossing's layout. The groups take shared constants from `plan-style`, never from here:
// a cycle through this barrel would read them before they are initialised.
export {
  FENCE_LINES_SOURCE_ID,
  CROSSINGS_SOURCE_ID,
  LAYOUT_POINTS_SOURCE_ID,
  FLOODGATE_SOURCE_ID,
  REALIGN_SOURCE_ID,
  FENCE_STATUS_STYLES,
  LAYOUT_MIN_ZOOM,
  LAYOUT_VIEW_ZOOM,
  PLAN_COLOURS,
} from './plan-style';
export { fenceCasingLayer, fenceLabelLayer, fenceLineLayer, realignCasingLayer, realignLineLayer } from './fence-layers';
export {
  CROSSING_INTERACTIVE_LAYER_IDS,
  crossingDotLayer,
  crossingHitLayer,
  crossingMarkLayer,
  crossingRedesignLayer,
  crossingRingLayer,
  selectedCrossingLayers,
} from './crossing-layers';
export { LAYOUT_ICONS, LAYOUT_ICON_COLOURS, floodgateBandLayer, layoutLabelLayer, layoutMarkerLayer, layoutPostLayer } from './layout-layers';
