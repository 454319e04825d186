// Card payments at the Counter, through the provider's real SDK and the local payment fake: an
// order reaches the bar only once its card has been charged, a declined card can be tried again
// (or swapped for cash) under the same client order id, and a paid order is never charged twice.
import { randomUUID } from 'node:crypto';
import request from 'supertest';
import Stripe from 'stripe';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { OrderView, TicketView } from '@/domain/types';
import { demoMenu, manualClock, startTestServer, type TestServer } from '../support/test-server';
import { orderBody, type Agent, type LineInput } from './helpers';
import { jsonOf } from '../support/rows';

// The provider's documented test cards, see ../shared/reference/check-values.md ("Payments"):
// 4242 4242 4242 4242 succeeds, …0002 is declined (card_declined), …9995 insufficient funds,
// …0069 expired card. These are their test PaymentMethod ids.
const VISA = 'pm_card_visa';
const DECLINED = 'pm_card_chargeDeclined';
const INSUFFICIENT_FUNDS = 'pm_card_chargeDeclinedInsufficientFunds';
const EXPIRED = 'pm_card_chargeDeclinedExpiredCard';

const time = manualClock('2026-03-02T14:00:00.000Z');
const nowIso = () => time.clock().toISOString();

let server: TestServer;
let cashier: Agent;
let ids: Awaited<ReturnType<typeof demoMenu>>;

beforeAll(async () => {
  server = await startTestServer({ clock: time.clock });
  cashier = await server.signIn('cashier');
  ids = await demoMenu(server);
});
afterAll(() => server.close());

/** An order body paid by card; the same clientOrderId may be passed to send it again. */
function cardBody(customerName: string, items: LineInput[], paymentMethod: string, clientOrderId = randomUUID()) {
  return { ...orderBody(customerName, items), clientOrderId, payment: { method: 'card' as const, paymentMethod } };
}
function cashBody(customerName: string, items: LineInput[], tenderedCents: number, clientOrderId: string) {
  return { ...orderBody(customerName, items, tenderedCents), clientOrderId };
}

const latteAndCroissant = (): LineInput[] => [{ menuItemId: ids.item('Latte') }, { menuItemId: ids.item('Butter croissant') }];

const paymentRows = (orderId: number) => server.db('payments').where({ order_id: orderId }).orderBy('id');
const countRows = async (table: string) => Number((await server.db(table).count({ n: '*' }).first())?.n);
const ordersWithClientId = async (clientOrderId: string) =>
  Number((await server.db('orders').where({ client_order_id: clientOrderId }).count({ n: '*' }).first())?.n);

/** The types of the ticket events about one order, oldest first. */
async function eventTypes(orderId: number): Promise<string[]> {
  const rows = await server.db('events').whereNot({ type: 'menu.availability' }).orderBy('id').select('type', 'payload');
  return rows.filter((r) => jsonOf(r.payload).ticket.id === orderId).map((r) => r.type);
}

async function openTicket(orderId: number): Promise<TicketView | undefined> {
  const res = await cashier.get('/api/tickets?view=open');
  expect(res.status).toBe(200);
  return res.body.tickets.find((t: TicketView) => t.id === orderId);
}

/** Place an order whose card is declined; answers the waiting order. */
async function declinedOrder(customerName: string, items: LineInput[] = latteAndCroissant(), card = DECLINED) {
  const body = cardBody(customerName, items, card);
  const res = await cashier.post('/api/orders').send(body);
  expect(res.status, JSON.stringify(res.body)).toBe(402);
  const order = (await cashier.get(`/api/orders/${res.body.error.details.orderId}`)).body.order as OrderView;
  return { body, order };
}

