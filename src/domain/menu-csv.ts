// The menu as a spreadsheet: one row per item size, in columns of our own. The same module reads
// an owner's file (papaparse's output → rows plus per-row errors) and writes the export, so a
// file exported and imported again changes nothing.
//
// Cells are read as the export writes them: a leading ' before =, +, -, @, tab, CR or LF is the
// OWASP CSV-injection guard of src/domain/csv.ts and is taken off again (a name "=Tonic" comes
// back as "=Tonic", and is guarded again on the next export).
import Papa from 'papaparse';
import { z } from 'zod';
import { allergensOf, type AllergenList } from './allergens';
import { toCsv } from './csv';
import { PLAIN_TEXT_MESSAGE, isPlainText } from './text';
import { allergensFrom, ingredientNamed, INGREDIENT_NAMES, inOrder, type Ingredient } from './ingredients';
import { TEXTURES, type MenuView, type Station, type Texture } from './types';

export const MENU_CSV_COLUMNS = [
  'category',
  'item',
  'station',
  'size',
  'volume_ml',
  'price',
  'shots',
  'dose_g',
  'yield_g',
  'milk_ml',
  'takes_milk',
  'default_milk',
  'texture',
  'ingredients',
  'allergens',
  'default_size',
] as const;
export type MenuCsvColumn = (typeof MENU_CSV_COLUMNS)[number];
export type MenuCsvCells = Record<MenuCsvColumn, string>;

/** What each column takes, shown beside the import panel. */
export const MENU_CSV_HELP: Record<MenuCsvColumn, string> = {
  category: 'menu tab, e.g. Espresso',
  item: 'item name, e.g. Latte',
  station: 'bar or counter',
  size: 'size name, e.g. Regular; empty for an item without sizes',
  volume_ml: 'cup size in mL (with a size)',
  price: 'price like 4.80',
  shots: 'espresso shots in the recipe',
  dose_g: 'ground coffee in, grams (one decimal)',
  yield_g: 'espresso out, grams (one decimal)',
  milk_ml: 'cold milk the recipe takes, mL',
  takes_milk: 'yes or no',
  default_milk: 'milk code, e.g. WH',
  texture: 'flat, silky, foamy or cold',
  ingredients: "what it contains, separated by ;, e.g. wheat; cow's milk; egg",
  allergens: 'worked out from the ingredients for the café’s list; may be left out or empty',
  default_size: 'yes on the size a tap picks',
};

/** Upload limits, shared by the panel (checked before sending) and the server. */
export const MENU_CSV_MAX_BYTES = 256 * 1024;
export const MENU_CSV_MAX_ROWS = 1000;

/** Columns a file may leave out: the allergens follow from the ingredients. */
const OPTIONAL_COLUMNS: readonly MenuCsvColumn[] = ['allergens'];

export interface MenuCsvContext {
  /** The location's published allergen list (src/domain/allergens.ts). */
  allergenList: AllergenList;
  /** Codes of the milks on the menu (the lane badges). */
  milkCodes: readonly string[];
}

export interface MenuCsvRow {
  category: string;
  item: string;
  station: Station;
  /** null: the item has no sizes and this row carries its price. */
  size: string | null;
  volumeMl: number | null;
  priceCents: number;
  shots: number;
  doseDg: number;
  yieldDg: number;
  milkMl: number;
  takesMilk: boolean;
  defaultMilk: string | null;
  texture: Texture | null;
  ingredients: Ingredient[];
  defaultSize: boolean;
}

/** `row` is the spreadsheet's row number (the header is row 1); `column` null: the whole row or file. */
export interface RowError {
  row: number;
  column: MenuCsvColumn | null;
  message: string;
}

export interface ReadRow {
  row: number;
  cells: MenuCsvCells;
  /** null when a cell of the row is wrong. */
  data: MenuCsvRow | null;
}

export interface MenuCsvRead {
  rows: ReadRow[];
  errors: RowError[];
}

// ---------------------------------------------------------------- one row

class Problem {
  constructor(readonly message: string) {}
}
type Reader<T> = (text: string) => T | Problem;

/** A zod string column that reads its text with `read`, or reports the reader's problem. */
const column = <T>(read: Reader<T>) =>
  z.string().transform((text, ctx) => {
    const value = read(text);
    if (value instanceof Problem) {
      ctx.addIssue({ code: 'custom', message: value.message });
      return z.NEVER;
    }
    return value;
  });

