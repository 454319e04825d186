// Taking an order: price it on the server, store it with its drinks, payment and event in one
// transaction, and make a replay of the same client order id return the same order. Cash is
// fired to the bar at once; a card order waits, unfired, until its payment has succeeded.
import type { Knex } from 'knex';
import type { CreateOrderBody } from '../../src/domain/schemas';
import type { OrderView, SessionUser } from '../../src/domain/types';
import { containing, containsSql, dialectOf, lockingRead } from '../db/dialect';
import { isUniqueViolation, json } from '../db/rows';
import { HttpError, conflict } from '../errors';
import { payByCard } from './card-payments';
import { settleOpenAttempts } from './card-settle';
import { fireOrder } from './fire-order';
import { orderItemRow } from './order-item-row';
import type { Deps } from './deps';
import { appendEvent, lockCafe, runCommand } from './events';
import { priceOrder, type PricedOrder } from './order-pricing';
import { quoteForNewOrder } from './quotes';
import { loadTicket } from './ticket-views';

type Db = Knex | Knex.Transaction;

/** The café's own calendar date; order numbers start again at 1 each day. */
// Making an Intl.DateTimeFormat costs ~30× a format() with it, and reports call this per row.
const dateFormats = new Map<string, Intl.DateTimeFormat>();

export function businessDate(at: Date, timeZone: string): string {
  let format = dateFormats.get(timeZone);
  if (!format) {
    format = new Intl.DateTimeFormat('en-CA', { timeZone, year: 'numeric', month: '2-digit', day: '2-digit' });
    dateFormats.set(timeZone, format);
  }
  return format.format(at);
}

export function toOrderView(o: Record<string, any>, items: Record<string, any>[], payment?: Record<string, any>, takenBy?: string): OrderView {
  return {
    id: o.id,
    clientOrderId: o.client_order_id,
    number: o.number,
    customerName: o.customer_name,
    status: o.status,
    paymentStatus: o.payment_status,
    service: o.service,
    allergens: json<string[]>(o.allergens, []),
    allergyNote: o.allergy_note ?? null,
    customerEmail: o.customer_email ?? null,
    lines: items.map((i) => ({
      id: i.id,
      menuItemId: i.menu_item_id,
      itemName: i.item_name,
      station: i.station,
      sizeName: i.size_name,
      milkName: i.milk_name,
      shots: i.shots,
      modifiers: json<{ name: string }[]>(i.modifiers, []).map((m) => m.name),
      note: i.note,
      priceCents: i.price_cents,
    })),
    subtotalCents: o.subtotal_cents,
    discountCents: o.discount_cents,
    discountReason: o.discount_reason ?? null,
    taxCents: o.tax_cents,
    totalCents: o.total_cents,
    refundedCents: o.refunded_cents,
    payment: {
      method: o.payment_method,
      tenderedCents: o.tendered_cents,
      changeCents: o.change_cents,
      providerId: payment?.provider_id ?? null,
    },
    changeCents: o.change_cents,
    quotedWaitSeconds: o.quoted_wait_seconds,
    takenBy: takenBy ?? null,
    createdAt: o.created_at,
    firedAt: o.fired_at,
    voidReason: o.void_reason ?? null,
  };
}

export async function loadOrder(db: Db, orderId: number): Promise<OrderView> {
  const o = await db('orders').where({ id: orderId }).first();
  const items = await db('order_items').where({ order_id: orderId }).orderBy('line_no');
  const payment = await db('payments').where({ order_id: orderId, status: 'succeeded' }).first('provider_id');
  const user = o.taken_by ? await db('users').where({ id: o.taken_by }).first('name') : null;
  return toOrderView(o, items, payment, user?.name);
}

export async function findOrderInLocation(db: Db, user: SessionUser, orderId: number) {
  const o = await db('orders').where({ id: orderId, location_id: user.locationId }).first();
  return o ?? null;
}

async function findByClientId(db: Db, user: SessionUser, clientOrderId: string) {
  const existing = await db('orders').where({ client_order_id: clientOrderId }).first('id', 'location_id');
  if (!existing) return null;
  if (existing.location_id !== user.locationId) throw conflict('This order id is already in use');
  return loadOrder(db, existing.id);
}

