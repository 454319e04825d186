// Bar commands: start, bump and recall. Each is one transaction plus its event.
import type { Knex } from 'knex';
import type { BoardSnapshot, SessionUser } from '../../src/domain/types';
import { RECALL_WINDOW_SECONDS } from '../../src/domain/timing';
import { conflict, notFound } from '../errors';
import type { Deps } from './deps';
import { appendEvent, latestSeq, runCommand } from './events';
import { loadLocation } from './menu';
import { loadBoardTickets, loadTicket } from './ticket-views';


export async function boardSnapshot(deps: Deps, locationId: number): Promise<BoardSnapshot> {
  // One read transaction, so the tickets and the sequence number describe the same moment.
  return deps.db.transaction(async (trx) => {
    const location = await loadLocation(trx, locationId);
    const nowMs = deps.clock().getTime();
    const tickets = await loadBoardTickets(trx, locationId, nowMs, location.pickupTimeoutSeconds);
    return {
      seq: await latestSeq(trx, locationId),
      now: new Date(nowMs).toISOString(),
      location: {
        name: location.name,
        waitTargetSeconds: location.waitTargetSeconds,
        pickupTimeoutSeconds: location.pickupTimeoutSeconds,
      },
      tickets,
    };
  });
}

async function drinkInLocation(trx: Knex.Transaction, drinkId: number, user: SessionUser) {
  const drink = await trx('order_items')
    .join('orders', 'orders.id', 'order_items.order_id')
    .where('order_items.id', drinkId)
    .andWhere('orders.location_id', user.locationId)
    .andWhere('order_items.station', 'bar')
    .first('order_items.*', 'orders.status as order_status');
  if (!drink) throw notFound('Drink');
  return drink;
}

async function orderInLocation(trx: Knex.Transaction, orderId: number, user: SessionUser) {
  const order = await trx('orders').where({ id: orderId, location_id: user.locationId }).first();
  if (!order) throw notFound('Ticket');
  return order;
}

async function nextBumpSeq(trx: Knex.Transaction): Promise<number> {
  const row = await trx('order_items').max<{ n: number | null }>({ n: 'bump_seq' }).first();
  return (row?.n ?? 0) + 1;
}

/** Once every bar drink is done the ticket is ready for pickup. */
async function settleTicket(trx: Knex.Transaction, orderId: number, at: string) {
  const left = await trx('order_items')
    .where({ order_id: orderId, station: 'bar' })
    .whereNot({ status: 'done' })
    .count<{ n: number }>({ n: '*' })
    .first();
  if (Number(left?.n) === 0) await trx('orders').where({ id: orderId, status: 'open' }).update({ status: 'ready', ready_at: at });
}

export function startDrink(deps: Deps, user: SessionUser, drinkId: number) {
  return runCommand(deps, async (trx) => {
    const drink = await drinkInLocation(trx, drinkId, user);
    if (drink.status !== 'queued') throw conflict(`This drink is already ${drink.status === 'done' ? 'done' : 'being made'}`);
    const at = deps.clock().toISOString();
    await trx('order_items').where({ id: drinkId, status: 'queued' }).update({ status: 'making', started_at: at });
    const ticket = await loadTicket(trx, drink.order_id);
    return { result: ticket, events: [await appendEvent(trx, user.locationId, 'drink.started', ticket, at, user.id)] };
  });
}

export function bumpDrink(deps: Deps, user: SessionUser, drinkId: number) {
  return runCommand(deps, async (trx) => {
    const drink = await drinkInLocation(trx, drinkId, user);
    if (drink.status === 'done') throw conflict('This drink was already bumped');
    const at = deps.clock().toISOString();
    const changed = await trx('order_items')
      .where({ id: drinkId })
      .whereNot({ status: 'done' })
      .update({ status: 'done', done_at: at, done_by: user.id, bump_seq: await nextBumpSeq(trx), started_at: drink.started_at ?? at });
    if (changed !== 1) throw conflict('This drink was already bumped');
    await settleTicket(trx, drink.order_id, at);
    const ticket = await loadTicket(trx, drink.order_id);
    return { result: ticket, events: [await appendEvent(trx, user.locationId, 'drink.bumped', ticket, at, user.id)] };
  });
}

export function bumpTicket(deps: Deps, user: SessionUser, orderId: number) {
  return runCommand(deps, async (trx) => {
    const order = await orderInLocation(trx, orderId, user);
    if (order.status !== 'open') throw conflict('This ticket has no drinks left to bump');
    const at = deps.clock().toISOString();
    const bumpSeq = await nextBumpSeq(trx);
    await trx('order_items')
      .where({ order_id: orderId, station: 'bar', status: 'queued' })
      .update({ started_at: at });
    const changed = await trx('order_items')
      .where({ order_id: orderId, station: 'bar' })
      .whereNot({ status: 'done' })
      .update({ status: 'done', done_at: at, done_by: user.id, bump_seq: bumpSeq });
    if (changed === 0) throw conflict('This ticket has no drinks left to bump');
    await settleTicket(trx, orderId, at);
    const ticket = await loadTicket(trx, orderId);
    return { result: ticket, events: [await appendEvent(trx, user.locationId, 'ticket.bumped', ticket, at, user.id)] };
  });
}

/** Undo the ticket's last bump (one drink, or all the drinks one ticket bump finished). */
export function recallTicket(deps: Deps, user: SessionUser, orderId: number) {
  return runCommand(deps, async (trx) => {
    const order = await orderInLocation(trx, orderId, user);
    if (order.status === 'collected') throw conflict('This ticket was already collected');
    const last = await trx('order_items')
      .where({ order_id: orderId, station: 'bar', status: 'done' })
      .whereNotNull('bump_seq')
      .orderBy('bump_seq', 'desc')
      .first('bump_seq', 'done_at');
    if (!last) throw conflict('Nothing on this ticket to recall');
    const now = deps.clock();
    if (now.getTime() - Date.parse(last.done_at) > RECALL_WINDOW_SECONDS * 1000) {
      throw conflict(`A bump can be recalled for ${RECALL_WINDOW_SECONDS / 60} minutes`);
    }
    const at = now.toISOString();
    // A recalled drink goes back to "making": the barista had started it.
    await trx('order_items')
      .where({ order_id: orderId, bump_seq: last.bump_seq })
      .update({ status: 'making', done_at: null, done_by: null, bump_seq: null });
    await trx('orders').where({ id: orderId }).update({ status: 'open', ready_at: null });
    const ticket = await loadTicket(trx, orderId);
    return { result: ticket, events: [await appendEvent(trx, user.locationId, 'ticket.recalled', ticket, at, user.id)] };
  });
}
