// An order as the Counter and receipts read it: one order, or today's list with a search.
import { businessDate } from '@/domain/business-date';
import type { RemakeMark } from '@/domain/remakes';
import type { OrderView, SessionUser } from '@/domain/types';
import { containing, containsSql, dialectOf } from '@server/db/dialect';
import type { Db } from '@server/db/knex';
import { json } from '@server/db/rows';
import type { Deps } from '@server/deps';
import type { Row } from '@server/db/tables';
import type { PaidPart } from '@/domain/split-payment';
import { paidPartRows } from './settle';

export function toOrderView(
  o: Row<'orders'>,
  items: Row<'order_items'>[],
  payment?: Pick<Row<'payments'>, 'provider_id'>,
  takenBy?: string,
  parts: PaidPart[] = [],
): OrderView {
  const remadeAs = new Map(items.filter((i) => i.remake_of != null).map((i) => [i.remake_of!, i.id]));
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
      extras: json<{ name: string }[]>(i.extras, []).map((m) => m.name),
      note: i.note,
      priceCents: i.price_cents,
      status: i.status,
      refundedAt: i.refunded_at ?? null,
      remake: remakeMark(i),
      remadeAs: remadeAs.get(i.id) ?? null,
    })),
    subtotalCents: o.subtotal_cents,
    discountCents: o.discount_cents,
    discountReason: o.discount_reason ?? null,
    taxCents: o.tax_cents,
    totalCents: o.total_cents,
    tipCents: o.tip_cents,
    refundedCents: o.refunded_cents,
    payment: {
      method: o.payment_method,
      tenderedCents: o.tendered_cents,
      changeCents: o.change_cents,
      providerId: payment?.provider_id ?? null,
      parts,
    },
    changeCents: o.change_cents,
    quotedWaitSeconds: o.quoted_wait_seconds,
    takenBy: takenBy ?? null,
    createdAt: o.created_at,
    firedAt: o.fired_at,
    voidReason: o.void_reason ?? null,
  };
}

/** The remake an order line carries, or null (src/domain/remakes.ts). */
export function remakeMark(i: Pick<Row<'order_items'>, 'remake_of' | 'remake_reason' | 'remake_note'>): RemakeMark | null {
  return i.remake_of != null && i.remake_reason ? { of: i.remake_of, reason: i.remake_reason, note: i.remake_note ?? null } : null;
}

export async function loadOrder(db: Db, orderId: number): Promise<OrderView> {
  const o = await db('orders').where({ id: orderId }).first();
  const items = await db('order_items').where({ order_id: orderId }).orderBy('line_no');
  const parts = await paidPartRows(db, orderId);
  const card = parts.find((p) => p.method === 'card');
  const user = o.taken_by ? await db('users').where({ id: o.taken_by }).first('name') : null;
  return toOrderView(
    o,
    items,
    { provider_id: card?.providerId ?? null },
    user?.name,
    parts.map(({ providerId: _, ...part }) => part),
  );
}

export async function findOrderInLocation(db: Db, user: SessionUser, orderId: number) {
  const o = await db('orders').where({ id: orderId, location_id: user.locationId }).first();
  return o ?? null;
}

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
