// The menu as the owner edits it: everything, retired things included, in display order.
import type { BarEffect } from './drink-options';
import type { AllergenList } from './allergens';
import type { Station, Texture } from './types';
import type { TemperatureUnit } from './units';

export interface AdminSize {
  id: number;
  name: string;
  volumeMl: number;
  cup: string | null;
  priceCents: number;
  shots: number;
  /** Coffee in and espresso out for the size's shots, in tenths of a gram. */
  doseDg: number;
  yieldDg: number;
  milkMl: number;
  isDefault: boolean;
  retired: boolean;
}

export interface AdminItem {
  id: number;
  categoryId: number;
  name: string;
  station: Station;
  priceCents: number | null;
  takesMilk: boolean;
  defaultMilkId: number | null;
  texture: Texture | null;
  /** What it contains (src/domain/ingredients.ts). */
  ingredients: string[];
  /** Worked out from the ingredients for the café's list. */
  allergens: string[];
  /** false while 86'd. */
  available: boolean;
  retired: boolean;
  extraGroupIds: number[];
  /** Sizes in use first, in order, then retired ones. */
  sizes: AdminSize[];
}

export interface AdminCategory {
  id: number;
  name: string;
  retired: boolean;
}

export interface AdminMilk {
  id: number;
  name: string;
  code: string;
  upchargeCents: number;
  /** What it contains (src/domain/ingredients.ts). */
  ingredients: string[];
  /** Worked out from the ingredients for the café's list. */
  allergens: string[];
  retired: boolean;
}

export interface AdminExtraGroup {
  id: number;
  name: string;
  selection: 'single' | 'multi';
  required: boolean;
  retired: boolean;
  itemIds: number[];
}

export interface AdminExtra {
  id: number;
  groupId: number;
  name: string;
  priceCents: number;
  /** What it contains (src/domain/ingredients.ts). */
  ingredients: string[];
  /** Worked out from the ingredients for the café's list. */
  allergens: string[];
  /** What it does at the bar (src/domain/drink-options.ts); null: nothing. */
  barEffect: BarEffect | null;
  retired: boolean;
}

export interface AdminMenuView {
  location: {
    name: string;
    currency: string;
    locale: string;
    allergenList: AllergenList;
    /** What the café's people read temperatures in (the steam caution). */
    temperatureUnit: TemperatureUnit;
    /** The published list the location chose; every allergen shown is worked out for it. */
    allergens: readonly string[];
  };
  categories: AdminCategory[];
  items: AdminItem[];
  milks: AdminMilk[];
  extraGroups: AdminExtraGroup[];
  extras: AdminExtra[];
}

/** What every menu command answers: the id it made or changed, and the menu as it now is. */
export interface MenuAdminResult {
  id: number;
  menu: AdminMenuView;
}

/** On / 86'd / retired, in words (the table never tells it by colour alone). */
export type ItemStatus = 'on' | '86' | 'retired';
export const itemStatus = (i: Pick<AdminItem, 'available' | 'retired'>): ItemStatus => (i.retired ? 'retired' : i.available ? 'on' : '86');