async function insertOrder(deps: Deps, user: SessionUser, body: CreateOrderBody, priced: PricedOrder): Promise<number> {
  const { menu, lines, totals } = priced;
  const cash = body.payment.method === 'cash' ? body.payment : null;
  return runCommand(deps, async (trx) => {
    const now = deps.clock();
    const at = now.toISOString();
    const day = businessDate(now, menu.location.timeZone);
    // The quote and the open shift are read before the café's lock: neither needs it, and the quote
    // reads every drink on the bar, which would keep the café's other counters waiting meanwhile.
    const barDrinks = lines.filter((l) => l.station === 'bar').length;
    const quote = await quoteForNewOrder(trx, user.locationId, now, barDrinks, menu.location.baristasOnBar);
    const shift = await trx('shifts').where({ location_id: user.locationId }).whereNull('closed_at').first('id');
    await lockCafe(trx, user.locationId); // orders taken at once get numbers one after another
    const last = await trx('orders')
      .where({ location_id: user.locationId, business_date: day })
      .max<{ n: number | null }>({ n: 'number' })
      .first();
    // An order of counter items only is collected at the till once paid.
    const firedStatus = barDrinks > 0 ? 'open' : 'collected';
    const [{ id: orderId }] = await trx('orders')
      .insert({
        location_id: user.locationId,
        shift_id: shift?.id ?? null,
        client_order_id: body.clientOrderId,
        business_date: day,
        number: (last?.n ?? 0) + 1,
        customer_name: body.customerName,
        status: cash ? firedStatus : 'pending',
        payment_status: cash ? 'paid' : 'unpaid',
        service: body.service,
        allergens: JSON.stringify(body.allergens),
        allergy_note: body.allergyNote || null,
        customer_email: body.customerEmail ?? null,
        subtotal_cents: totals.subtotalCents,
        discount_cents: totals.discountCents,
        discount_reason: body.discount?.reason ?? null,
        tax_cents: totals.taxCents,
        total_cents: totals.totalCents,
        payment_method: body.payment.method,
        tendered_cents: cash?.tenderedCents ?? null,
        change_cents: cash ? cash.tenderedCents - totals.totalCents : null,
        quoted_wait_seconds: quote,
        taken_by: user.id,
        created_at: at,
        fired_at: cash ? at : null,
        ready_at: cash && barDrinks === 0 ? at : null,
        collected_at: cash && barDrinks === 0 ? at : null,
      })
      .returning('id');
    await trx('order_items').insert(
      lines.map((l, i) => ({
        ...orderItemRow(l, orderId, i + 1),
        status: l.station === 'bar' ? 'queued' : 'done',
      })),
    );
    if (cash) {
      await trx('payments').insert({
        order_id: orderId,
        method: 'cash',
        status: 'succeeded',
        amount_cents: totals.totalCents,
        tendered_cents: cash.tenderedCents,
        change_cents: cash.tenderedCents - totals.totalCents,
        created_at: at,
        updated_at: at,
      });
    }
    const ticket = await loadTicket(trx, orderId);
    const event = await appendEvent(trx, user.locationId, cash ? 'order.fired' : 'order.taken', ticket, at, user.id);
    return { result: orderId, events: [event] };
  });
}

export async function createOrder(
  deps: Deps,
  user: SessionUser,
  body: CreateOrderBody,
): Promise<{ order: OrderView; created: boolean }> {
  const replay = await findByClientId(deps.db, user, body.clientOrderId);
  if (replay) {
    // A declined card may be tried again with another card; a paid order is never charged again.
    if (replay.status === 'pending' && replay.paymentStatus === 'unpaid') {
      const order =
        body.payment.method === 'card'
          ? await payByCard(deps, user, replay.id, body.payment.paymentMethod)
          : await payPendingByCash(deps, user, replay.id, body.payment.tenderedCents);
      return { order, created: false };
    }
    return { order: replay, created: false };
  }

  const priced = await priceOrder(deps, user, body);
  let orderId: number;
  try {
    orderId = await insertOrder(deps, user, body, priced);
  } catch (err) {
    // Two sends of one order raced: the loser answers with the winner's order.
    if (isUniqueViolation(err)) {
      const winner = await findByClientId(deps.db, user, body.clientOrderId);
      if (winner) return { order: winner, created: false };
    }
    throw err;
  }
  if (body.payment.method === 'card') {
    return { order: await payByCard(deps, user, orderId, body.payment.paymentMethod), created: true };
  }
  return { order: await loadOrder(deps.db, orderId), created: true };
}

/** A card was declined and the customer pays cash instead: settle the waiting order and fire it. */
async function payPendingByCash(deps: Deps, user: SessionUser, orderId: number, tendered: number): Promise<OrderView> {
  // A card whose answer was lost may have been charged: if so, the order is paid and no cash is
  // taken. If the card service can't say, cash goes ahead and a charge found later is given back.
  await settleOpenAttempts(deps, orderId);
  return runCommand(deps, async (trx) => {
    const order = await lockingRead(trx, trx('orders').where({ id: orderId, location_id: user.locationId })).first();
    if (order.status !== 'pending' || order.payment_status !== 'unpaid') return { result: await loadOrder(trx, orderId), events: [] };
    if (tendered < order.total_cents) {
      throw new HttpError(400, 'validation_failed', 'The cash tendered is less than the total', [
        { path: 'payment.tenderedCents', message: `At least ${order.total_cents} cents are due` },
      ]);
    }
    const live = await trx('payments').where({ order_id: orderId, status: 'processing' }).first('id');
    if (live) throw conflict('A card payment for this order is in progress');
    const at = deps.clock().toISOString();
    const change = tendered - order.total_cents;
    await trx('payments').insert({
      order_id: orderId,
      method: 'cash',
      status: 'succeeded',
      amount_cents: order.total_cents,
      tendered_cents: tendered,
      change_cents: change,
      created_at: at,
      updated_at: at,
    });
    await fireOrder(trx, orderId, at, { payment_method: 'cash', tendered_cents: tendered, change_cents: change });
    const ticket = await loadTicket(trx, orderId);
    const event = await appendEvent(trx, user.locationId, 'order.fired', ticket, at, user.id);
    return { result: await loadOrder(trx, orderId), events: [event] };
  });
}

/** Today's orders at the café, newest first; `q` matches a name or an order number. */
export async function listOrders(deps: Deps, user: SessionUser, q: string | undefined, limit: number): Promise<OrderView[]> {
  const location = await deps.db('locations').where({ id: user.locationId }).first('time_zone');
  const day = businessDate(deps.clock(), location.time_zone);
  const query = deps.db('orders').where({ location_id: user.locationId, business_date: day });
  if (q) {
    const n = Number(q.replace(/^#/, ''));
    query.andWhere((w) => {
      w.whereRaw(containsSql(dialectOf(deps.db), 'customer_name'), [containing(q)]);
      if (Number.isInteger(n) && n > 0) w.orWhere('number', n);
    });
  }
  const rows = await query.orderBy('id', 'desc').limit(limit).select('id');
  return Promise.all(rows.map((r) => loadOrder(deps.db, r.id)));
}
