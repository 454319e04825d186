// Split payment through the real API and the local payment fake, on SQLite and (project server-pg)
// PostgreSQL: part cash, part card (or two cards) on one order; the order reaches the bar only once
// its parts cover the amount due; a declined card leaves the paid parts paid and the same list is
// sent again with another card; a part is never taken twice, however many sends race; each part is
// refundable on its own; the reports and the drawer count the cash part as cash.
import { randomUUID } from 'node:crypto';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { ReportView } from '@/domain/reports';
import type { OrderView } from '@/domain/types';
import { demoMenu, manualClock, startTestServer, type TestServer } from '../support/test-server';
import { jsonOf } from '../support/rows';
import { orderBody, type Agent, type LineInput } from './helpers';

// The provider's documented test cards (../shared/reference/check-values.md, "Payments"):
// 4242 4242 4242 4242 succeeds, …0002 is declined; these are their test PaymentMethod ids.
const VISA = 'pm_card_visa';
const DECLINED = 'pm_card_chargeDeclined';

const time = manualClock('2026-03-02T14:00:00.000Z');
const TODAY = '2026-03-02'; // café-local (America/New_York) date of the clock above

let server: TestServer;
let cashier: Agent;
let lead: Agent;
let lines: LineInput[];
/** What the order of `lines` comes to (total; no tip), learned from a plain cash order of them. */
let due: number;

type Part = { method: 'cash'; amountCents: number; tenderedCents: number } | { method: 'card'; amountCents: number; paymentMethod: string };
const cash = (amountCents: number, tenderedCents = amountCents): Part => ({ method: 'cash', amountCents, tenderedCents });
const card = (amountCents: number, paymentMethod = VISA): Part => ({ method: 'card', amountCents, paymentMethod });

function splitBody(customerName: string, parts: Part[], clientOrderId = randomUUID()) {
  return { ...orderBody(customerName, lines), clientOrderId, payment: { method: 'split' as const, parts } };
}

const countRows = async (table: string) => Number((await server.db(table).count({ n: '*' }).first())?.n);
const paymentsOf = (orderId: number) => server.db('payments').where({ order_id: orderId }).orderBy('id');
const orderRow = (id: number) => server.db('orders').where({ id }).first();
async function eventTypes(orderId: number): Promise<string[]> {
  const rows = await server.db('events').orderBy('id').select('type', 'payload');
  return rows.filter((r) => jsonOf(r.payload).ticket?.id === orderId).map((r) => r.type);
}

async function place(body: ReturnType<typeof splitBody>, status = 201) {
  const res = await cashier.post('/api/orders').send(body);
  expect(res.status, JSON.stringify(res.body)).toBe(status);
  return res;
}

beforeAll(async () => {
  server = await startTestServer({ clock: time.clock });
  [cashier, lead] = [await server.signIn('cashier'), await server.signIn('lead')];
  const ids = await demoMenu(server);
  lines = [{ menuItemId: ids.item('Latte') }, { menuItemId: ids.item('Butter croissant') }];
  const open = await lead.post('/api/shifts').send({ openingFloatCents: 100_00, baristasOnBar: 1, waitTargetSeconds: 240 });
  expect(open.status, JSON.stringify(open.body)).toBe(201);
  const plain = await cashier.post('/api/orders').send(orderBody('Priced Once', lines));
  expect(plain.status).toBe(201);
  due = plain.body.order.totalCents;
  expect(due).toBeGreaterThan(500); // room for a cash part of 5.00 and a card part
});
afterAll(() => server.close());

