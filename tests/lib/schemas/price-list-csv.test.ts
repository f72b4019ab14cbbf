import { readFileSync } from 'node:fs';
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { applyImportedPrices, parsePriceListCsv, priceListToCsv, type PriceCsvResult } from '../../../src/lib/schemas/price-list-csv';
import { priceListSchema, type PriceListItem } from '../../../src/lib/schemas/price-list';

const DEMO = (JSON.parse(readFileSync('data-samples/saltbush-rise-prices.json', 'utf8')) as { items: PriceListItem[] }).items;

function rowsOf(result: PriceCsvResult) {
  if (!result.ok) throw new Error(`expected rows, got: ${result.error}`);
  return result.rows;
}

describe('parsePriceListCsv', () => {
  it('reads a hand-checkable file', () => {
    const rows = rowsOf(parsePriceListCsv('id,name,unit,unit_price_aud,supplier_note\nLINE_POST,Star picket,each,11.50,Bourke depot\n'));
    expect(rows).toEqual([
      { row: 2, problems: [], item: { code: 'LINE_POST', description: 'Star picket', unit: 'each', unitPriceCents: 1150, supplierNote: 'Bourke depot' }, raw: { code: 'LINE_POST', description: 'Star picket', unit: 'each', price: '11.50' } },
    ]);
  });

  it.each([
    ['spreadsheet style', 'Item ID,Item name,Unit,Unit price (AUD),Supplier note'],
    ['other names, other order', 'unit,price,description,code,notes'],
    ['upper case with dollar sign', 'CODE,NAME,UNITS,PRICE $,SUPPLIER'],
  ])('finds the columns by name: %s', (_label, header) => {
    const names = header.split(',').map((h) => h.toLowerCase());
    const value = (h: string) => (/unit$|units/.test(h) ? 'm' : /price/.test(h) ? '2.25' : /name|description/.test(h) ? 'Plain wire' : /id|code/.test(h) ? 'WIRE_PLAIN' : 'per metre');
    const rows = rowsOf(parsePriceListCsv(`${header}\n${names.map(value).join(',')}\n`));
    expect(rows[0]!.item).toMatchObject({ code: 'WIRE_PLAIN', description: 'Plain wire', unit: 'm', unitPriceCents: 225 });
  });

  it('keeps a quoted field with commas (and doubled quotes) as one field', () => {
    const rows = rowsOf(parsePriceListCsv('id,name,unit,unit_price_aud,supplier_note\nSTAY,"Stay, 2.4 m ""heavy""",each,"1,250.00","Smith & Co, Bourke"\n'));
    expect(rows[0]!.item).toEqual({ code: 'STAY', description: 'Stay, 2.4 m "heavy"', unit: 'each', unitPriceCents: 125_000, supplierNote: 'Smith & Co, Bourke' });
  });

  it('skips a byte order mark, CRLF line ends and empty lines, and numbers rows as a spreadsheet does', () => {
    const text = '\uFEFFid,name,unit,unit_price_aud\r\n\r\nCLIP,Post clip,each,0.12\r\n   \r\n,,,\r\nDROPPER,Wire dropper,each,1.80\r\n';
    const rows = rowsOf(parsePriceListCsv(text));
    expect(rows.map((r) => [r.row, r.item?.code, r.item?.unitPriceCents])).toEqual([
      [3, 'CLIP', 12],
      [6, 'DROPPER', 180],
    ]);
  });

  it('reads semicolon-separated files', () => {
    const rows = rowsOf(parsePriceListCsv('id;name;unit;price\nTIE_WIRE;Tie wire;kg;9,00\nCLIP;Clip;each;0.12\n'));
    // "9,00" (a decimal comma) is not read as 900 dollars: it is reported.
    expect(rows[0]!.problems[0]).toMatch(/not a number of dollars/);
    expect(rows[1]!.item?.unitPriceCents).toBe(12);
  });

  it('reports each bad row with its number and what is wrong, and keeps the good rows', () => {
    const text = [
      'id,name,unit,unit_price_aud',
      'LINE_POST,Star picket,each,11.50',
      'HEAVY_POST,Heavy post,bundle,64',
      'STAY,Stay,each,-3',
      'CLIP,Post clip,each,twelve',
      ',No id,each,1',
      'DROPPER,,each,1.80',
      'LINE_POST,Star picket again,each,12',
      'LINE_POST,Star picket by the metre,m,6',
      'TIE_WIRE,Tie wire,kg,9.005',
    ].join('\n');
    const rows = rowsOf(parsePriceListCsv(text));
    const problems = Object.fromEntries(rows.map((r) => [r.row, r.problems.join(' ')]));
    expect(problems).toEqual({
      2: '',
      3: 'The unit "bundle" is not one of each, m, roll, kg.',
      4: 'The unit price -3 is negative.',
      5: 'The unit price "twelve" is not a number of dollars.',
      6: 'The id is missing.',
      7: 'The name is missing.',
      8: 'LINE_POST per each is already on row 2.',
      9: '',
      10: 'The unit price 9.005 has more than two decimal places (cents).',
    });
    expect(rows.filter((r) => r.item).map((r) => r.row)).toEqual([2, 9]);
  });

  it.each([
    ['an empty file', '', /empty/],
    ['only blank lines', '\n\n  \n', /empty/],
    ['a header and nothing else', 'id,name,unit,price\n', /no items/],
    ['no price column', 'id,name,unit\nCLIP,Clip,each\n', /no unit price column/],
    ['a binary file', 'PK\u0003\u0004\u0000\u0000garbage', /not a text file/],
    ['an unclosed quote', 'id,name,unit,price\nCLIP,"Post clip,each,0.12\n', /quote that is never closed/],
  ])('refuses %s with a clear message', (_label, text, message) => {
    const result = parsePriceListCsv(text);
    expect(result.ok).toBe(false);
    if (!result.ok) expect(result.error).toMatch(message);
  });

  it('lists the columns it ignored', () => {
    const result = parsePriceListCsv('id,name,unit,price,colour\nCLIP,Clip,each,0.12,red\n');
    expect(result.ok && result.ignoredColumns).toEqual(['colour']);
  });
});

