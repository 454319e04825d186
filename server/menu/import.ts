// Menu import and export. An owner's spreadsheet is checked against the location's menu and
// applied all-or-nothing in one transaction; the export writes the menu in the same columns.
//
// Matching: a row belongs to the item with the same category and item name, and to that item's
// size with the same size name (upper/lower case ignored; the menu keeps its own spelling). A
// match is updated, anything else is added. Nothing is ever deleted or retired: items and sizes
// the file leaves out stay as they are. An item's default size is the row marked default_size
// yes; with none marked the item keeps its current default (a new item takes its first row).
import type { Knex } from 'knex';
import type { AllergenList } from '@/domain/allergens';
import {
  groupMenuRows,
  parseMenuCsv,
  writeMenuCsv,
  type ImportItem,
  type MenuCsvContext,
  type MenuImportCounts,
  type MenuImportPreview,
  type RowAction,
  type RowError,
} from '@/domain/menu-csv';
import type { SessionUser } from '@/domain/types';
import { bool, json } from '@server/db/rows';
import { invalid, unsupported } from '@server/domain-errors';
import type { Deps } from '@server/deps';
import { appendMenuChangedEvent, runCommand } from '@server/events';
import { loadMenu } from './menu';
import type { Db } from '@server/db/knex';

const lower = (s: string) => s.toLowerCase();

/** An uploaded file's bytes as text; spreadsheets save other encodings too, so say which to pick. */
export function csvText(bytes: Buffer): string {
  let text: string;
  try {
    text = new TextDecoder('utf-8', { fatal: true }).decode(bytes);
  } catch {
    throw invalid('The file is not UTF-8 text. In your spreadsheet, save it as "CSV UTF-8".');
  }
  if (text.includes('\u0000')) throw unsupported('That file is not a CSV text file.');
  return text;
}

async function csvContext(db: Db, locationId: number) {
  const location = await db('locations').where({ id: locationId }).first('allergen_list');
  const list = (location?.allergen_list ?? 'US') as AllergenList;
  const milks = await db('milk_options').where({ location_id: locationId }).whereNull('retired_at').orderBy(['sort', 'id']).select('id', 'code');
  const ctx: MenuCsvContext = { allergenList: list, milkCodes: milks.map((m) => m.code as string) };
  return { ctx, milkId: new Map<string, number>(milks.map((m) => [m.code as string, m.id as number])) };
}

interface CategoryRef {
  id: number | null;
  name: string;
  sort: number;
}

interface SizePlan {
  id: number | null;
  row: number | null;
  fields: Record<string, unknown>;
  changed: boolean;
}

interface ItemPlan {
  category: CategoryRef;
  id: number | null;
  fields: Record<string, unknown>;
  changed: boolean;
  sizes: SizePlan[];
}

interface Plan {
  errors: RowError[];
  actions: Map<number, RowAction>;
  newCategories: CategoryRef[];
  items: ItemPlan[];
}

const differs = (row: Record<string, unknown>, fields: Record<string, unknown>) =>
  Object.entries(fields).some(([k, v]) => (typeof v === 'boolean' ? bool(row[k]) !== v : (row[k] ?? null) !== v));