describe('part cash, part card', () => {
  it('takes both parts, fires the order once, and says each part on the order', async () => {
    const body = splitBody('Odile Frane', [cash(500, 1000), card(due - 500)]);
    const order: OrderView = (await place(body)).body.order;
    expect(order).toMatchObject({ status: 'open', paymentStatus: 'paid', payment: { method: 'split', tenderedCents: 1000, changeCents: 500 } });
    expect(order.payment.parts).toEqual([
      expect.objectContaining({ part: 1, method: 'cash', amountCents: 500, tenderedCents: 1000, changeCents: 500, refundedCents: 0 }),
      expect.objectContaining({ part: 2, method: 'card', amountCents: due - 500, refundedCents: 0 }),
    ]);
    const rows = await paymentsOf(order.id);
    expect(rows.map((p) => [p.part, p.method, p.status, p.amount_cents])).toEqual([
      [1, 'cash', 'succeeded', 500],
      [2, 'card', 'succeeded', due - 500],
    ]);
    expect(await orderRow(order.id)).toMatchObject({ payment_method: 'split', split_cash_cents: 500 });
    // taken (waiting for its money), then fired once the card part was in
    expect(await eventTypes(order.id)).toEqual(['order.taken', 'order.fired']);
    // the card was charged its part only, at the payment fake
    const charge = await server.deps.payments!.lookupCharge(rows[1].provider_id);
    expect(charge?.receivedCents).toBe(due - 500);
  });

  it('two cards: each charged its own part', async () => {
    const half = Math.floor(due / 2);
    // two people's cards; the fake knows one card that succeeds, presented twice
    const order: OrderView = (await place(splitBody('Two Cards', [card(half), card(due - half)]))).body.order;
    expect(order.paymentStatus).toBe('paid');
    expect(order.payment.parts.map((p) => [p.method, p.amountCents])).toEqual([
      ['card', half],
      ['card', due - half],
    ]);
    expect(await orderRow(order.id)).toMatchObject({ payment_method: 'split', split_cash_cents: 0 });
  });
});

describe('a list that is wrong', () => {
  it('refuses parts that do not add up to the amount due: 400 on payment.parts, nothing stored', async () => {
    const before = [await countRows('orders'), await countRows('payments')];
    for (const parts of [
      [cash(500), card(due - 499)],
      [cash(500), card(due - 501)],
    ]) {
      const res = await cashier.post('/api/orders').send(splitBody('Wrong Sum', parts));
      expect(res.status).toBe(400);
      expect(res.body.error.details).toEqual([expect.objectContaining({ path: 'payment.parts', message: expect.stringContaining(String(due)) })]);
    }
    expect([await countRows('orders'), await countRows('payments')]).toEqual(before);
  });

  it('refuses a cash part with less tendered than the part, one part, or five: 400 naming the field', async () => {
    const cases: [Part[], string][] = [
      [[cash(500, 400), card(due - 500)], 'payment.parts.0.tenderedCents'],
      [[card(due)], 'payment.parts'],
      [[cash(100), cash(100), cash(100), cash(100), card(due - 400)], 'payment.parts'],
    ];
    for (const [parts, path] of cases) {
      const res = await cashier.post('/api/orders').send(splitBody('Bad Part', parts));
      expect(res.status, JSON.stringify(parts)).toBe(400);
      expect(res.body.error.details.map((d: { path: string }) => d.path)).toContain(path);
    }
  });
});

