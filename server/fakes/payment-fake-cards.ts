// Test cards understood by the local payment fake (server/fakes/payment-fake.ts), and below them the
// parsing and checking of request parameters, kept here so the fake itself stays short.
// Test cards:
// These are the provider's documented test cards (see /work/shared/reference/check-values.md,
// "Payments"): 4242… succeeds, …0002 generic decline, …9995 insufficient funds, …0069 expired card.
// The test PaymentMethod ids (pm_card_*) and the raw numbers are both accepted as `payment_method`;
// a raw number is reported back as its pm_card_* id, as the provider never echoes card numbers.

export interface CardDecline {
  code: 'card_declined' | 'expired_card';
  decline_code: string;
  message: string;
}

export interface TestCard {
  paymentMethod: string;
  number: string;
  brand: string;
  last4: string;
  decline: CardDecline | null;
}

const CARDS: TestCard[] = [
  { paymentMethod: 'pm_card_visa', number: '4242424242424242', brand: 'visa', last4: '4242', decline: null },
  {
    paymentMethod: 'pm_card_chargeDeclined',
    number: '4000000000000002',
    brand: 'visa',
    last4: '0002',
    decline: { code: 'card_declined', decline_code: 'generic_decline', message: 'Your card was declined.' },
  },
  {
    paymentMethod: 'pm_card_chargeDeclinedInsufficientFunds',
    number: '4000000000009995',
    brand: 'visa',
    last4: '9995',
    decline: { code: 'card_declined', decline_code: 'insufficient_funds', message: 'Your card has insufficient funds.' },
  },
  {
    paymentMethod: 'pm_card_chargeDeclinedExpiredCard',
    number: '4000000000000069',
    brand: 'visa',
    last4: '0069',
    // decline_code 'expired_card' is from memory of the provider's decline table, not confirmed.
    decline: { code: 'expired_card', decline_code: 'expired_card', message: 'Your card has expired.' },
  },
];

/** The test card for a PaymentMethod id or a raw card number (spaces and dashes allowed), or null. */
export function findTestCard(paymentMethod: string): TestCard | null {
  const digits = paymentMethod.replace(/[\s-]/g, '');
  return CARDS.find((c) => c.paymentMethod === paymentMethod || (/^\d+$/.test(digits) && c.number === digits)) ?? null;
}

/** A PaymentMethod-like object, as the provider puts in last_payment_error.payment_method. */
export function paymentMethodObject(card: TestCard): Record<string, unknown> {
  return {
    id: card.paymentMethod,
    object: 'payment_method',
    type: 'card',
    card: { brand: card.brand, last4: card.last4, exp_month: 12, exp_year: new Date().getFullYear() + 3, funding: 'credit' },
    livemode: false,
  };
}

// ---- Request parameters: the provider's form encoding and its invalid_request_error answers. ----

export type Form = { [key: string]: string | Form };
export type Obj = Record<string, unknown>;

/** An error answer: HTTP status, the `error` object, and whether an Idempotency-Key stores it. */
export class ApiError extends Error {
  constructor(
    readonly status: number,
    readonly error: Obj,
    readonly store: boolean,
  ) {
    super(String(error.message));
  }
}
export const invalid = (message: string, extra: Obj = {}, store = false) => new ApiError(400, { type: 'invalid_request_error', message, ...extra }, store);
export const missing = (kind: string, id: string, param?: string) =>
  new ApiError(param ? 400 : 404, { type: 'invalid_request_error', code: 'resource_missing', message: `No such ${kind}: '${id}'`, param }, false);

/** Parses a form body with bracket notation (`metadata[orderId]=12`, `a[b][c]=x`) into nested objects. */
export function parseForm(body: string): Form {
  const out: Form = {};
  for (const [key, value] of new URLSearchParams(body)) {
    const m = /^([^[\]]+)((?:\[[^[\]]*\])*)$/.exec(key);
    if (!m) throw invalid(`Invalid parameter name: ${key}`, { param: key });
    const path = [m[1], ...[...m[2].matchAll(/\[([^[\]]*)\]/g)].map((s) => s[1])];
    if (path.length > 4 || path.some((p) => p === '' || p === '__proto__')) throw invalid(`Invalid parameter name: ${key}`, { param: key });
    let node = out;
    path.slice(0, -1).forEach((seg) => {
      const next = node[seg] ?? (node[seg] = {});
      if (typeof next === 'string') throw invalid(`Invalid hash for ${key}`, { param: key });
      node = next;
    });
    const last = path[path.length - 1];
    if (typeof node[last] === 'object') throw invalid(`Invalid value for ${key}`, { param: key });
    node[last] = value;
  }
  return out;
}

export function allowOnly(p: Form, known: string[]) {
  for (const k of Object.keys(p)) if (!known.includes(k)) throw invalid(`Received unknown parameter: ${k}`, { param: k });
}
export function str(p: Form, name: string): string | undefined {
  const v = p[name];
  if (v !== undefined && typeof v !== 'string') throw invalid(`Invalid string: ${name} must be a string`, { param: name });
  return v;
}
export function int(p: Form, name: string): number | undefined {
  const v = str(p, name);
  if (v === undefined) return undefined;
  if (!/^\d+$/.test(v)) throw invalid(`Invalid integer: ${v}`, { param: name, code: 'parameter_invalid_integer' });
  const n = Number(v);
  if (n < 1 || n > 99_999_999)
    throw invalid('This value must be greater than or equal to 1 and at most 99999999.', { param: name, code: 'parameter_invalid_integer' });
  return n;
}
export function metadata(p: Form): Record<string, string> {
  const v = p.metadata;
  if (v === undefined || v === '') return {};
  if (typeof v === 'string') throw invalid('Invalid object: metadata must be a hash', { param: 'metadata' });
  const out: Record<string, string> = {};
  for (const [k, val] of Object.entries(v)) {
    if (typeof val !== 'string') throw invalid(`Invalid string: metadata[${k}]`, { param: `metadata[${k}]` });
    if (val !== '') out[k] = val; // the provider treats an empty value as "unset"
  }
  return out;
}
/** The test card named by `payment_method`, null when none is given; unknown ones are refused. */
export function cardParam(p: Form): TestCard | null {
  const pm = str(p, 'payment_method');
  if (pm === undefined || pm === '') return null;
  const found = findTestCard(pm);
  if (!found) throw missing('PaymentMethod', pm, 'payment_method');
  return found;
}
export const unexpectedState = (action: string, status: string) =>
  invalid(`You cannot ${action} this PaymentIntent because it has a status of ${status}.`, { code: 'payment_intent_unexpected_state' }, true);
