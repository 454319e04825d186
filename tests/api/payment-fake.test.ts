// The local payment fake, driven by the provider's REAL Node SDK over loopback HTTP (no mocks).
import http from 'node:http';
import type { AddressInfo } from 'node:net';
import Stripe from 'stripe';
import { afterAll, beforeAll, beforeEach, describe, expect, it, vi } from 'vitest';
import { startPaymentFake, type PaymentFake } from '@server/fakes/payment-fake';

interface Delivery {
  raw: Buffer;
  headers: http.IncomingHttpHeaders;
}

let fake: PaymentFake;
let stripe: Stripe;
let receiver: http.Server;
let receiverUrl: string;
const deliveries: Delivery[] = [];
let failNext = 0; // the receiver answers 500 to this many deliveries, to exercise retries

beforeAll(async () => {
  fake = await startPaymentFake();
  stripe = new Stripe(fake.secretKey, { host: fake.host, port: fake.port, protocol: 'http' });
  receiver = http.createServer((req, res) => {
    const chunks: Buffer[] = [];
    req.on('data', (c: Buffer) => chunks.push(c));
    req.on('end', () => {
      if (failNext > 0) {
        failNext--;
        res.writeHead(500).end();
        return;
      }
      deliveries.push({ raw: Buffer.concat(chunks), headers: req.headers });
      res.writeHead(200, { 'Content-Type': 'application/json' }).end('{"received":true}');
    });
  });
  await new Promise<void>((resolve) => receiver.listen(0, '127.0.0.1', resolve));
  receiverUrl = `http://127.0.0.1:${(receiver.address() as AddressInfo).port}/webhooks/payments`;
});

afterAll(async () => {
  await fake?.close();
  await new Promise<void>((resolve) => {
    if (!receiver) return resolve();
    receiver.close(() => resolve());
    receiver.closeAllConnections();
  });
});

beforeEach(() => {
  fake.setWebhookUrl(null);
  deliveries.length = 0;
  failNext = 0;
});

async function cardError(p: Promise<unknown>): Promise<Stripe.errors.StripeCardError> {
  const err = await p.then(
    () => null,
    (e: unknown) => e,
  );
  expect(err).toBeInstanceOf(Stripe.errors.StripeCardError);
  return err as Stripe.errors.StripeCardError;
}

const verified = (d: Delivery) => stripe.webhooks.constructEvent(d.raw, String(d.headers['stripe-signature']), fake.webhookSecret);

