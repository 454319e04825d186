// Taking an order: price it on the server, store it with its drinks, payment and event in one
// transaction, and make a replay of the same client order id return the same order. Cash is
// fired to the bar at once; a card order waits, unfired, until its payment has succeeded, and an
// order paid in parts until every part is in (split-payment.ts).
import type { CreateOrderBody } from '@/domain/schemas';
import type { OrderView, SessionUser } from '@/domain/types';
import { businessDate } from '@/domain/business-date';
import { amountDueCents } from '@/domain/tips';
import { lockingRead } from '@server/db/dialect';
import { isUniqueViolation } from '@server/db/rows';
import { conflict } from '@server/domain-errors';
import { payByCard } from '@server/payments/card-payments';
import { settleOpenAttempts } from '@server/payments/card-settle';
import { cashColumns, cashPayment, fireOrder, paidPartOf, paidParts, requireEnoughCash, settledColumns } from './settle';
import { payInParts, requirePartsCover } from './split-payment';
import { orderItemRow } from './order-item-row';
import type { Deps } from '@server/deps';
import { appendEvent, lockCafe, runCommand } from '@server/events';
import { priceOrder, type PricedOrder } from './order-pricing';
import { quoteForNewOrder } from './quotes';
import { loadOrder, toOrderView } from './order-views';
import { loadTicket, loadTickets } from '@server/tickets/ticket-views';
import type { Db } from '@server/db/knex';

async function findByClientId(db: Db, user: SessionUser, clientOrderId: string) {
  const existing = await db('orders').where({ client_order_id: clientOrderId }).first('id', 'location_id');
  if (!existing) return null;
  if (existing.location_id !== user.locationId) throw conflict('This order id is already in use');
  return loadOrder(db, existing.id);
}

/**
 * Store the order; answers it as GET /api/orders/:id would, from the rows the inserts returned
 * (defaults included), so the rush's hottest path reads nothing back after its commit.
 */
async function insertOrder(deps: Deps, user: SessionUser, body: CreateOrderBody, priced: PricedOrder): Promise<OrderView> {
  const { menu, lines, totals, tipCents } = priced;
  const due = amountDueCents(totals.totalCents, tipCents);
  const cash = body.payment.method === 'cash' ? body.payment : null;
  return runCommand(deps, async (trx) => {
    const now = deps.clock();
    const at = now.toISOString();
    const day = businessDate(now, menu.location.timeZone);
    // The quote and the open shift are read before the café's lock: neither needs it, and the quote
    // counts the drinks on the bar, which would keep the café's other counters waiting meanwhile.
    const barDrinks = lines.filter((l) => l.station === 'bar').length;
    const quote = await quoteForNewOrder(trx, user.locationId, now, barDrinks, menu.location.baristasOnBar);
    const shift = await trx('shifts').where({ location_id: user.locationId }).whereNull('closed_at').first('id');
    await lockCafe(trx, user.locationId); // orders taken at once get numbers one after another
    const last = await trx('orders').where({ location_id: user.locationId, business_date: day }).max<{ n: number | null }>({ n: 'number' }).first();
    const [order] = await trx('orders')
      .insert({
        location_id: user.locationId,
        shift_id: shift?.id ?? null,
        client_order_id: body.clientOrderId,
        business_date: day,
        number: (last?.n ?? 0) + 1,
        customer_name: body.customerName,
        service: body.service,
        allergens: JSON.stringify(body.allergens),
        allergy_note: body.allergyNote || null,
        customer_email: body.customerEmail ?? null,
        subtotal_cents: totals.subtotalCents,
        discount_cents: totals.discountCents,
        discount_reason: body.discount?.reason ?? null,
        tax_cents: totals.taxCents,
        total_cents: totals.totalCents,
        tip_cents: tipCents,
        quoted_wait_seconds: quote,
        taken_by: user.id,
        created_at: at,
        // cash is settled as the order is taken; a card order waits for its charge (card-payments.ts)
        ...(cash
          ? { ...cashColumns(due, cash.tenderedCents), ...settledColumns(barDrinks > 0, at) }
          : { payment_method: body.payment.method, status: 'pending', payment_status: 'unpaid' }),
      })
      .returning('*');
    const items = await trx('order_items')
      .insert(
        lines.map((l, i) => ({
          ...orderItemRow(l, order.id, i + 1),
          status: l.station === 'bar' ? 'queued' : 'done',
        })),
      )
      .returning('*');
    const payments = cash
      ? await trx('payments')
          .insert(cashPayment(order.id, due, cash.tenderedCents, at))
          .returning('*')
      : [];
    // the event's ticket from the row the insert returned, taken by the person of the session
    const [ticket] = await loadTickets(trx, [order], new Map([[user.id, user.name]]));
    const event = await appendEvent(trx, user.locationId, cash ? 'order.fired' : 'order.taken', ticket, at, user.id);
    items.sort((a, b) => a.line_no - b.line_no);
    const view = toOrderView(
      order,
      items,
      undefined,
      user.name,
      payments.map((p) => paidPartOf(p, 0)),
    );
    return { result: view, events: [event] };
  });
}