describe('a card that is charged', () => {
  it('answers 201 with a paid order fired to the bar, its drinks on the ticket and its payment stored', async () => {
    const body = cardBody('Wilfred Ashdown', latteAndCroissant(), VISA);
    const res = await cashier.post('/api/orders').send(body);

    expect(res.status, JSON.stringify(res.body)).toBe(201);
    const order: OrderView = res.body.order;
    expect(order).toMatchObject({
      clientOrderId: body.clientOrderId,
      customerName: 'Wilfred Ashdown',
      paymentStatus: 'paid',
      status: 'open',
      firedAt: nowIso(),
      refundedCents: 0,
      payment: { method: 'card', tenderedCents: null, changeCents: null },
    });
    expect(order.payment.providerId).toMatch(/^pi_/);
    expect(order.lines.map((l) => [l.itemName, l.station])).toEqual([
      ['Latte', 'bar'],
      ['Butter croissant', 'counter'],
    ]);

    // The bar sees the latte; the croissant is collected at the counter.
    const ticket = await openTicket(order.id);
    expect(ticket).toBeDefined();
    expect(ticket!.drinks.map((d) => d.itemName)).toEqual(['Latte']);

    expect(await paymentRows(order.id)).toEqual([
      expect.objectContaining({ method: 'card', status: 'succeeded', provider_id: order.payment.providerId, amount_cents: order.totalCents }),
    ]);
    // Taken (waiting for its card), then fired once the card was charged.
    expect(await eventTypes(order.id)).toEqual(['order.taken', 'order.fired']);

    // GET answers what the POST answered.
    expect((await cashier.get(`/api/orders/${order.id}`)).body.order).toEqual(order);
  });
});

describe('a declined card', () => {
  it.each([
    { card: DECLINED, code: 'card_declined', declineCode: 'generic_decline', says: /declined/i },
    { card: INSUFFICIENT_FUNDS, code: 'card_declined', declineCode: 'insufficient_funds', says: /insufficient funds/i },
    // The provider's decline table gives no decline code for an expired card (its error code says
    // it all); the fake sends one. Either is accepted below.
    { card: EXPIRED, code: 'expired_card', declineCode: undefined, says: /expired/i },
  ])('$card: 402 payment_declined; the order waits, unpaid and off the bar', async ({ card, code, declineCode, says }) => {
    const body = cardBody('Cordelia Vance', latteAndCroissant(), card);
    const res = await cashier.post('/api/orders').send(body);

    expect(res.status).toBe(402);
    expect(res.body).toEqual({
      error: {
        code: 'payment_declined',
        message: expect.stringMatching(says),
        details: { orderId: expect.any(Number), code, declineCode: declineCode ?? res.body.error?.details?.declineCode },
      },
    });
    if (declineCode === undefined) expect([null, 'expired_card']).toContain(res.body.error.details.declineCode);
    const { orderId } = res.body.error.details;

    const got = await cashier.get(`/api/orders/${orderId}`);
    expect(got.status).toBe(200);
    expect(got.body.order).toMatchObject({ clientOrderId: body.clientOrderId, status: 'pending', paymentStatus: 'unpaid', firedAt: null });
    expect(got.body.order.payment.providerId).toBeNull();
    expect(await openTicket(orderId)).toBeUndefined();

    const payments = await paymentRows(orderId);
    expect(payments).toEqual([expect.objectContaining({ method: 'card', status: 'declined' })]);
    expect(payments[0].provider_id).toMatch(/^pi_/);
    expect(await eventTypes(orderId)).toEqual(['order.taken']);
  });

  it('can be tried again with another card under the same clientOrderId: 200, paid, fired, one order', async () => {
    const { body, order: waiting } = await declinedOrder('Bartholomew Penrose');

    const retry = await cashier.post('/api/orders').send({ ...body, payment: { method: 'card', paymentMethod: VISA } });
    expect(retry.status, JSON.stringify(retry.body)).toBe(200);
    expect(retry.body.order).toMatchObject({ id: waiting.id, number: waiting.number, paymentStatus: 'paid', status: 'open', firedAt: nowIso() });
    expect(retry.body.order.payment.providerId).toMatch(/^pi_/);

    expect(await ordersWithClientId(body.clientOrderId)).toBe(1);
    const payments = await paymentRows(waiting.id);
    expect(payments.map((p) => p.status)).toEqual(['declined', 'succeeded']);
    expect(payments[1].provider_id).toBe(retry.body.order.payment.providerId);
    expect(payments[1].provider_id).not.toBe(payments[0].provider_id);
    expect(await openTicket(waiting.id)).toBeDefined();
    expect(await eventTypes(waiting.id)).toEqual(['order.taken', 'order.fired']);
  });

  it('can be paid in cash instead: 200, paid by cash with change, fired', async () => {
    const { body, order: waiting } = await declinedOrder('Hermione Castellan');

    const cash = await cashier.post('/api/orders').send(cashBody('Hermione Castellan', body.items, 20_00, body.clientOrderId));
    expect(cash.status, JSON.stringify(cash.body)).toBe(200);
    expect(cash.body.order).toMatchObject({
      id: waiting.id,
      paymentStatus: 'paid',
      status: 'open',
      firedAt: nowIso(),
      changeCents: 20_00 - waiting.totalCents,
      payment: { method: 'cash', tenderedCents: 20_00, changeCents: 20_00 - waiting.totalCents, providerId: null },
    });
    expect(await ordersWithClientId(body.clientOrderId)).toBe(1);
    const payments = await paymentRows(waiting.id);
    expect(payments.map((p) => [p.method, p.status])).toEqual([
      ['card', 'declined'],
      ['cash', 'succeeded'],
    ]);
    expect(payments[1]).toMatchObject({ amount_cents: waiting.totalCents, tendered_cents: 20_00, change_cents: 20_00 - waiting.totalCents });
    expect(await openTicket(waiting.id)).toBeDefined();
    expect(await eventTypes(waiting.id)).toEqual(['order.taken', 'order.fired']);
  });

  it('refuses too little cash for the waiting order, and it keeps waiting', async () => {
    const { body, order: waiting } = await declinedOrder('Lysander Frome');
    const res = await cashier.post('/api/orders').send(cashBody('Lysander Frome', body.items, waiting.totalCents - 1, body.clientOrderId));
    expect(res.status).toBe(400);
    expect(res.body.error).toMatchObject({ code: 'validation_failed', details: [{ path: 'payment.tenderedCents', message: expect.any(String) }] });
    expect((await cashier.get(`/api/orders/${waiting.id}`)).body.order).toMatchObject({ status: 'pending', paymentStatus: 'unpaid' });
    expect((await paymentRows(waiting.id)).map((p) => p.status)).toEqual(['declined']);
  });
});

