/**
 * What the crossing endpoints answer, as the islands read it: types only, no runtime code.
 * They describe the JSON of `src/pages/api/properties/[id]/crossings/…` (the stored design is the
 * design core's result with the map's extras), so the server and the islands can share them.
 * Lengths and heights in metres, chainages in metres along the fence, positions `[lon, lat]` WGS84.
 */
import type { FeatureCollection, Point } from 'geojson';
import type { CrossingInputs } from './crossing';
import type { FenceLine } from './plan';

export type LonLat = [number, number];

export type AngleClass = 'good' | 'fair' | 'poor';
export type CrossingKind = 'crossing' | 'touch' | 'crosses-twice' | 'runs-along';
export type DesignStatus = 'designed' | 'needs-input' | 'no-channel' | 'failed' | 'touch' | 'runs-along' | 'no-terrain';
export type CrossingStyle = 'continuous-floodgate' | 'drop-down-section';

/** `GET /api/properties/:id/fence-lines` */
export type FenceLinesResponse = { fenceLines: FenceLine[] };

/** One crossing as the list and the map show it (the properties of each Point of the collection). */
export type CrossingSummaryView = {
  id: number;
  fenceLineId: number;
  fenceName: string;
  drainageLineId: number | null;
  kind: CrossingKind;
  chainageM: number;
  /** Angle between the fence and the flow, degrees; 90 is square. Null for a fence running along a channel. */
  angleDeg: number | null;
  angleClass: AngleClass | null;
  upstreamAreaHa: number | null;
  streamOrder: number | null;
  designStatus: DesignStatus;
  /** Failed in two inspection rounds: the crossing's style should be reconsidered. */
  redesign?: boolean;
  provisional: boolean;
  style: CrossingStyle | null;
  floodLevelM: number | null;
  floodgateLengthM: number | null;
  computedAt: string | null;
};

/** `GET /api/properties/:id/crossings` */
export type CrossingCollection = FeatureCollection<Point, CrossingSummaryView>;

export type SectionPointView = { stationM: number; chainageM: number; elevationM: number };

export type CrossSectionView = {
  stationsM: number[];
  elevationsM: number[];
  bed: SectionPointView;
  banks: [SectionPointView, SectionPointView];
  bankStationsM: [number, number];
  channelDepthM: number;
  warnings: string[];
};

export type FloodFromMarkView = {
  stageM: number;
  maxDepthM: number;
  overtopped: boolean;
  wettedWidthM: number;
  dischargeM3s: number | null;
  meanVelocityMs: number | null;
  warnings: string[];
  method: string;
};

export type FloodLevelView = {
  overtopped: boolean;
  stageM: number | null;
  maxDepthM: number | null;
  meanVelocityMs: number | null;
  wettedWidthM: number | null;
  dischargeM3s: number;
  /** Only when overtopped: what the whole profile carries brim-full, m³/s. */
  capacityM3s?: number;
  warnings: string[];
  method: string;
};

export type RainfallFloodView = {
  tcMin: number;
  intensityMmH: number;
  dischargeM3s: number;
  aepPercent: number;
  method: string;
  sources: string[];
  caveats: string[];
  warnings: string[];
  inputs?: { ifd?: { aepPercent: number[] }; runoffCoefficient?: number; tcMethod?: string };
};

export type CrossingFloodsView = {
  fromMark: FloodFromMarkView | null;
  fromRainfall: { flood: RainfallFloodView; level: FloodLevelView } | null;
  /** A discharge given directly (the command line's), when there was one. */
  fromDischarge?: FloodLevelView | null;
  rainfallUnavailable: string | null;
  chosen: 'mark' | 'rainfall' | 'discharge' | null;
  levelM: number | null;
  meanVelocityMs: number | null;
  maxDepthM: number | null;
  wettedWidthM: number | null;
  overtopped: boolean;
  warnings: string[];
};

export type EndStrainerView = {
  side: 'start' | 'end';
  chainageM: number;
  groundM: number | null;
  setbackFromWetZoneM: number;
  onDryGround: boolean;
  reasons: string[];
  warnings: string[];
};

export type FloodgatePostView = {
  chainageM: number;
  groundM: number | null;
  role: 'floodgate' | 'line';
  floodDepthM: number;
  velocityMs: number;
  heavy: boolean;
  braced: boolean;
  hungDropper: { link: 'open' | 'closed'; reason: string } | null;
  breakawayTie: boolean;
  reasons: string[];
};

export type WireRequirementView = {
  index: number;
  heightM: number;
  specifiedKind: 'plain' | 'barbed';
  kind: 'plain' | 'barbed';
  mustBePlain: boolean;
  reason: string;
};

export type FloodgateLayoutView = {
  style: CrossingStyle;
  floodLevelM: number;
  designLevelM: number;
  wetZone: { startChainageM: number; endChainageM: number; lengthM: number; maxDepthM: number };
  floodgate: { startChainageM?: number; endChainageM?: number; lengthM: number; reason: string };
  endStrainers: [EndStrainerView, EndStrainerView];
  posts: FloodgatePostView[];
  breakawayTies: { chainageM: number; at: 'lowest-post' | 'end-assembly'; reason: string }[];
  wires: WireRequirementView[];
  styleDetail: {
    wiresRunThrough: boolean;
    flexRunEachSideM: number;
    recommendedMinFlexRunM: number;
    staysPerEndStrainer?: number;
    reasons: string[];
  };
  heavyPosts: { minSizeMm?: number; minEmbedmentM?: number; preferredEmbedmentM?: number; reason: string };
  warnings: string[];
};

