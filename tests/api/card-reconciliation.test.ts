// Card money reconciliation, through the provider's real SDK and the local payment fake, with the
// fake's fault switches standing between them: answers lost after the card was charged, the
// provider offline, webhooks held back and sent late. Whatever happens, every charge the provider
// made for an order ends either recorded against that order or given back by Jugline, with a
// refund row saying why.
import { randomUUID } from 'node:crypto';
import request from 'supertest';
import Stripe from 'stripe';
import { afterAll, afterEach, beforeAll, describe, expect, it } from 'vitest';
import type { PaymentFake } from '@server/fakes/payment-fake';
import { demoMenu, manualClock, startTestServer, type TestServer } from '../support/test-server';
import { orderBody, type Agent, type LineInput } from './helpers';
import { jsonOf } from '../support/rows';

// The provider's documented test cards, see /work/shared/reference/check-values.md ("Payments"):
// 4242 4242 4242 4242 succeeds, 4000 0000 0000 0002 is declined. Their test PaymentMethod ids.
const VISA = 'pm_card_visa';
const DECLINED = 'pm_card_chargeDeclined';

const time = manualClock('2026-03-03T15:00:00.000Z');

let server: TestServer;
let fake: PaymentFake;
let sdk: Stripe;
let cashier: Agent;
let lead: Agent;
let ids: Awaited<ReturnType<typeof demoMenu>>;

beforeAll(async () => {
  server = await startTestServer({ clock: time.clock });
  fake = server.payments.fake!;
  sdk = new Stripe(fake.secretKey, { host: fake.host, port: fake.port, protocol: 'http' });
  [cashier, lead] = [await server.signIn('cashier'), await server.signIn('lead')];
  ids = await demoMenu(server);
});
afterEach(async () => {
  fake.faults.clear();
  await fake.webhooksSettled();
});
afterAll(() => server.close());

const items = (): LineInput[] => [{ menuItemId: ids.item('Latte') }, { menuItemId: ids.item('Butter croissant') }];
function cardBody(customerName: string, paymentMethod = VISA) {
  return { ...orderBody(customerName, items()), clientOrderId: randomUUID(), payment: { method: 'card' as const, paymentMethod } };
}
const withCard = <T extends { payment: unknown }>(body: T, paymentMethod: string) => ({ ...body, payment: { method: 'card' as const, paymentMethod } });
const withCash = <T extends { payment: unknown }>(body: T, tenderedCents: number) => ({ ...body, payment: { method: 'cash' as const, tenderedCents } });

const orderRow = (id: number) => server.db('orders').where({ id }).first();
const paymentRows = (orderId: number) => server.db('payments').where({ order_id: orderId }).orderBy('id');
const refundRows = (orderId: number) => server.db('refunds').where({ order_id: orderId }).orderBy('id');

/** The types of the ticket events about one order, oldest first. */
async function eventTypes(orderId: number): Promise<string[]> {
  const rows = await server.db('events').where('type', 'like', 'order.%').orderBy('id').select('type', 'payload');
  return rows.filter((r) => jsonOf(r.payload).ticket.id === orderId).map((r) => r.type);
}

/**
 * A card order whose charge went through at the provider but whose answer never came back (every
 * try the SDK made), with the provider's webhooks held back: Jugline answers 502 and can't know
 * yet whether the card was charged.
 */
async function lostAnswer(customerName: string) {
  const body = cardBody(customerName);
  fake.faults.holdWebhooks(true);
  fake.faults.loseChargeAnswers();
  const res = await cashier.post('/api/orders').send(body);
  fake.faults.loseChargeAnswers(0);
  expect(res.status, JSON.stringify(res.body)).toBe(502);
  expect(res.body.error.code).toBe('payment_unavailable');
  const orderId: number = res.body.error.details.orderId;
  expect(await orderRow(orderId)).toMatchObject({ status: 'pending', payment_status: 'unpaid' });
  return { body, orderId };
}

