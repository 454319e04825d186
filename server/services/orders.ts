// Taking an order: price it on the server, store it with its drinks and its event in one
// transaction, and make a replay of the same client order id return the same order.
import type { Knex } from 'knex';
import { orderTotals } from '../../src/domain/money';
import { resolveLine, type ResolvedLine } from '../../src/domain/order-lines';
import type { CreateOrderBody } from '../../src/domain/schemas';
import type { OrderView, SessionUser } from '../../src/domain/types';
import { isUniqueViolation, json } from '../db/rows';
import { HttpError, conflict } from '../errors';
import type { Deps } from './deps';
import { appendEvent, runCommand } from './events';
import { loadMenu } from './menu';
import { loadTicket } from './ticket-views';

/** The café's own calendar date; order numbers start again at 1 each day. */
export function businessDate(at: Date, timeZone: string): string {
  return new Intl.DateTimeFormat('en-CA', { timeZone, year: 'numeric', month: '2-digit', day: '2-digit' }).format(at);
}

export async function loadOrder(db: Knex | Knex.Transaction, orderId: number): Promise<OrderView> {
  const o = await db('orders').where({ id: orderId }).first();
  const items = await db('order_items').where({ order_id: orderId }).orderBy('line_no');
  return {
    id: o.id,
    clientOrderId: o.client_order_id,
    number: o.number,
    customerName: o.customer_name,
    status: o.status,
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
    taxCents: o.tax_cents,
    totalCents: o.total_cents,
    payment: { method: o.payment_method, tenderedCents: o.tendered_cents, changeCents: o.change_cents },
    changeCents: o.change_cents,
    firedAt: o.fired_at,
  };
}

async function findByClientId(db: Knex | Knex.Transaction, user: SessionUser, clientOrderId: string) {
  const existing = await db('orders').where({ client_order_id: clientOrderId }).first('id', 'location_id');
  if (!existing) return null;
  if (existing.location_id !== user.locationId) throw conflict('This order id is already in use');
  return loadOrder(db, existing.id);
}

export async function createOrder(
  deps: Deps,
  user: SessionUser,
  body: CreateOrderBody,
): Promise<{ order: OrderView; created: boolean }> {
  const replay = await findByClientId(deps.db, user, body.clientOrderId);
  if (replay) return { order: replay, created: false };

  const menu = await loadMenu(deps.db, user.locationId);
  const lines: ResolvedLine[] = body.items.map((input, i) => {
    const r = resolveLine(menu, input);
    if (r.ok) return r.line;
    const details = [{ path: `items.${i}.${r.problem.field}`, message: r.problem.message }];
    if (r.problem.kind === 'unavailable') throw new HttpError(409, 'unavailable', r.problem.message, details);
    throw new HttpError(400, 'validation_failed', 'Some fields need fixing', details);
  });
  const totals = orderTotals(lines.map((l) => l.priceCents), menu.location);
  const tendered = body.payment.tenderedCents;
  if (tendered < totals.totalCents) {
    throw new HttpError(400, 'validation_failed', 'The cash tendered is less than the total', [
      { path: 'payment.tenderedCents', message: `At least ${totals.totalCents} cents are due` },
    ]);
  }

  try {
    return await runCommand(deps, async (trx) => {
      const now = deps.clock();
      const at = now.toISOString();
      const day = businessDate(now, menu.location.timeZone);
      const last = await trx('orders')
        .where({ location_id: user.locationId, business_date: day })
        .max<{ n: number | null }>({ n: 'number' })
        .first();
      const hasBarDrinks = lines.some((l) => l.station === 'bar');
      const [{ id: orderId }] = await trx('orders')
        .insert({
          location_id: user.locationId,
          client_order_id: body.clientOrderId,
          business_date: day,
          number: (last?.n ?? 0) + 1,
          customer_name: body.customerName,
          // An order of counter items only is handed over at the till.
          status: hasBarDrinks ? 'open' : 'collected',
          subtotal_cents: totals.subtotalCents,
          discount_cents: totals.discountCents,
          tax_cents: totals.taxCents,
          total_cents: totals.totalCents,
          payment_method: 'cash',
          tendered_cents: tendered,
          change_cents: tendered - totals.totalCents,
          taken_by: user.id,
          fired_at: at,
          ready_at: hasBarDrinks ? null : at,
          collected_at: hasBarDrinks ? null : at,
        })
        .returning('id');
      await trx('order_items').insert(
        lines.map((l, i) => ({
          order_id: orderId,
          menu_item_id: l.menuItemId,
          line_no: i + 1,
          item_name: l.itemName,
          station: l.station,
          size_id: l.size?.id ?? null,
          size_name: l.size?.name ?? null,
          volume_ml: l.size?.volumeMl ?? null,
          milk_id: l.milk?.id ?? null,
          milk_name: l.milk?.name ?? null,
          milk_code: l.milk?.code ?? null,
          shots: l.shots,
          milk_ml: l.milkMl,
          texture: l.texture,
          modifiers: JSON.stringify(l.modifiers),
          note: l.note,
          price_cents: l.priceCents,
          status: l.station === 'bar' ? 'queued' : 'done',
        })),
      );
      const ticket = await loadTicket(trx, orderId);
      const event = await appendEvent(trx, user.locationId, 'order.fired', ticket, at, user.id);
      return { result: { order: await loadOrder(trx, orderId), created: true }, events: [event] };
    });
  } catch (err) {
    // Two sends of one order raced: the loser answers with the winner's order.
    if (isUniqueViolation(err)) {
      const winner = await findByClientId(deps.db, user, body.clientOrderId);
      if (winner) return { order: winner, created: false };
    }
    throw err;
  }
}