const name =
  (max: number, optional = false): Reader<string | null> =>
  (t) => {
    if (t === '') return optional ? null : new Problem('Needed');
    if (t.length > max) return new Problem(`At most ${max} characters`);
    return isPlainText(t) ? t : new Problem(PLAIN_TEXT_MESSAGE);
  };
const whole =
  (max: number, example: string, blank: number | null | Problem): Reader<number | null> =>
  (t) => {
    if (t === '') return blank;
    if (!/^\d{1,6}$/.test(t)) return new Problem(`Use a whole number, like ${example}`);
    return Number(t) > max ? new Problem(`At most ${max}`) : Number(t);
  };
/** Grams with at most one decimal → tenths of a gram. */
const grams: Reader<number> = (t) => {
  if (t === '') return 0;
  const m = /^(\d{1,3})(?:\.(\d))?$/.exec(t);
  if (!m) return new Problem('Use grams with at most one decimal, like 18.5');
  const dg = Number(m[1]) * 10 + Number(m[2] ?? 0);
  return dg > 2000 ? new Problem('At most 200 g') : dg;
};
/** A decimal price → cents, without floating point ("4.8" is 480). */
const price: Reader<number> = (t) => {
  if (t === '') return new Problem('Needed, like 4.80');
  const m = /^(\d{1,4})(?:\.(\d{1,2}))?$/.exec(t);
  if (!m) return new Problem('Use a price like 4.80 (digits and a point, no currency sign)');
  return Number(m[1]) * 100 + Number((m[2] ?? '0').padEnd(2, '0'));
};
const yesNo: Reader<boolean> = (t) => {
  const v = t.toLowerCase();
  if (v === 'yes') return true;
  if (v === 'no' || v === '') return false;
  return new Problem('Use yes or no');
};
const station: Reader<Station> = (t) => {
  const v = t.toLowerCase();
  return v === 'bar' || v === 'counter' ? v : new Problem('Use bar or counter');
};
const texture: Reader<Texture | null> = (t) => {
  const v = t.toLowerCase();
  if (v === '') return null;
  return (TEXTURES as readonly string[]).includes(v) ? (v as Texture) : new Problem('Use flat, silky, foamy or cold (or leave it empty)');
};

const sameSet = (a: readonly string[], b: readonly string[]) => a.every((x) => b.includes(x)) && b.every((x) => a.includes(x));