async function releaseWebhooks() {
  fake.faults.holdWebhooks(false);
  await fake.webhooksSettled();
}

/** What the provider holds for an order: its succeeded charges and every refund of them. */
async function providerSide(orderId: number) {
  const charges = await sdk.paymentIntents.search({ query: `metadata['orderId']:'${orderId}' AND status:'succeeded'` }).autoPagingToArray({ limit: 100 });
  const refunds = (await Promise.all(charges.map((pi) => sdk.refunds.list({ payment_intent: pi.id }).autoPagingToArray({ limit: 100 })))).flat();
  return { charges, refunds };
}

/**
 * Every charge the provider made for the order is recorded against it, or given back in full by
 * the provider with a Jugline refund row (with its reason) for that refund; never both, never
 * neither. An order paid by card records exactly one. Answers the provider's side.
 */
async function expectEveryChargeAccountedFor(orderId: number) {
  const side = await providerSide(orderId);
  const payments = await paymentRows(orderId);
  const refunds = await refundRows(orderId);
  const order = await orderRow(orderId);
  let recorded = 0;
  for (const pi of side.charges) {
    const givenBack = side.refunds.filter((r) => r.payment_intent === pi.id);
    if (payments.some((p) => p.provider_id === pi.id && p.status === 'succeeded')) {
      recorded++;
      expect(givenBack, `${pi.id} is recorded and also given back automatically`).toEqual(
        givenBack.filter((r) => refunds.some((row) => row.provider_id === r.id && row.cause === null)),
      );
      continue;
    }
    expect(
      givenBack.reduce((sum, r) => sum + r.amount, 0),
      `${pi.id} is neither recorded nor given back`,
    ).toBe(pi.amount_received);
    for (const r of givenBack) {
      expect(refunds, `no Jugline refund row for ${r.id}`).toContainEqual(
        expect.objectContaining({ provider_id: r.id, amount_cents: r.amount, reason: expect.stringMatching(/\w/) }),
      );
    }
  }
  expect(recorded).toBe(order.payment_status !== 'unpaid' && order.payment_method === 'card' ? 1 : 0);
  return side;
}