describe('a declined card in a split', () => {
  async function declinedSplit() {
    const body = splitBody('Marten Oakes', [cash(500), card(due - 500, DECLINED)]);
    const res = await place(body, 402);
    expect(res.body.error.message).toMatch(/^Part 2 of 2: Card declined/);
    expect(res.body.error.details).toMatchObject({ part: 2, paidParts: [1] });
    return { body, orderId: res.body.error.details.orderId as number };
  }

  it('keeps the cash part paid and the order waiting, off the bar', async () => {
    const { orderId } = await declinedSplit();
    expect(await orderRow(orderId)).toMatchObject({ status: 'pending', payment_status: 'unpaid' });
    expect((await paymentsOf(orderId)).map((p) => [p.part, p.method, p.status])).toEqual([
      [1, 'cash', 'succeeded'],
      [2, 'card', 'declined'],
    ]);
    expect(await eventTypes(orderId)).toEqual(['order.taken']);
  });

  it('the same list with another card pays the rest: the cash is not taken twice, the order fires', async () => {
    const { body, orderId } = await declinedSplit();
    const res = await place({ ...body, payment: { method: 'split', parts: [cash(500), card(due - 500, VISA)] } }, 200);
    expect(res.body.order).toMatchObject({ id: orderId, status: 'open', paymentStatus: 'paid' });
    const rows = await paymentsOf(orderId);
    expect(rows.filter((p) => p.status === 'succeeded').map((p) => [p.part, p.method, p.amount_cents])).toEqual([
      [1, 'cash', 500],
      [2, 'card', due - 500],
    ]);
    expect(await eventTypes(orderId)).toEqual(['order.taken', 'order.fired']);
  });

  it('or the rest in cash: the second part becomes cash', async () => {
    const { body, orderId } = await declinedSplit();
    const res = await place({ ...body, payment: { method: 'split', parts: [cash(500), cash(due - 500, 5000)] } }, 200);
    expect(res.body.order).toMatchObject({ status: 'open', paymentStatus: 'paid', payment: { method: 'split', tenderedCents: 5500 } });
    // all of it cash: a cash order in the reports
    expect(await orderRow(orderId)).toMatchObject({ split_cash_cents: due });
  });

  it('refuses a paid part sent changed, and a single payment for a partly paid order: 409, nothing taken', async () => {
    const { body, orderId } = await declinedSplit();
    const before = await countRows('payments');
    const changed = await cashier.post('/api/orders').send({ ...body, payment: { method: 'split', parts: [cash(600), card(due - 600)] } });
    expect(changed.status).toBe(409);
    expect(changed.body.error.message).toMatch(/Part 1 was paid already/);
    const whole = await cashier.post('/api/orders').send({ ...body, payment: { method: 'cash', tenderedCents: due } });
    expect(whole.status).toBe(409);
    expect(await countRows('payments')).toBe(before);
    expect(await orderRow(orderId)).toMatchObject({ status: 'pending', payment_status: 'unpaid' });
  });

  it('a part partly given back: the list sent again is refused (409), nothing more is taken', async () => {
    const { body, orderId } = await declinedSplit();
    expect((await lead.post(`/api/orders/${orderId}/refund`).send({ amountCents: 100, reason: 'Short change' })).status).toBe(200);
    const before = await countRows('payments');
    const again = await cashier.post('/api/orders').send({ ...body, payment: { method: 'split', parts: [cash(500), card(due - 500, VISA)] } });
    expect(again.status).toBe(409);
    expect(await countRows('payments')).toBe(before);
    expect(await orderRow(orderId)).toMatchObject({ status: 'pending', payment_status: 'unpaid', refunded_cents: 100 });
    // nor voided with 4.00 of the part still held: the rest is given back first
    expect((await lead.post(`/api/orders/${orderId}/void`).send({ reason: 'Customer left' })).status).toBe(409);
    const rest = await lead.post(`/api/orders/${orderId}/refund`).send({ reason: 'Customer left' });
    expect(rest.body.order).toMatchObject({ status: 'void', refundedCents: 500 });
  });

  it('cannot be voided while a part is paid (409); a refund gives the part back and voids it', async () => {
    const { orderId } = await declinedSplit();
    const voided = await lead.post(`/api/orders/${orderId}/void`).send({ reason: 'Customer left' });
    expect(voided.status).toBe(409);
    const res = await lead.post(`/api/orders/${orderId}/refund`).send({ reason: 'Customer left' });
    expect(res.status, JSON.stringify(res.body)).toBe(200);
    expect(res.body.order).toMatchObject({ status: 'void', paymentStatus: 'unpaid', refundedCents: 500 });
    expect(await eventTypes(orderId)).toEqual(['order.taken', 'order.refunded']);
  });
});

describe('sends of one split order at once', () => {
  it('store one order, take each part once and fire it once', async () => {
    const body = splitBody('Many Hands', [cash(500), card(due - 500)]);
    const results = await Promise.all(Array.from({ length: 8 }, () => cashier.post('/api/orders').send(body)));
    const statuses = results.map((r) => r.status);
    // one creates it; the rest answer the same order, or that a card for it is running now
    expect(statuses.filter((s) => s === 201)).toHaveLength(1);
    expect(
      statuses.every((s) => [200, 201, 409].includes(s)),
      JSON.stringify(statuses),
    ).toBe(true);
    const orders = await server.db('orders').where({ client_order_id: body.clientOrderId });
    expect(orders).toHaveLength(1);
    // a send that met the running card goes again, as the Counter would
    await place(body, 200);
    const paid = (await paymentsOf(orders[0].id)).filter((p) => p.status === 'succeeded');
    expect(paid.map((p) => [p.part, p.method])).toEqual([
      [1, 'cash'],
      [2, 'card'],
    ]);
    expect(await eventTypes(orders[0].id)).toEqual(['order.taken', 'order.fired']);
  });
});