/** The zod schema of one row; the milk codes and allergens it accepts are the location's. */
export function menuCsvRowSchema(ctx: MenuCsvContext) {
  const milk: Reader<string | null> = (t) => {
    if (t === '') return null;
    const code = t.toUpperCase();
    return ctx.milkCodes.includes(code) ? code : new Problem(`No milk with code "${t}"; the menu's milks are ${ctx.milkCodes.join(', ') || 'none yet'}`);
  };
  const words = (t: string) =>
    t
      .split(';')
      .map((w) => w.trim())
      .filter(Boolean);
  const ingredients: Reader<Ingredient[]> = (t) => {
    const out: Ingredient[] = [];
    for (const word of words(t)) {
      const known = ingredientNamed(word);
      if (!known) return new Problem(`"${word}" is not an ingredient Jugline knows: ${INGREDIENT_NAMES.join(', ')}`);
      out.push(known);
    }
    return inOrder(out);
  };
  const list = allergensOf(ctx.allergenList);
  const allergens: Reader<string[]> = (t) => {
    const out: string[] = [];
    for (const word of words(t)) {
      const known = list.find((a) => a.toLowerCase() === word.toLowerCase());
      if (!known) return new Problem(`"${word}" is not on the café's allergen list (${ctx.allergenList}): ${list.join(', ')}`);
      out.push(known);
    }
    return out;
  };
  return z
    .object({
      category: column(name(60)),
      item: column(name(60)),
      station: column(station),
      size: column(name(20, true)),
      volume_ml: column(whole(5000, '350', null)),
      price: column(price),
      shots: column(whole(9, '2', 0)),
      dose_g: column(grams),
      yield_g: column(grams),
      milk_ml: column(whole(2000, '180', 0)),
      takes_milk: column(yesNo),
      default_milk: column(milk),
      texture: column(texture),
      ingredients: column(ingredients),
      allergens: column(allergens),
      default_size: column(yesNo),
    })
    .superRefine((r, issue) => {
      const at = (path: MenuCsvColumn, message: string) => issue.addIssue({ code: 'custom', path: [path], message });
      if (r.size === null) {
        if (r.volume_ml !== null) at('volume_ml', 'Leave empty for an item without sizes (or give the size a name)');
        if (r.default_size) at('default_size', 'Only a row with a size can be the default size');
        const recipe = (['dose_g', 'yield_g', 'milk_ml'] as const).filter((c) => r[c] !== 0);
        for (const c of recipe) at(c, 'An item without sizes keeps no recipe; give the row a size');
      } else if (r.volume_ml === null || r.volume_ml === 0) at('volume_ml', 'Needed for a size, like 350');
      // the export writes the allergens for reading; a file that says otherwise is asked to change the ingredients
      const derived = allergensFrom(r.ingredients, ctx.allergenList);
      if (r.allergens.length > 0 && !sameSet(r.allergens, derived)) {
        const says = derived.join('; ') || 'none';
        at(
          'allergens',
          `The allergens follow from the ingredients, which contain ${says} on the ${ctx.allergenList} list: change the ingredients, or leave this cell empty`,
        );
      }
      if (!r.takes_milk) {
        if (r.default_milk !== null) at('default_milk', 'Only for an item that takes milk (takes_milk yes)');
        if (r.milk_ml !== 0) at('milk_ml', 'Only for an item that takes milk (takes_milk yes)');
      }
    })
    .transform((r): MenuCsvRow => ({
      category: r.category!,
      item: r.item!,
      station: r.station,
      size: r.size,
      volumeMl: r.volume_ml,
      priceCents: r.price,
      shots: r.shots ?? 0,
      doseDg: r.dose_g,
      yieldDg: r.yield_g,
      milkMl: r.milk_ml ?? 0,
      takesMilk: r.takes_milk,
      defaultMilk: r.default_milk,
      texture: r.texture,
      ingredients: r.ingredients,
      defaultSize: r.default_size,
    }));
}

// ---------------------------------------------------------------- the file

const GUARDED = /^'[=+\-@\t\r\n]/;
/** A cell as the owner meant it: trimmed, with the export's formula guard taken off. */
export const cleanCell = (text: string) => (GUARDED.test(text.trim()) ? text.trim().slice(1) : text).trim();

function readHeader(header: string[], errors: RowError[]): Map<MenuCsvColumn, number> {
  const names = header.map((h) =>
    h
      .replace(/^\uFEFF/, '')
      .trim()
      .toLowerCase(),
  );
  const at = new Map<MenuCsvColumn, number>();
  if (names.length === 1 && names[0].includes(';')) {
    errors.push({ row: 1, column: null, message: 'The columns are separated by ";"; save the file as CSV with commas (CSV UTF-8)' });
    return at;
  }
  names.forEach((n, i) => {
    if (n === '') return;
    if (!(MENU_CSV_COLUMNS as readonly string[]).includes(n)) errors.push({ row: 1, column: null, message: `Unknown column "${header[i].trim()}"` });
    else if (at.has(n as MenuCsvColumn)) errors.push({ row: 1, column: n as MenuCsvColumn, message: 'This column appears twice' });
    else at.set(n as MenuCsvColumn, i);
  });
  for (const c of MENU_CSV_COLUMNS) {
    if (at.has(c) || OPTIONAL_COLUMNS.includes(c)) continue;
    // a file from before ingredients: say what the new column is for
    const message =
      c === 'ingredients'
        ? 'Column missing from the first row: list what each item contains (e.g. wheat; egg); the allergens follow from it'
        : 'Column missing from the first row';
    errors.push({ row: 1, column: c, message });
  }
  return at;
}

