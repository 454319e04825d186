// The customer's receipt as an e-mail (plain text and HTML), and sending it for an order.
import type { Knex } from 'knex';
import type { Deps } from '@server/deps';
import { formatCents } from '@/domain/money';
import { groupOrderLines } from '@/domain/order-quantity';
import { soldLines } from '@/domain/remakes';
import { partLines } from '@/domain/split-payment';
import { amountDueCents } from '@/domain/tips';
import type { OrderLineView, OrderView } from '@/domain/types';
import { escapeHtml } from '@/domain/html';
import { notFound } from '@server/domain-errors';
import type { Mailer } from '@server/mail/outbox';
import { loadOrder } from './order-views';

export interface ReceiptLocation {
  name: string;
  currency: string;
  locale?: string;
  /** The café's zone, so the time on the receipt is the time on the café's clock. */
  timeZone?: string;
}

export interface ReceiptEmail {
  subject: string;
  text: string;
  html: string;
}

const firstName = (name: string) => name.trim().split(/\s+/)[0] ?? name;

/** "Large · Oat milk · 3 shots · Vanilla syrup, Extra hot": the choices that make the drink. */
export function lineDetails(line: OrderLineView): string {
  const milk = line.milkName && (/milk$/i.test(line.milkName) ? line.milkName : `${line.milkName} milk`);
  const shots = line.shots > 0 ? `${line.shots} ${line.shots === 1 ? 'shot' : 'shots'}` : null;
  const extras = line.extras.length ? line.extras.join(', ') : null;
  return [line.sizeName, milk, shots, extras].filter(Boolean).join(' · ');
}

export function receiptEmail(order: OrderView, location: ReceiptLocation, footer?: string): ReceiptEmail {
  const locale = location.locale ?? 'en-US';
  const money = (cents: number) => formatCents(cents, location.currency, locale);
  const when = new Intl.DateTimeFormat(locale, { dateStyle: 'long', timeStyle: 'short', timeZone: location.timeZone }).format(
    new Date(order.firedAt ?? order.createdAt),
  );
  const name = firstName(order.customerName);
  const { payment } = order;
  const paidLine =
    payment.method === 'split'
      ? `Paid in ${payment.parts.length} parts: ${partLines(payment.parts, money).join('; ')}`
      : payment.method === 'cash'
        ? `Paid in cash: ${money(payment.tenderedCents ?? order.totalCents)} · change ${money(payment.changeCents ?? 0)}`
        : `Paid by ${payment.method}: ${money(amountDueCents(order.totalCents, order.tipCents))}`;

  const discountLabel = order.discountReason ? `Discount (${order.discountReason})` : 'Discount';
  const totals: [string, string][] = [
    ['Subtotal', money(order.subtotalCents)],
    ...(order.discountCents > 0 ? [[discountLabel, `−${money(order.discountCents)}`] as [string, string]] : []),
    ['Tax', money(order.taxCents)],
    ['Total', money(order.totalCents)],
    // the tip is outside the total (never taxed or discounted), so it comes after it
    ...(order.tipCents > 0
      ? [['Tip', money(order.tipCents)] as [string, string], ['Amount paid', money(amountDueCents(order.totalCents, order.tipCents))] as [string, string]]
      : []),
    ...(order.refundedCents > 0 ? [['Refunded', `−${money(order.refundedCents)}`] as [string, string]] : []),
  ];

  const subject = `Your receipt from ${location.name} — order #${order.number}`;

  const text = [
    location.name,
    `Receipt for order #${order.number}`,
    `Thank you, ${name}!`,
    when,
    '',
    ...groupOrderLines(soldLines(order.lines)).flatMap(({ line: l, quantity, totalCents }) => {
      const details = lineDetails(l);
      return [
        `${quantity > 1 ? `${quantity} × ` : ''}${l.itemName} — ${money(totalCents)}`,
        ...(details ? [`  ${details}`] : []),
        ...(l.note ? [`  Note: ${l.note}`] : []),
      ];
    }),
    '',
    ...totals.map(([label, value]) => `${label}: ${value}`),
    '',
    paidLine,
    ...(footer ? ['', footer] : []),
    '',
  ].join('\n');

  const e = escapeHtml;
  const cell = 'padding:6px 0;border-bottom:1px solid #e4ddd2;vertical-align:top';
  const rows = groupOrderLines(soldLines(order.lines))
    .map(({ line: l, quantity, totalCents }) => {
      const details = lineDetails(l);
      return (
        `<tr><td style="${cell}"><strong>${quantity > 1 ? `${quantity} × ` : ''}${e(l.itemName)}</strong>` +
        (details ? `<br><span style="color:#5a5047">${e(details)}</span>` : '') +
        (l.note ? `<br><span style="color:#5a5047">Note: ${e(l.note)}</span>` : '') +
        `</td><td style="${cell};text-align:right;white-space:nowrap">${e(money(totalCents))}</td></tr>`
      );
    })
    .join('');
  const totalRows = totals
    .map(([label, value]) => {
      const strong = label === 'Total' ? 'font-weight:700;font-size:18px' : '';
      return `<tr><td style="padding:4px 0;${strong}">${e(label)}</td><td style="padding:4px 0;text-align:right;${strong}">${e(value)}</td></tr>`;
    })
    .join('');

  const html =
    `<!doctype html><html lang="${e(locale)}"><body style="margin:0;background:#fbfaf7;color:#1d1a17;font-family:Helvetica,Arial,sans-serif">` +
    `<div style="max-width:480px;margin:0 auto;padding:24px">` +
    `<h1 style="margin:0;font-size:24px">${e(location.name)}</h1>` +
    `<p style="margin:4px 0 0">Receipt for order <strong>#${order.number}</strong> — thank you, ${e(name)}!</p>` +
    `<p style="margin:4px 0 16px;color:#5a5047">${e(when)}</p>` +
    `<table style="width:100%;border-collapse:collapse">${rows}</table>` +
    `<table style="width:100%;border-collapse:collapse;margin-top:12px">${totalRows}</table>` +
    `<p style="margin:16px 0 0">${e(paidLine)}</p>` +
    (footer ? `<p style="margin:16px 0 0;color:#5a5047">${e(footer)}</p>` : '') +
    `</div></body></html>`;

  return { subject, text, html };
}