describe('refunds of a split order', () => {
  let order: OrderView;
  beforeAll(async () => {
    order = (await place(splitBody('Refund Parts', [cash(500, 500), card(due - 500)]))).body.order;
  });
  const part = (n: number) => order.payment.parts[n - 1];

  it('refunds one part alone, and no more than that part', async () => {
    const tooMuch = await lead.post(`/api/orders/${order.id}/refund`).send({ paymentId: part(1).paymentId, amountCents: 501, reason: 'Too much' });
    expect(tooMuch.status).toBe(400);
    expect(tooMuch.body.error.details).toEqual([expect.objectContaining({ path: 'amountCents' })]);
    const res = await lead.post(`/api/orders/${order.id}/refund`).send({ paymentId: part(2).paymentId, amountCents: 100, reason: 'Cold drink' });
    expect(res.status, JSON.stringify(res.body)).toBe(200);
    expect(res.body.order.payment.parts.map((p: { refundedCents: number }) => p.refundedCents)).toEqual([0, 100]);
    const refund = await server.db('refunds').where({ order_id: order.id }).first();
    expect(refund).toMatchObject({ payment_id: part(2).paymentId, amount_cents: 100 });
    expect(refund.provider_id).toMatch(/^re_/);
  });

  it('refuses a payment that is not a part of this order (400 on paymentId)', async () => {
    const other = await lead.post(`/api/orders/${order.id}/refund`).send({ paymentId: 999_999, reason: 'Wrong part' });
    expect(other.status).toBe(400);
    expect(other.body.error.details).toEqual([expect.objectContaining({ path: 'paymentId' })]);
  });

  it('refunding the cash part many times at once gives back the part once', async () => {
    const results = await Promise.all(
      Array.from({ length: 6 }, () => lead.post(`/api/orders/${order.id}/refund`).send({ paymentId: part(1).paymentId, reason: 'Paid twice' })),
    );
    expect(results.filter((r) => r.status === 200)).toHaveLength(1);
    expect(results.every((r) => [200, 409].includes(r.status))).toBe(true);
    const cashBack = await server
      .db('refunds')
      .where({ payment_id: part(1).paymentId })
      .sum({ s: 'amount_cents' })
      .first();
    expect(Number(cashBack?.s)).toBe(500);
  });

  it('the rest without naming a part: the card part gives back what is left, the order is refunded in full and leaves the bar', async () => {
    const res = await lead.post(`/api/orders/${order.id}/refund`).send({ reason: 'Wrong order' });
    expect(res.status, JSON.stringify(res.body)).toBe(200);
    expect(res.body.order).toMatchObject({ paymentStatus: 'refunded', status: 'void', refundedCents: due });
    expect(res.body.order.payment.parts.map((p: { refundedCents: number }) => p.refundedCents)).toEqual([500, due - 500]);
  });
});

describe('reports and the drawer', () => {
  it('count a split’s cash part as cash and the rest as card', async () => {
    const res = await lead.get(`/api/reports/range?from=${TODAY}&to=${TODAY}`);
    expect(res.status).toBe(200);
    const r: ReportView = res.body;
    // by hand from the paid orders' rows: cash orders count their total; a split its cash parts
    const paid = await server.db('orders').whereIn('payment_status', ['paid', 'refunded']);
    const cashCents = paid.reduce(
      (sum, o) => sum + (o.payment_method === 'cash' ? o.total_cents : o.payment_method === 'split' ? Math.min(o.split_cash_cents, o.total_cents) : 0),
      0,
    );
    expect(r.paymentMix.cash.cents).toBe(cashCents);
    expect(r.paymentMix.cash.cents + r.paymentMix.card.cents).toBe(r.grossCents);
    // the all-cash split counts among the cash orders
    const cashOrders = paid.filter((o) => o.payment_method === 'cash' || (o.payment_method === 'split' && o.split_cash_cents >= o.total_cents)).length;
    expect(r.paymentMix.cash.orders).toBe(cashOrders);
  });

  it('the drawer expects every cash part taken, less the cash handed back', async () => {
    const cashIn = Number((await server.db('payments').where({ method: 'cash', status: 'succeeded' }).sum({ s: 'amount_cents' }).first())?.s);
    const cashOut = Number(
      (
        await server
          .db('refunds')
          .join('payments', 'payments.id', 'refunds.payment_id')
          .where({ 'payments.method': 'cash' })
          .sum({ s: 'refunds.amount_cents' })
          .first()
      )?.s,
    );
    const close = await lead.post('/api/shifts/current/close').send({ countedCashCents: 0, confirmOpenTickets: true });
    expect(close.status, JSON.stringify(close.body)).toBe(200);
    expect(close.body.shift.expectedCashCents).toBe(100_00 + cashIn - cashOut);
  });
});
