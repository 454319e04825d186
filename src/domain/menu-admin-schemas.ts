// The menu editor's request bodies (what the routes parse) and its forms (what the owner types:
// grams and prices as text), written once. The forms' rules are the bodies' rules, so the screen
// and the server refuse the same things with the same words.
import { BAR_EFFECTS } from './drink-options';
import { z } from 'zod';
import { inOrder, INGREDIENT_NAMES } from './ingredients';
import { parseAmountToCents } from './money';
import { parseGramsToDg, parseWhole } from './menu-units';
import { plainText } from './text';
import { TEXTURES } from './types';

/** Ranges the menu accepts. Names follow the columns' lengths. */
export const MENU_LIMITS = {
  priceCents: { min: 0, max: 100_000 },
  shots: { min: 0, max: 4 },
  /** Coffee in for a size with shots: 5–30 g (in tenths of a gram). */
  doseDg: { min: 50, max: 300 },
  yieldDg: { min: 0, max: 1200 },
  milkMl: { min: 0, max: 600 },
  volumeMl: { min: 1, max: 1000 },
  sizes: 8,
  names: { item: 60, category: 60, milk: 40, group: 40, extra: 40, size: 20, cup: 40 },
} as const;

const MESSAGES = {
  price: 'Prices run from 0.00 to 1,000.00',
  shots: 'Shots run from 0 to 4',
  dose: 'Dose 5–30 g for a size with shots',
  yield: 'Target yield 0–120 g',
  milk: 'Milk 0–600 ml',
  volume: 'Cup volume 1–1000 ml',
};

const unique = <T>(xs: readonly T[]) => new Set(xs).size === xs.length;
const name = (max: number) => plainText().min(1, 'Enter a name').max(max, `At most ${max} characters`);
const int = (min: number, max: number, message: string) => z.number({ error: message }).int(message).min(min, message).max(max, message);
const cents = int(MENU_LIMITS.priceCents.min, MENU_LIMITS.priceCents.max, MESSAGES.price);
const id = z.number().int().positive();
const ids = (max: number, what: string) => z.array(id).max(max).refine(unique, `${what} is listed twice`);
/**
 * What it contains, from Jugline's ingredients (src/domain/ingredients.ts), stored in their order.
 * The allergens are never sent: they are worked out from these for the café's list.
 */
export const ingredientList = z
  .array(z.enum(INGREDIENT_NAMES, { error: 'Not an ingredient Jugline knows: choose one from the list' }))
  .max(INGREDIENT_NAMES.length)
  .refine(unique, 'An ingredient is listed twice')
  .transform(inOrder);

// ---------------------------------------------------------------- bodies

export const moveBody = z.strictObject({ direction: z.enum(['up', 'down']) });
export type MoveBody = z.infer<typeof moveBody>;

export const categoryBody = z.strictObject({ name: name(MENU_LIMITS.names.category) });
export type CategoryBody = z.infer<typeof categoryBody>;

export const milkCode = plainText()
  .regex(/^[A-Za-z]{2}$/, 'Two letters, like OA')
  .transform((c) => c.toUpperCase());

export const milkBody = z.strictObject({
  name: name(MENU_LIMITS.names.milk),
  code: milkCode,
  upchargeCents: cents,
  ingredients: ingredientList.default([]),
});
export type MilkBody = z.infer<typeof milkBody>;

export const extraGroupBody = z.strictObject({
  name: name(MENU_LIMITS.names.group),
  selection: z.enum(['single', 'multi']),
  required: z.boolean(),
  itemIds: ids(200, 'An item').default([]),
});
export type ExtraGroupBody = z.infer<typeof extraGroupBody>;

export const extraBody = z.strictObject({
  groupId: id,
  name: name(MENU_LIMITS.names.extra),
  priceCents: cents,
  ingredients: ingredientList.default([]),
  /** What it does at the bar (src/domain/drink-options.ts); null or left out: nothing. */
  barEffect: z.enum(BAR_EFFECTS).nullable().default(null),
});
export type ExtraBody = z.infer<typeof extraBody>;

export const sizeInput = z.strictObject({
  /** Left out for a new size. */
  id: id.optional(),
  name: name(MENU_LIMITS.names.size),
  volumeMl: int(MENU_LIMITS.volumeMl.min, MENU_LIMITS.volumeMl.max, MESSAGES.volume),
  cup: plainText()
    .max(MENU_LIMITS.names.cup, `At most ${MENU_LIMITS.names.cup} characters`)
    .nullable()
    .default(null)
    .transform((c) => c || null),
  priceCents: cents,
  shots: int(MENU_LIMITS.shots.min, MENU_LIMITS.shots.max, MESSAGES.shots),
  doseDg: int(0, MENU_LIMITS.doseDg.max, MESSAGES.dose),
  yieldDg: int(MENU_LIMITS.yieldDg.min, MENU_LIMITS.yieldDg.max, MESSAGES.yield),
  milkMl: int(MENU_LIMITS.milkMl.min, MENU_LIMITS.milkMl.max, MESSAGES.milk),
  isDefault: z.boolean(),
});
export type SizeInput = z.infer<typeof sizeInput>;