describe('payment intents', () => {
  it('creates, then confirms with the test PaymentMethod pm_card_visa', async () => {
    const created = await stripe.paymentIntents.create({
      amount: 450,
      currency: 'usd',
      payment_method: 'pm_card_visa',
      metadata: { orderId: '12' },
      description: 'Flat white',
    });
    expect(created).toMatchObject({
      object: 'payment_intent',
      amount: 450,
      amount_received: 0,
      currency: 'usd',
      status: 'requires_confirmation',
      payment_method: 'pm_card_visa',
      metadata: { orderId: '12' },
      description: 'Flat white',
      livemode: false,
      last_payment_error: null,
      latest_charge: null,
    });
    expect(created.id).toMatch(/^pi_/);
    const confirmed = await stripe.paymentIntents.confirm(created.id);
    expect(confirmed).toMatchObject({ id: created.id, status: 'succeeded', amount_received: 450 });
    expect(confirmed.latest_charge).toMatch(/^ch_/);
  });

  it('creates without a payment method as requires_payment_method, and confirms with one later', async () => {
    const pi = await stripe.paymentIntents.create({ amount: 300, currency: 'eur' });
    expect(pi.status).toBe('requires_payment_method');
    const confirmed = await stripe.paymentIntents.confirm(pi.id, { payment_method: 'pm_card_visa' });
    expect(confirmed.status).toBe('succeeded');
  });

  // The provider's documented test cards, see /work/shared/reference/check-values.md ("Payments"):
  // 4242 4242 4242 4242 succeeds.
  it('charges the raw test number 4242424242424242 with confirm=true in one call', async () => {
    const pi = await stripe.paymentIntents.create({ amount: 525, currency: 'usd', payment_method: '4242424242424242', confirm: true });
    expect(pi).toMatchObject({ status: 'succeeded', amount_received: 525, payment_method: 'pm_card_visa' });
    expect(pi.latest_charge).toMatch(/^ch_/);
  });

  // The provider's documented test cards, see check-values.md: …0002 declined (card_declined),
  // …9995 insufficient funds, …0069 expired card. Messages are the provider's customer-facing texts.
  const declines = [
    { pm: 'pm_card_chargeDeclined', number: '4000000000000002', code: 'card_declined', decline: 'generic_decline', message: 'Your card was declined.' },
    {
      pm: 'pm_card_chargeDeclinedInsufficientFunds',
      number: '4000000000009995',
      code: 'card_declined',
      decline: 'insufficient_funds',
      message: 'Your card has insufficient funds.',
    },
    { pm: 'pm_card_chargeDeclinedExpiredCard', number: '4000000000000069', code: 'expired_card', decline: null, message: 'Your card has expired.' },
  ];
  for (const d of declines) {
    for (const paymentMethod of [d.pm, d.number]) {
      it(`declines ${paymentMethod} with ${d.code}${d.decline ? `/${d.decline}` : ''} and leaves the PI requires_payment_method`, async () => {
        const err = await cardError(stripe.paymentIntents.create({ amount: 400, currency: 'usd', payment_method: paymentMethod, confirm: true }));
        expect(err.statusCode).toBe(402);
        expect(err.code).toBe(d.code);
        if (d.decline) expect(err.decline_code).toBe(d.decline);
        expect(err.message).toBe(d.message);
        const piId = (err.payment_intent as Stripe.PaymentIntent | undefined)?.id;
        expect(piId).toMatch(/^pi_/);
        const pi = await stripe.paymentIntents.retrieve(piId!);
        expect(pi.status).toBe('requires_payment_method');
        expect(pi.amount_received).toBe(0);
        expect(pi.last_payment_error).toMatchObject({ type: 'card_error', code: d.code, message: d.message });
      });
    }
  }

  it('lets a declined PI be retried with another card', async () => {
    const err = await cardError(stripe.paymentIntents.create({ amount: 400, currency: 'usd', payment_method: 'pm_card_chargeDeclined', confirm: true }));
    const piId = (err.payment_intent as Stripe.PaymentIntent).id;
    const retried = await stripe.paymentIntents.confirm(piId, { payment_method: 'pm_card_visa' });
    expect(retried).toMatchObject({ status: 'succeeded', last_payment_error: null });
  });

  it('rejects an unknown payment method and bad amounts as invalid requests', async () => {
    await expect(stripe.paymentIntents.create({ amount: 400, currency: 'usd', payment_method: 'pm_card_nope', confirm: true })).rejects.toMatchObject({
      type: 'StripeInvalidRequestError',
      statusCode: 400,
      param: 'payment_method',
    });
    await expect(stripe.paymentIntents.create({ amount: 0, currency: 'usd' })).rejects.toMatchObject({ type: 'StripeInvalidRequestError', param: 'amount' });
    await expect(stripe.paymentIntents.create({ amount: 100, currency: 'usd', capture_method: 'manual' })).rejects.toMatchObject({
      type: 'StripeInvalidRequestError',
      param: 'capture_method',
    });
  });

  it('retrieves a PI, and answers 404 resource_missing for an unknown id', async () => {
    const pi = await stripe.paymentIntents.create({ amount: 350, currency: 'usd', payment_method: 'pm_card_visa', confirm: true, metadata: { orderId: '7' } });
    const got = await stripe.paymentIntents.retrieve(pi.id);
    expect(got).toMatchObject({ id: pi.id, status: 'succeeded', amount: 350, metadata: { orderId: '7' } });
    await expect(stripe.paymentIntents.retrieve('pi_missing')).rejects.toMatchObject({
      type: 'StripeInvalidRequestError',
      statusCode: 404,
      code: 'resource_missing',
    });
  });

  it('cancels an unpaid PI and refuses to cancel a succeeded one', async () => {
    const open = await stripe.paymentIntents.create({ amount: 200, currency: 'usd', payment_method: 'pm_card_visa' });
    const canceled = await stripe.paymentIntents.cancel(open.id);
    expect(canceled.status).toBe('canceled');
    expect((await stripe.paymentIntents.retrieve(open.id)).status).toBe('canceled');
    const paid = await stripe.paymentIntents.create({ amount: 200, currency: 'usd', payment_method: 'pm_card_visa', confirm: true });
    await expect(stripe.paymentIntents.cancel(paid.id)).rejects.toMatchObject({ type: 'StripeInvalidRequestError', statusCode: 400 });
    expect((await stripe.paymentIntents.retrieve(paid.id)).status).toBe('succeeded');
  });
});