/** What the file would do to the menu: per row add / update / unchanged, or why it can't. */
async function planImport(db: Db, locationId: number, items: ImportItem[], milkId: Map<string, number>): Promise<Plan> {
  const categories = await db('menu_categories').where({ location_id: locationId }).whereNull('retired_at').select('id', 'name', 'sort');
  const menuItems = await db('menu_items')
    .whereIn(
      'category_id',
      categories.map((c) => c.id),
    )
    .whereNull('retired_at');
  // a retired size (kept for past orders, 20261202000100_menu_recipes) is not on the menu: a row of that name adds a new one
  const sizes = await db('item_sizes')
    .whereIn(
      'item_id',
      menuItems.map((i) => i.id),
    )
    .whereNull('retired_at');
  const maxSort = (rows: { sort: number }[]) => rows.reduce((m, r) => Math.max(m, r.sort), -1);

  const plan: Plan = { errors: [], actions: new Map(), newCategories: [], items: [] };
  const categoryByName = new Map<string, CategoryRef>(categories.map((c) => [lower(c.name), { id: c.id, name: c.name, sort: c.sort }]));
  let nextCategorySort = maxSort(categories) + 1;
  const nextItemSort = new Map<CategoryRef, number>();

  for (const item of items) {
    let category = categoryByName.get(lower(item.category));
    if (!category) {
      category = { id: null, name: item.category, sort: nextCategorySort++ };
      categoryByName.set(lower(item.category), category);
      plan.newCategories.push(category);
    }
    const existing = category.id === null ? undefined : menuItems.find((i) => i.category_id === category.id && lower(i.name) === lower(item.name));
    const existingSizes = existing ? sizes.filter((s) => s.item_id === existing.id) : [];
    const sized = item.rows[0].data.size !== null;
    if (!sized && existingSizes.length > 0) {
      for (const { row } of item.rows) {
        const names = existingSizes.map((s) => s.name).join(', ');
        plan.errors.push({ row, column: 'size', message: `${existing!.name} has sizes on the menu (${names}); give the row a size` });
      }
      continue;
    }

    const defaultRow = item.rows.find((r) => r.data.defaultSize);
    const fields: Record<string, unknown> = {
      station: item.station,
      takes_milk: item.takesMilk,
      default_milk_id: item.defaultMilk === null ? null : milkId.get(item.defaultMilk)!,
      texture: item.texture,
      ingredients: JSON.stringify(item.ingredients),
    };
    if (!sized) Object.assign(fields, { price_cents: item.rows[0].data.priceCents, shots: item.rows[0].data.shots });
    else if (!existing) Object.assign(fields, { price_cents: null, shots: (defaultRow ?? item.rows[0]).data.shots });
    else if (existingSizes.length === 0) fields.price_cents = null; // an item without sizes gets its first ones
    // the same list stored with other spacing is not a change
    if (existing && fields.ingredients === JSON.stringify(json<string[]>(existing.ingredients, []))) fields.ingredients = existing.ingredients;
    if (!existing) {
      const sort = nextItemSort.get(category) ?? maxSort(menuItems.filter((i) => i.category_id === category.id)) + 1;
      nextItemSort.set(category, sort + 1);
      Object.assign(fields, { name: item.name, sort });
    }
    const itemChanged = !existing || differs(existing, fields);
    const keepsDefault = !defaultRow && existingSizes.some((s) => bool(s.is_default));
    let nextSizeSort = maxSort(existingSizes) + 1;

    const plans: SizePlan[] = [];
    if (sized) {
      for (const [index, { row, data }] of item.rows.entries()) {
        const match = existingSizes.find((s) => lower(s.name) === lower(data.size!));
        const isDefault = defaultRow ? defaultRow.row === row : keepsDefault ? bool(match?.is_default) : index === 0;
        const sizeFields: Record<string, unknown> = {
          volume_ml: data.volumeMl,
          price_cents: data.priceCents,
          shots: data.shots,
          milk_ml: data.milkMl,
          dose_dg: data.doseDg,
          yield_dg: data.yieldDg,
          is_default: isDefault,
        };
        if (!match) Object.assign(sizeFields, { name: data.size, sort: nextSizeSort++ });
        const changed = !match || differs(match, sizeFields);
        plans.push({ id: match?.id ?? null, row, fields: sizeFields, changed });
        plan.actions.set(row, !match ? 'add' : changed || itemChanged ? 'update' : 'unchanged');
      }
      // the file names a new default: the sizes it leaves out stop being the default
      if (defaultRow) {
        for (const s of existingSizes) {
          if (bool(s.is_default) && !plans.some((p) => p.id === s.id)) plans.push({ id: s.id, row: null, fields: { is_default: false }, changed: true });
        }
      }
    } else {
      const [{ row }] = item.rows;
      plan.actions.set(row, !existing ? 'add' : itemChanged ? 'update' : 'unchanged');
    }
    plan.items.push({ category, id: existing?.id ?? null, fields, changed: itemChanged, sizes: plans });
  }
  return plan;
}

