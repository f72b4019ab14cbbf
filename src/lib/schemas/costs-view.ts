import type { DesignSettings } from './crossing';
import type { PriceListItem } from './price-list';

/** What `GET /api/properties/:id/settings` answers (the IFD table is not used by the islands yet). */
export type SettingsView = {
  settings: { designSettings: DesignSettings; priceList: PriceListItem[]; version: number };
  defaults: { labourRatePerDayCents: number; metresPerDay: number };
};

/** The part of a fence line's cost the Costs page shows. */
export type FenceLineCostView = {
  fenceLineId: number;
  name: string;
  status: string;
  lengthM: number;
  crossings: number;
  priced: {
    materialsCents: number;
    labour: { days: number; costCents: number };
    totalCents: number;
    complete: boolean;
    unpriced: { item: { code: string; description: string; unit: string }; why: string }[];
  };
};

/** What `GET /api/properties/:id/costs` answers. Money in whole cents (AUD). */
export type CostsView = {
  fenceLines: FenceLineCostView[];
  crossings: { crossingId: number; fenceLineId: number; fenceName: string; chainageM: number; style: string | null; materialsCents: number; labourCents: number; totalCents: number; complete: boolean }[];
  totals: { lengthM: number; materialsCents: number; labourCents: number; labourDays: number; totalCents: number; complete: boolean };
  priceListItems: number;
};