describe('a lost answer', () => {
  it('heals by itself when only one try lost its answer: the SDK tries again with the same key, one charge', async () => {
    const body = cardBody('Henrietta Sparrow');
    fake.faults.loseChargeAnswers(1);
    const res = await cashier.post('/api/orders').send(body);
    expect(res.status, JSON.stringify(res.body)).toBe(201);
    expect(res.body.order).toMatchObject({ paymentStatus: 'paid', status: 'open' });
    await releaseWebhooks();
    const { charges } = await expectEveryChargeAccountedFor(res.body.order.id);
    expect(charges).toHaveLength(1);
    expect((await paymentRows(res.body.order.id)).map((p) => p.status)).toEqual(['succeeded']);
  });

  it('then another card (declined), then the first card again: the customer is charged once, and the late webhook changes nothing', async () => {
    const { body, orderId } = await lostAnswer('Marisol Fenwick');

    // Before trying another card Jugline asks the provider what became of the first: it was
    // charged, so the order is paid and the second card is never tried.
    const other = await cashier.post('/api/orders').send(withCard(body, DECLINED));
    expect(other.status, JSON.stringify(other.body)).toBe(200);
    expect(other.body.order).toMatchObject({ id: orderId, paymentStatus: 'paid', status: 'open' });
    const again = await cashier.post('/api/orders').send(body);
    expect(again.status).toBe(200);
    expect(again.body.order).toMatchObject({ id: orderId, paymentStatus: 'paid' });

    await releaseWebhooks();
    const { charges, refunds } = await expectEveryChargeAccountedFor(orderId);
    const order = await orderRow(orderId);
    const taken = charges.reduce((sum, pi) => sum + pi.amount_received, 0) - refunds.reduce((sum, r) => sum + r.amount, 0);
    expect(taken).toBe(order.total_cents);
    expect(charges).toHaveLength(1);
    expect(await eventTypes(orderId)).toEqual(['order.taken', 'order.fired']);
  });

  it('then the lead voids the order: the charge is given back through the provider, with a refund row saying so', async () => {
    const { orderId } = await lostAnswer('Odalys Brenner');
    const voided = await lead.post(`/api/orders/${orderId}/void`).send({ reason: 'Customer left' });
    expect(voided.status, JSON.stringify(voided.body)).toBe(200);
    await releaseWebhooks(); // the provider's late word changes nothing more

    const order = await orderRow(orderId);
    expect(order).toMatchObject({ status: 'void', payment_status: 'unpaid', refunded_cents: 0 });
    const { charges, refunds } = await expectEveryChargeAccountedFor(orderId);
    expect(charges).toHaveLength(1);
    expect(refunds).toHaveLength(1);
    expect(await refundRows(orderId)).toEqual([
      expect.objectContaining({
        amount_cents: order.total_cents,
        cause: 'order_voided',
        created_by: null,
        reason: expect.stringMatching(/void/i),
        provider_id: refunds[0].id,
      }),
    ]);
    // Nothing is left for a lead to give back.
    const refund = await lead.post(`/api/orders/${orderId}/refund`).send({ reason: 'Customer asked' });
    expect(refund.status).toBe(409);
    expect(await eventTypes(orderId)).toEqual(['order.taken', 'order.voided']);
  });

  it('then a void while the provider is down: the webhook that comes later gives the charge back', async () => {
    const { orderId } = await lostAnswer('Thaddeus Quarry');
    fake.faults.setOffline(true);
    const voided = await lead.post(`/api/orders/${orderId}/void`).send({ reason: 'Customer left' });
    expect(voided.status, JSON.stringify(voided.body)).toBe(200);
    fake.faults.setOffline(false);
    expect(await refundRows(orderId)).toEqual([]);

    await releaseWebhooks();
    const { refunds } = await expectEveryChargeAccountedFor(orderId);
    expect(refunds).toHaveLength(1);
    expect(await refundRows(orderId)).toEqual([expect.objectContaining({ cause: 'order_voided', provider_id: refunds[0].id })]);
    expect(await orderRow(orderId)).toMatchObject({ status: 'void', payment_status: 'unpaid' });
  });

  it('then cash while the provider is down: the order is paid in cash, and the card charge the webhook reports is given back', async () => {
    const { body, orderId } = await lostAnswer('Perpetua Lisle');
    fake.faults.setOffline(true);
    const cash = await cashier.post('/api/orders').send(withCash(body, 20_00));
    fake.faults.setOffline(false);
    expect(cash.status, JSON.stringify(cash.body)).toBe(200);
    expect(cash.body.order).toMatchObject({ paymentStatus: 'paid', status: 'open', payment: { method: 'cash' } });

    await releaseWebhooks();
    const { refunds } = await expectEveryChargeAccountedFor(orderId);
    expect(refunds).toHaveLength(1);
    expect(await refundRows(orderId)).toEqual([
      expect.objectContaining({ cause: 'paid_otherwise', created_by: null, reason: expect.stringMatching(/another way|cash/i) }),
    ]);
    expect(await orderRow(orderId)).toMatchObject({ payment_method: 'cash', payment_status: 'paid', refunded_cents: 0 });
    expect(await eventTypes(orderId)).toEqual(['order.taken', 'order.fired']);
  });

  it('then cash while the provider answers: the card was charged, so no cash is taken', async () => {
    const { body, orderId } = await lostAnswer('Bertrand Ashe');
    const cash = await cashier.post('/api/orders').send(withCash(body, 20_00));
    expect(cash.status, JSON.stringify(cash.body)).toBe(200);
    expect(cash.body.order).toMatchObject({ paymentStatus: 'paid', payment: { method: 'card', tenderedCents: null } });
    await releaseWebhooks();
    await expectEveryChargeAccountedFor(orderId);
    expect((await paymentRows(orderId)).map((p) => [p.method, p.status])).toEqual([['card', 'succeeded']]);
  });

  it('then another card while the provider is down: refused with 502, nothing charged, the order waits', async () => {
    const { body, orderId } = await lostAnswer('Leopold Marr');
    fake.faults.setOffline(true);
    const other = await cashier.post('/api/orders').send(withCard(body, VISA));
    fake.faults.setOffline(false);
    expect(other.status).toBe(502);
    expect(other.body.error).toMatchObject({ code: 'payment_unavailable', details: { orderId } });
    expect((await paymentRows(orderId)).map((p) => p.status)).toEqual(['unknown']);
    await releaseWebhooks(); // the provider's word: the first card was charged
    expect(await orderRow(orderId)).toMatchObject({ status: 'open', payment_status: 'paid' });
    await expectEveryChargeAccountedFor(orderId);
  });
});

