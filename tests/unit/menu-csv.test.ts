import { readFileSync } from 'node:fs';
import Papa from 'papaparse';
import { describe, expect, it } from 'vitest';
import { cleanCell, importSummary, MENU_CSV_COLUMNS, parseMenuCsv, readMenuCsv, writeMenuCsv, type MenuCsvContext } from '@/domain/menu-csv';
import type { MenuItemView, MenuView } from '@/domain/types';
import { PLAIN_TEXT_MESSAGE } from '@/domain/text';
import { contrastRatio } from '@/lib/contrast';

// The location's published list: US major food allergens (FALCPA 2004 + FASTER Act 2021,
// docs/check-values.md "Allergens").
const ctx: MenuCsvContext = { allergenList: 'US', milkCodes: ['WH', 'SK', 'OA'] };
const HEADER = MENU_CSV_COLUMNS.join(',');
const LATTE_REGULAR = "Espresso,Latte,bar,Regular,350,5.40,2,19,38,270,yes,WH,silky,cow's milk,milk,yes";
const LATTE_LARGE = "Espresso,Latte,bar,Large,470,5.90,2,19,38,360,yes,WH,silky,cow's milk,milk,no";
const CROISSANT = "Food,Butter croissant,counter,,,4.25,0,,,,no,,,wheat; cow's milk; egg,wheat; milk; eggs,no";
const csv = (...lines: string[]) => [HEADER, ...lines].join('\r\n') + '\r\n';