describe('refunds', () => {
  it('refunds in full by default and then refuses a second refund', async () => {
    const pi = await stripe.paymentIntents.create({ amount: 480, currency: 'usd', payment_method: 'pm_card_visa', confirm: true });
    const refund = await stripe.refunds.create({ payment_intent: pi.id, reason: 'requested_by_customer', metadata: { by: 'counter' } });
    expect(refund).toMatchObject({
      object: 'refund',
      amount: 480,
      currency: 'usd',
      payment_intent: pi.id,
      status: 'succeeded',
      reason: 'requested_by_customer',
      metadata: { by: 'counter' },
    });
    expect(refund.id).toMatch(/^re_/);
    expect(await stripe.refunds.retrieve(refund.id)).toMatchObject({ id: refund.id, amount: 480 });
    await expect(stripe.refunds.create({ payment_intent: pi.id })).rejects.toMatchObject({
      type: 'StripeInvalidRequestError',
      code: 'charge_already_refunded',
    });
  });

  it('refunds partially, refuses an over-refund, then refunds the rest', async () => {
    const pi = await stripe.paymentIntents.create({ amount: 1000, currency: 'usd', payment_method: 'pm_card_visa', confirm: true });
    expect((await stripe.refunds.create({ payment_intent: pi.id, amount: 300 })).amount).toBe(300);
    await expect(stripe.refunds.create({ payment_intent: pi.id, amount: 701 })).rejects.toMatchObject({
      type: 'StripeInvalidRequestError',
      statusCode: 400,
      code: 'amount_too_large',
    });
    expect((await stripe.refunds.create({ payment_intent: pi.id })).amount).toBe(700);
  });

  it('refuses to refund a PI that did not succeed, and 404s an unknown refund', async () => {
    const pi = await stripe.paymentIntents.create({ amount: 250, currency: 'usd', payment_method: 'pm_card_visa' });
    await expect(stripe.refunds.create({ payment_intent: pi.id })).rejects.toMatchObject({ type: 'StripeInvalidRequestError', statusCode: 400 });
    await expect(stripe.refunds.retrieve('re_missing')).rejects.toMatchObject({ statusCode: 404, code: 'resource_missing' });
  });
});

describe('authentication and idempotency', () => {
  it('answers a wrong secret key with 401, which the SDK raises as StripeAuthenticationError', async () => {
    const wrong = new Stripe('sk_test_not_the_fakes_key', { host: fake.host, port: fake.port, protocol: 'http' });
    const err = await wrong.paymentIntents.create({ amount: 100, currency: 'usd' }).then(
      () => null,
      (e: unknown) => e,
    );
    expect(err).toBeInstanceOf(Stripe.errors.StripeAuthenticationError);
    expect(err).toMatchObject({ statusCode: 401, rawType: 'invalid_request_error' });
  });

  it('replays the first answer for a repeated Idempotency-Key without charging again', async () => {
    const before = fake.events().length;
    const key = `order-${Date.now()}-a`;
    const params = { amount: 610, currency: 'usd', payment_method: 'pm_card_visa', confirm: true, metadata: { orderId: '41' } };
    const first = await stripe.paymentIntents.create(params, { idempotencyKey: key });
    const second = await stripe.paymentIntents.create(params, { idempotencyKey: key });
    expect(second.id).toBe(first.id);
    expect(second.latest_charge).toBe(first.latest_charge);
    expect(second.lastResponse.headers['idempotent-replayed']).toBe('true');
    const produced = fake.events().slice(before);
    expect(produced.map((e) => e.type)).toEqual(['payment_intent.succeeded']); // one PI, charged once
  });

  it('replays a decline too, and refuses the same key with different params', async () => {
    const key = `order-${Date.now()}-b`;
    const params = { amount: 610, currency: 'usd', payment_method: 'pm_card_chargeDeclined', confirm: true };
    const a = await cardError(stripe.paymentIntents.create(params, { idempotencyKey: key }));
    const b = await cardError(stripe.paymentIntents.create(params, { idempotencyKey: key }));
    expect((b.payment_intent as Stripe.PaymentIntent).id).toBe((a.payment_intent as Stripe.PaymentIntent).id);
    const err = await stripe.paymentIntents.create({ ...params, amount: 611 }, { idempotencyKey: key }).then(
      () => null,
      (e: unknown) => e,
    );
    expect(err).toBeInstanceOf(Stripe.errors.StripeIdempotencyError);
  });
});

