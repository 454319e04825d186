// The location's settings and pitchers. Each change is one transaction plus a menu.changed
// event, so every open Counter, Bar and Pickup reloads what it shows from them.
import type { Knex } from 'knex';
import type { AllergenList } from '../../src/domain/allergens';
import {
  ALLERGEN_EQUIVALENTS,
  defaultMinFillMl,
  listOf,
  milliToPercent,
  retagged,
  type AllergenSwitchConflict,
  type PitcherBody,
  type PitcherView,
  type SettingsBody,
  type SettingsPage,
  type SettingsView,
  type UnlistedTags,
} from '../../src/domain/settings-schemas';
import type { SessionUser } from '../../src/domain/types';
import { json } from '../db/rows';
import { conflict, HttpError, notFound } from '../errors';
import type { Deps } from './deps';
import { appendMenuChangedEvent, runCommand } from './events';
import { loadMenu } from './menu';

type Db = Knex | Knex.Transaction;

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
  for (const item of (await loadMenu(db, locationId)).items)
    for (const s of item.sizes) cups.set(s.volumeMl, (cups.get(s.volumeMl) ?? new Set()).add(s.name));
  return {
    settings,
    pitchers: pitchers.map(pitcherView),
    cupSizes: [...cups].sort(([a], [b]) => a - b).map(([volumeMl, names]) => ({ volumeMl, names: [...names] })),
  };
}

// ---------------------------------------------------------------- allergen lists

const TAGGED = [
  { kind: 'milk', table: 'milk_options' },
  { kind: 'modifier', table: 'modifiers' },
  { kind: 'item', table: 'menu_items' },
] as const;

/** Every milk, extra and item of the café (retired ones too, so none comes back stale). */
async function taggedRows(trx: Knex.Transaction, locationId: number) {
  const out: { kind: UnlistedTags['kind']; table: string; id: number; name: string; tags: string[] }[] = [];
  for (const { kind, table } of TAGGED) {
    const q = trx(table).select(`${table}.id`, `${table}.name`, `${table}.allergens`);
    if (table === 'menu_items') q.join('menu_categories', 'menu_categories.id', 'menu_items.category_id').where('menu_categories.location_id', locationId);
    else q.where(`${table}.location_id`, locationId);
    for (const r of await q.orderBy(`${table}.id`)) out.push({ kind, table, id: r.id, name: r.name, tags: json<string[]>(r.allergens, []) });
  }
  return out;
}

/**
 * Switching lists rewrites the menu's tags by the owner's choices, in the same transaction. A
 * tag the new list lacks and the owner has not decided on refuses the whole change (409).
 */
async function switchAllergenList(trx: Knex.Transaction, locationId: number, to: AllergenList, choice: Record<string, string | null>) {
  const list = listOf(to);
  for (const [tag, target] of Object.entries(choice)) {
    if (target !== null && !list.includes(target))
      throw new HttpError(400, 'validation_failed', 'Some fields need fixing', [
        { path: `allergenRetag.${tag}`, message: `"${target}" is not on the ${to} list` },
      ]);
  }
  const rows = await taggedRows(trx, locationId);
  const unlisted = rows.filter((r) => r.tags.some((t) => !list.includes(t)));
  const undecided = [...new Set(unlisted.flatMap((r) => r.tags.filter((t) => !list.includes(t) && !(t in choice))))];
  if (undecided.length > 0) {
    const details: AllergenSwitchConflict = {
      to,
      unlisted: unlisted.map(({ kind, id, name, tags }) => ({ kind, id, name, tags: tags.filter((t) => !list.includes(t)) })),
      suggestions: Object.fromEntries(
        [...new Set(unlisted.flatMap((r) => r.tags.filter((t) => !list.includes(t))))].map((t) => [t, ALLERGEN_EQUIVALENTS[to][t] ?? null]),
      ),
    };
    throw conflict(`Tags on the menu are not on the ${to} list: choose what each becomes, then switch`, details);
  }
  for (const r of unlisted) await trx(r.table).where({ id: r.id }).update({ allergens: JSON.stringify(retagged(r.tags, to, choice)) });
}

export function updateSettings(deps: Deps, user: SessionUser, body: SettingsBody): Promise<SettingsPage> {
  return runCommand(deps, async (trx) => {
    const before = await loadSettingsView(trx, user.locationId);
    if (body.allergenList && body.allergenList !== before.allergenList)
      await switchAllergenList(trx, user.locationId, body.allergenList, body.allergenRetag ?? {});
    const changes: Record<string, unknown> = {};
    for (const [key, column] of Object.entries(COLUMNS)) {
      const value = body[key as keyof typeof COLUMNS];
      if (value !== undefined) changes[column] = value;
    }
    await trx('locations').where({ id: user.locationId }).update(changes);
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
