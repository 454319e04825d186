// Turn what the cashier picked into a priced line, checked against the menu. Pure: the server
// uses it to price every order (prices are never taken from the client); the Counter uses it
// to show a running price before sending.
import type { OrderLineInput } from './schemas';
import { withBarEffects } from './drink-options';
import type { MenuView, MilkView, SizeView, Station, Texture } from './types';

export interface ResolvedLine {
  menuItemId: number;
  itemName: string;
  station: Station;
  size: SizeView | null;
  milk: MilkView | null;
  shots: number;
  milkMl: number;
  /** Coffee for the shots actually ordered, from the recipe's dose per shot, in 0.1 g. */
  doseDg: number;
  /** Allergens the drink itself contains: the item's, its milk's and its extras'. */
  contains: string[];
  texture: Texture | null;
  /** Steamed cooler, in a jug of its own (a drink option); texture and milk already follow the options. */
  kidsTemp: boolean;
  extras: { id: number; name: string; priceCents: number }[];
  note: string | null;
  priceCents: number;
}

export type LineProblem = { field: string; message: string; kind: 'invalid' | 'unavailable' };
export type LineResult = { ok: true; line: ResolvedLine } | { ok: false; problem: LineProblem };

const fail = (field: string, message: string, kind: LineProblem['kind'] = 'invalid'): LineResult => ({
  ok: false,
  problem: { field, message, kind },
});

export function resolveLine(menu: MenuView, input: OrderLineInput): LineResult {
  const item = menu.items.find((i) => i.id === input.menuItemId);
  if (!item) return fail('menuItemId', `No menu item ${input.menuItemId}`);
  if (!item.available) return fail('menuItemId', `${item.name} is 86'd`, 'unavailable');

  let size: SizeView | null = null;
  if (item.sizes.length > 0) {
    size = input.sizeId === undefined ? (item.sizes.find((s) => s.isDefault) ?? item.sizes[0]) : (item.sizes.find((s) => s.id === input.sizeId) ?? null);
    if (!size) return fail('sizeId', `${item.name} has no size ${input.sizeId}`);
  } else if (input.sizeId !== undefined) {
    return fail('sizeId', `${item.name} comes in one size`);
  }

  let milk: MilkView | null = null;
  if (item.takesMilk) {
    const milkId = input.milkId ?? item.defaultMilkId;
    milk = menu.milks.find((m) => m.id === milkId) ?? null;
    if (!milk) return fail('milkId', `Choose a milk for ${item.name}`);
  } else if (input.milkId !== undefined) {
    return fail('milkId', `${item.name} takes no milk`);
  }

  const recipeShots = size?.shots ?? item.shots;
  const shots = input.shots ?? recipeShots;
  const extraShots = Math.max(0, shots - recipeShots);

  const ids = input.extraIds ?? [];
  if (new Set(ids).size !== ids.length) return fail('extraIds', 'An extra is listed twice');
  const extras = [];
  for (const id of ids) {
    const mod = menu.extras.find((m) => m.id === id);
    if (!mod) return fail('extraIds', `No extra ${id}`);
    if (!item.extraGroupIds.includes(mod.groupId)) return fail('extraIds', `${mod.name} is not offered on ${item.name}`);
    extras.push({ id: mod.id, name: mod.name, priceCents: mod.priceCents, groupId: mod.groupId });
  }
  for (const group of menu.extraGroups.filter((g) => item.extraGroupIds.includes(g.id))) {
    const chosen = extras.filter((m) => m.groupId === group.id).length;
    if (group.selection === 'single' && chosen > 1) return fail('extraIds', `Choose one ${group.name.toLowerCase()}`);
    if (group.required && chosen === 0) return fail('extraIds', `Choose a ${group.name.toLowerCase()} for ${item.name}`);
  }

  const base = size?.priceCents ?? item.priceCents ?? 0;
  // A milk costs extra only as a swap: the drink's own milk is in its price (a drink made with oat
  // by default is sold at its menu price). Common practice for alternative-milk charges.
  const milkCharge = milk && milk.id !== item.defaultMilkId ? milk.upchargeCents : 0;
  // drink options change how the bar makes it: texture, cold milk, a cooler jug
  const effects = ids.flatMap((id) => menu.extras.find((m) => m.id === id)?.barEffect ?? []);
  const made = withBarEffects({ texture: item.texture, milkMl: item.takesMilk ? (size?.milkMl ?? 0) : 0 }, effects, menu.location.milkGrowthPct);
  const priceCents = base + milkCharge + extraShots * menu.location.extraShotCents + extras.reduce((sum, m) => sum + m.priceCents, 0);

  return {
    ok: true,
    line: {
      menuItemId: item.id,
      itemName: item.name,
      station: item.station,
      size,
      milk,
      shots,
      milkMl: made.milkMl,
      doseDg: size && size.shots > 0 ? Math.round((size.doseDg / size.shots) * shots) : 0,
      contains: [...new Set([...item.allergens, ...(milk?.allergens ?? []), ...ids.flatMap((id) => menu.extras.find((m) => m.id === id)?.allergens ?? [])])],
      texture: made.texture,
      kidsTemp: made.kidsTemp,
      extras: extras.map(({ id, name, priceCents }) => ({ id, name, priceCents })),
      note: input.note ? input.note : null,
      priceCents,
    },
  };
}