describe('webhooks', () => {
  it('delivers signed events that constructEvent verifies, in order, and rejects a tampered body', async () => {
    fake.setWebhookUrl(receiverUrl);
    const paid = await stripe.paymentIntents.create({ amount: 700, currency: 'usd', payment_method: 'pm_card_visa', confirm: true });
    await cardError(stripe.paymentIntents.create({ amount: 700, currency: 'usd', payment_method: 'pm_card_chargeDeclinedInsufficientFunds', confirm: true }));
    const open = await stripe.paymentIntents.create({ amount: 700, currency: 'usd' });
    await stripe.paymentIntents.cancel(open.id);
    const refund = await stripe.refunds.create({ payment_intent: paid.id, amount: 200 });

    const expected = ['payment_intent.succeeded', 'payment_intent.payment_failed', 'payment_intent.canceled', 'charge.refunded', 'refund.created'];
    await vi.waitFor(() => expect(deliveries).toHaveLength(expected.length), { timeout: 5000 });
    const events = deliveries.map(verified);
    expect(events.map((e) => e.type)).toEqual(expected);
    expect(events.every((e) => e.object === 'event' && e.livemode === false && e.id.startsWith('evt_'))).toBe(true);
    expect(events[0].data.object).toMatchObject({ id: paid.id, status: 'succeeded' });
    expect(events[1].data.object).toMatchObject({ status: 'requires_payment_method', last_payment_error: { decline_code: 'insufficient_funds' } });
    expect(events[2].data.object).toMatchObject({ id: open.id, status: 'canceled' });
    expect(events[3].data.object).toMatchObject({ object: 'charge', payment_intent: paid.id, amount_refunded: 200, refunded: false });
    expect(events[4].data.object).toMatchObject({ id: refund.id, amount: 200 });
    expect(
      fake
        .events()
        .slice(-5)
        .map((e) => e.id),
    ).toEqual(events.map((e) => e.id));

    const tampered = Buffer.from(deliveries[0].raw.toString('utf8').replace('"amount": 700', '"amount": 1'));
    expect(tampered.equals(deliveries[0].raw)).toBe(false);
    expect(() => stripe.webhooks.constructEvent(tampered, String(deliveries[0].headers['stripe-signature']), fake.webhookSecret)).toThrow(
      Stripe.errors.StripeSignatureVerificationError,
    );
    expect(() => stripe.webhooks.constructEvent(deliveries[0].raw, String(deliveries[0].headers['stripe-signature']), 'whsec_other')).toThrow(
      Stripe.errors.StripeSignatureVerificationError,
    );
  });

  it('retries a delivery the app answered with an error', async () => {
    fake.setWebhookUrl(receiverUrl);
    failNext = 2;
    const pi = await stripe.paymentIntents.create({ amount: 90, currency: 'usd', payment_method: 'pm_card_visa', confirm: true });
    await vi.waitFor(() => expect(deliveries).toHaveLength(1), { timeout: 5000 });
    expect(failNext).toBe(0);
    expect(verified(deliveries[0]).data.object).toMatchObject({ id: pi.id });
  });

  it('keeps answering the API, without errors, when the webhook URL is down', async () => {
    const down = http.createServer();
    await new Promise<void>((resolve) => down.listen(0, '127.0.0.1', resolve));
    const downUrl = `http://127.0.0.1:${(down.address() as AddressInfo).port}/`;
    await new Promise<void>((resolve) => down.close(() => resolve()));
    fake.setWebhookUrl(downUrl);
    const pi = await stripe.paymentIntents.create({ amount: 90, currency: 'usd', payment_method: 'pm_card_visa', confirm: true });
    expect(pi.status).toBe('succeeded');
    expect(fake.events().at(-1)?.type).toBe('payment_intent.succeeded');
    // A later event to a live receiver still arrives once the dead one has been given up on.
    fake.setWebhookUrl(receiverUrl);
    await stripe.paymentIntents.cancel((await stripe.paymentIntents.create({ amount: 90, currency: 'usd' })).id);
    await vi.waitFor(() => expect(deliveries).toHaveLength(1), { timeout: 5000 });
    expect(verified(deliveries[0]).type).toBe('payment_intent.canceled');
  });
});

