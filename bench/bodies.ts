// What the bench's counters order: a few usual baskets made from the café's own menu.
import type { OrderBody } from './load';

export interface MenuItem {
  id: number;
  name: string;
  station: string;
  takesMilk: boolean;
  sizes: { id: number }[];
}

/** Four orders of one to three bar drinks (and a pastry), from the café's own menu. */
export function orderBodies(menu: { items: MenuItem[]; milks: { id: number; name: string }[] }): OrderBody[] {
  const bar = menu.items.filter((i) => i.station === 'bar');
  const milky = bar.filter((i) => i.takesMilk);
  const counter = menu.items.find((i) => i.station === 'counter');
  const oat = menu.milks.find((m) => m.name === 'Oat') ?? menu.milks[0];
  const line = (i: MenuItem, size = 0, milk?: number) => ({
    menuItemId: i.id,
    ...(i.sizes.length ? { sizeId: i.sizes[Math.min(size, i.sizes.length - 1)].id } : {}),
    ...(milk && i.takesMilk ? { milkId: milk } : {}),
  });
  const pick = (list: MenuItem[], k: number) => list[k % list.length];
  const lists = [
    [line(pick(milky, 0))],
    [line(pick(milky, 1), 1, oat?.id), line(pick(bar, 0))],
    [line(pick(milky, 2), 2), ...(counter ? [line(counter)] : [])],
    [line(pick(milky, 0)), line(pick(milky, 1), 0), line(pick(bar, 1))],
  ];
  const station = new Map(menu.items.map((i) => [i.id, i.station]));
  return lists.map((items) => ({ items, barDrinks: items.filter((l) => station.get(l.menuItemId) === 'bar').length }));
}
