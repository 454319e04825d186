// The "ready" mail: a customer who left an address at the Counter is told when the Bar has bumped
// the order's last drink. It goes through the same mailer as the receipt (the local SMTP fake and
// the Outbox in the demo), after the bump has committed, and at most once per order.
import type { Deps } from '@server/deps';
import { groupOrderLines } from '@/domain/order-quantity';
import { soldLines } from '@/domain/remakes';
import type { OrderView, TicketView } from '@/domain/types';
import { escapeHtml } from '@/domain/html';
import { bool } from '@server/db/rows';
import { lineDetails, type ReceiptEmail } from './receipts';
import { loadOrder } from './order-views';

const firstName = (name: string) => name.trim().split(/\s+/)[0] || name;

/** The ready mail for an order: its number, the name on the cup and the drinks to collect. */
export function readyEmail(order: OrderView, cafeName: string, locale = 'en-US'): ReceiptEmail {
  // counter items were handed over when the order was taken: the mail names what the Bar made
  const drinks = groupOrderLines(soldLines(order.lines).filter((l) => l.station === 'bar'));
  const name = firstName(order.customerName);
  const subject = `Your order #${order.number} is ready at ${cafeName}`;
  const collect = `Ask for #${order.number}, ${order.customerName}, where the drinks are handed out.`;

  const text = [
    cafeName,
    `Order #${order.number} is ready, ${name}!`,
    '',
    ...drinks.flatMap(({ line: l, quantity }) => {
      const details = lineDetails(l);
      return [`${quantity} × ${l.itemName}`, ...(details ? [`  ${details}`] : []), ...(l.note ? [`  Note: ${l.note}`] : [])];
    }),
    '',
    collect,
    '',
    'You get this note because you left your address for the receipt.',
    '',
  ].join('\n');

  const e = escapeHtml;
  const cell = 'padding:6px 0;border-bottom:1px solid #e4ddd2;vertical-align:top';
  const rows = drinks
    .map(({ line: l, quantity }) => {
      const details = lineDetails(l);
      return (
        `<tr><td style="${cell}"><strong>${quantity} × ${e(l.itemName)}</strong>` +
        (details ? `<br><span style="color:#5a5047">${e(details)}</span>` : '') +
        (l.note ? `<br><span style="color:#5a5047">Note: ${e(l.note)}</span>` : '') +
        `</td></tr>`
      );
    })
    .join('');
  const html =
    `<!doctype html><html lang="${e(locale)}"><body style="margin:0;background:#fbfaf7;color:#1d1a17;font-family:Helvetica,Arial,sans-serif">` +
    `<div style="max-width:480px;margin:0 auto;padding:24px">` +
    `<h1 style="margin:0;font-size:24px">${e(cafeName)}</h1>` +
    `<p style="margin:4px 0 16px;font-size:18px">Order <strong>#${order.number}</strong> is ready, ${e(name)}!</p>` +
    `<table style="width:100%;border-collapse:collapse">${rows}</table>` +
    `<p style="margin:16px 0 0">${e(collect)}</p>` +
    `<p style="margin:16px 0 0;color:#5a5047">You get this note because you left your address for the receipt.</p>` +
    `</div></body></html>`;

  return { subject, text, html };
}

/**
 * After a bump has committed: mail each of these tickets that is now ready, carries the
 * customer's address and has had no ready mail, when the café sends them. Each is claimed with a
 * conditional update first, so a recall and re-bump, two screens bumping at once or a second
 * process find it claimed and mail nothing. Runs without holding up the bump's answer, and never
 * throws: a failure is recorded on the order ('failed', with the reason) and logged, and is not
 * tried again — by then the customer is most likely at the counter, and a late "ready" note is
 * worse than none.
 */
export function mailReadyTickets(deps: Deps, locationId: number, tickets: readonly TicketView[]): void {
  const ready = [...new Set(tickets.filter((t) => t.status === 'ready').map((t) => t.id))];
  if (!deps.mailer || ready.length === 0) return;
  void Promise.all(ready.map((id) => mailReady(deps, locationId, id))).catch((err) =>
    console.warn(`A ready mail was not sent: ${String((err as Error)?.message ?? err).slice(0, 200)}`),
  );
}

async function mailReady(deps: Deps, locationId: number, orderId: number): Promise<void> {
  const { db, mailer } = deps;
  if (!mailer) return;
  const cafe = await db('locations').where({ id: locationId }).first('name', 'locale', 'ready_mail');
  if (!cafe || !bool(cafe.ready_mail)) return;
  const claimed = await db('orders')
    .where({ id: orderId, location_id: locationId, status: 'ready' })
    .whereNotNull('customer_email')
    .whereNull('ready_mail_state')
    .update({ ready_mail_state: 'sending', ready_mail_at: deps.clock().toISOString() });
  if (claimed !== 1) return;
  const order = await loadOrder(db, orderId);
  const email = order.customerEmail ?? '';
  // the customer's address stays out of the log, even inside a mail server's message
  const reason = (err: unknown) =>
    String((err as Error)?.message ?? err)
      .split(email)
      .join('<customer>')
      .slice(0, 200);
  const record = (fields: Record<string, string | null>) =>
    db('orders')
      .where({ id: orderId, ready_mail_state: 'sending' })
      .update({ ...fields, ready_mail_at: deps.clock().toISOString() });
  try {
    await mailer.send({ to: email, ...readyEmail(order, cafe.name, cafe.locale), fromName: cafe.name, locationId });
  } catch (err) {
    console.warn(`The ready mail of order ${orderId} was not sent: ${reason(err)}`);
    await record({ ready_mail_state: 'failed', ready_mail_error: reason(err) });
    return;
  }
  await record({ ready_mail_state: 'sent', ready_mail_error: null });
}