describe('lists and search', () => {
  // A fake of its own on a clock the test moves, so `created` and the ranges are known.
  let dated: PaymentFake;
  let sdk: Stripe;
  let at = Date.parse('2026-04-01T09:00:00Z');
  const unix = (iso: string) => Date.parse(iso) / 1000;
  beforeAll(async () => {
    dated = await startPaymentFake({ clock: () => new Date(at) });
    sdk = new Stripe(dated.secretKey, { host: dated.host, port: dated.port, protocol: 'http' });
  });
  afterAll(() => dated?.close());

  async function charge(iso: string, amount: number, metadata: Record<string, string>) {
    at = Date.parse(iso);
    return sdk.paymentIntents.create({ amount, currency: 'usd', payment_method: 'pm_card_visa', confirm: true, metadata });
  }

  it('lists PaymentIntents newest first, in a created range, page by page', async () => {
    const early = await charge('2026-04-01T09:00:00Z', 100, { day: 'a' });
    const ids = [];
    for (let i = 0; i < 5; i++) ids.push((await charge(`2026-04-02T10:0${i}:00Z`, 200 + i, { day: 'b' })).id);
    const late = await charge('2026-04-03T08:00:00Z', 300, { day: 'c' });
    expect(early.created).toBe(unix('2026-04-01T09:00:00Z'));

    const range = { gte: unix('2026-04-02T00:00:00Z'), lt: unix('2026-04-03T00:00:00Z') };
    const first = await sdk.paymentIntents.list({ created: range, limit: 2 });
    expect(first).toMatchObject({ object: 'list', has_more: true });
    expect(first.data.map((p) => p.id)).toEqual([ids[4], ids[3]]);
    // the SDK follows starting_after through the pages
    const all = await sdk.paymentIntents.list({ created: range, limit: 2 }).autoPagingToArray({ limit: 100 });
    expect(all.map((p) => p.id)).toEqual([...ids].reverse());
    expect((await sdk.paymentIntents.list({ created: { gt: range.lt } })).data.map((p) => p.id)).toEqual([late.id]);
    await expect(sdk.paymentIntents.list({ limit: 101 })).rejects.toMatchObject({ type: 'StripeInvalidRequestError', param: 'limit' });
  });

  it("searches PaymentIntents by metadata['key']:'value' and status, joined by AND", async () => {
    const a = await charge('2026-04-04T09:00:00Z', 410, { orderId: '77', paymentId: '1' });
    const b = await charge('2026-04-04T09:01:00Z', 410, { orderId: '77', paymentId: '2' });
    await charge('2026-04-04T09:02:00Z', 410, { orderId: '78', paymentId: '3' });
    const open = await sdk.paymentIntents.create({ amount: 410, currency: 'usd', metadata: { orderId: '77', paymentId: '4' } });

    const found = await sdk.paymentIntents.search({ query: "metadata['orderId']:'77'" });
    expect(found).toMatchObject({ object: 'search_result', has_more: false, next_page: null });
    expect(found.data.map((p) => p.id)).toEqual([open.id, b.id, a.id]);
    const paid = await sdk.paymentIntents.search({ query: "metadata['orderId']:'77' AND status:'succeeded'", limit: 1 });
    expect(paid.data.map((p) => p.id)).toEqual([b.id]);
    expect(paid.has_more).toBe(true);
    const pages = await sdk.paymentIntents.search({ query: "metadata['orderId']:'77' AND status:'succeeded'", limit: 1 }).autoPagingToArray({ limit: 10 });
    expect(pages.map((p) => p.id)).toEqual([b.id, a.id]);
    await expect(sdk.paymentIntents.search({ query: 'amount>3' })).rejects.toMatchObject({ type: 'StripeInvalidRequestError', param: 'query' });
  });

  it('lists refunds by PaymentIntent and created range', async () => {
    const pi = await charge('2026-04-05T09:00:00Z', 900, {});
    const other = await charge('2026-04-05T09:00:00Z', 900, {});
    at = Date.parse('2026-04-05T12:00:00Z');
    const r1 = await sdk.refunds.create({ payment_intent: pi.id, amount: 100 });
    await sdk.refunds.create({ payment_intent: other.id, amount: 100 });
    at = Date.parse('2026-04-06T12:00:00Z');
    const r2 = await sdk.refunds.create({ payment_intent: pi.id, amount: 200 });

    expect((await sdk.refunds.list({ payment_intent: pi.id })).data.map((r) => r.id)).toEqual([r2.id, r1.id]);
    const day5 = await sdk.refunds.list({ created: { gte: unix('2026-04-05T00:00:00Z'), lt: unix('2026-04-06T00:00:00Z') } });
    expect(day5.data.map((r) => r.amount)).toEqual([100, 100]);
    expect(day5.data[1]).toMatchObject({ id: r1.id, object: 'refund', payment_intent: pi.id, created: unix('2026-04-05T12:00:00Z') });
  });
});