describe('reading a menu file', () => {
  it('reads sized and unsized rows into cents, tenths of a gram and the ingredients in their own spelling and order', () => {
    const { rows, errors } = parseMenuCsv(csv(LATTE_REGULAR, 'espresso,latte,BAR,Small,240,4.8,2,18.5,37,180,YES,wh,silky,Cow’s Milk,Milk,no', CROISSANT), ctx);
    expect(errors).toEqual([]);
    expect(rows.map((r) => r.row)).toEqual([2, 3, 4]); // the header is row 1, as a spreadsheet numbers it
    expect(rows[0].data).toEqual({
      category: 'Espresso',
      item: 'Latte',
      station: 'bar',
      size: 'Regular',
      volumeMl: 350,
      priceCents: 540,
      shots: 2,
      doseDg: 190,
      yieldDg: 380,
      milkMl: 270,
      takesMilk: true,
      defaultMilk: 'WH',
      texture: 'silky',
      ingredients: ["cow's milk"],
      defaultSize: true,
    });
    // "4.8" is 480 cents, 18.5 g is 185 tenths (integer cents, DEVELOPERS.md; worked by hand)
    expect(rows[1].data).toMatchObject({ priceCents: 480, doseDg: 185, yieldDg: 370, defaultMilk: 'WH', ingredients: ["cow's milk"], station: 'bar' });
    expect(rows[2].data).toMatchObject({ size: null, volumeMl: null, priceCents: 425, doseDg: 0, milkMl: 0, ingredients: ["cow's milk", 'egg', 'wheat'] });
  });

  it('takes a quoted field with commas and doubled quotes as one cell (RFC 4180 §2.5–2.7)', () => {
    const line = 'Espresso,"Latte, oat ""house""",bar,Regular,350,5.40,2,19,38,270,yes,OA,silky,oats,,yes';
    const { rows, errors } = parseMenuCsv(csv(line), ctx);
    expect(errors).toEqual([]);
    expect(rows[0].data?.item).toBe('Latte, oat "house"');
  });

  it('ignores a UTF-8 byte order mark before the first column name (U+FEFF, as spreadsheets save "CSV UTF-8"; from memory)', () => {
    const { rows, errors } = parseMenuCsv('\uFEFF' + csv(LATTE_REGULAR), ctx);
    expect(errors).toEqual([]);
    expect(rows[0].data?.category).toBe('Espresso');
    // the pure reader handles a mark left in papaparse's output too
    const parsed = Papa.parse<string[]>(csv(LATTE_REGULAR), { delimiter: ',' });
    parsed.data[0][0] = '\uFEFF' + parsed.data[0][0];
    expect(readMenuCsv(parsed, ctx).errors).toEqual([]);
  });

  it('reads CRLF (RFC 4180 §2.1) and LF line ends alike, skipping blank lines but keeping row numbers', () => {
    const crlf = parseMenuCsv(`${HEADER}\r\n${LATTE_REGULAR}\r\n\r\n${LATTE_LARGE}\r\n`, ctx);
    const lf = parseMenuCsv(`${HEADER}\n${LATTE_REGULAR}\n\n${LATTE_LARGE}\n`, ctx);
    expect(crlf.errors).toEqual([]);
    expect(crlf.rows.map((r) => r.data)).toEqual(lf.rows.map((r) => r.data));
    expect(crlf.rows.map((r) => r.row)).toEqual([2, 4]);
  });

  it('refuses a line break inside a name, and counts a quoted multi-line cell as one row', () => {
    const { errors } = parseMenuCsv(
      csv('Espresso,"Lat\r\nte",bar,Regular,350,5.40,2,19,38,270,yes,WH,silky,,,yes', 'Espresso,Mocha,bar,Regular,350,x,2,19,38,250,yes,WH,silky,,,yes'),
      ctx,
    );
    expect(errors).toEqual([
      { row: 2, column: 'item', message: PLAIN_TEXT_MESSAGE },
      { row: 3, column: 'price', message: expect.stringContaining('like 4.80') },
    ]);
  });

  it('gives each bad cell its row, column and a message saying what to write', () => {
    const { rows, errors } = parseMenuCsv(
      csv(
        'Espresso,Latte,bar,Regular,350,4.80,2,19,38,270,yes,WH,silky,,,yes',
        'Espresso,Mocha,grill,Regular,350,$5.20,2,19,38,250,maybe,ZZ,steamy,oat,coconut,yes',
        'Food,Scone,counter,,,3.50,0,,,,no,OA,,,,no',
        'Food,Tart,counter,,200,2.00,0,,,,no,,,,,yes',
        'Food,Bun,counter,,,,0,,,,no,,,,,no',
      ),
      ctx,
    );
    expect(rows.map((r) => r.data === null)).toEqual([false, true, true, true, true]);
    expect(errors).toEqual(
      expect.arrayContaining([
        { row: 3, column: 'station', message: 'Use bar or counter' },
        { row: 3, column: 'price', message: expect.stringContaining('no currency sign') },
        { row: 3, column: 'takes_milk', message: 'Use yes or no' },
        { row: 3, column: 'default_milk', message: expect.stringContaining('WH, SK, OA') },
        { row: 3, column: 'texture', message: expect.stringContaining('flat, silky, foamy or cold') },
        // "oat" is no ingredient Jugline knows ("oats" is)
        { row: 3, column: 'ingredients', message: expect.stringContaining('"oat" is not an ingredient Jugline knows') },
        // coconut is not on the US list (FDA Q&A Edition 5, January 2025; docs/check-values.md)
        { row: 3, column: 'allergens', message: expect.stringContaining('"coconut" is not on the café\'s allergen list (US)') },
        { row: 4, column: 'default_milk', message: expect.stringContaining('takes_milk yes') },
        { row: 6, column: 'price', message: 'Needed, like 4.80' },
        { row: 5, column: 'volume_ml', message: expect.stringContaining('without sizes') },
        { row: 5, column: 'default_size', message: expect.stringContaining('with a size') },
      ]),
    );
    expect(errors.every((e) => e.row !== 2)).toBe(true);
  });

  it.each([
    ['4.80', 480],
    ['4.8', 480],
    ['4', 400],
    ['0.05', 5],
    ['9999.99', 999_999],
  ])('reads the price %s as %i cents (worked by hand)', (text, cents) => {
    const { rows, errors } = parseMenuCsv(csv(`Food,Tart,counter,,,${text},0,,,,no,,,,,no`), ctx);
    expect(errors).toEqual([]);
    expect(rows[0].data?.priceCents).toBe(cents);
  });

  it.each(['4,80', '4.805', '-1', '1e3', '€4', ' . '])('refuses the price %j', (text) => {
    const { errors } = parseMenuCsv(csv(`Food,Tart,counter,,,"${text}",0,,,,no,,,,,no`), ctx);
    expect(errors).toEqual([{ row: 2, column: 'price', message: expect.any(String) }]);
  });

  it('checks the first row: missing, unknown and repeated columns, and ";" as separator', () => {
    const short = parseMenuCsv('category,item,prce\r\nEspresso,Latte,4.80\r\n', ctx);
    expect(short.rows).toEqual([]);
    expect(short.errors).toEqual(
      expect.arrayContaining([
        { row: 1, column: null, message: 'Unknown column "prce"' },
        { row: 1, column: 'price', message: 'Column missing from the first row' },
      ]),
    );
    const twice = parseMenuCsv(`${HEADER},item\r\n${LATTE_REGULAR},Latte\r\n`, ctx);
    expect(twice.errors).toEqual([{ row: 1, column: 'item', message: 'This column appears twice' }]);
    const semicolons = parseMenuCsv(MENU_CSV_COLUMNS.join(';') + '\r\n', ctx);
    expect(semicolons.errors).toEqual([{ row: 1, column: null, message: expect.stringContaining('commas') }]);
    expect(parseMenuCsv('', ctx).errors).toEqual([{ row: 1, column: null, message: expect.stringContaining('empty') }]);
    expect(parseMenuCsv(HEADER + '\r\n', ctx).errors).toEqual([{ row: 2, column: null, message: expect.stringContaining('no rows') }]);
  });

  it('a row with more cells than columns (an unquoted comma) gets one message about quoting, not one per shifted cell', () => {
    const { rows, errors } = parseMenuCsv(csv('Food,Scone,counter,,,3,75,0,,,,no,,,wheat,,no'), ctx);
    expect(rows[0].data).toBeNull();
    expect(errors).toEqual([{ row: 2, column: null, message: expect.stringContaining('Put that value in quotes') }]);
  });

  it('takes the columns in any order', () => {
    const order = [...MENU_CSV_COLUMNS].reverse();
    const cells = LATTE_REGULAR.split(',').reverse();
    const { rows, errors } = parseMenuCsv(`${order.join(',')}\r\n${cells.join(',')}\r\n`, ctx);
    expect(errors).toEqual([]);
    expect(rows[0].data).toMatchObject({ item: 'Latte', size: 'Regular', priceCents: 540 });
  });

  it('reports a broken quote as a problem of its row', () => {
    const { errors } = parseMenuCsv(`${HEADER}\r\n${LATTE_REGULAR}\r\nEspresso,"Mocha,bar\r\n`, ctx);
    expect(errors.some((e) => e.row === 3 && e.column === null && /quote/.test(e.message))).toBe(true);
  });

  it('checks rows of one item against each other', () => {
    const { errors } = parseMenuCsv(
      csv(
        LATTE_REGULAR,
        "Espresso,Latte,counter,Large,470,5.90,2,19,38,360,yes,WH,foamy,cow's milk,milk,yes",
        "Espresso,LATTE,bar,regular,350,5.40,2,19,38,270,yes,WH,silky,cow's milk; egg,,no",
        "Espresso,Latte,bar,,,5.00,2,,,,yes,WH,silky,cow's milk,milk,no",
      ),
      ctx,
    );
    expect(errors).toEqual(
      expect.arrayContaining([
        { row: 3, column: 'station', message: expect.stringContaining('Differs from row 2 (bar)') },
        { row: 3, column: 'texture', message: expect.stringContaining('Differs from row 2 (silky)') },
        { row: 3, column: 'default_size', message: "Row 2 is already Latte's default size" },
        { row: 4, column: 'ingredients', message: expect.stringContaining("Differs from row 2 (cow's milk)") },
        { row: 4, column: 'size', message: 'Same category, item and size as row 2' },
        { row: 5, column: 'size', message: expect.stringContaining('a size, or none') },
      ]),
    );
  });
});

