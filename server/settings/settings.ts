// The location's settings and pitchers. Each change is one transaction plus a menu.changed
// event, so every open Counter, Bar and Pickup reloads what it shows from them.
import type { Knex } from 'knex';
import { allergenSwitch, type MenuEntry } from '@/domain/allergen-switch';
import type { AllergenList } from '@/domain/allergens';
import {
  defaultMinFillMl,
  milliToPercent,
  type PitcherBody,
  type PitcherView,
  type SettingsBody,
  type SettingsPage,
  type SettingsView,
} from '@/domain/settings-schemas';
import type { SessionUser } from '@/domain/types';
import { bool, json } from '@server/db/rows';
import { conflict, fieldsNeedFixing, notFound } from '@server/domain-errors';
import type { Deps } from '@server/deps';
import { appendMenuChangedEvent, runCommand } from '@server/events';
import { loadMenu } from '@server/menu/menu';
import type { Db } from '@server/db/knex';

const COLUMNS = {
  name: 'name',
  timeZone: 'time_zone',
  currency: 'currency',
  locale: 'locale',
  taxMode: 'tax_mode',
  taxRatePercent: 'tax_rate_milli_pct',
  extraShotCents: 'extra_shot_cents',
  waitTargetSeconds: 'wait_target_seconds',
  pickupTimeoutSeconds: 'pickup_timeout_seconds',
  volumeUnit: 'volume_unit',
  temperatureUnit: 'temperature_unit',
  jugWasteMl: 'jug_waste_ml',
  jugMaxDrinks: 'jug_max_drinks',
  expansionFlatPct: 'expansion_flat_pct',
  expansionSilkyPct: 'expansion_silky_pct',
  expansionFoamyPct: 'expansion_foamy_pct',
  allergenList: 'allergen_list',
  receiptFooter: 'receipt_footer',
  readyMail: 'ready_mail',
  tipsOn: 'tips_on',
  tipPercents: 'tip_percents',
  tipCustom: 'tip_custom',
} as const satisfies Record<keyof SettingsView, string>;

async function loadSettingsView(db: Db, locationId: number): Promise<SettingsView> {
  const l = await db('locations').where({ id: locationId }).first();
  if (!l) throw notFound('Location');
  return {
    name: l.name,
    timeZone: l.time_zone,
    currency: l.currency,
    locale: l.locale,
    taxMode: l.tax_mode,
    taxRatePercent: milliToPercent(l.tax_rate_milli_pct),
    extraShotCents: l.extra_shot_cents,
    waitTargetSeconds: l.wait_target_seconds,
    pickupTimeoutSeconds: l.pickup_timeout_seconds,
    volumeUnit: l.volume_unit,
    temperatureUnit: l.temperature_unit,
    jugWasteMl: l.jug_waste_ml,
    jugMaxDrinks: l.jug_max_drinks,
    expansionFlatPct: l.expansion_flat_pct,
    expansionSilkyPct: l.expansion_silky_pct,
    expansionFoamyPct: l.expansion_foamy_pct,
    allergenList: l.allergen_list,
    receiptFooter: l.receipt_footer ?? null,
    readyMail: bool(l.ready_mail),
    tipsOn: bool(l.tips_on),
    tipPercents: json<number[]>(l.tip_percents, []),
    tipCustom: bool(l.tip_custom),
  };
}

const pitcherView = (p: Record<string, number>): PitcherView => ({ id: p.id, capacityMl: p.capacity_ml, fillLineMl: p.fill_line_ml, minFillMl: p.min_fill_ml });
const pitcherRow = (p: PitcherBody) => ({
  capacity_ml: p.capacityMl,
  fill_line_ml: p.fillLineMl,
  min_fill_ml: p.minFillMl ?? defaultMinFillMl(p.capacityMl, p.fillLineMl),
});

export async function loadSettings(db: Db, locationId: number): Promise<SettingsPage> {
  const settings = await loadSettingsView(db, locationId);
  const pitchers = await db('pitchers').where({ location_id: locationId }).orderBy(['capacity_ml', 'id']);
  const cups = new Map<number, Set<string>>();
  for (const item of (await loadMenu(db, locationId)).items) for (const s of item.sizes) cups.set(s.volumeMl, (cups.get(s.volumeMl) ?? new Set()).add(s.name));
  return {
    settings,
    pitchers: pitchers.map(pitcherView),
    cupSizes: [...cups].sort(([a], [b]) => a - b).map(([volumeMl, names]) => ({ volumeMl, names: [...names] })),
    allergenSwitch: allergenSwitch(await menuEntries(db, locationId), settings.allergenList, OTHER_LIST[settings.allergenList]),
  };
}

