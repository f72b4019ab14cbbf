import { z } from 'zod';

/** Units a price list sells materials in (the materials core counts in the same units). */
export const PRICE_UNITS = ['each', 'm', 'roll', 'kg'] as const;
export type PriceUnit = (typeof PRICE_UNITS)[number];

/** Most items a price list holds. */
export const MAX_PRICE_ITEMS = 500;

/** One item of a property's price list: money in whole cents (AUD). */
export const priceItemSchema = z.object({
  code: z.string().trim().min(1, 'Give the item an id (the code the materials list uses, such as LINE_POST).').max(60, 'Keep the id to 60 characters.'),
  description: z.string().trim().min(1, 'Give the item a name.').max(200, 'Keep the name to 200 characters.'),
  unit: z.enum(PRICE_UNITS, { errorMap: () => ({ message: 'The unit is each, m, roll or kg.' }) }),
  unitPriceCents: z
    .number({ invalid_type_error: 'The unit price is a number of dollars.' })
    .int('The unit price is in whole cents.')
    .min(0, 'The unit price cannot be negative.')
    .max(100_000_000, 'The unit price is at most $1,000,000.'),
  supplierNote: z.string().trim().max(200, 'Keep the supplier note to 200 characters.').default(''),
});
export type PriceListItem = z.infer<typeof priceItemSchema>;

/** The key that makes an item unique: the same id may be priced in two units (wire per roll and per metre). */
export function priceKey(item: { code: string; unit: string }): string {
  return `${item.code.trim().toUpperCase()}\u0000${item.unit}`;
}

/**
 * A whole price list: each id priced at most once in each unit (a second price would leave the
 * costs ambiguous). A duplicate is reported on the later item's id.
 */
export const priceListSchema = z
  .array(priceItemSchema)
  .max(MAX_PRICE_ITEMS, `A price list holds at most ${MAX_PRICE_ITEMS} items.`)
  .superRefine((items, ctx) => {
    const seen = new Map<string, number>();
    items.forEach((item, i) => {
      const key = priceKey(item);
      const first = seen.get(key);
      if (first === undefined) seen.set(key, i);
      else ctx.addIssue({ code: z.ZodIssueCode.custom, path: [i, 'code'], message: `${item.code} per ${item.unit} is already priced on row ${first + 1}.` });
    });
  });
