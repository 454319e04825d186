// The owner's bean lots: add, edit, move between grinders, retire; and the location's dial-in
// window and low-stock line. Each command is one transaction; moving coffee in or out of a
// grinder tells every open screen (menu.changed), so the Bar's strip follows.
import type { Knex } from 'knex';
import type { BeanLotBody, BeanSettingsBody, BeansView } from '@/domain/beans-schemas';
import { businessDate } from '@/domain/business-date';
import type { SessionUser } from '@/domain/types';
import { conflict, fieldsNeedFixing, notFound } from '@server/domain-errors';
import type { Deps } from '@server/deps';
import { appendMenuChangedEvent, runCommand } from '@server/events';
import { loadLocation } from '@server/menu/menu';
import { loadBeanSettings, loadLotViews, locationLocale } from './views';

export async function beansView(deps: Deps, locationId: number): Promise<BeansView> {
  const now = deps.clock();
  const location = await loadLocation(deps.db, locationId);
  return {
    today: businessDate(now, location.timeZone),
    now: now.toISOString(),
    timeZone: location.timeZone,
    locale: await locationLocale(deps.db, locationId),
    settings: await loadBeanSettings(deps.db, locationId),
    lots: await loadLotViews(deps.db, { locationId, timeZone: location.timeZone, now, includeRetired: true }),
  };
}

async function lotView(trx: Knex.Transaction, locationId: number, timeZone: string, now: Date, lotId: number) {
  const [view] = await loadLotViews(trx, { locationId, timeZone, now, includeRetired: true, lotId });
  return view;
}

/** Dates on a bag can't be in the café's future. */
async function checkDates(trx: Knex.Transaction, locationId: number, now: Date, body: BeanLotBody) {
  const { timeZone } = await loadLocation(trx, locationId);
  const today = businessDate(now, timeZone);
  const details = (['roastDate', 'receivedDate'] as const).filter((f) => body[f] > today).map((path) => ({ path, message: `After today (${today})` }));
  if (details.length) throw fieldsNeedFixing(details);
  return timeZone;
}

/** Filling a grinder moves the lot that was in it to the shelf. */
async function clearGrinder(trx: Knex.Transaction, locationId: number, hopper: string, keepId: number | null, at: string) {
  if (hopper === 'shelf') return;
  const q = trx('bean_lots').where({ location_id: locationId, hopper }).whereNull('retired_at');
  if (keepId !== null) q.whereNot({ id: keepId });
  await q.update({ hopper: 'shelf', updated_at: at });
}

const lotRow = (b: BeanLotBody) => ({
  name: b.name,
  roaster: b.roaster,
  origin: b.origin || null,
  notes: b.notes || null,
  roast_date: b.roastDate,
  received_date: b.receivedDate,
  received_g: b.receivedG,
  hopper: b.hopper,
  rest_days: b.restDays,
  best_until_days: b.bestUntilDays,
});

export function createLot(deps: Deps, user: SessionUser, body: BeanLotBody) {
  return runCommand(deps, async (trx) => {
    const now = deps.clock();
    const at = now.toISOString();
    const timeZone = await checkDates(trx, user.locationId, now, body);
    await clearGrinder(trx, user.locationId, body.hopper, null, at);
    const [{ id }] = await trx('bean_lots')
      .insert({ location_id: user.locationId, ...lotRow(body), created_at: at, updated_at: at })
      .returning('id');
    const lot = await lotView(trx, user.locationId, timeZone, now, id);
    return { result: lot, events: [await appendMenuChangedEvent(trx, user.locationId, at, user.id)] };
  });
}

async function activeLot(trx: Knex.Transaction, user: SessionUser, lotId: number) {
  const lot = await trx('bean_lots').where({ id: lotId, location_id: user.locationId }).first();
  if (!lot) throw notFound('Bean lot');
  if (lot.retired_at) throw conflict('This lot is retired');
  return lot;
}

export function updateLot(deps: Deps, user: SessionUser, lotId: number, body: BeanLotBody) {
  return runCommand(deps, async (trx) => {
    await activeLot(trx, user, lotId);
    const now = deps.clock();
    const at = now.toISOString();
    const timeZone = await checkDates(trx, user.locationId, now, body);
    await clearGrinder(trx, user.locationId, body.hopper, lotId, at);
    await trx('bean_lots')
      .where({ id: lotId })
      .update({ ...lotRow(body), updated_at: at });
    const lot = await lotView(trx, user.locationId, timeZone, now, lotId);
    return { result: lot, events: [await appendMenuChangedEvent(trx, user.locationId, at, user.id)] };
  });
}

/** An empty bag comes off the list (its history stays for the reports). */
export function retireLot(deps: Deps, user: SessionUser, lotId: number) {
  return runCommand(deps, async (trx) => {
    await activeLot(trx, user, lotId);
    const now = deps.clock();
    const at = now.toISOString();
    await trx('bean_lots').where({ id: lotId }).update({ retired_at: at, hopper: 'shelf', updated_at: at });
    const { timeZone } = await loadLocation(trx, user.locationId);
    const lot = await lotView(trx, user.locationId, timeZone, now, lotId);
    return { result: lot, events: [await appendMenuChangedEvent(trx, user.locationId, at, user.id)] };
  });
}

export function saveBeanSettings(deps: Deps, user: SessionUser, body: BeanSettingsBody) {
  return runCommand(deps, async (trx) => {
    const at = deps.clock().toISOString();
    const row = {
      time_min_s: body.timeMinS,
      time_max_s: body.timeMaxS,
      ratio_min_x10: body.ratioMinX10,
      ratio_max_x10: body.ratioMaxX10,
      low_stock_g: body.lowStockG,
      updated_at: at,
    };
    await trx('bean_settings')
      .insert({ location_id: user.locationId, ...row })
      .onConflict('location_id')
      .merge(row);
    const settings = await loadBeanSettings(trx, user.locationId);
    return { result: settings, events: [await appendMenuChangedEvent(trx, user.locationId, at, user.id)] };
  });
}
