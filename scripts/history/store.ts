// Writing planned days through Knex, one transaction per day, on SQLite or PostgreSQL alike: each
// table's rows for the day go in as a few multi-row inserts. The columns are filled as
// server/orders/orders.ts and the bar commands fill them; no events rows (the realtime log is
// for live screens, not for history).
import type { Knex } from 'knex';
import { dialectOf } from '@server/db/dialect';
import { orderItemRow } from '@server/orders/order-item-row';
import { waitOfOrder } from '@server/reports/sql';
import type { DayPlan } from './day';

export interface Written {
  orders: number;
  items: number;
  payments: number;
  refunds: number;
}

export interface DayWriter {
  write(day: DayPlan): Promise<Written>;
}

// rows per INSERT: at about 25 columns, well under SQLite's 32,766 and PostgreSQL's 65,535 bound values
const CHUNK = 400;

async function insertAll<T extends Record<string, unknown>>(trx: Knex.Transaction, table: string, rows: T[], returning?: string[]) {
  const back: Record<string, unknown>[] = [];
  for (let i = 0; i < rows.length; i += CHUNK) {
    const chunk = rows.slice(i, i + CHUNK);
    if (returning) back.push(...(await trx(table).insert(chunk).returning(returning)));
    else await trx(table).insert(chunk);
  }
  return back;
}

export async function dayWriter(db: Knex, locationId: number, lead: number): Promise<DayWriter> {
  // the stored wait, worked out by the same SQL the bar's bump uses (server/tickets/tickets.ts)
  const waits = `UPDATE orders AS o SET wait_seconds = ${waitOfOrder(dialectOf(db))} WHERE o.location_id = ? AND o.business_date = ? AND o.ready_at IS NOT NULL`;
  // Bumps are numbered in the order they happened, after any the bar has made already (read once:
  // bump_seq has no index, and history is the only writer while it runs).
  let seq = Number((await db('order_items').max({ n: 'bump_seq' }).first())?.n ?? 0);

  const write = (day: DayPlan) =>
    db.transaction(async (trx): Promise<Written> => {
      const bumps = day.orders
        .flatMap((o, oi) => o.drinks.map((d, li) => (d ? { key: `${oi}/${li}`, doneAt: d.doneAt } : null)))
        .filter((b) => b !== null)
        .sort((a, b) => (a.doneAt < b.doneAt ? -1 : a.doneAt > b.doneAt ? 1 : 0));
      const bumpSeq = new Map(bumps.map((b) => [b.key, ++seq]));

      const s = day.shift;
      const [{ id: shiftId }] = await trx('shifts')
        .insert({
          location_id: locationId,
          opened_at: s.openedAt,
          opened_by: lead,
          opening_float_cents: s.openingFloatCents,
          baristas_on_bar: s.baristasOnBar,
          wait_target_seconds: s.waitTargetSeconds,
          closed_at: s.closedAt,
          closed_by: lead,
          expected_cash_cents: s.expectedCashCents,
          counted_cash_cents: s.countedCashCents,
          close_note: s.closeNote,
        })
        .returning('id');

      const orderRows = day.orders.map((o) => {
        const { totals, discount } = o.priced;
        const cash = o.payment.method === 'cash' ? o.payment : null;
        const refunded = o.refund?.amountCents ?? 0;
        return {
          location_id: locationId,
          shift_id: shiftId,
          client_order_id: o.clientOrderId,
          business_date: day.date,
          number: o.number,
          customer_name: o.customerName,
          status: 'collected',
          payment_status: refunded > 0 && refunded === totals.totalCents ? 'refunded' : 'paid',
          service: o.service,
          allergens: '[]',
          subtotal_cents: totals.subtotalCents,
          discount_cents: totals.discountCents,
          discount_reason: discount?.reason ?? null,
          tax_cents: totals.taxCents,
          total_cents: totals.totalCents,
          refunded_cents: refunded,
          payment_method: o.payment.method,
          tendered_cents: cash?.tenderedCents ?? null,
          change_cents: cash?.changeCents ?? null,
          quoted_wait_seconds: o.quotedWaitSeconds,
          taken_by: o.takenBy,
          created_at: o.createdAt,
          fired_at: o.createdAt,
          ready_at: o.readyAt,
          collected_at: o.collectedAt,
        };
      });
      // ids matched back by client_order_id: a multi-row RETURNING promises no order
      const orderIds = new Map((await insertAll(trx, 'orders', orderRows, ['id', 'client_order_id'])).map((r) => [r.client_order_id as string, Number(r.id)]));
      const idOf = (o: DayPlan['orders'][number]) => orderIds.get(o.clientOrderId)!;

      const itemRows = day.orders.flatMap((o, oi) =>
        o.priced.lines.map((l, li) => {
          const drink = o.drinks[li];
          return {
            ...orderItemRow(l, idOf(o), li + 1),
            status: 'done',
            started_at: drink?.startedAt ?? null,
            started_by: drink?.doneBy ?? null,
            done_at: drink?.doneAt ?? null,
            done_by: drink?.doneBy ?? null,
            bump_seq: drink ? bumpSeq.get(`${oi}/${li}`) : null,
          };
        }),
      );
      await insertAll(trx, 'order_items', itemRows);

      const paymentRows = day.orders.map((o) => {
        const cash = o.payment.method === 'cash' ? o.payment : null;
        return {
          order_id: idOf(o),
          method: o.payment.method,
          status: 'succeeded',
          amount_cents: o.priced.totals.totalCents,
          tendered_cents: cash?.tenderedCents ?? null,
          change_cents: cash?.changeCents ?? null,
          provider_id: o.payment.method === 'card' ? o.payment.providerId : null,
          created_at: o.createdAt,
          updated_at: o.createdAt,
        };
      });
      const paymentIds = new Map((await insertAll(trx, 'payments', paymentRows, ['id', 'order_id'])).map((r) => [Number(r.order_id), Number(r.id)]));

      const refundRows = day.orders.flatMap((o) =>
        o.refund
          ? [
              {
                order_id: idOf(o),
                payment_id: paymentIds.get(idOf(o))!,
                amount_cents: o.refund.amountCents,
                reason: o.refund.reason,
                provider_id: o.refund.providerId,
                created_by: lead,
                created_at: o.refund.createdAt,
              },
            ]
          : [],
      );
      await insertAll(trx, 'refunds', refundRows);
      await trx.raw(waits, [locationId, day.date]);
      return { orders: orderRows.length, items: itemRows.length, payments: paymentRows.length, refunds: refundRows.length };
    });

  return { write };
}
