// Bar commands: start, bump and recall. Each is one transaction plus its event.
import type { Knex } from 'knex';
import type { BoardSnapshot, SessionUser } from '@/domain/types';
import { needsJug } from '@/domain/jug-plan';
import { RECALL_WINDOW_SECONDS } from '@/domain/timing';
import { conflict, notFound } from '@server/domain-errors';
import { alreadyBumped, assertAllergyRead, bumpRows, nextBumpSeq, openDrinks, settleTicket, startRows, ticketEvents, ticketWords } from './bar-rows';
import { recordCoffeeUse, returnCoffeeUse } from '@server/beans/usage';
import type { Deps } from '@server/deps';
import { snapshotRead } from '@server/db/dialect';
import { appendEvent, latestSeq, runCommand } from '@server/events';
import { openJug } from './jugs';
import { mailReadyTickets } from '@server/orders/ready-mail';
import { loadJugRules, loadLocation } from '@server/menu/menu';
import { loadBoardTickets, loadTicket } from './ticket-views';

export async function boardSnapshot(deps: Deps, locationId: number): Promise<BoardSnapshot> {
  // One read transaction on one snapshot, so the tickets and the sequence number describe the same moment.
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
        volumeUnit: location.volumeUnit ?? 'ml',
        jugRules: await loadJugRules(trx, locationId),
      },
      tickets,
    };
  }, snapshotRead(deps.db));
}

async function orderInLocation(trx: Knex.Transaction, orderId: number, user: SessionUser) {
  const order = await trx('orders').where({ id: orderId, location_id: user.locationId }).first();
  if (!order) throw notFound('Ticket');
  return order;
}

/**
 * Start drinks each on its own (queued → making). A drink that needs steamed milk becomes a
 * started jug of its own, so the Bar never plans it with others; to steam drinks together, start
 * them as one jug (jugs.ts).
 */
export function startDrinks(deps: Deps, user: SessionUser, drinkIds: number[]) {
  return runCommand(deps, async (trx) => {
    const rows = await openDrinks(trx, user, drinkIds);
    const busy = rows.find((r) => r.status !== 'queued');
    if (busy) throw conflict(busy.status === 'done' ? alreadyBumped(busy) : `The ${busy.item_name} for ${ticketWords(busy)} is already being made`);
    const at = deps.clock().toISOString();
    const steamed = rows.filter((r) => needsJug({ id: r.id, milkMl: r.milk_ml, texture: r.texture }));
    for (const row of steamed) await openJug(trx, user, [row], at);
    await startRows(
      trx,
      user,
      rows.filter((r) => !steamed.includes(r)).map((r) => r.id),
      at,
    );
    const { tickets, events } = await ticketEvents(
      trx,
      user,
      rows.map((r) => r.order_id),
      'drink.started',
      at,
    );
    return { result: tickets, events };
  });
}

/**
 * Bump one drink or a batch. Two screens bumping the same drink: one wins, the other gets 409.
 * A ticket this makes ready is mailed to its customer once the bump has committed.
 */
export async function bumpDrinks(deps: Deps, user: SessionUser, drinkIds: number[]) {
  const tickets = await runCommand(deps, async (trx) => {
    const rows = await openDrinks(trx, user, drinkIds);
    const { tickets, events } = await bumpRows(trx, user, rows, deps.clock().toISOString());
    return { result: tickets, events };
  });
  mailReadyTickets(deps, user.locationId, tickets);
  return tickets;
}

export const startDrink = async (deps: Deps, user: SessionUser, drinkId: number) => (await startDrinks(deps, user, [drinkId]))[0];
export const bumpDrink = async (deps: Deps, user: SessionUser, drinkId: number) => (await bumpDrinks(deps, user, [drinkId]))[0];

export async function bumpTicket(deps: Deps, user: SessionUser, orderId: number) {
  const ticket = await runCommand(deps, async (trx) => {
    const order = await orderInLocation(trx, orderId, user);
    if (order.status !== 'open') throw conflict('This ticket has no drinks left to bump');
    const left = await trx('order_items').where({ order_id: orderId, station: 'bar' }).whereNot({ status: 'done' }).whereNull('refunded_at').select('id');
    if (left.length === 0) throw conflict('This ticket has no drinks left to bump');
    assertAllergyRead(
      await openDrinks(
        trx,
        user,
        left.map((d) => d.id),
      ),
    );
    const at = deps.clock().toISOString();
    const bumpSeq = await nextBumpSeq(trx, user.locationId);
    await trx('order_items').where({ order_id: orderId, station: 'bar', status: 'queued' }).whereNull('refunded_at').update({ started_at: at });
    await trx('order_items')
      .where({ order_id: orderId, station: 'bar' })
      .whereNot({ status: 'done' })
      .whereNull('refunded_at')
      .update({ status: 'done', done_at: at, done_by: user.id, bump_seq: bumpSeq });
    await recordCoffeeUse(
      trx,
      user.locationId,
      left.map((d) => d.id),
      at,
    );
    await settleTicket(trx, orderId, at);
    const ticket = await loadTicket(trx, orderId);
    return { result: ticket, events: [await appendEvent(trx, user.locationId, 'ticket.bumped', ticket, at, user.id)] };
  });
  mailReadyTickets(deps, user.locationId, [ticket]);
  return ticket;
}

/**
 * Undo the ticket's last bump (one drink, or all the drinks one ticket bump finished). A recalled
 * drink comes back as being made: it was made, so it takes no new milk. It stays in the jug it
 * was started in (jug_drinks is never rewritten): back among that jug's drinks if they are still
 * on the bar, or as that jug again, alone, if the jug was bumped; "Bump jug" then bumps it. A
 * drink bumped straight from the queue comes back in no jug.
 */
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
    await trx('order_items').where({ order_id: orderId, bump_seq: last.bump_seq }).update({ status: 'making', done_at: null, done_by: null, bump_seq: null });
    await trx('orders').where({ id: orderId }).update({ status: 'open', ready_at: null, wait_seconds: null });
    const ticket = await loadTicket(trx, orderId);
    return { result: ticket, events: [await appendEvent(trx, user.locationId, 'ticket.recalled', ticket, at, user.id)] };
  });
}