describe('priceListToCsv', () => {
  it('writes the header and dollars with two decimals', () => {
    expect(priceListToCsv([{ code: 'STAY', description: 'Stay, 2.4 m', unit: 'each', unitPriceCents: 3200, supplierNote: '' }])).toBe('id,name,unit,unit_price_aud,supplier_note\nSTAY,"Stay, 2.4 m",each,32.00,\n');
  });

  it('round-trips the demo price list exactly', () => {
    const rows = rowsOf(parsePriceListCsv(priceListToCsv(DEMO)));
    expect(rows.every((r) => r.problems.length === 0)).toBe(true);
    expect(rows.map((r) => r.item)).toEqual(DEMO);
  });

  it('round-trips any valid price list (property test)', () => {
    const text = fc.string({ minLength: 1, maxLength: 30 }).map((s) => s.trim()).filter((s) => s.length > 0 && !s.includes('\u0000'));
    const item = fc.record({
      code: text,
      description: text,
      unit: fc.constantFrom('each' as const, 'm' as const, 'roll' as const, 'kg' as const),
      unitPriceCents: fc.integer({ min: 0, max: 100_000_000 }),
      supplierNote: fc.oneof(fc.constant(''), text),
    });
    const list = fc.uniqueArray(item, { maxLength: 20, selector: (i) => `${i.code.toUpperCase()}|${i.unit}` });
    fc.assert(
      fc.property(list, (items) => {
        fc.pre(items.length > 0);
        const rows = rowsOf(parsePriceListCsv(priceListToCsv(items)));
        expect(rows.map((r) => r.item)).toEqual(items);
      }),
      { seed: 42, numRuns: 200 },
    );
  });
});

describe('applyImportedPrices', () => {
  const current: PriceListItem[] = [
    { code: 'CLIP', description: 'Clip', unit: 'each', unitPriceCents: 12, supplierNote: '' },
    { code: 'STAY', description: 'Stay', unit: 'each', unitPriceCents: 3200, supplierNote: 'old' },
  ];
  const imported: PriceListItem[] = [
    { code: 'STAY', description: 'Stay 2.4 m', unit: 'each', unitPriceCents: 3500, supplierNote: 'new' },
    { code: 'TIE_WIRE', description: 'Tie wire', unit: 'kg', unitPriceCents: 900, supplierNote: '' },
  ];

  it('merges: changes matching items in place, adds new ones, keeps the rest', () => {
    expect(applyImportedPrices(current, imported, 'merge').map((i) => [i.code, i.unitPriceCents])).toEqual([
      ['CLIP', 12],
      ['STAY', 3500],
      ['TIE_WIRE', 900],
    ]);
  });

  it('replaces: the file becomes the list', () => {
    expect(applyImportedPrices(current, imported, 'replace')).toEqual(imported);
  });

  it('does not modify either list', () => {
    const before = JSON.stringify([current, imported]);
    applyImportedPrices(current, imported, 'merge');
    expect(JSON.stringify([current, imported])).toBe(before);
  });
});

describe('priceListSchema', () => {
  it('refuses the same id and unit twice, naming the first row', () => {
    const result = priceListSchema.safeParse([...current(), current()[0]]);
    expect(result.success).toBe(false);
    expect(result.error?.issues[0]).toMatchObject({ path: [2, 'code'], message: 'CLIP per each is already priced on row 1.' });
  });

  it('accepts the demo price list', () => {
    expect(priceListSchema.safeParse(DEMO).success).toBe(true);
  });

  function current(): PriceListItem[] {
    return [
      { code: 'CLIP', description: 'Clip', unit: 'each', unitPriceCents: 12, supplierNote: '' },
      { code: 'CLIP', description: 'Clip by weight', unit: 'kg', unitPriceCents: 1500, supplierNote: '' },
    ];
  }
});
