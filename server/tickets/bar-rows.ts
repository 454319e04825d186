// The rows behind the bar's commands (tickets.ts and jugs.ts): checking the drinks a command
// names, bumping them, settling their tickets and the event each ticket gets. Each runs inside
// the command's transaction.
import type { Knex } from 'knex';
import { byAge } from '@/domain/lanes';
import type { SessionUser, TicketEventType, TicketStatus } from '@/domain/types';
import { dialectOf } from '@server/db/dialect';
import { json } from '@server/db/rows';
import { conflict, notFound } from '@server/domain-errors';
import { recordCoffeeUse } from '@server/beans/usage';
import { appendEvent, lockCafe } from '@server/events';
import { waitOfOrder } from '@server/reports/sql';
import { loadTicket } from './ticket-views';
import type { JsonColumn, Row } from '@server/db/tables';

/** A drink a command names, with the ticket fields the command checks. */
export type DrinkRow = Row<'order_items'> & {
  order_status: TicketStatus;
  order_allergens: JsonColumn;
  allergy_note: string | null;
  fired_at: string | null;
  order_created_at: string;
  rushed_at: string | null;
  order_number: number;
  customer_name: string;
  done_by_name: string | null;
};

/**
 * The bar drinks a command names, each checked: in this café, on an open ticket. Read under the
 * café's lock (lockCafe), so a command that lost a race to another screen reads the winner's
 * bump and says who made it, instead of failing later on a row that changed under it.
 */
export async function openDrinks(trx: Knex.Transaction, user: SessionUser, drinkIds: number[]): Promise<DrinkRow[]> {
  await lockCafe(trx, user.locationId);
  const rows = await trx('order_items')
    .join('orders', 'orders.id', 'order_items.order_id')
    .whereIn('order_items.id', drinkIds)
    .andWhere('orders.location_id', user.locationId)
    .andWhere('order_items.station', 'bar')
    .select(
      'order_items.*',
      'orders.status as order_status',
      'orders.allergens as order_allergens',
      'orders.allergy_note',
      'orders.fired_at',
      'orders.created_at as order_created_at',
      'orders.rushed_at',
      'orders.number as order_number',
      'orders.customer_name',
      'bumper.name as done_by_name',
    )
    .leftJoin('users as bumper', 'bumper.id', 'order_items.done_by');
  for (const id of drinkIds) if (!rows.some((r) => r.id === id)) throw notFound(`Drink ${id}`);
  const refunded = rows.find((r) => r.refunded_at && r.status !== 'done');
  if (refunded) throw conflict(`The ${refunded.item_name} for ${ticketWords(refunded)} was refunded: it is not on the bar`);
  for (const r of rows) if (r.order_status !== 'open') throw conflict(notOnBar(r));
  return rows;
}

// Refusals in the bar's words: which ticket (number and first name, as on the card), and what
// happened to it — usually another screen bumped it a moment earlier.
const firstOf = (name: string | null | undefined) => (name ?? '').trim().split(/\s+/)[0] || 'someone else';
export const ticketWords = (r: DrinkRow) => `#${r.order_number} ${firstOf(r.customer_name)}`;

function notOnBar(r: DrinkRow): string {
  if (r.order_status === 'ready' || r.order_status === 'collected')
    return `${ticketWords(r)} was already bumped${r.done_by_name ? ` by ${firstOf(r.done_by_name)}` : ''}: it is done`;
  if (r.order_status === 'void') return `${ticketWords(r)} was voided: it is not on the bar`;
  return `${ticketWords(r)} is waiting for its payment: it is not on the bar yet`;
}

export const alreadyBumped = (r: DrinkRow) => `The ${r.item_name} for ${ticketWords(r)} was already bumped by ${firstOf(r.done_by_name)}`;

/** The rows in the bar's lane order: rushed first, then oldest ticket, then line. */
export const inLaneOrder = (rows: DrinkRow[]) =>
  [...rows].sort((a, b) =>
    byAge(
      { rushedAt: a.rushed_at ?? null, firedAt: a.fired_at ?? a.order_created_at, ticketId: a.order_id, id: a.id },
      { rushedAt: b.rushed_at ?? null, firedAt: b.fired_at ?? b.order_created_at, ticketId: b.order_id, id: b.id },
    ),
  );

