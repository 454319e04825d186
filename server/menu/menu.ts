// The menu as the Counter and the pricing see it.
import type { JugRules, Pitcher } from '@/domain/jug-plan';
import { allergensFrom } from '@/domain/ingredients';
import type { LocationView, MenuView, Texture } from '@/domain/types';
import { bool, json } from '@server/db/rows';
import { notFound } from '@server/domain-errors';
import { photoUrlOf } from './item-photos';
import type { Db } from '@server/db/knex';
import type { Row } from '@server/db/tables';

export async function loadLocation(db: Db, locationId: number): Promise<LocationView> {
  const l = await db('locations').where({ id: locationId }).first();
  if (!l) throw notFound('Location');
  return {
    id: l.id,
    name: l.name,
    timeZone: l.time_zone,
    currency: l.currency,
    taxMode: l.tax_mode,
    taxRateMilliPct: l.tax_rate_milli_pct,
    extraShotCents: l.extra_shot_cents,
    waitTargetSeconds: l.wait_target_seconds,
    pickupTimeoutSeconds: l.pickup_timeout_seconds,
    allergenList: l.allergen_list,
    baristasOnBar: l.baristas_on_bar,
    receiptFooter: l.receipt_footer ?? null,
    readyMail: bool(l.ready_mail),
    tips: { on: bool(l.tips_on), percents: json<number[]>(l.tip_percents, []), custom: bool(l.tip_custom) },
    jugWasteMl: l.jug_waste_ml,
    volumeUnit: l.volume_unit,
    temperatureUnit: l.temperature_unit,
    milkGrowthPct: { flat: l.expansion_flat_pct, silky: l.expansion_silky_pct, foamy: l.expansion_foamy_pct },
  };
}

export async function loadPitchers(db: Db, locationId: number): Promise<Pitcher[]> {
  const rows = await db('pitchers').where({ location_id: locationId }).orderBy(['fill_line_ml', 'capacity_ml']);
  return rows.map((p) => ({ capacityMl: p.capacity_ml, fillLineMl: p.fill_line_ml, minFillMl: p.min_fill_ml }));
}

/** The café's rules for jugs, as the Bar plans with them and a started jug is checked against. */
export async function loadJugRules(db: Db, locationId: number): Promise<JugRules> {
  const l = await db('locations').where({ id: locationId }).first();
  if (!l) throw notFound('Location');
  return {
    pitchers: await loadPitchers(db, locationId),
    wasteMl: l.jug_waste_ml,
    maxDrinks: l.jug_max_drinks,
    expansionPct: { flat: l.expansion_flat_pct, silky: l.expansion_silky_pct, foamy: l.expansion_foamy_pct },
  };
}

/** An item_sizes row as the screens see it (the Counter's menu and the back-office editor). */
export const sizeView = (s: Row<'item_sizes'>) => ({
  id: s.id as number,
  name: s.name as string,
  volumeMl: s.volume_ml as number,
  priceCents: s.price_cents as number,
  shots: s.shots as number,
  milkMl: s.milk_ml as number,
  doseDg: s.dose_dg as number,
  yieldDg: s.yield_dg as number,
  isDefault: bool(s.is_default),
  cup: (s.cup as string | null) ?? null,
});

export async function loadMenu(db: Db, locationId: number): Promise<MenuView> {
  const location = await loadLocation(db, locationId);
  const categories = await db('menu_categories').where({ location_id: locationId }).whereNull('retired_at').orderBy(['sort', 'id']).select('id', 'name');
  const items = await db('menu_items')
    .whereIn(
      'category_id',
      categories.map((c) => c.id),
    )
    .whereNull('retired_at')
    .orderBy(['sort', 'id']);
  const sizes = await db('item_sizes')
    .whereIn(
      'item_id',
      items.map((i) => i.id),
    )
    .whereNull('retired_at') // retired in the menu editor: past orders keep them, the Counter doesn't
    .orderBy(['sort', 'id']);
  const milks = await db('milk_options').where({ location_id: locationId }).whereNull('retired_at').orderBy(['sort', 'id']);
  const groups = await db('extra_groups').where({ location_id: locationId }).whereNull('retired_at').orderBy(['sort', 'id']);
  const extras = await db('extras')
    .where({ location_id: locationId })
    .whereIn(
      'group_id',
      groups.map((g) => g.id),
    )
    .whereNull('retired_at')
    .orderBy(['sort', 'id']);
  const links = await db('item_extra_groups')
    .whereIn(
      'item_id',
      items.map((i) => i.id),
    )
    .whereIn(
      'group_id',
      groups.map((g) => g.id),
    );
  const groupName = new Map(groups.map((g) => [g.id, g.name as string]));
  const allergens = (row: { ingredients: string }) => allergensFrom(json<string[]>(row.ingredients, []), location.allergenList);

  return {
    location,
    categories,
    items: items.map((i) => ({
      id: i.id,
      categoryId: i.category_id,
      name: i.name,
      station: i.station,
      priceCents: i.price_cents,
      shots: i.shots,
      takesMilk: bool(i.takes_milk),
      defaultMilkId: i.default_milk_id,
      texture: (i.texture as Texture | null) ?? null,
      available: bool(i.available),
      ingredients: json<string[]>(i.ingredients, []),
      allergens: allergens(i),
      sizes: sizes.filter((s) => s.item_id === i.id).map(sizeView),
      extraGroupIds: links.filter((l) => l.item_id === i.id).map((l) => l.group_id),
      photoUrl: photoUrlOf(i.photo),
    })),
    milks: milks.map((m) => ({
      id: m.id,
      name: m.name,
      code: m.code,
      upchargeCents: m.upcharge_cents,
      allergens: allergens(m),
    })),
    extraGroups: groups.map((g) => ({ id: g.id, name: g.name, selection: g.selection, required: bool(g.required) })),
    extras: extras.map((m) => ({
      id: m.id,
      groupId: m.group_id,
      groupName: groupName.get(m.group_id) ?? '',
      name: m.name,
      priceCents: m.price_cents,
      allergens: allergens(m),
      barEffect: m.bar_effect ?? null,
    })),
  };
}