describe('ingredients, and the allergens that follow from them', () => {
  const EU: MenuCsvContext = { ...ctx, allergenList: 'EU' };
  const OAT_LATTE = 'Espresso,Oat latte,bar,Regular,350,5.90,2,19,38,270,yes,OA,silky,oats,%s,yes';

  it('leaves the allergens column to the export: a file may leave it out, or leave a cell empty', () => {
    const header = MENU_CSV_COLUMNS.filter((c) => c !== 'allergens');
    const line = "Food,Butter croissant,counter,,,4.25,0,,,,no,,,wheat; cow's milk; egg,no";
    const { rows, errors } = parseMenuCsv(`${header.join(',')}\r\n${line}\r\n`, ctx);
    expect(errors).toEqual([]);
    expect(rows[0].data?.ingredients).toEqual(["cow's milk", 'egg', 'wheat']);
    expect(parseMenuCsv(csv(OAT_LATTE.replace('%s', '')), EU).errors).toEqual([]);
  });

  it("checks a filled allergens cell against the ingredients, under the café's list", () => {
    // Regulation (EU) No 1169/2011 Annex II item 1: oats are a cereal containing gluten
    expect(parseMenuCsv(csv(OAT_LATTE.replace('%s', 'cereals containing gluten')), EU).errors).toEqual([]);
    // FALCPA's nine do not include oats: nothing to write on the US list
    expect(parseMenuCsv(csv(OAT_LATTE.replace('%s', 'wheat')), ctx).errors).toEqual([
      {
        row: 2,
        column: 'allergens',
        message: 'The allergens follow from the ingredients, which contain none on the US list: change the ingredients, or leave this cell empty',
      },
    ]);
  });

  it('asks a file from before ingredients for the new column', () => {
    const old = MENU_CSV_COLUMNS.filter((c) => c !== 'ingredients');
    expect(parseMenuCsv(`${old.join(',')}\r\n`, ctx).errors).toEqual([
      { row: 1, column: 'ingredients', message: expect.stringContaining('list what each item contains') },
    ]);
  });
});

