// Bar commands: start, bump and recall. Each is one transaction plus its event.
import type { Knex } from 'knex';
import type { BoardSnapshot, SessionUser, TicketEventType } from '../../src/domain/types';
import { json } from '../db/rows';
import { RECALL_WINDOW_SECONDS } from '../../src/domain/timing';
import { conflict, notFound } from '../errors';
import type { Deps } from './deps';
import { appendEvent, latestSeq, runCommand } from './events';
import { loadLocation, loadPitchers } from './menu';
import { WAIT_OF_ORDER } from './reports/sql';
import { loadBoardTickets, loadTicket } from './ticket-views';
import { recordCoffeeUse, returnCoffeeUse } from './beans-usage';


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
        pitchers: await loadPitchers(trx, locationId),
        jugWasteMl: location.jugWasteMl,
      },
      tickets,
    };
  });
}

/** The bar drinks a command names, each checked: in this café, on an open ticket. */
async function openDrinks(trx: Knex.Transaction, user: SessionUser, drinkIds: number[]) {
  const rows = await trx('order_items')
    .join('orders', 'orders.id', 'order_items.order_id')
    .whereIn('order_items.id', drinkIds)
    .andWhere('orders.location_id', user.locationId)
    .andWhere('order_items.station', 'bar')
    .select('order_items.*', 'orders.status as order_status', 'orders.allergens as order_allergens', 'orders.allergy_note');
  for (const id of drinkIds) if (!rows.some((r) => r.id === id)) throw notFound(`Drink ${id}`);
  for (const r of rows) if (r.order_status !== 'open') throw conflict(`Drink ${r.id} is not on an open ticket`);
  return rows;
}

const hasAllergy = (r: Record<string, any>) =>
  json<string[]>(r.order_allergens, []).length > 0 || !!r.allergy_note;

/** An allergy drink is bumped only once a barista has confirmed reading its allergy. */
function assertAllergyRead(rows: Record<string, any>[]) {
  const unread = rows.find((r) => hasAllergy(r) && !r.allergy_ack_at);
  if (unread) throw conflict('Read the allergy on this ticket and acknowledge it before bumping', { drinkId: unread.id });
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
  if (Number(left?.n) === 0) {
    const changed = await trx('orders').where({ id: orderId, status: 'open' }).update({ status: 'ready', ready_at: at });
    if (changed) await trx.raw(`UPDATE orders AS o SET wait_seconds = ${WAIT_OF_ORDER} WHERE o.id = ?`, [orderId]);
  }
}

/** One event per ticket the command touched, each carrying the ticket's new state. */
async function ticketEvents(trx: Knex.Transaction, user: SessionUser, orderIds: number[], type: TicketEventType, at: string) {
  const events = [];
  const tickets = [];
  for (const id of [...new Set(orderIds)]) {
    const ticket = await loadTicket(trx, id);
    tickets.push(ticket);
    events.push(await appendEvent(trx, user.locationId, type, ticket, at, user.id));
  }
  return { tickets, events };
}

/** Start one drink or a batch (queued → making). */
export function startDrinks(deps: Deps, user: SessionUser, drinkIds: number[]) {
  return runCommand(deps, async (trx) => {
    const rows = await openDrinks(trx, user, drinkIds);
    const busy = rows.find((r) => r.status !== 'queued');
    if (busy) throw conflict(`Drink ${busy.id} is already ${busy.status === 'done' ? 'done' : 'being made'}`);
    const at = deps.clock().toISOString();
    await trx('order_items').whereIn('id', drinkIds).andWhere({ status: 'queued' }).update({ status: 'making', started_at: at, started_by: user.id });
    const { tickets, events } = await ticketEvents(trx, user, rows.map((r) => r.order_id), 'drink.started', at);
    return { result: tickets, events };
  });
}

/** Bump one drink or a batch. Two screens bumping the same drink: one wins, the other gets 409. */
export function bumpDrinks(deps: Deps, user: SessionUser, drinkIds: number[]) {
  return runCommand(deps, async (trx) => {
    const rows = await openDrinks(trx, user, drinkIds);
    const done = rows.find((r) => r.status === 'done');
    if (done) throw conflict(`Drink ${done.id} was already bumped`);
    assertAllergyRead(rows);
    const at = deps.clock().toISOString();
    const bumpSeq = await nextBumpSeq(trx);
    await trx('order_items').whereIn('id', drinkIds).whereNull('started_at').update({ started_at: at });
    const changed = await trx('order_items')
      .whereIn('id', drinkIds)
      .whereNot({ status: 'done' })
      .update({ status: 'done', done_at: at, done_by: user.id, bump_seq: bumpSeq });
    if (changed !== drinkIds.length) throw conflict('A drink was already bumped');
    await recordCoffeeUse(trx, user.locationId, drinkIds, at);
    for (const orderId of new Set(rows.map((r) => r.order_id))) await settleTicket(trx, orderId, at);
    const { tickets, events } = await ticketEvents(trx, user, rows.map((r) => r.order_id), 'drink.bumped', at);
    return { result: tickets, events };
  });
}

export const startDrink = async (deps: Deps, user: SessionUser, drinkId: number) => (await startDrinks(deps, user, [drinkId]))[0];
export const bumpDrink = async (deps: Deps, user: SessionUser, drinkId: number) => (await bumpDrinks(deps, user, [drinkId]))[0];

export function bumpTicket(deps: Deps, user: SessionUser, orderId: number) {
  return runCommand(deps, async (trx) => {
    const order = await orderInLocation(trx, orderId, user);
    if (order.status !== 'open') throw conflict('This ticket has no drinks left to bump');
    const left = await trx('order_items').where({ order_id: orderId, station: 'bar' }).whereNot({ status: 'done' }).select('id');
    if (left.length === 0) throw conflict('This ticket has no drinks left to bump');
    assertAllergyRead(await openDrinks(trx, user, left.map((d) => d.id)));
    const at = deps.clock().toISOString();
    const bumpSeq = await nextBumpSeq(trx);
    await trx('order_items').where({ order_id: orderId, station: 'bar', status: 'queued' }).update({ started_at: at });
    await trx('order_items')
      .where({ order_id: orderId, station: 'bar' })
      .whereNot({ status: 'done' })
      .update({ status: 'done', done_at: at, done_by: user.id, bump_seq: bumpSeq });
    await recordCoffeeUse(trx, user.locationId, left.map((d) => d.id), at);
    await settleTicket(trx, orderId, at);
    const ticket = await loadTicket(trx, orderId);
    return { result: ticket, events: [await appendEvent(trx, user.locationId, 'ticket.bumped', ticket, at, user.id)] };
  });
}

/** Undo the ticket's last bump (one drink, or all the drinks one ticket bump finished). */
export function recallTicket(deps: Deps, user: SessionUser, orderId: number) {
  return runCommand(deps, async (trx) => {
    const order = await orderInLocation(trx, orderId, user);
    if (order.status !== 'open' && order.status !== 'ready') throw conflict(`This ticket is ${order.status}; nothing to recall`);
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
    await returnCoffeeUse(trx, orderId, last.bump_seq);
    // A recalled drink goes back to "making": the barista had started it.
    await trx('order_items')
      .where({ order_id: orderId, bump_seq: last.bump_seq })
      .update({ status: 'making', done_at: null, done_by: null, bump_seq: null });
    await trx('orders').where({ id: orderId }).update({ status: 'open', ready_at: null, wait_seconds: null });
    const ticket = await loadTicket(trx, orderId);
    return { result: ticket, events: [await appendEvent(trx, user.locationId, 'ticket.recalled', ticket, at, user.id)] };
  });
}