const hasAllergy = (r: DrinkRow) => json<string[]>(r.order_allergens, []).length > 0 || !!r.allergy_note;

/** An allergy drink is bumped only once a barista has confirmed reading its allergy. */
export function assertAllergyRead(rows: DrinkRow[]) {
  const unread = rows.find((r) => hasAllergy(r) && !r.allergy_ack_at);
  if (unread) throw conflict('Read the allergy on this ticket and acknowledge it before bumping', { drinkId: unread.id });
}

/** The next bump number; the café stays locked until the bump commits (lockCafe). */
export async function nextBumpSeq(trx: Knex.Transaction, locationId: number): Promise<number> {
  await lockCafe(trx, locationId);
  const row = await trx('order_items').max<{ n: number | null }>({ n: 'bump_seq' }).first();
  return (row?.n ?? 0) + 1;
}

/** Once every bar drink is done the ticket is ready for pickup. */
export async function settleTicket(trx: Knex.Transaction, orderId: number, at: string) {
  const left = await trx('order_items')
    .where({ order_id: orderId, station: 'bar' })
    .whereNot({ status: 'done' })
    .whereNull('refunded_at') // refunded before it was made: not made at all
    .count<{ n: number }>({ n: '*' })
    .first();
  if (Number(left?.n) === 0) {
    const changed = await trx('orders').where({ id: orderId, status: 'open' }).update({ status: 'ready', ready_at: at });
    if (changed) await trx.raw(`UPDATE orders AS o SET wait_seconds = ${waitOfOrder(dialectOf(trx))} WHERE o.id = ?`, [orderId]);
  }
}

/** One event per ticket the command touched, each carrying the ticket's new state. */
export async function ticketEvents(trx: Knex.Transaction, user: SessionUser, orderIds: number[], type: TicketEventType, at: string) {
  const events = [];
  const tickets = [];
  for (const id of [...new Set(orderIds)]) {
    const ticket = await loadTicket(trx, id);
    tickets.push(ticket);
    events.push(await appendEvent(trx, user.locationId, type, ticket, at, user.id));
  }
  return { tickets, events };
}

/**
 * Bump these checked rows as one bump (one bump number, so a recall undoes them together). The
 * update is conditional: a drink another screen bumped first makes the whole command 409.
 */
export async function bumpRows(trx: Knex.Transaction, user: SessionUser, rows: DrinkRow[], at: string) {
  const done = rows.find((r) => r.status === 'done');
  if (done) throw conflict(alreadyBumped(done));
  assertAllergyRead(rows);
  const drinkIds = rows.map((r) => r.id);
  const bumpSeq = await nextBumpSeq(trx, user.locationId);
  await trx('order_items').whereIn('id', drinkIds).whereNull('started_at').update({ started_at: at });
  const changed = await trx('order_items')
    .whereIn('id', drinkIds)
    .whereNot({ status: 'done' })
    .update({ status: 'done', done_at: at, done_by: user.id, bump_seq: bumpSeq });
  if (changed !== drinkIds.length) throw conflict('A drink was already bumped');
  await recordCoffeeUse(trx, user.locationId, drinkIds, at);
  for (const orderId of new Set(rows.map((r) => r.order_id))) await settleTicket(trx, orderId, at);
  return ticketEvents(
    trx,
    user,
    rows.map((r) => r.order_id),
    'drink.bumped',
    at,
  );
}

/** Queued → being made, conditionally: a drink another screen started first makes the command 409. */
export async function startRows(trx: Knex.Transaction, user: SessionUser, drinkIds: number[], at: string) {
  if (drinkIds.length === 0) return;
  const changed = await trx('order_items')
    .whereIn('id', drinkIds)
    .andWhere({ status: 'queued' })
    .update({ status: 'making', started_at: at, started_by: user.id });
  if (changed !== drinkIds.length) throw conflict('A drink was already started');
}
