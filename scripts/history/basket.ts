// What one customer orders: 1–3 items, mostly bar drinks, with the scenario's milk mix
// (whole 46 %, oat 24 %, skim 10 %, soy 6 %, almond 8 %, none 6 %), sizes mostly Regular, a few
// extra shots and syrups, and a pastry with about one order in five. Ids come from the menu by name.
import type { OrderLineInput } from '@/domain/schemas';
import type { MenuItemView, MenuView } from '@/domain/types';
import type { Random } from './random';

/** Share of bar drinks by milk, in percent; null: a drink without milk. */
export const MILK_MIX: readonly (readonly [string | null, number])[] = [
  ['Whole', 46],
  ['Oat', 24],
  ['Skim', 10],
  ['Soy', 6],
  ['Almond', 8],
  [null, 6],
];

const BLACK_DRINKS = [
  ['Espresso', 35],
  ['Long black', 35],
  ['Batch brew', 30],
] as const;

const MILK_DRINKS = [
  ['Latte', 34],
  ['Cappuccino', 22],
  ['Flat white', 20],
  ['Mocha', 8],
  ['Chai latte', 8],
  ['Iced latte', 8],
] as const;

const PASTRIES = [
  ['Butter croissant', 40],
  ['Almond croissant', 25],
  ['Banana bread', 35],
] as const;

const SIZE_MIX: Record<string, number> = { Small: 17, Regular: 63, Large: 20 };
const SYRUPS = [
  ['Vanilla syrup', 45],
  ['Caramel syrup', 35],
  ['Hazelnut syrup', 20],
] as const;

export interface MenuIndex {
  menu: MenuView;
  item(name: string): MenuItemView;
  milkId(name: string): number;
  extraId(name: string): number;
  offers(item: MenuItemView, groupName: string): boolean;
}

/** Look the demo menu up by name; a café whose menu lacks one of these names can't get history. */
export function indexMenu(menu: MenuView): MenuIndex {
  const need = <T>(found: T | undefined, what: string): T => {
    if (found === undefined) throw new Error(`The menu has no ${what}; history needs the demo café's menu`);
    return found;
  };
  const groupIds = new Map(menu.extraGroups.map((g) => [g.name, g.id]));
  return {
    menu,
    item: (name) =>
      need(
        menu.items.find((i) => i.name === name),
        `item "${name}"`,
      ),
    milkId: (name) =>
      need(
        menu.milks.find((m) => m.name === name),
        `milk "${name}"`,
      ).id,
    extraId: (name) =>
      need(
        menu.extras.find((m) => m.name === name),
        `extra "${name}"`,
      ).id,
    offers: (item, groupName) => item.extraGroupIds.includes(groupIds.get(groupName) ?? -1),
  };
}

/** More iced lattes in summer, fewer in winter (month 1–12). */
function icedWeight(month: number): number {
  if (month >= 6 && month <= 8) return 2;
  if (month === 12 || month <= 2) return 0.4;
  return 1;
}

function drinkLine(ix: MenuIndex, random: Random, month: number): OrderLineInput {
  const milk = random.weighted(MILK_MIX);
  const name =
    milk === null ? random.weighted(BLACK_DRINKS) : random.weighted(MILK_DRINKS.map(([n, w]) => [n, n === 'Iced latte' ? w * icedWeight(month) : w] as const));
  const item = ix.item(name);
  const line: OrderLineInput = { menuItemId: item.id };
  if (milk !== null) line.milkId = ix.milkId(milk);

  if (item.sizes.length > 1) {
    const size = random.weighted(item.sizes.map((s) => [s, SIZE_MIX[s.name] ?? (s.isDefault ? 63 : 25)] as const));
    line.sizeId = size.id;
  }
  const recipeShots = item.sizes.find((s) => s.id === line.sizeId)?.shots ?? item.sizes[0]?.shots ?? item.shots;

  const mods: number[] = [];
  if (recipeShots > 0) {
    if (random.chance(0.07)) line.shots = recipeShots + 1;
    if (ix.offers(item, 'Coffee') && random.chance(0.04)) mods.push(ix.extraId('Decaf'));
  }
  const syrup = ix.offers(item, 'Syrup') && random.chance(name === 'Mocha' ? 0.03 : 0.09);
  if (syrup) mods.push(ix.extraId(random.weighted(SYRUPS)));
  if (ix.offers(item, 'Temperature') && random.chance(0.04)) mods.push(ix.extraId('Extra hot'));
  const sweet = name === 'Mocha' || name === 'Chai latte' || syrup;
  if (ix.offers(item, 'Sweetness') && random.chance(sweet ? 0.1 : 0.01)) mods.push(ix.extraId('Half sweet'));
  if (mods.length) line.extraIds = mods;
  return line;
}

/** The lines of one order, drinks first. `month` is 1–12. */
export function basket(ix: MenuIndex, random: Random, month: number): OrderLineInput[] {
  const pastry = random.chance(0.2);
  const water = random.chance(0.02);
  const drinks = pastry
    ? random.weighted([
        [0, 12],
        [1, 70],
        [2, 18],
      ] as const)
    : random.weighted([
        [1, 74],
        [2, 20],
        [3, 6],
      ] as const);
  const lines = Array.from({ length: drinks }, () => drinkLine(ix, random, month));
  if (pastry) lines.push({ menuItemId: ix.item(random.weighted(PASTRIES)).id });
  if (water && lines.length < 3) lines.push({ menuItemId: ix.item('Bottled water').id });
  return lines;
}