describe('webhooks for an order in any state', () => {
  it('a charge the provider made on an attempt Jugline saw declined, after another card paid: given back as a duplicate', async () => {
    const body = cardBody('Cosima Thorne', DECLINED);
    const declined = await cashier.post('/api/orders').send(body);
    expect(declined.status).toBe(402);
    const orderId: number = declined.body.error.details.orderId;
    const paid = await cashier.post('/api/orders').send(withCard(body, VISA));
    expect(paid.status).toBe(200);
    // The declined PaymentIntent is confirmed again behind Jugline's back, and this time it takes money.
    const [first] = await paymentRows(orderId);
    await sdk.paymentIntents.confirm(first.provider_id, { payment_method: VISA });
    await fake.webhooksSettled();

    const { charges, refunds } = await expectEveryChargeAccountedFor(orderId);
    expect(charges).toHaveLength(2);
    expect(refunds).toHaveLength(1);
    expect(await refundRows(orderId)).toEqual([
      expect.objectContaining({ payment_id: first.id, cause: 'duplicate', created_by: null, reason: expect.stringMatching(/duplicate/i) }),
    ]);
    expect(await orderRow(orderId)).toMatchObject({ payment_status: 'paid', refunded_cents: 0, status: 'open' });
  });

  it('answers 503 with Retry-After when it cannot ask the provider, so the provider sends it again', async () => {
    const { orderId } = await lostAnswer('Quentin Yarrow');
    const [attempt] = await paymentRows(orderId);
    const event = fake
      .events()
      .find((e) => e.type === 'payment_intent.succeeded' && (e.data.object.metadata as { paymentId?: string }).paymentId === String(attempt.id));
    expect(event).toBeDefined();
    const payload = JSON.stringify(event);
    fake.faults.setOffline(true);
    const res = await request(server.url)
      .post('/api/webhooks/payments')
      .set('Content-Type', 'application/json')
      .set('Stripe-Signature', Stripe.webhooks.generateTestHeaderString({ payload, secret: fake.webhookSecret }))
      .send(payload);
    fake.faults.setOffline(false);
    expect(res.status).toBe(503);
    expect(Number(res.headers['retry-after'])).toBeGreaterThan(0);
    expect((await paymentRows(orderId)).map((p) => p.status)).toEqual(['unknown']);
    await releaseWebhooks();
    expect(await orderRow(orderId)).toMatchObject({ payment_status: 'paid' });
  });
});

