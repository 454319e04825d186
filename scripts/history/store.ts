// Writing planned days with better-sqlite3 prepared statements, one transaction per day. The
// columns are filled as server/services/orders.ts and the bar commands fill them; no events rows
// (the realtime log is for live screens, not for history).
import { orderItemRow } from '../../server/services/order-item-row';
import type { Database } from 'better-sqlite3';
import { waitOfOrder } from '../../server/services/reports/sql';
import type { DayPlan } from './day';

export interface Written {
  orders: number;
  items: number;
  payments: number;
  refunds: number;
}

export interface DayWriter {
  write(day: DayPlan): Written;
}

export function dayWriter(conn: Database, locationId: number, lead: number): DayWriter {
  const shift = conn.prepare(
    `INSERT INTO shifts (location_id, opened_at, opened_by, opening_float_cents, baristas_on_bar, wait_target_seconds,
       closed_at, closed_by, expected_cash_cents, counted_cash_cents, close_note)
     VALUES (@location_id, @opened_at, @opened_by, @opening_float_cents, @baristas_on_bar, @wait_target_seconds,
       @closed_at, @closed_by, @expected_cash_cents, @counted_cash_cents, @close_note)`,
  );
  const order = conn.prepare(
    `INSERT INTO orders (location_id, shift_id, client_order_id, business_date, number, customer_name, status,
       payment_status, service, allergens, subtotal_cents, discount_cents, discount_reason, tax_cents, total_cents,
       refunded_cents, payment_method, tendered_cents, change_cents, quoted_wait_seconds, taken_by, created_at,
       fired_at, ready_at, collected_at)
     VALUES (@location_id, @shift_id, @client_order_id, @business_date, @number, @customer_name, 'collected',
       @payment_status, @service, '[]', @subtotal_cents, @discount_cents, @discount_reason, @tax_cents, @total_cents,
       @refunded_cents, @payment_method, @tendered_cents, @change_cents, @quoted_wait_seconds, @taken_by, @created_at,
       @created_at, @ready_at, @collected_at)`,
  );
  const item = conn.prepare(
    `INSERT INTO order_items (order_id, menu_item_id, line_no, item_name, station, size_id, size_name, volume_ml,
       milk_id, milk_name, milk_code, shots, milk_ml, dose_dg, texture, modifiers, note, price_cents, status,
       started_at, started_by, done_at, done_by, bump_seq)
     VALUES (@order_id, @menu_item_id, @line_no, @item_name, @station, @size_id, @size_name, @volume_ml,
       @milk_id, @milk_name, @milk_code, @shots, @milk_ml, @dose_dg, @texture, @modifiers, @note, @price_cents, 'done',
       @started_at, @done_by, @done_at, @done_by, @bump_seq)`,
  );
  const payment = conn.prepare(
    `INSERT INTO payments (order_id, method, status, amount_cents, tendered_cents, change_cents, provider_id, created_at, updated_at)
     VALUES (@order_id, @method, 'succeeded', @amount_cents, @tendered_cents, @change_cents, @provider_id, @created_at, @created_at)`,
  );
  const refund = conn.prepare(
    `INSERT INTO refunds (order_id, payment_id, amount_cents, reason, provider_id, created_by, created_at)
     VALUES (@order_id, @payment_id, @amount_cents, @reason, @provider_id, @created_by, @created_at)`,
  );
  // the stored wait, worked out by the same SQL the bar's bump uses (server/services/tickets.ts);
  // this writer is better-sqlite3's, so SQLite's
  const waits = conn.prepare(
    `UPDATE orders AS o SET wait_seconds = ${waitOfOrder('sqlite')} WHERE o.location_id = ? AND o.business_date = ? AND o.ready_at IS NOT NULL`,
  );
  // Bumps are numbered in the order they happened, after any the bar has made already (read once:
  // bump_seq has no index, and history is the only writer while it runs).
  let seq = Number((conn.prepare('SELECT MAX(bump_seq) AS n FROM order_items').get() as { n: number | null }).n ?? 0);

  const writeDay = conn.transaction((day: DayPlan): Written => {
    const written: Written = { orders: 0, items: 0, payments: 0, refunds: 0 };
    const bumps = day.orders
      .flatMap((o, oi) => o.drinks.map((d, li) => (d ? { key: `${oi}/${li}`, doneAt: d.doneAt } : null)))
      .filter((b) => b !== null)
      .sort((a, b) => (a.doneAt < b.doneAt ? -1 : a.doneAt > b.doneAt ? 1 : 0));
    const bumpSeq = new Map(bumps.map((b) => [b.key, ++seq]));

    const s = day.shift;
    const shiftId = shift.run({
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
    }).lastInsertRowid;

    day.orders.forEach((o, oi) => {
      const { totals, lines, discount } = o.priced;
      const cash = o.payment.method === 'cash' ? o.payment : null;
      const refunded = o.refund?.amountCents ?? 0;
      const orderId = order.run({
        location_id: locationId,
        shift_id: shiftId,
        client_order_id: o.clientOrderId,
        business_date: day.date,
        number: o.number,
        customer_name: o.customerName,
        payment_status: refunded > 0 && refunded === totals.totalCents ? 'refunded' : 'paid',
        service: o.service,
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
        ready_at: o.readyAt,
        collected_at: o.collectedAt,
      }).lastInsertRowid;

      lines.forEach((l, li) => {
        const drink = o.drinks[li];
        item.run({
          ...orderItemRow(l, Number(orderId), li + 1),
          started_at: drink?.startedAt ?? null,
          done_at: drink?.doneAt ?? null,
          done_by: drink?.doneBy ?? null,
          bump_seq: drink ? bumpSeq.get(`${oi}/${li}`) : null,
        });
      });

      const paymentId = payment.run({
        order_id: orderId,
        method: o.payment.method,
        amount_cents: totals.totalCents,
        tendered_cents: cash?.tenderedCents ?? null,
        change_cents: cash?.changeCents ?? null,
        provider_id: o.payment.method === 'card' ? o.payment.providerId : null,
        created_at: o.createdAt,
      }).lastInsertRowid;

      if (o.refund) {
        refund.run({
          order_id: orderId,
          payment_id: paymentId,
          amount_cents: o.refund.amountCents,
          reason: o.refund.reason,
          provider_id: o.refund.providerId,
          created_by: lead,
          created_at: o.refund.createdAt,
        });
        written.refunds++;
      }
      written.orders++;
      written.items += lines.length;
      written.payments++;
    });
    waits.run(locationId, day.date);
    return written;
  });

  return { write: (day) => writeDay(day) };
}