/** papaparse's output (arrays, no header mode) → rows and every problem, by spreadsheet row. */
export function readMenuCsv(parsed: Papa.ParseResult<string[]>, ctx: MenuCsvContext): MenuCsvRead {
  const errors: RowError[] = parsed.errors.map((e) => ({
    row: typeof e.row === 'number' ? e.row + 1 : 1,
    column: null,
    message: `The file could not be read here: ${e.message.toLowerCase()} (check the quotes)`,
  }));
  const [header, ...body] = parsed.data;
  if (!header || header.every((h) => h.trim() === '')) {
    return { rows: [], errors: [...errors, { row: 1, column: null, message: 'The file is empty; its first row names the columns' }] };
  }
  const at = readHeader(header, errors);
  if (errors.some((e) => e.row === 1)) return { rows: [], errors };

  const schema = menuCsvRowSchema(ctx);
  const rows: ReadRow[] = [];
  body.forEach((cellsIn, i) => {
    const row = i + 2;
    if (cellsIn.every((c) => c.trim() === '')) return; // blank lines between rows are fine
    const cells = Object.fromEntries(MENU_CSV_COLUMNS.map((c) => [c, at.has(c) ? cleanCell(cellsIn[at.get(c)!] ?? '') : ''])) as MenuCsvCells;
    // more cells than columns shifts every cell after the extra one: say that alone, not fifteen other things
    if (cellsIn.length > header.length && cellsIn.slice(header.length).some((c) => c.trim() !== '')) {
      const message = `This row has ${cellsIn.length} cells but there are ${header.length} columns; is there a comma inside a value? Put that value in quotes`;
      errors.push({ row, column: null, message });
      rows.push({ row, cells, data: null });
      return;
    }
    const result = schema.safeParse(cells);
    if (!result.success) {
      for (const issue of result.error.issues) errors.push({ row, column: (issue.path[0] as MenuCsvColumn | undefined) ?? null, message: issue.message });
    }
    rows.push({ row, cells, data: result.success ? result.data : null });
  });
  if (rows.length === 0) errors.push({ row: 2, column: null, message: 'The file has no rows under the column names' });
  if (rows.length > MENU_CSV_MAX_ROWS)
    errors.push({ row: rows[MENU_CSV_MAX_ROWS].row, column: null, message: `At most ${MENU_CSV_MAX_ROWS} rows in one file` });
  errors.push(...checkAcrossRows(rows));
  return { rows, errors: errors.sort((a, b) => a.row - b.row) };
}

/** The text of an uploaded file → rows and problems. Commas only: ingredients and allergens use ";" inside a cell. */
export function parseMenuCsv(text: string, ctx: MenuCsvContext): MenuCsvRead {
  return readMenuCsv(Papa.parse<string[]>(text, { delimiter: ',', skipEmptyLines: false }), ctx);
}

// ---------------------------------------------------------------- rows of one item

export interface ImportItem {
  category: string;
  name: string;
  station: Station;
  takesMilk: boolean;
  defaultMilk: string | null;
  texture: Texture | null;
  ingredients: Ingredient[];
  /** Rows in file order; one row with size null for an item without sizes. */
  rows: { row: number; data: MenuCsvRow }[];
}

const itemKey = (r: MenuCsvRow) => `${r.category.toLowerCase()}\u0000${r.item.toLowerCase()}`;

/** Valid rows grouped by (category, item), in the order the file first names them. */
export function groupMenuRows(rows: ReadRow[]): ImportItem[] {
  const items = new Map<string, ImportItem>();
  for (const { row, data } of rows) {
    if (!data) continue;
    const key = itemKey(data);
    const item = items.get(key) ?? {
      category: data.category,
      name: data.item,
      station: data.station,
      takesMilk: data.takesMilk,
      defaultMilk: data.defaultMilk,
      texture: data.texture,
      ingredients: data.ingredients,
      rows: [],
    };
    item.rows.push({ row, data });
    items.set(key, item);
  }
  return [...items.values()];
}

const ITEM_FIELDS = [
  ['station', 'station', (r: MenuCsvRow) => r.station],
  ['takes_milk', 'takes_milk', (r: MenuCsvRow) => (r.takesMilk ? 'yes' : 'no')],
  ['default_milk', 'default milk', (r: MenuCsvRow) => r.defaultMilk ?? 'none'],
  ['texture', 'texture', (r: MenuCsvRow) => r.texture ?? 'none'],
  ['ingredients', 'list of ingredients', (r: MenuCsvRow) => r.ingredients.join('; ') || 'none'],
] as const;