describe('the answer and the webhook settling one attempt at once', () => {
  const signed = (payload: string) =>
    request(server.url)
      .post('/api/webhooks/payments')
      .set('Content-Type', 'application/json')
      .set('Stripe-Signature', Stripe.webhooks.generateTestHeaderString({ payload, secret: fake.webhookSecret }))
      .send(payload);

  it('settle it exactly once, with one order.fired event, round after round', async () => {
    for (let round = 0; round < 6; round++) {
      const { body, orderId } = await lostAnswer(`Ambrose Kettle ${round}`);
      const [attempt] = await paymentRows(orderId);
      const event = fake
        .events()
        .find((e) => e.type === 'payment_intent.succeeded' && (e.data.object.metadata as { paymentId?: string }).paymentId === String(attempt.id))!;
      const payload = JSON.stringify(event);
      // The held webhook goes out while the Counter resends and the provider's event is delivered
      // again (at least once, maybe more), all at the same time.
      fake.faults.holdWebhooks(false);
      const answers = await Promise.all([
        ...Array.from({ length: 4 }, () => cashier.post('/api/orders').send(body)),
        ...Array.from({ length: 4 }, () => signed(payload)),
      ]);
      await fake.webhooksSettled();
      for (const a of answers.slice(0, 4)) {
        expect(a.status, JSON.stringify(a.body)).toBe(200);
        expect(a.body.order).toMatchObject({ id: orderId, paymentStatus: 'paid' });
      }
      for (const a of answers.slice(4)) expect(a.status, JSON.stringify(a.body)).toBe(200);
      expect((await paymentRows(orderId)).map((p) => p.status)).toEqual(['succeeded']);
      expect(await refundRows(orderId)).toEqual([]);
      expect(await eventTypes(orderId)).toEqual(['order.taken', 'order.fired']);
      const { charges } = await expectEveryChargeAccountedFor(orderId);
      expect(charges).toHaveLength(1);
    }
  });

  it('card orders placed together, each racing its own webhook: each settled once', async () => {
    const bodies = Array.from({ length: 12 }, (_, i) => cardBody(`Isadora Penn ${i}`));
    const answers = await Promise.all(bodies.map((b) => cashier.post('/api/orders').send(b)));
    await fake.webhooksSettled();
    for (const a of answers) {
      expect(a.status, JSON.stringify(a.body)).toBe(201);
      const orderId = a.body.order.id;
      expect((await paymentRows(orderId)).map((p) => p.status)).toEqual(['succeeded']);
      expect(await eventTypes(orderId)).toEqual(['order.taken', 'order.fired']);
    }
  });
});

describe('an attempt cut off mid-call (the server restarted while the card service was asked)', () => {
  /** A declined order, then a card attempt left "processing" as a crash would leave it. */
  async function stuckAttempt(customerName: string, charged: boolean) {
    const body = cardBody(customerName, DECLINED);
    const res = await cashier.post('/api/orders').send(body);
    expect(res.status).toBe(402);
    const orderId: number = res.body.error.details.orderId;
    const order = await orderRow(orderId);
    const at = time.clock().toISOString();
    const [{ id }] = await server
      .db('payments')
      .insert({ order_id: orderId, method: 'card', status: 'processing', amount_cents: order.total_cents, created_at: at, updated_at: at })
      .returning('id');
    if (charged) {
      // the card was run before the crash: the card service holds the charge
      const pi = await sdk.paymentIntents.create({
        amount: order.total_cents,
        currency: 'usd',
        payment_method: VISA,
        confirm: true,
        metadata: { orderId: String(orderId), paymentId: String(id), locationId: String(order.location_id) },
      });
      await server.db('payments').where({ id }).update({ provider_id: pi.id });
    }
    return { body, orderId, paymentId: id as number };
  }

  it('blocks a new card while it may still be running, and is asked about once it is too old to be', async () => {
    const { body, orderId, paymentId } = await stuckAttempt('Araminta Voss', false);
    const early = await cashier.post('/api/orders').send(withCard(body, VISA));
    expect(early.status).toBe(409);
    time.advance(3 * 60_000); // longer than the SDK's three tries can take
    const later = await cashier.post('/api/orders').send(withCard(body, VISA));
    expect(later.status, JSON.stringify(later.body)).toBe(200);
    expect(later.body.order).toMatchObject({ paymentStatus: 'paid' });
    // it never learned a charge id, so it never ran the card: closed as not charged
    expect(await server.db('payments').where({ id: paymentId }).first()).toMatchObject({ status: 'failed' });
    await fake.webhooksSettled();
    await expectEveryChargeAccountedFor(orderId);
  });

  it('whose card was charged (and its webhook lost): cash later finds the charge and takes no cash; a void gives it back', async () => {
    fake.faults.holdWebhooks(true);
    const paidCase = await stuckAttempt('Florian Gage', true);
    const voidCase = await stuckAttempt('Imogen Tarrant', true);
    time.advance(3 * 60_000);

    const cash = await cashier.post('/api/orders').send(withCash(paidCase.body, 20_00));
    expect(cash.status, JSON.stringify(cash.body)).toBe(200);
    expect(cash.body.order).toMatchObject({ paymentStatus: 'paid', payment: { method: 'card' } });
    expect(await server.db('payments').where({ id: paidCase.paymentId }).first()).toMatchObject({ status: 'succeeded' });

    const voided = await lead.post(`/api/orders/${voidCase.orderId}/void`).send({ reason: 'Customer left' });
    expect(voided.status, JSON.stringify(voided.body)).toBe(200);
    expect(await refundRows(voidCase.orderId)).toEqual([expect.objectContaining({ payment_id: voidCase.paymentId, cause: 'order_voided' })]);

    await releaseWebhooks(); // the lost webhooks turn up after all: nothing more happens
    await expectEveryChargeAccountedFor(paidCase.orderId);
    await expectEveryChargeAccountedFor(voidCase.orderId);
    expect(await eventTypes(voidCase.orderId)).toEqual(['order.taken', 'order.voided']);
  });
});

