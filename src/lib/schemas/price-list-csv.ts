/**
 * The price list as CSV, both ways: export for a spreadsheet or a supplier, and import with every
 * problem found before anything changes. Pure (no I/O): used by the Costs page in the browser.
 */
import Papa from 'papaparse';
import { MAX_PRICE_ITEMS, PRICE_UNITS, priceKey, type PriceListItem, type PriceUnit } from './price-list';

/** The header Gullyline writes; import also accepts the names in {@link HEADER_ALIASES}. */
export const PRICE_LIST_CSV_HEADER = ['id', 'name', 'unit', 'unit_price_aud', 'supplier_note'] as const;

type Column = 'code' | 'description' | 'unit' | 'price' | 'note';

/** Header names import understands, compared in lower case without spaces, punctuation or a currency. */
const HEADER_ALIASES: Record<string, Column> = {
  id: 'code', itemid: 'code', code: 'code', itemcode: 'code', item: 'code', sku: 'code',
  name: 'description', itemname: 'description', description: 'description',
  unit: 'unit', units: 'unit', uom: 'unit',
  unitprice: 'price', price: 'price', unitpriceaud: 'price', priceaud: 'price', unitpricecents: 'price', cost: 'price', unitcost: 'price',
  suppliernote: 'note', supplier: 'note', note: 'note', notes: 'note',
};

const UNIT_ALIASES: Record<string, PriceUnit> = {
  each: 'each', ea: 'each', item: 'each', m: 'm', metre: 'm', meter: 'm', metres: 'm', meters: 'm', roll: 'roll', rolls: 'roll', coil: 'roll', kg: 'kg', kgs: 'kg', kilogram: 'kg',
};

/** One data row of an imported file: what was read, and its problems (none means it can be applied). */
export type PriceCsvRow = {
  /** The row's number in the file as a spreadsheet counts it (the header is row 1). */
  row: number;
  item: PriceListItem | null;
  problems: string[];
  /** The row's cells as written, to show beside its problems. */
  raw: { code: string; description: string; unit: string; price: string };
};

/** A parsed file: a file-level error (nothing usable) or its rows. */
export type PriceCsvResult = { ok: false; error: string } | { ok: true; rows: PriceCsvRow[]; ignoredColumns: string[] };

/** Writes a price list as CSV (prices in dollars with two decimals), with a header row. */
export function priceListToCsv(items: readonly PriceListItem[]): string {
  const rows = items.map((item) => [item.code, item.description, item.unit, (item.unitPriceCents / 100).toFixed(2), item.supplierNote]);
  return `${Papa.unparse({ fields: [...PRICE_LIST_CSV_HEADER], data: rows }, { newline: '\n', quotes: false })}\n`;
}

function normaliseHeader(name: string): string {
  return name.toLowerCase().replace(/[^a-z]/g, '');
}

/** Dollars as typed in a spreadsheet or a form ("12.5", "$1,250.00") to whole cents, or why not. */
export function parseDollars(text: string): { cents: number } | { problem: string } {
  const cleaned = text.trim().replace(/^\$\s*/, '').replace(/^(-?)\$\s*/, '$1');
  if (cleaned === '') return { problem: 'The unit price is missing.' };
  const plain = /^-?\d{1,3}(,\d{3})+(\.\d*)?$/.test(cleaned) ? cleaned.replace(/,/g, '') : cleaned;
  if (!/^-?(\d+\.?\d*|\.\d+)$/.test(plain)) return { problem: `The unit price "${text.trim()}" is not a number of dollars.` };
  const dollars = Number(plain);
  if (dollars < 0) return { problem: `The unit price ${text.trim()} is negative.` };
  if (!/^\d*(\.\d{0,2})?$/.test(plain)) return { problem: `The unit price ${text.trim()} has more than two decimal places (cents).` };
  if (dollars > 1_000_000) return { problem: 'The unit price is at most $1,000,000.' };
  return { cents: Math.round(dollars * 100) };
}

/**
 * Reads a price list from CSV text. The first non-empty line is the header: columns are found by
 * name (id or code, name or description, unit, unit price or price, supplier note; any case, a
 * "(AUD)" or "$" ignored), in any order, extra columns ignored. Separator and quoting are CSV's
 * (a field with a comma in quotes stays one field); a byte order mark and empty lines are
 * skipped. Each data row is checked: a missing id or name, a unit other than each/m/roll/kg, a
 * price that is not a non-negative number of dollars with at most two decimals, and an id and
 * unit already given on an earlier row are reported with the row's number.
 *
 * @param text - the file's text (already decoded)
 * @returns `{ ok: false, error }` when the file cannot be read as a price list at all, else the rows
 */
