// An invented menu item for unit tests of pricing and lines: a bar drink with no sizes, milk or
// extras unless the test says so.
import type { MenuItemView } from '@/domain/types';

export function menuItem(over: Partial<MenuItemView> & Pick<MenuItemView, 'id' | 'name'>, extraGroupIds: number[] = []): MenuItemView {
  return {
    categoryId: 1,
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
    extraGroupIds,
    ...over,
  };
}