describe("GET /api/reports/cards: the day's card check", () => {
  const DAY = '2026-03-05';
  const check = (date = DAY) => lead.get('/api/reports/cards').query({ date });
  beforeAll(() => time.set(`${DAY}T15:00:00.000Z`)); // 10:00 in New York, the demo café's zone

  it('a day in step: every charge recorded or given back, every refund on both sides, the totals agree', async () => {
    const paid = await cashier.post('/api/orders').send(cardBody('Winslow Hart'));
    expect(paid.status).toBe(201);
    const declinedFirst = cardBody('Philippa Dunn', DECLINED);
    expect((await cashier.post('/api/orders').send(declinedFirst)).status).toBe(402);
    const second = await cashier.post('/api/orders').send(withCard(declinedFirst, VISA));
    expect(second.status).toBe(200);
    expect((await cashier.post('/api/orders').send(orderBody('Cash Only', items(), 50_00))).status).toBe(201);
    const partial = await lead.post(`/api/orders/${paid.body.order.id}/refund`).send({ reason: 'Wrong milk', amountCents: 300 });
    expect(partial.status).toBe(200);
    const { orderId: voidedId } = await lostAnswer('Evander Crisp');
    expect((await lead.post(`/api/orders/${voidedId}/void`).send({ reason: 'Customer left' })).status).toBe(200);
    await releaseWebhooks();

    const res = await check();
    expect(res.status, JSON.stringify(res.body)).toBe(200);
    const view = res.body;
    const total = (await orderRow(paid.body.order.id)).total_cents as number; // every order here is a latte and a croissant
    expect(view).toMatchObject({ date: DAY, currency: 'USD', timeZone: 'America/New_York', providerNote: null, mismatches: 0, differenceCents: 0 });
    // three charges taken (two recorded, one given back), a decline that took nothing
    expect(view.provider).toEqual({ chargedCents: 3 * total, refundedCents: 300 + total, netCents: 2 * total - 300, charges: 3, refunds: 2 });
    expect(view.jugline).toEqual({ ...view.provider, recordedCents: 2 * total, givenBackCents: total });
    expect(view.charges.map((c: { match: string; orderId: number }) => [c.orderId, c.match])).toEqual([
      [paid.body.order.id, 'recorded'],
      [second.body.order.id, 'no_money'],
      [second.body.order.id, 'recorded'],
      [voidedId, 'given_back'],
    ]);
    expect(view.refunds).toEqual([
      expect.objectContaining({ orderId: paid.body.order.id, amountCents: 300, automatic: false, by: 'Theo Brand', reason: 'Wrong milk', match: 'matched' }),
      expect.objectContaining({ orderId: voidedId, amountCents: total, automatic: true, by: null, reason: expect.stringMatching(/void/i), match: 'matched' }),
    ]);
  });

  it('a charge whose answer and webhook never came shows as a mismatch; settling records it, once', async () => {
    const { orderId } = await lostAnswer('Rosalind Vane');
    const before = (await check()).body;
    const line = before.charges.find((c: { orderId: number }) => c.orderId === orderId);
    expect(line).toMatchObject({ providerStatus: 'succeeded', juglineStatus: 'unknown', match: 'mismatch', note: 'not_recorded' });
    expect(before.mismatches).toBe(1);
    const total = (await orderRow(orderId)).total_cents;
    expect(before.differenceCents).toBe(total);

    // A cashier may not settle; the lead may.
    expect((await cashier.post('/api/reports/cards/settle').send({ date: DAY })).status).toBe(403);
    const settled = await lead.post('/api/reports/cards/settle').send({ date: DAY });
    expect(settled.status, JSON.stringify(settled.body)).toBe(200);
    expect(settled.body).toMatchObject({ mismatches: 0, differenceCents: 0 });
    expect(settled.body.charges.find((c: { orderId: number }) => c.orderId === orderId)).toMatchObject({ match: 'recorded', juglineStatus: 'succeeded' });
    expect(await orderRow(orderId)).toMatchObject({ status: 'open', payment_status: 'paid' });

    await releaseWebhooks(); // the held webhook arrives after all: nothing more happens
    expect(await eventTypes(orderId)).toEqual(['order.taken', 'order.fired']);
    expect((await check()).body).toMatchObject({ mismatches: 0, differenceCents: 0 });
  });

  it("the card service down: its side is missing and said so, Jugline's side is there; settling answers 502", async () => {
    fake.faults.setOffline(true);
    const res = await check();
    const settle = await lead.post('/api/reports/cards/settle').send({ date: DAY });
    fake.faults.setOffline(false);
    expect(res.status).toBe(200);
    expect(res.body).toMatchObject({ provider: null, differenceCents: null, mismatches: 0, providerNote: expect.stringMatching(/did not answer/) });
    expect(res.body.jugline.charges).toBeGreaterThan(0);
    expect(res.body.charges.every((c: { match: string }) => c.match === 'unchecked')).toBe(true);
    expect(settle.status).toBe(502);
    expect(settle.body.error.code).toBe('payment_unavailable');
  });

  it('another day is checked on its own; today when no date is given', async () => {
    const other = await check('2026-03-04');
    expect(other.status).toBe(200);
    expect(other.body).toMatchObject({ date: '2026-03-04', mismatches: 0, charges: [], refunds: [], differenceCents: 0 });
    const today = await lead.get('/api/reports/cards');
    expect(today.status).toBe(200);
    expect(today.body.date).toBe(DAY);
  });

  it('refuses a date that is not a calendar date, and a settle without one, with 400 naming the field', async () => {
    const bad = await lead.get('/api/reports/cards').query({ date: '2026-02-30' });
    expect(bad.status).toBe(400);
    expect(bad.body.error).toMatchObject({ code: 'validation_failed', details: [{ path: 'query.date', message: expect.any(String) }] });
    const none = await lead.post('/api/reports/cards/settle').send({});
    expect(none.status).toBe(400);
    expect(none.body.error.details).toEqual([expect.objectContaining({ path: 'date' })]);
    expect((await cashier.get('/api/reports/cards')).status).toBe(403);
  });
});