/**
 * Mail the receipt of one of the location's orders to `email`. An order of another location is
 * reported as not found, so its existence isn't revealed.
 */
export async function sendOrderReceipt(db: Knex, mailer: Mailer, locationId: number, orderId: number, email: string): Promise<{ messageId: string }> {
  const own = await db('orders').where({ id: orderId, location_id: locationId }).first('id');
  if (!own) throw notFound('Order');
  const order = await loadOrder(db, orderId);
  const l = await db('locations').where({ id: locationId }).first();
  const location: ReceiptLocation = { name: l.name, currency: l.currency, locale: l.locale, timeZone: l.time_zone };
  const mail = receiptEmail(order, location, l.receipt_footer ?? undefined);
  return mailer.send({ to: email, ...mail, fromName: location.name, locationId });
}

/**
 * The receipt that is part of an order carrying the customer's e-mail: once the order is paid,
 * claim its mail with a conditional update (a replayed or raced send of the same client order id
 * finds it claimed and mails nothing), then hand it to the mail server without holding up the
 * order's answer. A failure is recorded on the order and logged, never thrown: the order stands.
 */
export async function mailReceiptWithOrder(deps: Deps, locationId: number, order: OrderView): Promise<void> {
  const { mailer } = deps;
  const email = order.customerEmail;
  if (!mailer || !email || order.paymentStatus !== 'paid') return;
  // the customer's address stays out of the log, even inside a mail server's message
  const reason = (err: unknown) =>
    String((err as Error)?.message ?? err)
      .split(email)
      .join('<customer>')
      .slice(0, 200);
  let claimed: number;
  try {
    claimed = await deps
      .db('orders')
      .where({ id: order.id, location_id: locationId })
      .whereNull('receipt_mail_state')
      .update({ receipt_mail_state: 'sending', receipt_mail_at: deps.clock().toISOString() });
  } catch (err) {
    console.warn(`The receipt of order ${order.id} was not mailed: ${reason(err)}`);
    return;
  }
  if (claimed !== 1) return;
  const record = (fields: Record<string, string | null>) =>
    deps
      .db('orders')
      .where({ id: order.id, receipt_mail_state: 'sending' })
      .update({ ...fields, receipt_mail_at: deps.clock().toISOString() });
  void sendOrderReceipt(deps.db, mailer, locationId, order.id, email)
    .then(
      () => record({ receipt_mail_state: 'sent', receipt_mail_error: null }),
      (err) => {
        console.warn(`The receipt of order ${order.id} was not mailed: ${reason(err)}`);
        return record({ receipt_mail_state: 'failed', receipt_mail_error: reason(err) });
      },
    )
    .catch((err) => console.warn(`What happened to the receipt mail of order ${order.id} was not saved: ${reason(err)}`));
}