export function parsePriceListCsv(text: string): PriceCsvResult {
  if (typeof text !== 'string') return { ok: false, error: 'The file could not be read as text.' };
  if (text.includes('\u0000')) return { ok: false, error: 'This is not a text file. Choose a CSV file saved from a spreadsheet.' };
  const body = text.replace(/^\uFEFF/, '');
  if (body.trim() === '') return { ok: false, error: 'The file is empty.' };
  const parsed = Papa.parse<string[]>(body, { skipEmptyLines: false, delimitersToGuess: [',', ';', '\t'] });
  const fatal = parsed.errors.find((e) => e.type === 'Quotes');
  if (fatal) return { ok: false, error: `Row ${(fatal.row ?? 0) + 1} has a quote that is never closed, so the file cannot be read. Fix it in the spreadsheet and export again.` };
  const records = parsed.data.map((fields, index) => ({ fields, row: index + 1 })).filter(({ fields }) => fields.some((f) => f.trim() !== ''));
  const [header, ...data] = records;
  if (!header) return { ok: false, error: 'The file is empty.' };

  const columns = new Map<Column, number>();
  const ignoredColumns: string[] = [];
  header.fields.forEach((name, index) => {
    const column = HEADER_ALIASES[normaliseHeader(name)];
    if (column && !columns.has(column)) columns.set(column, index);
    else if (name.trim() !== '') ignoredColumns.push(name.trim());
  });
  const missing = (['code', 'description', 'unit', 'price'] as const).filter((c) => !columns.has(c));
  if (missing.length > 0) {
    const names = { code: 'id', description: 'name', unit: 'unit', price: 'unit price' } as const;
    return { ok: false, error: `The first row should name the columns: ${PRICE_LIST_CSV_HEADER.join(', ')}. This file has no ${missing.map((c) => names[c]).join(', ')} column.` };
  }
  if (data.length === 0) return { ok: false, error: 'The file has a header but no items.' };
  if (data.length > MAX_PRICE_ITEMS) return { ok: false, error: `The file has ${data.length} items; a price list holds at most ${MAX_PRICE_ITEMS}.` };

  const inCents = normaliseHeader(header.fields[columns.get('price')!] ?? '').endsWith('cents');
  const seen = new Map<string, number>();
  const rows = data.map(({ fields, row }): PriceCsvRow => {
    const cell = (c: Column) => (columns.has(c) ? (fields[columns.get(c)!] ?? '').trim() : '');
    const problems: string[] = [];
    const code = cell('code');
    const description = cell('description');
    const unitText = cell('unit');
    if (code === '') problems.push('The id is missing.');
    else if (code.length > 60) problems.push('The id is longer than 60 characters.');
    if (description === '') problems.push('The name is missing.');
    else if (description.length > 200) problems.push('The name is longer than 200 characters.');
    const unit = UNIT_ALIASES[unitText.toLowerCase()];
    if (!unit) problems.push(unitText === '' ? 'The unit is missing (each, m, roll or kg).' : `The unit "${unitText}" is not one of ${PRICE_UNITS.join(', ')}.`);
    const price = inCents && /^\d+$/.test(cell('price')) ? { cents: Number(cell('price')) } : parseDollars(cell('price'));
    if ('problem' in price) problems.push(price.problem);
    const supplierNote = cell('note').slice(0, 200);
    if (code !== '' && unit) {
      const key = priceKey({ code, unit });
      const first = seen.get(key);
      if (first !== undefined) problems.push(`${code} per ${unit} is already on row ${first}.`);
      else seen.set(key, row);
    }
    const item = problems.length === 0 && unit && 'cents' in price ? { code, description, unit, unitPriceCents: price.cents, supplierNote } : null;
    return { row, item, problems, raw: { code, description, unit: unitText, price: cell('price') } };
  });
  return { ok: true, rows, ignoredColumns };
}

/**
 * Applies imported items to a price list. `replace`: the imported items become the list.
 * `merge`: an imported item with the id and unit of an existing one changes its name, price and
 * note in place; the others are added at the end; items the file does not mention stay.
 * Neither list is modified. Works on any rows with an id and a unit (the page merges its edited rows).
 */
export function applyImportedPrices<T extends { code: string; unit: string }>(current: readonly T[], imported: readonly T[], mode: 'replace' | 'merge'): T[] {
  if (mode === 'replace') return imported.map((item) => ({ ...item }));
  const byKey = new Map(imported.map((item) => [priceKey(item), item]));
  const merged = current.map((item) => ({ ...(byKey.get(priceKey(item)) ?? item) }));
  const present = new Set(current.map(priceKey));
  return [...merged, ...imported.filter((item) => !present.has(priceKey(item))).map((item) => ({ ...item }))];
}