// ---------------------------------------------------------------- export

function item(over: Partial<MenuItemView> & Pick<MenuItemView, 'id' | 'name' | 'categoryId'>): MenuItemView {
  return {
    station: 'bar',
    priceCents: null,
    shots: 0,
    takesMilk: false,
    defaultMilkId: null,
    texture: null,
    available: true,
    ingredients: [],
    allergens: [],
    sizes: [],
    extraGroupIds: [],
    ...over,
  };
}

function menu(items: MenuItemView[]): MenuView {
  return {
    location: {} as MenuView['location'],
    categories: [
      { id: 1, name: 'Espresso' },
      { id: 2, name: 'Food' },
    ],
    items,
    milks: [
      { id: 10, name: 'Whole', code: 'WH', upchargeCents: 0, allergens: ['milk'] },
      { id: 11, name: 'Oat', code: 'OA', upchargeCents: 70, allergens: [] },
    ],
    extraGroups: [],
    extras: [],
  };
}

const size = (id: number, name: string, volumeMl: number, priceCents: number, isDefault: boolean) => ({
  id,
  name,
  volumeMl,
  priceCents,
  shots: 2,
  milkMl: 270,
  doseDg: 185,
  yieldDg: 370,
  isDefault,
});

const DEMO = menu([
  item({
    id: 1,
    categoryId: 1,
    name: 'Latte',
    takesMilk: true,
    defaultMilkId: 11,
    texture: 'silky',
    ingredients: ["cow's milk"],
    allergens: ['milk'],
    shots: 2,
    sizes: [size(1, 'Regular', 350, 540, true), size(2, 'Large', 470, 590, false)],
  }),
  item({
    id: 2,
    categoryId: 2,
    name: 'Butter croissant',
    station: 'counter',
    priceCents: 425,
    ingredients: ["cow's milk", 'egg', 'wheat'],
    allergens: ['milk', 'eggs', 'wheat'],
  }),
]);