const itemShape = {
  categoryId: id,
  name: name(MENU_LIMITS.names.item),
  station: z.enum(['bar', 'counter']),
  /** The price when the item has no sizes (a croissant); ignored with sizes. */
  priceCents: cents.nullable().default(null),
  takesMilk: z.boolean(),
  defaultMilkId: id.nullable().default(null),
  texture: z.enum(TEXTURES).nullable().default(null),
  ingredients: ingredientList.default([]),
  extraGroupIds: ids(20, 'A group of extras').default([]),
  sizes: z.array(sizeInput).max(MENU_LIMITS.sizes, `At most ${MENU_LIMITS.sizes} sizes`).default([]),
};

export type ItemBody = z.output<z.ZodObject<typeof itemShape>>;

export interface Problem {
  path: (string | number)[];
  message: string;
}

/** The rules across fields of an item: sizes, default size, milk and recipe. */
export function itemProblems(item: ItemBody): Problem[] {
  const out: Problem[] = [];
  const add = (path: Problem['path'], message: string) => out.push({ path, message });
  if (item.sizes.length === 0 && item.priceCents === null) add(['priceCents'], 'Give a price, or add a size');
  if (item.sizes.length > 0 && item.sizes.filter((s) => s.isDefault).length !== 1) add(['sizes'], 'Choose exactly one default size');
  const seen = new Map<string, number>();
  item.sizes.forEach((s, i) => {
    const key = s.name.toLowerCase();
    if (seen.has(key)) add(['sizes', i, 'name'], `Two sizes are called ${s.name}`);
    seen.set(key, i);
  });
  const listedIds = item.sizes.flatMap((s) => (s.id ? [s.id] : []));
  if (!unique(listedIds)) add(['sizes'], 'A size is listed twice');
  if (item.takesMilk) {
    if (item.station !== 'bar') add(['station'], 'A drink with milk is made at the bar');
    if (item.defaultMilkId === null) add(['defaultMilkId'], 'Choose the milk it comes with');
    if (item.texture === null) add(['texture'], 'Choose how the milk is steamed');
    if (item.sizes.length === 0) add(['sizes'], 'A drink with milk needs a size with its milk volume');
  } else {
    if (item.defaultMilkId !== null) add(['defaultMilkId'], 'Only a drink with milk has a milk');
    if (item.texture !== null) add(['texture'], 'Only a drink with milk has a texture');
  }
  item.sizes.forEach((s, i) => {
    if (item.takesMilk && s.milkMl < 1) add(['sizes', i, 'milkMl'], 'Give the milk for this size (1–600 ml)');
    if (!item.takesMilk && s.milkMl > 0) add(['sizes', i, 'milkMl'], 'Only a drink with milk takes milk');
    if (s.shots > 0 && s.doseDg < MENU_LIMITS.doseDg.min) add(['sizes', i, 'doseDg'], MESSAGES.dose);
    if (s.shots === 0 && s.doseDg > 0) add(['sizes', i, 'doseDg'], 'No shots, no dose');
    if (s.shots === 0 && s.yieldDg > 0) add(['sizes', i, 'yieldDg'], 'No shots, no yield');
  });
  return out;
}

const withRules = <T extends ItemBody>(item: T, ctx: z.RefinementCtx, path: (p: Problem['path']) => Problem['path'] = (p) => p) => {
  for (const p of itemProblems(item)) ctx.addIssue({ code: 'custom', path: path(p.path), message: p.message });
};

export const itemBody = z.strictObject(itemShape).superRefine((item, ctx) => withRules(item, ctx));

// ---------------------------------------------------------------- forms (what the owner types)

const text = z.string();
const parsed = (parse: (t: string) => number | null, wrong: string, min: number, max: number, range: string) =>
  text.transform((t, ctx) => {
    const n = parse(t);
    if (n === null) ctx.addIssue({ code: 'custom', message: wrong });
    else if (n < min || n > max) ctx.addIssue({ code: 'custom', message: range });
    else return n;
    return z.NEVER;
  });
const amount = parsed((t) => (t.trim() === '' ? 0 : parseAmountToCents(t)), 'An amount, like 5.60', 0, MENU_LIMITS.priceCents.max, MESSAGES.price);
const whole = (min: number, max: number, range: string) => parsed(parseWhole, 'A whole number', min, max, range);
const grams = (max: number, range: string) => parsed(parseGramsToDg, 'Grams, like 18 or 18.5', 0, max, range);