/** An item's rows must agree on the item's own fields; a (category, item, size) appears once. */
function checkAcrossRows(rows: ReadRow[]): RowError[] {
  const errors: RowError[] = [];
  const seen = new Map<string, number>();
  for (const item of groupMenuRows(rows)) {
    const [first] = item.rows;
    let defaultRow: number | null = null;
    for (const { row, data } of item.rows) {
      const sizeKey = `${itemKey(data)}\u0000${(data.size ?? '').toLowerCase()}`;
      if (seen.has(sizeKey)) errors.push({ row, column: 'size', message: `Same category, item and size as row ${seen.get(sizeKey)}` });
      else seen.set(sizeKey, row);
      if (row === first.row) continue;
      if ((data.size === null) !== (first.data.size === null)) {
        errors.push({
          row,
          column: 'size',
          message: `Give every row of ${item.name} a size, or none (row ${first.row} ${first.data.size === null ? 'has none' : 'has one'})`,
        });
      }
      for (const [col, label, value] of ITEM_FIELDS) {
        if (value(data) !== value(first.data)) {
          errors.push({ row, column: col, message: `Differs from row ${first.row} (${value(first.data)}); ${item.name} has one ${label} on every size` });
        }
      }
    }
    for (const { row, data } of item.rows) {
      if (!data.defaultSize) continue;
      if (defaultRow !== null) errors.push({ row, column: 'default_size', message: `Row ${defaultRow} is already ${item.name}'s default size` });
      else defaultRow = row;
    }
  }
  return errors;
}

// ---------------------------------------------------------------- export

const decimal = (n: number, unit: number, places: number) =>
  `${Math.floor(n / unit)}${n % unit || places === 2 ? `.${String(n % unit).padStart(places, '0')}` : ''}`;
const priceText = (cents: number) => decimal(cents, 100, 2);
const gramsText = (dg: number) => (dg === 0 ? '0' : decimal(dg, 10, 1));

/** The current menu as rows of cells, categories and items in menu order. */
export function menuCsvCells(menu: MenuView): MenuCsvCells[] {
  const milkCode = new Map(menu.milks.map((m) => [m.id, m.code]));
  const out: MenuCsvCells[] = [];
  for (const category of menu.categories) {
    for (const item of menu.items.filter((i) => i.categoryId === category.id)) {
      const common = {
        category: category.name,
        item: item.name,
        station: item.station,
        takes_milk: item.takesMilk ? 'yes' : 'no',
        default_milk: (item.defaultMilkId !== null && milkCode.get(item.defaultMilkId)) || '',
        texture: item.texture ?? '',
        ingredients: item.ingredients.join('; '),
        allergens: item.allergens.join('; '),
      };
      if (item.sizes.length === 0) {
        out.push({
          ...common,
          size: '',
          volume_ml: '',
          price: priceText(item.priceCents ?? 0),
          shots: String(item.shots),
          dose_g: '',
          yield_g: '',
          milk_ml: '',
          default_size: 'no',
        });
      }
      for (const s of item.sizes) {
        out.push({
          ...common,
          size: s.name,
          volume_ml: String(s.volumeMl),
          price: priceText(s.priceCents),
          shots: String(s.shots),
          dose_g: gramsText(s.doseDg),
          yield_g: gramsText(s.yieldDg),
          milk_ml: String(s.milkMl),
          default_size: s.isDefault ? 'yes' : 'no',
        });
      }
    }
  }
  return out;
}

/** The export: header row of column names, every field quoted, formula cells guarded (csv.ts). */
export function writeMenuCsv(menu: MenuView): string {
  return toCsv(
    MENU_CSV_COLUMNS.map((c) => ({ key: c, header: c })),
    menuCsvCells(menu),
  );
}

// ---------------------------------------------------------------- preview and result

export type RowAction = 'add' | 'update' | 'unchanged';

export interface MenuImportCounts {
  rows: number;
  added: number;
  updated: number;
  unchanged: number;
}

export interface MenuImportPreview {
  fileName: string;
  rows: (ReadRow & { action: RowAction | null })[];
  errors: RowError[];
  counts: MenuImportCounts;
}

/** "12 rows: 3 added, 9 updated" (and how many were already as the file says). */
export function importSummary(c: MenuImportCounts): string {
  const parts = [`${c.added} added`, `${c.updated} updated`];
  if (c.unchanged > 0) parts.push(`${c.unchanged} unchanged`);
  return `${c.rows} ${c.rows === 1 ? 'row' : 'rows'}: ${parts.join(', ')}`;
}
