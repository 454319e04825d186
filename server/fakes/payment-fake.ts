// Local fake of the card-payment provider: a real HTTP server on loopback that the provider's
// official Node SDK (`stripe`) talks to when pointed at it with
//   new Stripe(fake.secretKey, { host: fake.host, port: fake.port, protocol: 'http' }).
// It speaks the provider's v1 wire format: form-encoded bodies with bracket notation, Bearer auth,
// Idempotency-Key replay, JSON answers, errors as { error: { type, code, ... } } with the status the
// SDK maps to its error classes (401 auth, 402 card, 400/404 invalid request), and signed webhooks.
// Only what Jugline uses: PaymentIntents (create, confirm, cancel, retrieve, list, search) and
// Refunds (create, retrieve, list). `faults` lets a test lose answers, take the fake offline or
// hold its webhooks, to check what the app does when the network fails it.
import crypto from 'node:crypto';
import http from 'node:http';
import https from 'node:https';
import type { AddressInfo } from 'node:net';
import { listPage, searchPage } from './payment-fake-lists';
import {
  ApiError,
  allowOnly,
  cardParam,
  findTestCard,
  int,
  invalid,
  metadata,
  missing,
  paymentMethodObject,
  parseForm,
  str,
  unexpectedState,
  type Form,
  type Obj,
  type TestCard,
} from './payment-fake-cards';

export { parseForm };

export interface FakeEvent {
  id: string;
  object: 'event';
  type: string;
  created: number;
  livemode: false;
  api_version: string;
  pending_webhooks: number;
  request: { id: string; idempotency_key: string | null };
  data: { object: Record<string, unknown> };
}
/** Switches a test flips to make the network fail the app; all off at start. */
export interface PaymentFaults {
  /**
   * Charge the card as asked, then hang up without answering: the next `times` answers to
   * requests that ran a card (and to their replays under the same Idempotency-Key) are lost.
   * Without `times`, until switched off with 0.
   */
  loseChargeAnswers(times?: number): void;
  /** Hang up on every request without doing anything, as during an outage. */
  setOffline(on: boolean): void;
  /** Keep webhooks queued instead of sending them; switching it off sends them in order. */
  holdWebhooks(on: boolean): void;
  /** All switches off (held webhooks are sent). */
  clear(): void;
}
export interface PaymentFake {
  url: string;
  host: string;
  port: number;
  secretKey: string;
  webhookSecret: string;
  setWebhookUrl(url: string | null): void;
  events(): FakeEvent[];
  faults: PaymentFaults;
  /** Resolves once every webhook queued so far has been delivered or given up on. */
  webhooksSettled(): Promise<void>;
  close(): Promise<void>;
}

interface Ctx {
  requestId: string;
  idempotencyKey: string | null;
  apiVersion: string;
  ranCard: boolean;
}
interface Result {
  status: number;
  body: unknown;
  store: boolean;
}

// The version stripe@23.1.0 pins (node_modules/stripe/esm/apiVersion.js); used when a request sends none.
const DEFAULT_API_VERSION = '2026-10-28.endive';
const RETRY_DELAYS_MS = [50, 150, 400]; // webhook retries after the first attempt
const MAX_BODY = 1_000_000;

const newId = (prefix: string) => `${prefix}_${crypto.randomBytes(12).toString('hex')}`;
const clone = <T>(v: T): T => JSON.parse(JSON.stringify(v)) as T;

/**
 * `clock` dates the objects (`created`), so a test's clock and the provider's agree on what
 * happened on which day; webhook signatures always carry the real time, as the SDK checks it.
 */