describe('replaying a paid order', () => {
  it('answers 200 with the same order and charges nothing more, whether sent with a card or cash', async () => {
    const body = cardBody('Augustina Pell', latteAndCroissant(), VISA);
    const first = await cashier.post('/api/orders').send(body);
    expect(first.status).toBe(201);
    const paymentsBefore = await countRows('payments');
    const eventsBefore = await countRows('events');

    const again = await cashier.post('/api/orders').send(body);
    expect(again.status).toBe(200);
    expect(again.body).toEqual(first.body);

    const asCash = await cashier.post('/api/orders').send(cashBody('Augustina Pell', body.items, 50_00, body.clientOrderId));
    expect(asCash.status).toBe(200);
    expect(asCash.body).toEqual(first.body);

    const otherCard = await cashier.post('/api/orders').send({ ...body, payment: { method: 'card', paymentMethod: DECLINED } });
    expect(otherCard.status).toBe(200);
    expect(otherCard.body).toEqual(first.body);

    expect(await countRows('payments')).toBe(paymentsBefore);
    expect(await countRows('events')).toBe(eventsBefore);
    expect((await paymentRows(first.body.order.id)).map((p) => p.status)).toEqual(['succeeded']);
    expect(await ordersWithClientId(body.clientOrderId)).toBe(1);
  });

  it('a paid cash order sent again with a card is not charged', async () => {
    const body = cashBody('Caspar Lindqvist', latteAndCroissant(), 20_00, randomUUID());
    const first = await cashier.post('/api/orders').send(body);
    expect(first.status).toBe(201);
    const paymentsBefore = await countRows('payments');

    const asCard = await cashier.post('/api/orders').send({ ...body, payment: { method: 'card', paymentMethod: VISA } });
    expect(asCard.status).toBe(200);
    expect(asCard.body).toEqual(first.body);
    expect(await countRows('payments')).toBe(paymentsBefore);
  });
});