export const sizeForm = z.object({
  /** The stored size's id (not `id`, which the form's row list keeps for itself). */
  sizeId: z.number().optional(),
  name: name(MENU_LIMITS.names.size),
  volumeMl: whole(MENU_LIMITS.volumeMl.min, MENU_LIMITS.volumeMl.max, MESSAGES.volume),
  cup: plainText().max(MENU_LIMITS.names.cup, `At most ${MENU_LIMITS.names.cup} characters`),
  price: amount,
  shots: whole(MENU_LIMITS.shots.min, MENU_LIMITS.shots.max, MESSAGES.shots),
  doseG: grams(MENU_LIMITS.doseDg.max, MESSAGES.dose),
  yieldG: grams(MENU_LIMITS.yieldDg.max, MESSAGES.yield),
  milkMl: whole(MENU_LIMITS.milkMl.min, MENU_LIMITS.milkMl.max, MESSAGES.milk),
  isDefault: z.boolean(),
});
export type SizeFormValues = z.input<typeof sizeForm>;

const FORM_FIELD: Record<string, string> = { priceCents: 'price', doseDg: 'doseG', yieldDg: 'yieldG', id: 'sizeId' };
/** A body's field path as the form names it ("sizes.0.doseDg" → "sizes.0.doseG"). */
export const formPathOf = (path: Problem['path']): Problem['path'] => path.map((p) => (typeof p === 'string' ? (FORM_FIELD[p] ?? p) : p));

export const itemForm = z
  .object({
    categoryId: z.string().regex(/^\d+$/, 'Choose a category'),
    name: name(MENU_LIMITS.names.item),
    station: z.enum(['bar', 'counter']),
    price: text,
    takesMilk: z.boolean(),
    defaultMilkId: text,
    texture: z.union([z.literal(''), z.enum(TEXTURES)]),
    ingredients: z.array(z.string()),
    extraGroupIds: z.array(z.number()),
    sizes: z.array(sizeForm).max(MENU_LIMITS.sizes, `At most ${MENU_LIMITS.sizes} sizes`),
  })
  .superRefine((f, ctx) => {
    // the price field only counts for an item without sizes
    if (f.sizes.length === 0) {
      const r = amount.safeParse(f.price);
      if (!r.success || f.price.trim() === '')
        ctx.addIssue({ code: 'custom', path: ['price'], message: r.success ? 'Give a price, or add a size' : r.error.issues[0].message });
    }
  })
  .transform((f): ItemBody => ({
    categoryId: Number(f.categoryId),
    name: f.name,
    station: f.station,
    priceCents: f.sizes.length === 0 ? (parseAmountToCents(f.price) ?? null) : null,
    takesMilk: f.takesMilk,
    defaultMilkId: f.takesMilk && f.defaultMilkId ? Number(f.defaultMilkId) : null,
    texture: f.takesMilk && f.texture ? f.texture : null,
    ingredients: inOrder(f.ingredients),
    extraGroupIds: f.extraGroupIds,
    sizes: f.sizes.map((s) => ({
      ...(s.sizeId ? { id: s.sizeId } : {}),
      name: s.name,
      volumeMl: s.volumeMl,
      cup: s.cup || null,
      priceCents: s.price,
      shots: s.shots,
      doseDg: s.shots > 0 ? s.doseG : 0,
      yieldDg: s.shots > 0 ? s.yieldG : 0,
      milkMl: f.takesMilk ? s.milkMl : 0,
      isDefault: s.isDefault,
    })),
  }))
  .superRefine((item, ctx) => withRules(item, ctx, formPathOf));
export type ItemFormValues = z.input<typeof itemForm>;

export const milkForm = z
  .object({ name: name(MENU_LIMITS.names.milk), code: milkCode, upcharge: amount, ingredients: z.array(z.string()) })
  .transform((f): MilkBody => ({ name: f.name, code: f.code, upchargeCents: f.upcharge, ingredients: inOrder(f.ingredients) }));
export type MilkFormValues = z.input<typeof milkForm>;

export const extraForm = z
  .object({ name: name(MENU_LIMITS.names.extra), price: amount, ingredients: z.array(z.string()), barEffect: z.enum([...BAR_EFFECTS, '']) })
  .transform((f) => ({ name: f.name, priceCents: f.price, ingredients: inOrder(f.ingredients), barEffect: f.barEffect === '' ? null : f.barEffect }));
export type ExtraFormValues = z.input<typeof extraForm>;

export const extraGroupForm = extraGroupBody.extend({ itemIds: z.array(z.number()) });
export type ExtraGroupFormValues = z.input<typeof extraGroupForm>;

export const categoryForm = categoryBody;

/** Retire (true) or restore (false), as the Counter's 86 sends `available`. */
export const retiredBody = z.strictObject({ retired: z.boolean() });
export type RetiredBody = z.infer<typeof retiredBody>;