export async function startPaymentFake(opts: { webhookUrl?: string; port?: number; clock?: () => Date } = {}): Promise<PaymentFake> {
  const clock = opts.clock ?? (() => new Date());
  const now = () => Math.floor(clock().getTime() / 1000);
  const secretKey = `sk_test_fake_${crypto.randomBytes(12).toString('hex')}`;
  const webhookSecret = `whsec_${crypto.randomBytes(24).toString('hex')}`;
  const intents = new Map<string, Obj>();
  const charges = new Map<string, Obj>();
  const refunds = new Map<string, Obj>();
  const idempotency = new Map<string, { method: string; path: string; fingerprint: string; result: Result }>();
  const produced: FakeEvent[] = [];
  const queue: { event: FakeEvent; url: string }[] = [];
  let webhookUrl: string | null = null;
  let delivering = false;
  let closed = false;
  let wake: (() => void) | null = null; // cuts a backoff sleep short on close()
  let inflight: http.ClientRequest | null = null;
  let heldWebhooks = false;
  let offline = false;
  let answersToLose = 0;
  const lostKeys = new Set<string>(); // idempotency keys whose answers are being lost
  let settledWaiters: (() => void)[] = [];

  function emit(type: string, object: Obj, ctx: Ctx) {
    const event: FakeEvent = {
      id: newId('evt'),
      object: 'event',
      type,
      created: now(),
      livemode: false,
      api_version: ctx.apiVersion,
      pending_webhooks: webhookUrl ? 1 : 0,
      request: { id: ctx.requestId, idempotency_key: ctx.idempotencyKey },
      data: { object: clone(object) },
    };
    produced.push(event);
    if (webhookUrl) {
      queue.push({ event, url: webhookUrl });
      setImmediate(pump);
    }
  }

  function pump() {
    if (delivering || closed || heldWebhooks) return;
    const next = queue.shift();
    if (!next) {
      const waiters = settledWaiters;
      settledWaiters = [];
      waiters.forEach((resolve) => resolve());
      return;
    }
    delivering = true;
    void deliver(next.event, next.url).finally(() => {
      delivering = false;
      pump();
    });
  }

  async function deliver(event: FakeEvent, url: string) {
    const payload = JSON.stringify(event, null, 2);
    for (let attempt = 0; attempt <= RETRY_DELAYS_MS.length && !closed; attempt++) {
      if (attempt > 0) {
        await new Promise<void>((resolve) => {
          const timer = setTimeout(
            () => {
              wake = null;
              resolve();
            },
            RETRY_DELAYS_MS[attempt - 1],
          );
          wake = () => {
            clearTimeout(timer);
            wake = null;
            resolve();
          };
        });
        if (closed) return;
      }
      if (await postOnce(url, payload)) return;
    }
    // Given up: the app was down or kept failing. Swallowed on purpose, as the provider would.
  }

  function postOnce(url: string, payload: string): Promise<boolean> {
    return new Promise((resolve) => {
      const t = Math.floor(Date.now() / 1000);
      const v1 = crypto.createHmac('sha256', webhookSecret).update(`${t}.${payload}`, 'utf8').digest('hex');
      const target = new URL(url);
      const req = (target.protocol === 'https:' ? https : http).request(target, {
        method: 'POST',
        agent: false,
        timeout: 5000,
        headers: {
          'Content-Type': 'application/json; charset=utf-8',
          'Content-Length': Buffer.byteLength(payload),
          'Stripe-Signature': `t=${t},v1=${v1}`,
          'User-Agent': 'Jugline-PaymentFake/1.0',
        },
      });
      inflight = req;
      const done = (ok: boolean) => {
        if (inflight === req) inflight = null;
        resolve(ok);
      };
      req.on('response', (res) => {
        res.resume();
        res.on('end', () => done(res.statusCode !== undefined && res.statusCode >= 200 && res.statusCode < 300));
        res.on('error', () => done(false));
      });
      req.on('timeout', () => req.destroy());
      req.on('error', () => done(false));
      req.end(payload);
    });
  }

  const intent = (id: string) => {
    const pi = intents.get(id);
    if (!pi) throw missing('payment_intent', id);
    return pi;
  };

  /** Charges the card on the PaymentIntent: success, or a decline answered with 402. */
  function runCard(pi: Obj, c: TestCard, ctx: Ctx) {
    ctx.ranCard = true;
    const charge: Obj = {
      id: newId('ch'),
      object: 'charge',
      amount: pi.amount,
      amount_captured: c.decline ? 0 : pi.amount,
      amount_refunded: 0,
      currency: pi.currency,
      payment_intent: pi.id,
      payment_method: c.paymentMethod,
      paid: !c.decline,
      captured: !c.decline,
      refunded: false,
      status: c.decline ? 'failed' : 'succeeded',
      metadata: pi.metadata,
      created: now(),
      livemode: false,
      failure_code: c.decline?.code ?? null,
      failure_message: c.decline?.message ?? null,
    };
    charges.set(charge.id as string, charge);
    pi.latest_charge = charge.id;
    if (!c.decline) {
      Object.assign(pi, { status: 'succeeded', amount_received: pi.amount, payment_method: c.paymentMethod, last_payment_error: null });
      emit('payment_intent.succeeded', pi, ctx);
      return;
    }
    const error = { type: 'card_error', ...c.decline, charge: charge.id, payment_method: paymentMethodObject(c) };
    Object.assign(pi, { status: 'requires_payment_method', payment_method: null, last_payment_error: error });
    emit('payment_intent.payment_failed', pi, ctx);
    throw new ApiError(402, { ...error, payment_intent: clone(pi) }, true);
  }

  function createIntent(p: Form, ctx: Ctx): Obj {
    allowOnly(p, [
      'amount',
      'currency',
      'payment_method',
      'confirm',
      'metadata',
      'description',
      'capture_method',
      'expand',
      'payment_method_types',
      'automatic_payment_methods',
      'receipt_email',
    ]);
    const amount = int(p, 'amount');
    if (amount === undefined) throw invalid('Missing required param: amount.', { param: 'amount', code: 'parameter_missing' });
    const currency = str(p, 'currency')?.toLowerCase();
    if (currency === undefined) throw invalid('Missing required param: currency.', { param: 'currency', code: 'parameter_missing' });
    if (!/^[a-z]{3}$/.test(currency)) throw invalid(`Invalid currency: ${currency}.`, { param: 'currency' });
    const confirm = str(p, 'confirm');
    if (confirm !== undefined && confirm !== 'true' && confirm !== 'false') throw invalid(`Invalid boolean: ${confirm}`, { param: 'confirm' });
    const capture = str(p, 'capture_method');
    if (capture !== undefined && capture !== 'automatic' && capture !== 'automatic_async')
      throw invalid(`The payment fake only supports capture_method=automatic, not ${capture}.`, { param: 'capture_method' });
    const c = cardParam(p);
    if (confirm === 'true' && !c)
      throw invalid("You cannot confirm this PaymentIntent because it's missing a payment method.", {
        param: 'payment_method',
        code: 'payment_intent_unexpected_state',
      });
    const id = newId('pi');
    const pi: Obj = {
      id,
      object: 'payment_intent',
      amount,
      amount_capturable: 0,
      amount_received: 0,
      currency,
      capture_method: capture ?? 'automatic',
      client_secret: `${id}_secret_${crypto.randomBytes(8).toString('hex')}`,
      status: c ? 'requires_confirmation' : 'requires_payment_method',
      payment_method: c?.paymentMethod ?? null,
      payment_method_types: ['card'],
      metadata: metadata(p),
      description: str(p, 'description') ?? null,
      created: now(),
      livemode: false,
      last_payment_error: null,
      latest_charge: null,
      canceled_at: null,
      cancellation_reason: null,
    };
    intents.set(id, pi);
    if (confirm === 'true' && c) runCard(pi, c, ctx);
    return pi;
  }

  function confirmIntent(pi: Obj, p: Form, ctx: Ctx): Obj {
    allowOnly(p, ['payment_method', 'expand', 'return_url']);
    if (pi.status !== 'requires_payment_method' && pi.status !== 'requires_confirmation') throw unexpectedState('confirm', String(pi.status));
    const c = cardParam(p) ?? (typeof pi.payment_method === 'string' ? findTestCard(pi.payment_method) : null);
    if (!c)
      throw invalid("You cannot confirm this PaymentIntent because it's missing a payment method.", {
        param: 'payment_method',
        code: 'payment_intent_unexpected_state',
      });
    runCard(pi, c, ctx);
    return pi;
  }

  function cancelIntent(pi: Obj, p: Form, ctx: Ctx): Obj {
    allowOnly(p, ['cancellation_reason', 'expand']);
    if (pi.status === 'succeeded' || pi.status === 'canceled') throw unexpectedState('cancel', String(pi.status));
    Object.assign(pi, { status: 'canceled', canceled_at: now(), cancellation_reason: str(p, 'cancellation_reason') ?? null });
    emit('payment_intent.canceled', pi, ctx);
    return pi;
  }

  function createRefund(p: Form, ctx: Ctx): Obj {
    allowOnly(p, ['payment_intent', 'amount', 'reason', 'metadata', 'expand']);
    const piId = str(p, 'payment_intent');
    if (!piId) throw invalid('Missing required param: payment_intent.', { param: 'payment_intent', code: 'parameter_missing' });
    const reason = str(p, 'reason');
    if (reason !== undefined && !['duplicate', 'fraudulent', 'requested_by_customer'].includes(reason))
      throw invalid(`Invalid reason: must be one of duplicate, fraudulent, or requested_by_customer`, { param: 'reason' });
    const requested = int(p, 'amount');
    const meta = metadata(p);
    const pi = intents.get(piId);
    if (!pi) throw missing('payment_intent', piId, 'payment_intent');
    const charge = pi.status === 'succeeded' ? charges.get(pi.latest_charge as string) : undefined;
    if (!charge)
      throw invalid(
        `This PaymentIntent (${piId}) does not have a successful charge to refund.`,
        { param: 'payment_intent', code: 'payment_intent_unexpected_state' },
        true,
      );
    const left = (charge.amount as number) - (charge.amount_refunded as number);
    if (left <= 0) throw invalid(`Charge ${String(charge.id)} has already been refunded.`, { code: 'charge_already_refunded' }, true);
    const money = (n: number) => `${(n / 100).toFixed(2)} ${String(charge.currency)}`;
    if (requested !== undefined && requested > left)
      throw invalid(
        `Refund amount (${money(requested)}) is greater than unrefunded amount on charge (${money(left)})`,
        { param: 'amount', code: 'amount_too_large' },
        true,
      );
    const amount = requested ?? left;
    const refund: Obj = {
      id: newId('re'),
      object: 'refund',
      amount,
      currency: charge.currency,
      charge: charge.id,
      payment_intent: pi.id,
      status: 'succeeded',
      reason: reason ?? null,
      metadata: meta,
      created: now(),
    };
    refunds.set(refund.id as string, refund);
    charge.amount_refunded = (charge.amount_refunded as number) + amount;
    charge.refunded = charge.amount_refunded === charge.amount;
    emit('charge.refunded', charge, ctx);
    emit('refund.created', refund, ctx);
    return refund;
  }

  function route(method: string, path: string, p: Form, ctx: Ctx): Obj {
    let m: RegExpExecArray | null;
    if (method === 'POST' && path === '/v1/payment_intents') return createIntent(p, ctx);
    if (method === 'GET' && path === '/v1/payment_intents') return listPage(path, intents.values(), p, []);
    if (method === 'GET' && path === '/v1/payment_intents/search') return searchPage(path, intents.values(), p);
    if ((m = /^\/v1\/payment_intents\/([^/]+)$/.exec(path)) && method === 'GET') return intent(m[1]);
    if ((m = /^\/v1\/payment_intents\/([^/]+)\/confirm$/.exec(path)) && method === 'POST') return confirmIntent(intent(m[1]), p, ctx);
    if ((m = /^\/v1\/payment_intents\/([^/]+)\/cancel$/.exec(path)) && method === 'POST') return cancelIntent(intent(m[1]), p, ctx);
    if (method === 'POST' && path === '/v1/refunds') return createRefund(p, ctx);
    if (method === 'GET' && path === '/v1/refunds') {
      const piId = str(p, 'payment_intent');
      const chargeId = str(p, 'charge');
      return listPage(
        path,
        refunds.values(),
        p,
        ['payment_intent', 'charge'],
        (r) => (piId === undefined || r.payment_intent === piId) && (chargeId === undefined || r.charge === chargeId),
      );
    }
    if ((m = /^\/v1\/refunds\/([^/]+)$/.exec(path)) && method === 'GET') {
      const refund = refunds.get(m[1]);
      if (!refund) throw missing('refund', m[1]);
      return refund;
    }
    throw new ApiError(404, { type: 'invalid_request_error', message: `Unrecognized request URL (${method}: ${path}).` }, false);
  }

  /** A lost answer: the request was handled, but the caller hears only a closed connection. */
  function loseAnswer(key: string | null, ranCard: boolean, res: http.ServerResponse): boolean {
    if (answersToLose <= 0 || !key || !(ranCard || lostKeys.has(key))) return false;
    answersToLose--;
    lostKeys.add(key);
    res.socket?.destroy();
    return true;
  }

  async function onRequest(req: http.IncomingMessage, res: http.ServerResponse) {
    if (offline) {
      req.socket.destroy();
      return;
    }
    const requestId = newId('req');
    const apiVersion = String(req.headers['stripe-version'] ?? DEFAULT_API_VERSION);
    const idempotencyKey = req.method === 'POST' ? ((req.headers['idempotency-key'] as string | undefined) ?? null) : null;
    const send = ({ status, body }: { status: number; body: unknown }, extra: Record<string, string> = {}) => {
      const text = JSON.stringify(body, null, 2);
      res.writeHead(status, {
        'Content-Type': 'application/json',
        'Content-Length': Buffer.byteLength(text),
        'Request-Id': requestId,
        'Stripe-Version': apiVersion,
        ...(idempotencyKey ? { 'Idempotency-Key': idempotencyKey } : {}),
        ...extra,
      });
      res.end(text);
    };
    const fail = (e: ApiError): Result => ({ status: e.status, body: { error: e.error }, store: e.store });
    try {
      const chunks: Buffer[] = [];
      let size = 0;
      for await (const chunk of req) {
        size += (chunk as Buffer).length;
        if (size > MAX_BODY) return send(fail(invalid('Request body too large.')));
        chunks.push(chunk as Buffer);
      }
      const auth = req.headers.authorization ?? '';
      if (auth !== `Bearer ${secretKey}`) {
        const given = auth.replace(/^Bearer\s+/i, '');
        const message = given
          ? `Invalid API Key provided: ${given.slice(0, 8)}${'*'.repeat(8)}${given.slice(-4)}`
          : 'You did not provide an API key. Provide it in the Authorization header, using Bearer auth.';
        return send({ status: 401, body: { error: { type: 'invalid_request_error', message } } });
      }
      const url = new URL(req.url ?? '/', 'http://fake');
      const method = req.method ?? 'GET';
      const params = parseForm(method === 'POST' ? Buffer.concat(chunks).toString('utf8') : url.search.slice(1));
      const fingerprint = JSON.stringify(params, (_k, v: unknown) =>
        v && typeof v === 'object' ? Object.fromEntries(Object.entries(v as Obj).sort(([a], [b]) => a.localeCompare(b))) : v,
      );
      if (idempotencyKey) {
        const prior = idempotency.get(idempotencyKey);
        if (prior && (prior.method !== method || prior.path !== url.pathname || prior.fingerprint !== fingerprint)) {
          return send(
            fail(
              invalid(
                `Keys for idempotent requests can only be used with the same parameters they were first used with. Try using a key other than '${idempotencyKey}' if you meant to execute a different request.`,
                { type: 'idempotency_error' },
              ),
            ),
          );
        }
        if (prior) {
          if (loseAnswer(idempotencyKey, false, res)) return;
          return send(prior.result, { 'Idempotent-Replayed': 'true' });
        }
      }
      const ctx: Ctx = { requestId, idempotencyKey, apiVersion, ranCard: false };
      let result: Result;
      try {
        result = { status: 200, body: route(method, url.pathname, params, ctx), store: true };
      } catch (e) {
        if (!(e instanceof ApiError)) throw e;
        result = fail(e);
      }
      result = { ...result, body: clone(result.body) }; // freeze the answer as sent, for replays
      if (idempotencyKey && result.store) {
        idempotency.set(idempotencyKey, { method, path: url.pathname, fingerprint, result });
        if (idempotency.size > 10_000) idempotency.delete(idempotency.keys().next().value as string);
      }
      if (loseAnswer(idempotencyKey, ctx.ranCard, res)) return;
      send(result);
    } catch (e) {
      if (e instanceof ApiError) return send(fail(e));
      if (!res.headersSent)
        send({ status: 500, body: { error: { type: 'api_error', message: `Payment fake failed: ${String(e)}` } } }, { 'Stripe-Should-Retry': 'false' });
    }
  }

  const server = http.createServer((req, res) => void onRequest(req, res));
  await new Promise<void>((resolve, reject) => {
    server.once('error', reject);
    server.listen(opts.port ?? 0, '127.0.0.1', () => {
      server.off('error', reject);
      resolve();
    });
  });
  const { port } = server.address() as AddressInfo;

  const fake: PaymentFake = {
    url: `http://127.0.0.1:${port}`,
    host: '127.0.0.1',
    port,
    secretKey,
    webhookSecret,
    setWebhookUrl(url) {
      if (url !== null && !/^https?:$/.test(new URL(url).protocol)) throw new Error(`Webhook URL must be http(s): ${url}`);
      webhookUrl = url;
    },
    events: () => produced.slice(),
    faults: {
      loseChargeAnswers(times = Number.POSITIVE_INFINITY) {
        answersToLose = times;
        if (times <= 0) lostKeys.clear();
      },
      setOffline(on) {
        offline = on;
      },
      holdWebhooks(on) {
        heldWebhooks = on;
        if (!on) setImmediate(pump);
      },
      clear() {
        fake.faults.loseChargeAnswers(0);
        fake.faults.setOffline(false);
        fake.faults.holdWebhooks(false);
      },
    },
    webhooksSettled: () =>
      new Promise<void>((resolve) => {
        if (closed || (!delivering && queue.length === 0)) return resolve();
        settledWaiters.push(resolve);
      }),
    async close() {
      if (closed) return;
      closed = true;
      queue.length = 0;
      settledWaiters.forEach((resolve) => resolve());
      settledWaiters = [];
      wake?.();
      inflight?.destroy();
      await new Promise<void>((resolve) => {
        server.close(() => resolve());
        server.closeAllConnections();
      });
    },
  };
  fake.setWebhookUrl(opts.webhookUrl ?? null);
  return fake;
}