describe('faults', () => {
  afterAll(() => fake.faults.clear());

  it('a lost answer charges once: the SDK tries again with the same Idempotency-Key and hears the replay', async () => {
    fake.faults.loseChargeAnswers(1);
    const before = fake.events().length;
    const pi = await stripe.paymentIntents.create(
      { amount: 515, currency: 'usd', payment_method: 'pm_card_visa', confirm: true, metadata: { lost: 'once' } },
      { idempotencyKey: `lost-once-${Date.now()}` },
    );
    expect(pi.status).toBe('succeeded');
    expect(
      fake
        .events()
        .slice(before)
        .map((e) => e.type),
    ).toEqual(['payment_intent.succeeded']);
  });

  it('answers lost on every try: the SDK gives up with a connection error, though the card was charged', async () => {
    fake.faults.loseChargeAnswers();
    const withRetries = new Stripe(fake.secretKey, { host: fake.host, port: fake.port, protocol: 'http', maxNetworkRetries: 2 });
    const err = await withRetries.paymentIntents
      .create(
        { amount: 516, currency: 'usd', payment_method: 'pm_card_visa', confirm: true, metadata: { lost: 'always' } },
        { idempotencyKey: `lost-${Date.now()}` },
      )
      .then(
        () => null,
        (e: unknown) => e,
      );
    expect(err).toBeInstanceOf(Stripe.errors.StripeConnectionError);
    fake.faults.loseChargeAnswers(0);
    const found = await stripe.paymentIntents.search({ query: "metadata['lost']:'always'" });
    expect(found.data.map((p) => [p.status, p.amount])).toEqual([['succeeded', 516]]);
  });

  it('offline: every request is hung up on and nothing is done', async () => {
    fake.faults.setOffline(true);
    const err = await stripe.paymentIntents
      .create({ amount: 517, currency: 'usd', payment_method: 'pm_card_visa', confirm: true, metadata: { offline: 'yes' } })
      .then(
        () => null,
        (e: unknown) => e,
      );
    expect(err).toBeInstanceOf(Stripe.errors.StripeConnectionError);
    fake.faults.setOffline(false);
    expect((await stripe.paymentIntents.search({ query: "metadata['offline']:'yes'" })).data).toEqual([]);
  });

  it('held webhooks are sent, in order, once let go', async () => {
    fake.setWebhookUrl(receiverUrl);
    fake.faults.holdWebhooks(true);
    const pi = await stripe.paymentIntents.create({ amount: 518, currency: 'usd', payment_method: 'pm_card_visa', confirm: true });
    await stripe.refunds.create({ payment_intent: pi.id });
    await new Promise((resolve) => setImmediate(resolve));
    expect(deliveries).toEqual([]);
    fake.faults.holdWebhooks(false);
    await fake.webhooksSettled();
    expect(deliveries.map((d) => verified(d).type)).toEqual(['payment_intent.succeeded', 'charge.refunded', 'refund.created']);
  });
});