describe('two sends of one new card order at once', () => {
  it('store one order and charge it once', async () => {
    for (let round = 0; round < 3; round++) {
      const body = cardBody(`Ottoline Marsh ${round}`, latteAndCroissant(), VISA);
      const answers = await Promise.all([cashier.post('/api/orders').send(body), cashier.post('/api/orders').send(body)]);

      // One send takes and charges the order; the other either sees it (200) or finds its card
      // payment in progress (409). Never a second order, never a second charge.
      for (const a of answers) expect([200, 201, 409], JSON.stringify(a.body)).toContain(a.status);
      expect(answers.some((a) => a.status === 201 || a.status === 200)).toBe(true);
      expect(answers.some((a) => a.body.order?.paymentStatus === 'paid')).toBe(true);
      for (const a of answers.filter((x) => x.status === 409)) expect(a.body.error.code).toBe('conflict');

      expect(await ordersWithClientId(body.clientOrderId)).toBe(1);
      const order = await server.db('orders').where({ client_order_id: body.clientOrderId }).first();
      expect(order).toMatchObject({ payment_status: 'paid', status: 'open' });
      const payments = await paymentRows(order.id);
      expect(payments.filter((p) => p.status === 'succeeded')).toHaveLength(1);
      expect(payments.filter((p) => p.status !== 'succeeded')).toEqual([]);
      expect(await eventTypes(order.id)).toEqual(['order.taken', 'order.fired']);

      // The send that was told to wait sends again and gets the paid order, charged once.
      const resend = await cashier.post('/api/orders').send(body);
      expect(resend.status).toBe(200);
      expect(resend.body.order).toMatchObject({ id: order.id, paymentStatus: 'paid' });
      expect(await paymentRows(order.id)).toHaveLength(1);
    }
  });
});