describe('writing the menu', () => {
  it('writes one row per size under the column names, every field quoted, CRLF line ends (RFC 4180)', () => {
    const text = writeMenuCsv(DEMO);
    const lines = text.split('\r\n');
    expect(lines[0]).toBe(MENU_CSV_COLUMNS.map((c) => `"${c}"`).join(','));
    expect(lines[1]).toBe(`"Espresso","Latte","bar","Regular","350","5.40","2","18.5","37","270","yes","OA","silky","cow's milk","milk","yes"`);
    expect(lines[3]).toBe(`"Food","Butter croissant","counter","","","4.25","0","","","","no","","","cow's milk; egg; wheat","milk; eggs; wheat","no"`);
    expect(lines).toHaveLength(4);
  });

  it('reads back exactly what it wrote', () => {
    const { rows, errors } = parseMenuCsv(writeMenuCsv(DEMO), ctx);
    expect(errors).toEqual([]);
    expect(rows.map((r) => r.data)).toEqual([
      expect.objectContaining({ item: 'Latte', size: 'Regular', priceCents: 540, doseDg: 185, yieldDg: 370, defaultMilk: 'OA', defaultSize: true }),
      expect.objectContaining({ item: 'Latte', size: 'Large', priceCents: 590, defaultSize: false }),
      expect.objectContaining({ item: 'Butter croissant', size: null, priceCents: 425, ingredients: ["cow's milk", 'egg', 'wheat'] }),
    ]);
  });

  // OWASP "CSV Injection" (check-values.md, "Security"): no cell may begin with =, +, -, @, tab,
  // CR or LF unless neutralised with a leading ' inside a quoted field.
  it.each(['=HYPERLINK("http://x.example","menu")', '+1+2', '-2+3 tonic', '@SUM(A1:A2)', '\t=1+1'])(
    'guards the name %j in the file and gives it back unchanged on import',
    (name) => {
      const text = writeMenuCsv(menu([item({ id: 1, categoryId: 2, name, station: 'counter', priceCents: 300 })]));
      const cells = Papa.parse<string[]>(text, { delimiter: ',' }).data.flat();
      for (const cell of cells) expect(/^[=+\-@\t\r\n]/.test(cell), cell).toBe(false);
      expect(text).toContain(`"'${name.replace(/"/g, '""')}"`);
      const { rows } = parseMenuCsv(text, ctx);
      const back = rows[0].cells.item;
      // a leading tab is trimmed on import like any white space; the formula stays text
      expect(back).toBe(name.trim());
    },
  );

  it('takes the guard off only before a risky character', () => {
    expect(cleanCell("'=1+1")).toBe('=1+1');
    expect(cleanCell("'Til dawn")).toBe("'Til dawn");
    expect(cleanCell('  Latte ')).toBe('Latte');
  });
});

describe('importSummary', () => {
  it('says what an import did', () => {
    expect(importSummary({ rows: 12, added: 3, updated: 9, unchanged: 0 })).toBe('12 rows: 3 added, 9 updated');
    expect(importSummary({ rows: 14, added: 0, updated: 1, unchanged: 13 })).toBe('14 rows: 0 added, 1 updated, 13 unchanged');
    expect(importSummary({ rows: 1, added: 1, updated: 0, unchanged: 0 })).toBe('1 row: 1 added, 0 updated');
  });
});

// The import panel's own colour pairs, read from the theme tokens (src/styles.css): WCAG 2.2
// SC 1.4.3 (text 4.5:1) and 1.4.11 (the progress bar's fill against its track 3:1).
const css = readFileSync(new URL('../../src/styles.css', import.meta.url), 'utf8');
const token = (name: string) => {
  if (name.startsWith('#')) return name;
  const hex = new RegExp(`--color-${name}:\\s*(#[0-9a-f]{6})`, 'i').exec(css)?.[1];
  if (!hex) throw new Error(`no token ${name}`);
  return hex;
};

describe('the import panel colours', () => {
  it.each([
    ['copper-700', 'steam-100', 4.5], // "⚠ Problem" on a bad row
    ['ink-900', 'steam-100', 4.5], // the bad row's cells
    ['copper-700', '#ffffff', 4.5], // messages on the white panel
    ['copper-700', 'steam-200', 3], // the upload's progress fill on its track
  ])('%s on %s is at least %d:1', (fg, bg, min) => {
    expect(contrastRatio(token(fg), token(bg))).toBeGreaterThanOrEqual(min);
  });
});
