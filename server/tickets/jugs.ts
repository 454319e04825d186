// Started jugs. "Start jug" stores the drinks a barista starts together, with the pour the café's
// rules give them now; from then on the jug is fixed: newer drinks go to later jugs, and a
// settings change re-plans only jugs not started yet. "Bump jug" names the jug and the drinks
// the screen showed in it, and bumps exactly those, or answers 409 when the jug's drinks still on
// the bar are not those any more. Each is one transaction plus its events.
import type { Knex } from 'knex';
import { jugBumpProblem, jugToStart } from '@/domain/jug-commands';
import type { SessionUser } from '@/domain/types';
import { conflict, notFound } from '@server/domain-errors';
import { bumpRows, inLaneOrder, openDrinks, startRows, ticketEvents, type DrinkRow } from './bar-rows';
import type { Deps } from '@server/deps';
import { runCommand } from '@server/events';
import { loadJugRules } from '@server/menu/menu';
import { bool } from '@server/db/rows';
import { mailReadyTickets } from '@server/orders/ready-mail';

/**
 * Store these checked rows as one started jug and mark them being made. 409 when they can't be
 * one jug (src/domain/jug-commands.ts) or another screen started one of them first.
 */
export async function openJug(trx: Knex.Transaction, user: SessionUser, rows: DrinkRow[], at: string): Promise<number> {
  const candidates = inLaneOrder(rows).map((r) => ({
    id: r.id,
    milkMl: r.milk_ml,
    texture: r.texture,
    kidsTemp: bool(r.kids_temp),
    milkId: r.milk_id ?? null,
    status: r.status,
  }));
  const start = jugToStart(candidates, await loadJugRules(trx, user.locationId));
  if (start.refused !== undefined) throw conflict(start.refused, start.drinkId === undefined ? undefined : { drinkId: start.drinkId });
  const { jug } = start;
  const [{ id: jugId }] = await trx('jugs')
    .insert({
      location_id: user.locationId,
      milk_id: rows[0].milk_id ?? null,
      capacity_ml: jug.pitcher.capacityMl,
      fill_line_ml: jug.pitcher.fillLineMl,
      min_fill_ml: jug.pitcher.minFillMl,
      cold_ml: jug.coldMl,
      waste_ml: jug.wasteMl,
      steam_for: jug.steamFor,
      fits: jug.fits,
      started_at: at,
      started_by: user.id,
    })
    .returning('id');
  await startRows(
    trx,
    user,
    rows.map((r) => r.id),
    at,
  );
  await trx('jug_drinks').insert(rows.map((r) => ({ order_item_id: r.id, jug_id: jugId })));
  return jugId as number;
}

export function startJug(deps: Deps, user: SessionUser, drinkIds: number[]) {
  return runCommand(deps, async (trx) => {
    const rows = await openDrinks(trx, user, drinkIds);
    const at = deps.clock().toISOString();
    const jugId = await openJug(trx, user, rows, at);
    const { tickets, events } = await ticketEvents(
      trx,
      user,
      rows.map((r) => r.order_id),
      'drink.started',
      at,
    );
    return { result: { jugId, tickets }, events };
  });
}

export async function bumpJug(deps: Deps, user: SessionUser, jugId: number, drinkIds: number[]) {
  const tickets = await runCommand(deps, async (trx) => {
    const jug = await trx('jugs').where({ id: jugId, location_id: user.locationId }).first('id');
    if (!jug) throw notFound('Jug');
    const open: number[] = await trx('jug_drinks')
      .join('order_items', 'order_items.id', 'jug_drinks.order_item_id')
      .where('jug_drinks.jug_id', jugId)
      .whereNot('order_items.status', 'done')
      .whereNull('order_items.refunded_at')
      .orderBy('order_items.id')
      .pluck('order_items.id');
    const problem = jugBumpProblem(open, drinkIds);
    if (problem) throw conflict(problem, { jugId, drinkIds: open });
    const rows = await openDrinks(trx, user, drinkIds);
    const { tickets, events } = await bumpRows(trx, user, rows, deps.clock().toISOString());
    return { result: tickets, events };
  });
  // after the commit, as every bump does (tickets.ts)
  mailReadyTickets(deps, user.locationId, tickets);
  return tickets;
}
