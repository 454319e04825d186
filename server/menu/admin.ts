// The back-office menu editor's read side: the whole menu, retired things included.
import { allergensOf, type AllergenList } from '@/domain/allergens';
import { allergensFrom } from '@/domain/ingredients';
import type { AdminMenuView } from '@/domain/menu-admin-view';
import type { Station, Texture } from '@/domain/types';
import { bool, json } from '@server/db/rows';
import { notFound } from '@server/domain-errors';
import { sizeView } from './menu';
import type { Db } from '@server/db/knex';

export async function loadAdminMenu(db: Db, locationId: number): Promise<AdminMenuView> {
  const location = await db('locations').where({ id: locationId }).first();
  if (!location) throw notFound('Location');
  const categories = await db('menu_categories').where({ location_id: locationId }).orderBy(['sort', 'id']);
  const place = new Map(categories.map((c, i) => [c.id as number, i]));
  // in the Counter's order: by category, then within it
  const items = (
    await db('menu_items')
      .whereIn('category_id', [...place.keys()])
      .orderBy(['sort', 'id'])
  ).sort((a, b) => place.get(a.category_id)! - place.get(b.category_id)!);
  const sizes = await db('item_sizes')
    .whereIn(
      'item_id',
      items.map((i) => i.id),
    )
    .orderByRaw('retired_at is not null, sort, id');
  const milks = await db('milk_options').where({ location_id: locationId }).orderBy(['sort', 'id']);
  const groups = await db('extra_groups').where({ location_id: locationId }).orderBy(['sort', 'id']);
  const extras = await db('extras').where({ location_id: locationId }).orderBy(['sort', 'id']);
  const links: { item_id: number; group_id: number }[] = await db('item_extra_groups').whereIn(
    'group_id',
    groups.map((g) => g.id),
  );
  const list = location.allergen_list as AllergenList;
  const contents = (row: { ingredients: string }) => {
    const ingredients = json<string[]>(row.ingredients, []);
    return { ingredients, allergens: allergensFrom(ingredients, list) };
  };

  return {
    location: {
      name: location.name,
      currency: location.currency,
      locale: location.locale,
      allergenList: list,
      temperatureUnit: location.temperature_unit === 'F' ? 'F' : 'C',
      allergens: allergensOf(list),
    },
    categories: categories.map((c) => ({ id: c.id, name: c.name, retired: c.retired_at !== null })),
    items: items.map((i) => ({
      id: i.id,
      categoryId: i.category_id,
      name: i.name,
      station: i.station as Station,
      priceCents: i.price_cents,
      takesMilk: bool(i.takes_milk),
      defaultMilkId: i.default_milk_id,
      texture: (i.texture as Texture | null) ?? null,
      ...contents(i),
      available: bool(i.available),
      retired: i.retired_at !== null,
      extraGroupIds: links.filter((l) => l.item_id === i.id).map((l) => l.group_id),
      sizes: sizes.filter((s) => s.item_id === i.id).map((s) => ({ ...sizeView(s), retired: s.retired_at !== null })),
    })),
    milks: milks.map((m) => ({
      id: m.id,
      name: m.name,
      code: m.code,
      upchargeCents: m.upcharge_cents,
      ...contents(m),
      retired: m.retired_at !== null,
    })),
    extraGroups: groups.map((g) => ({
      id: g.id,
      name: g.name,
      selection: g.selection,
      required: bool(g.required),
      retired: g.retired_at !== null,
      itemIds: links.filter((l) => l.group_id === g.id).map((l) => l.item_id),
    })),
    extras: extras.map((m) => ({
      id: m.id,
      groupId: m.group_id,
      name: m.name,
      priceCents: m.price_cents,
      ...contents(m),
      barEffect: m.bar_effect ?? null,
      retired: m.retired_at !== null,
    })),
  };
}