// ---------------------------------------------------------------- allergen lists

/** Rows on sale whose parent (a category, a group of extras) is in use too, in menu order. */
const onSale = (db: Db, locationId: number, table: string, parent: string, key: string) =>
  db(table)
    .join(parent, `${parent}.id`, `${table}.${key}`)
    .where(`${parent}.location_id`, locationId)
    .whereNull(`${table}.retired_at`)
    .whereNull(`${parent}.retired_at`)
    .orderBy([`${parent}.sort`, `${parent}.id`, `${table}.sort`, `${table}.id`])
    .select(`${table}.*`);

/** The café's milks, items and extras on sale, in menu order, with what each contains. */
async function menuEntries(db: Db, locationId: number): Promise<MenuEntry[]> {
  const milks = await db('milk_options').where({ location_id: locationId }).whereNull('retired_at').orderBy(['sort', 'id']);
  const items = await onSale(db, locationId, 'menu_items', 'menu_categories', 'category_id');
  const extras = await onSale(db, locationId, 'extras', 'extra_groups', 'group_id');
  const entry =
    (kind: MenuEntry['kind']) =>
    (r: { id: number; name: string; ingredients: string }): MenuEntry => ({
      kind,
      id: r.id,
      name: r.name,
      ingredients: json<string[]>(r.ingredients, []),
    });
  return [...milks.map(entry('milk')), ...items.map(entry('item')), ...extras.map(entry('extra'))];
}

const OTHER_LIST: Record<AllergenList, AllergenList> = { US: 'EU', EU: 'US' };

export function updateSettings(deps: Deps, user: SessionUser, body: SettingsBody): Promise<SettingsPage> {
  return runCommand(deps, async (trx) => {
    const changes: Record<string, unknown> = {};
    for (const [key, column] of Object.entries(COLUMNS)) {
      const value = body[key as keyof typeof COLUMNS];
      if (value !== undefined) changes[column] = Array.isArray(value) ? JSON.stringify(value) : value;
    }
    await trx('locations').where({ id: user.locationId }).update(changes);
    const tips = await loadSettingsView(trx, user.locationId);
    if (tips.tipsOn && tips.tipPercents.length === 0 && !tips.tipCustom) {
      // tips on with nothing to offer would show the cashier an empty choice
      throw fieldsNeedFixing([{ path: 'tipPercents', message: 'Suggest at least one tip, or allow a custom amount' }]);
    }
    const at = deps.clock().toISOString();
    return { result: await loadSettings(trx, user.locationId), events: [await appendMenuChangedEvent(trx, user.locationId, at, user.id)] };
  });
}

// ---------------------------------------------------------------- pitchers

async function pitcherOf(trx: Knex.Transaction, user: SessionUser, id: number) {
  const row = await trx('pitchers').where({ id, location_id: user.locationId }).first();
  if (!row) throw notFound('Pitcher');
  return row;
}

function pitcherCommand(deps: Deps, user: SessionUser, work: (trx: Knex.Transaction) => Promise<void>) {
  return runCommand(deps, async (trx) => {
    await work(trx);
    const at = deps.clock().toISOString();
    return { result: await loadSettings(trx, user.locationId), events: [await appendMenuChangedEvent(trx, user.locationId, at, user.id)] };
  });
}

export const addPitcher = (deps: Deps, user: SessionUser, p: PitcherBody) =>
  pitcherCommand(deps, user, async (trx) => {
    await trx('pitchers').insert({ location_id: user.locationId, ...pitcherRow(p) });
  });

export const updatePitcher = (deps: Deps, user: SessionUser, id: number, p: PitcherBody) =>
  pitcherCommand(deps, user, async (trx) => {
    await pitcherOf(trx, user, id);
    await trx('pitchers').where({ id }).update(pitcherRow(p));
  });

/** The jug plan needs a pitcher to plan with, so the last one stays. */
export const removePitcher = (deps: Deps, user: SessionUser, id: number) =>
  pitcherCommand(deps, user, async (trx) => {
    await pitcherOf(trx, user, id);
    const left = await trx('pitchers').where({ location_id: user.locationId }).count<{ n: number }>({ n: '*' }).first();
    if (Number(left?.n) <= 1) throw conflict('Keep at least one pitcher: the Bar plans every jug with one');
    await trx('pitchers').where({ id }).delete();
  });