export type WireCheckView = {
  flexRunEachSideM: number;
  governedBy: string;
  extraLengthM: number;
  tensionIncreaseN: number;
  totalTensionN: number;
  allowedTensionN: number;
  reasons: string[];
  method: string;
};

export type LoadsView = {
  bareWiresKn: number;
  debrisMatKn: number;
  totalKn: number;
  eachEndStrainerKn: number;
  reasons: string[];
  caution: string;
  method: string;
};

export type MaterialItemView = { code: string; description: string; unit: string; quantity: number; reason: string };

export type LayoutPointKind = 'end-strainer' | 'flex-run-strainer' | 'floodgate-post' | 'line-post' | 'breakaway-tie';

/** A place on the fence for a crew to find. */
export type LayoutPointView = {
  kind: LayoutPointKind;
  label: string;
  chainageM: number;
  position: LonLat;
  beyondFence?: boolean;
  braced?: boolean;
  link?: 'open' | 'closed' | null;
};

export type CatchmentView = { areaHa: number; longestFlowPathM: number; equalAreaSlopeMPerKm: number };

/** What every stored design may carry beside its status. */
type DesignExtras = {
  cautions?: string[];
  /** Ground along the fence around the crossing. */
  profile?: { chainageM: number; elevationM: number | null }[];
  catchment?: CatchmentView | null;
};

/** What the crossing's style was chosen by, and the rule's recommendation with its reasons. */
export type StyleChoiceView = {
  style: CrossingStyle;
  chosenBy: 'planner' | 'rule';
  recommended: CrossingStyle;
  reasons: string[];
  thresholds: { dropDownWidthM: number; dropDownDepthM: number; dropDownVelocityMs: number; dropDownDebris: 'moderate' | 'heavy' };
  basis: string;
};

/** One style in the comparison; `cost` is priced at read time from the property's price list. */
export type StyleSideView = {
  style: CrossingStyle;
  inPlan: boolean;
  counts: { endAssemblies: number; flexRunStrainers: number; posts: number; stays: number; hungDroppers: number; droppers: number; breakawayTies: number };
  wiresRunThrough: boolean;
  flexRunEachSideM: number;
  spanM: number;
  endAssemblyLoadKn: number | null;
  endAssemblyLoadReason: string;
  materials: MaterialItemView[];
  afterFlood: { work: string; hours: number; reason: string };
  strengths: string[];
  weaknesses: string[];
  cost?: { materialsCents: number; labourCents: number; labourDays: number; totalCents: number; complete: boolean; unpriced: string[] };
};

export type SectionReleaseView = {
  releaseEachEndKn: number;
  releaseTotalKn: number;
  releaseVelocityMs: number | null;
  releasesInDesignFlood: boolean;
  fenceStrainKn: number;
  endAssemblyCapacityKn: number;
  endAssemblyHolds: boolean;
  sectionWiresAtKnotKn: number;
  tieGoesFirst: boolean;
  reasons: string[];
  method: string;
};

/** Both ways to build the crossing, designed from the same flood and ground. */
export type StyleComparisonView = {
  stretchM: number;
  stretchReason: string;
  sides: [StyleSideView, StyleSideView];
  release: SectionReleaseView | null;
  inPlan: CrossingStyle;
  chosenBy: 'planner' | 'rule';
  recommendation: { style: CrossingStyle; reasons: string[] };
  basis: string;
};

export type DesignedCrossingView = DesignExtras & {
  status: 'designed';
  provisional: boolean;
  section: CrossSectionView;
  floods: CrossingFloodsView;
  layout: FloodgateLayoutView;
  wireCheck: WireCheckView | null;
  loads: LoadsView | null;
  materials: { items: MaterialItemView[]; warnings: string[] };
  warnings: string[];
  /** The values the design used, the property's settings filling what the crossing's inputs left out. */
  used?: { channelN?: number; overbankN?: number; freeboardM?: number; style?: CrossingStyle; debris?: 'light' | 'moderate' | 'heavy' };
  positions?: LayoutPointView[];
  /** Absent on designs stored before both styles were compared. */
  styleChoice?: StyleChoiceView;
  comparison?: StyleComparisonView;
};

export type UndesignedCrossingView = DesignExtras & {
  status: 'needs-input' | 'no-channel' | 'failed';
  /** Why there is no layout, in a sentence. */
  problem: string;
  floods?: CrossingFloodsView;
};

/** A crossing's stored design; touches, runs along and crossings without terrain have only the extras. */
export type CrossingDesignView =
  | DesignedCrossingView
  | UndesignedCrossingView
  | (DesignExtras & { status?: undefined; fromChainageM?: number; toChainageM?: number; lengthM?: number; touchReason?: string | null });

export type CrossingInputsView = CrossingInputs;

/** `GET /api/properties/:id/crossings/:crossingId` */
export type CrossingDetailView = CrossingSummaryView & {
  position: LonLat;
  inputs: CrossingInputsView;
  design: CrossingDesignView | null;
};

/** The body of `PATCH /api/properties/:id/crossings/:crossingId`: a number sets an input, null clears it. */
export type CrossingInputsChange = { [K in keyof CrossingInputs]?: CrossingInputs[K] | null };

export type RealignmentSuggestionView =
  | {
      ok: true;
      coordinates: LonLat[];
      addedLengthM: number;
      newAngleDeg: number;
      replacedChainageRange: { fromM: number; toM: number };
    }
  | { ok: false; reason: string };

/** `GET /api/properties/:id/crossings/:crossingId/realignment` */
export type RealignmentView = {
  crossing: { id: number; angleDeg: number | null; angleClass: AngleClass | null };
  fenceLine: { id: number; version: number };
  suggestion: RealignmentSuggestionView;
};