describe('POST /api/webhooks/payments', () => {
  const webhook = (payload: string, signature?: string) => {
    const req = request(server.url).post('/api/webhooks/payments').set('Content-Type', 'application/json');
    return (signature === undefined ? req : req.set('Stripe-Signature', signature)).send(payload);
  };
  const succeededEvent = (paymentIntentId: string, orderId: number, paymentId: number, amount: number) =>
    JSON.stringify({
      id: `evt_${randomUUID().replace(/-/g, '')}`,
      object: 'event',
      type: 'payment_intent.succeeded',
      created: Math.floor(Date.now() / 1000),
      livemode: false,
      data: {
        object: {
          id: paymentIntentId,
          object: 'payment_intent',
          status: 'succeeded',
          amount,
          amount_received: amount,
          currency: 'usd',
          metadata: { orderId: String(orderId), paymentId: String(paymentId) },
        },
      },
    });
  /** A card attempt the API sent but whose answer never came back: still "processing". */
  async function lostAttempt(orderId: number, amountCents: number): Promise<number> {
    const at = nowIso();
    const [{ id }] = await server
      .db('payments')
      .insert({ order_id: orderId, method: 'card', status: 'processing', amount_cents: amountCents, created_at: at, updated_at: at })
      .returning('id');
    return id;
  }

  it('refuses a missing, wrong, stale or mismatched signature with 400 and changes nothing', async () => {
    const { order } = await declinedOrder('Peregrine Stowe');
    const paymentId = await lostAttempt(order.id, order.totalCents);
    const payload = succeededEvent('pi_lost_signature_checks', order.id, paymentId, order.totalCents);
    const secret = server.payments.webhookSecret;
    const eventsBefore = await countRows('events');

    const attempts = [
      await webhook(payload),
      await webhook(payload, 'nonsense'),
      await webhook(payload, Stripe.webhooks.generateTestHeaderString({ payload, secret: 'whsec_not_the_right_one' })),
      // older than the SDK's default tolerance of 300 s (check-values.md, "Payments")
      await webhook(payload, Stripe.webhooks.generateTestHeaderString({ payload, secret, timestamp: Math.floor(Date.now() / 1000) - 600 })),
      // signed, but for other bytes
      await webhook(payload, Stripe.webhooks.generateTestHeaderString({ payload: payload.replace('succeeded', 'Succeeded'), secret })),
    ];
    for (const res of attempts) {
      expect(res.status).toBe(400);
      expect(res.body.error.code).toBe('validation_failed');
    }
    expect((await cashier.get(`/api/orders/${order.id}`)).body.order).toMatchObject({ status: 'pending', paymentStatus: 'unpaid' });
    expect((await server.db('payments').where({ id: paymentId }).first()).status).toBe('processing');
    expect(await countRows('events')).toBe(eventsBefore);
  });

  it('settles a payment whose API answer was lost: a signed payment_intent.succeeded pays and fires the order, once', async () => {
    // The card is charged, but every answer the SDK waits for is lost, and the provider's
    // webhook is held back until the test sends it itself.
    const fake = server.payments.fake!;
    fake.faults.holdWebhooks(true);
    fake.faults.loseChargeAnswers();
    const sent = await cashier.post('/api/orders').send(cardBody('Ravenna Oakes', latteAndCroissant(), VISA));
    fake.faults.loseChargeAnswers(0);
    expect(sent.status).toBe(502);
    const orderId: number = sent.body.error.details.orderId;
    const [attempt] = await paymentRows(orderId);
    expect(attempt).toMatchObject({ status: 'unknown', provider_id: expect.stringMatching(/^pi_/) });
    const event = fake.events().find((e) => e.type === 'payment_intent.succeeded' && e.data.object.id === attempt.provider_id);
    const payload = JSON.stringify(event);

    // No session: the signature is what says who is calling.
    const res = await webhook(payload, Stripe.webhooks.generateTestHeaderString({ payload, secret: server.payments.webhookSecret }));
    expect(res.status, JSON.stringify(res.body)).toBe(200);
    expect(res.body).toEqual({ received: true });

    const paid = (await cashier.get(`/api/orders/${orderId}`)).body.order;
    expect(paid).toMatchObject({ status: 'open', paymentStatus: 'paid', firedAt: nowIso(), payment: { method: 'card', providerId: attempt.provider_id } });
    expect(await server.db('payments').where({ id: attempt.id }).first()).toMatchObject({ status: 'succeeded', provider_id: attempt.provider_id });
    expect(await openTicket(orderId)).toBeDefined();
    expect(await eventTypes(orderId)).toEqual(['order.taken', 'order.fired']);

    // The provider delivers at least once: the same event again (and the held one) changes nothing.
    const again = await webhook(payload, Stripe.webhooks.generateTestHeaderString({ payload, secret: server.payments.webhookSecret }));
    expect(again.status).toBe(200);
    fake.faults.holdWebhooks(false);
    await fake.webhooksSettled();
    expect(await eventTypes(orderId)).toEqual(['order.taken', 'order.fired']);
    expect((await paymentRows(orderId)).map((p) => p.status)).toEqual(['succeeded']);
  });

  it('a succeeded event for an attempt that was declined changes nothing', async () => {
    const { order } = await declinedOrder('Tobias Wren');
    const [declined] = await paymentRows(order.id);
    const payload = succeededEvent(declined.provider_id, order.id, declined.id, order.totalCents);
    const res = await webhook(payload, Stripe.webhooks.generateTestHeaderString({ payload, secret: server.payments.webhookSecret }));
    expect(res.status).toBe(200);
    expect((await cashier.get(`/api/orders/${order.id}`)).body.order).toMatchObject({ status: 'pending', paymentStatus: 'unpaid' });
    expect(await eventTypes(order.id)).toEqual(['order.taken']);
  });
});