export async function createOrder(deps: Deps, user: SessionUser, body: CreateOrderBody): Promise<{ order: OrderView; created: boolean }> {
  const replay = await findByClientId(deps.db, user, body.clientOrderId);
  if (replay) {
    // A declined card may be tried again with another card; a paid order is never charged again.
    if (replay.status === 'pending' && replay.paymentStatus === 'unpaid') {
      const { payment } = body;
      if (payment.method === 'split') return { order: await payInParts(deps, user, replay.id, payment.parts), created: false };
      // a part paid and the rest still due: only a split can take the rest. (Parts that cover it
      // are a payment settling right now: the paths below find the order paid and answer it.)
      const paid = replay.payment.parts.reduce((sum, p) => sum + p.amountCents, 0);
      if (paid > 0 && paid < amountDueCents(replay.totalCents, replay.tipCents)) {
        throw conflict('Part of this order is paid already; send the rest as a split with the paid parts as they were', { orderId: replay.id });
      }
      const order =
        payment.method === 'card'
          ? await payByCard(deps, user, replay.id, payment.paymentMethod)
          : await payPendingByCash(deps, user, replay.id, payment.tenderedCents);
      return { order, created: false };
    }
    return { order: replay, created: false };
  }

  const priced = await priceOrder(deps, user, body);
  // a split that doesn't cover the order is refused before anything is stored
  if (body.payment.method === 'split') requirePartsCover(body.payment.parts, amountDueCents(priced.totals.totalCents, priced.tipCents));
  let order: OrderView;
  try {
    order = await insertOrder(deps, user, body, priced);
  } catch (err) {
    // Two sends of one order raced: the loser answers with the winner's order.
    if (isUniqueViolation(err)) {
      const winner = await findByClientId(deps.db, user, body.clientOrderId);
      if (winner) return { order: winner, created: false };
    }
    throw err;
  }
  if (body.payment.method === 'card') {
    return { order: await payByCard(deps, user, order.id, body.payment.paymentMethod), created: true };
  }
  if (body.payment.method === 'split') return { order: await payInParts(deps, user, order.id, body.payment.parts), created: true };
  return { order, created: true };
}

/** A card was declined and the customer pays cash instead: settle the waiting order and fire it. */
async function payPendingByCash(deps: Deps, user: SessionUser, orderId: number, tendered: number): Promise<OrderView> {
  // A card whose answer was lost may have been charged: if so, the order is paid and no cash is
  // taken. If the card service can't say, cash goes ahead and a charge found later is given back.
  await settleOpenAttempts(deps, orderId);
  return runCommand(deps, async (trx) => {
    const order = await lockingRead(trx, trx('orders').where({ id: orderId, location_id: user.locationId })).first();
    if (order.status !== 'pending' || order.payment_status !== 'unpaid') return { result: await loadOrder(trx, orderId), events: [] };
    // a split that raced this send has paid a part: cash for the whole would take it twice
    if ((await paidParts(trx, orderId)).length > 0) throw conflict('Part of this order is paid already; send the rest as a split', { orderId });
    const due = amountDueCents(order.total_cents, order.tip_cents);
    requireEnoughCash(due, tendered);
    const live = await trx('payments').where({ order_id: orderId, status: 'processing' }).first('id');
    if (live) throw conflict('A card payment for this order is in progress');
    const at = deps.clock().toISOString();
    await trx('payments').insert(cashPayment(orderId, due, tendered, at));
    await fireOrder(trx, orderId, at, cashColumns(due, tendered));
    const ticket = await loadTicket(trx, orderId);
    const event = await appendEvent(trx, user.locationId, 'order.fired', ticket, at, user.id);
    return { result: await loadOrder(trx, orderId), events: [event] };
  });
}

/** Today's orders at the café, newest first; `q` matches a name or an order number. */