async function writePlan(trx: Knex.Transaction, locationId: number, plan: Plan): Promise<boolean> {
  let wrote = false;
  for (const c of plan.newCategories) {
    const [{ id }] = await trx('menu_categories').insert({ location_id: locationId, name: c.name, sort: c.sort }).returning('id');
    c.id = id;
    wrote = true;
  }
  for (const item of plan.items) {
    let id = item.id;
    if (id === null)
      [{ id }] = await trx('menu_items')
        .insert({ ...item.fields, category_id: item.category.id })
        .returning('id');
    else if (item.changed) await trx('menu_items').where({ id }).update(item.fields);
    wrote ||= item.changed;
    for (const size of item.sizes.filter((s) => s.changed)) {
      if (size.id === null) await trx('item_sizes').insert({ ...size.fields, item_id: id });
      else await trx('item_sizes').where({ id: size.id }).update(size.fields);
      wrote = true;
    }
  }
  return wrote;
}

function countsOf(rows: number, actions: Map<number, RowAction>): MenuImportCounts {
  const n = (a: RowAction) => [...actions.values()].filter((v) => v === a).length;
  return { rows, added: n('add'), updated: n('update'), unchanged: n('unchanged') };
}

async function readAndPlan(db: Db, locationId: number, text: string) {
  const { ctx, milkId } = await csvContext(db, locationId);
  const read = parseMenuCsv(text, ctx);
  const plan = await planImport(db, locationId, groupMenuRows(read.rows), milkId);
  // rows with a problem of their own are left out of the plan; their neighbours' actions still show
  const errors = [...read.errors, ...plan.errors].sort((a, b) => a.row - b.row);
  const bad = new Set(errors.map((e) => e.row));
  for (const row of bad) plan.actions.delete(row);
  return { read, plan, errors };
}

/** What an import of this file would do; nothing is saved. */
export async function previewMenuImport(db: Knex, locationId: number, fileName: string, text: string): Promise<MenuImportPreview> {
  const { read, plan, errors } = await readAndPlan(db, locationId, text);
  return {
    fileName,
    rows: read.rows.map((r) => ({ ...r, action: plan.actions.get(r.row) ?? null })),
    errors,
    counts: countsOf(read.rows.length, plan.actions),
  };
}

/** Details of a refused import: one per problem, with its row and column. */
export const rowErrorDetails = (errors: RowError[]) =>
  errors.map((e) => ({ path: `row.${e.row}${e.column ? `.${e.column}` : ''}`, row: e.row, column: e.column, message: e.message }));

/** The whole file or nothing: any problem → 400 with every row's problems, the menu unchanged. */
export function importMenu(deps: Deps, user: SessionUser, text: string): Promise<MenuImportCounts> {
  return runCommand(deps, async (trx) => {
    const { read, plan, errors } = await readAndPlan(trx, user.locationId, text);
    if (errors.length > 0) {
      const n = new Set(errors.map((e) => e.row)).size;
      throw invalid(`${n} ${n === 1 ? 'row needs' : 'rows need'} fixing; nothing was imported`, rowErrorDetails(errors));
    }
    const wrote = await writePlan(trx, user.locationId, plan);
    const events = wrote ? [await appendMenuChangedEvent(trx, user.locationId, deps.clock().toISOString(), user.id)] : [];
    return { result: countsOf(read.rows.length, plan.actions), events };
  });
}

export async function exportMenuCsv(db: Knex, locationId: number): Promise<string> {
  return writeMenuCsv(await loadMenu(db, locationId));
}
