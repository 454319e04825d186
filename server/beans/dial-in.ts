// The dial-in log: test shots against the location's window, the advice for the next one, and
// the coffee each shot takes from its lot.
import type { DialInShotBody, DialInView, LoggedShot } from '@/domain/beans-schemas';
import { adviseShot, doseRange, type DialInShotView, type ShotWindow } from '@/domain/dial-in';
import { businessDate } from '@/domain/business-date';
import type { SessionUser } from '@/domain/types';
import { conflict, notFound } from '@server/domain-errors';
import type { Deps } from '@server/deps';
import { appendBeansChangedEvent, runCommand } from '@server/events';
import { loadLocation } from '@server/menu/menu';
import { loadBeanSettings, loadLotViews, locationLocale, shotsQuery, toShotView } from './views';
import type { Db } from '@server/db/knex';

/** The house double: the dose most of the menu's double-shot recipes use. */
export async function houseDoubleDoseDg(db: Db, locationId: number): Promise<number | null> {
  const row = await db('item_sizes')
    .join('menu_items', 'menu_items.id', 'item_sizes.item_id')
    .join('menu_categories', 'menu_categories.id', 'menu_items.category_id')
    .where({ 'menu_categories.location_id': locationId, 'item_sizes.shots': 2 })
    .andWhere('item_sizes.dose_dg', '>', 0)
    .whereNull('menu_items.retired_at')
    .whereNull('item_sizes.retired_at')
    .groupBy('item_sizes.dose_dg')
    .select('item_sizes.dose_dg as dose')
    .count({ n: '*' })
    .orderBy([
      { column: 'n', order: 'desc' },
      { column: 'dose', order: 'desc' },
    ])
    .first<{ dose: number; n: number } | undefined>();
  return row ? Number(row.dose) : null;
}

export async function shotWindow(db: Db, locationId: number): Promise<{ window: ShotWindow; recipeDoseDg: number | null }> {
  const targets = await loadBeanSettings(db, locationId);
  const recipeDoseDg = await houseDoubleDoseDg(db, locationId);
  const { timeMinS, timeMaxS, ratioMinX10, ratioMaxX10 } = targets;
  return { window: { ...doseRange(recipeDoseDg), timeMinS, timeMaxS, ratioMinX10, ratioMaxX10 }, recipeDoseDg };
}

export async function dialInView(deps: Deps, locationId: number): Promise<DialInView> {
  const now = deps.clock();
  const { timeZone } = await loadLocation(deps.db, locationId);
  const lots = await loadLotViews(deps.db, { locationId, timeZone, now, includeRetired: false });
  return {
    today: businessDate(now, timeZone),
    now: now.toISOString(),
    timeZone,
    locale: await locationLocale(deps.db, locationId),
    ...(await shotWindow(deps.db, locationId)),
    lots,
    espressoLotId: lots.find((l) => l.hopper === 'espresso')?.id ?? null,
  };
}

/** The lot's latest shots, newest first. */
export async function lotShots(db: Db, locationId: number, lotId: number, limit = 20): Promise<DialInShotView[]> {
  const lot = await db('bean_lots').where({ id: lotId, location_id: locationId }).first('id');
  if (!lot) throw notFound('Bean lot');
  const rows = await shotsQuery(db)
    .where({ 'dial_in_shots.lot_id': lotId })
    .orderBy([
      { column: 'dial_in_shots.pulled_at', order: 'desc' },
      { column: 'dial_in_shots.id', order: 'desc' },
    ])
    .limit(limit);
  return rows.map(toShotView);
}

/** Grams and seconds as weighed, kept to one decimal. */
const tenths = (x: number) => Math.round(x * 10);

export function logShot(deps: Deps, user: SessionUser, body: DialInShotBody) {
  return runCommand<LoggedShot>(deps, async (trx) => {
    const lot = await trx('bean_lots').where({ id: body.lotId, location_id: user.locationId }).first();
    if (!lot) throw notFound('Bean lot');
    if (lot.retired_at) throw conflict('This lot is retired; choose the one in the grinder');
    const now = deps.clock();
    const at = now.toISOString();
    const shot = { doseDg: tenths(body.doseG), yieldDg: tenths(body.yieldG), timeDs: tenths(body.timeS) };
    const { window } = await shotWindow(trx, user.locationId);
    const advice = adviseShot(shot, window);
    const [{ id }] = await trx('dial_in_shots')
      .insert({
        location_id: user.locationId,
        lot_id: lot.id,
        grind: body.grind,
        dose_dg: shot.doseDg,
        yield_dg: shot.yieldDg,
        time_ds: shot.timeDs,
        advice: advice.code,
        good: advice.good,
        taste_note: body.tasteNote || null,
        pulled_by: user.id,
        pulled_at: at,
      })
      .returning('id');
    // a test shot is coffee out of the bag like any drink
    await trx('bean_usage').insert({ lot_id: lot.id, source: 'dial_in', shot_id: id, dose_dg: shot.doseDg, used_at: at });
    const { timeZone } = await loadLocation(trx, user.locationId);
    const [view] = await loadLotViews(trx, { locationId: user.locationId, timeZone, now, includeRetired: false, lotId: lot.id });
    const saved = await shotsQuery(trx).where({ 'dial_in_shots.id': id }).first();
    // every open Bar reloads its "on the grinder" line: a good shot is the settings to pull with
    return { result: { shot: toShotView(saved), advice, lot: view }, events: [await appendBeansChangedEvent(trx, user.locationId, at, user.id)] };
  });
}
