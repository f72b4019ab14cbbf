import { parseDollars } from '../../lib/schemas/price-list-csv';
import type { PriceListItem, PriceUnit } from '../../lib/schemas/price-list';

/** A price list row as edited: the price as typed, and a key that stays with the row while it moves. */
export type DraftRow = { key: string; code: string; description: string; unit: PriceUnit; price: string; supplierNote: string };

let nextKey = 0;
const newKey = () => `row-${++nextKey}`;

export const formatAud = (cents: number) => new Intl.NumberFormat('en-AU', { style: 'currency', currency: 'AUD' }).format(cents / 100);

export function toDraft(items: readonly PriceListItem[]): DraftRow[] {
  return items.map((item) => ({
    key: newKey(),
    code: item.code,
    description: item.description,
    unit: item.unit,
    price: (item.unitPriceCents / 100).toFixed(2),
    supplierNote: item.supplierNote,
  }));
}

export function blankRow(): DraftRow {
  return { key: newKey(), code: '', description: '', unit: 'each', price: '', supplierNote: '' };
}

/**
 * The draft as the API takes it, or the problems of prices that are not numbers (keyed as the
 * server keys its field errors, `priceList.<index>.unitPriceCents`), which stop a save.
 */
export function fromDraft(rows: readonly DraftRow[]): { items: PriceListItem[]; problems: Record<string, string> } {
  const problems: Record<string, string> = {};
  const items = rows.map((row, index) => {
    const price = parseDollars(row.price);
    if ('problem' in price) problems[`priceList.${index}.unitPriceCents`] = price.problem;
    return { code: row.code, description: row.description, unit: row.unit, unitPriceCents: 'cents' in price ? price.cents : 0, supplierNote: row.supplierNote };
  });
  return { items, problems };
}
