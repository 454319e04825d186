// The card check: a day's card money as the card service has it, set beside Jugline's payments
// and refunds, the way a café checks its card batch at the end of the day. Pure: the server
// fetches both sides and the screen shows what this works out. Money in integer cents, times as
// ISO-8601 UTC strings.

/** Why Jugline gave a charge back by itself: the order could not take the money. */
export const AUTO_REFUND_CAUSES = ['order_voided', 'paid_otherwise', 'duplicate'] as const;
export type AutoRefundCause = (typeof AUTO_REFUND_CAUSES)[number];

/** The refund row's reason, as the lead reads it. */
export const AUTO_REFUND_REASON: Record<AutoRefundCause, string> = {
  order_voided: 'Order voided before its card charge was known: given back automatically',
  paid_otherwise: 'Order paid another way (cash): this card charge given back automatically',
  duplicate: 'Duplicate: the order was already paid by another card; given back automatically',
};

/** A charge the order can't take: voided (no payment), or paid already in cash or by card. */
export function autoRefundCause(paidWith: 'cash' | 'card' | null): AutoRefundCause {
  if (paidWith === null) return 'order_voided';
  return paidWith === 'cash' ? 'paid_otherwise' : 'duplicate';
}

/** A card attempt in Jugline (payments.status). */
export type AttemptStatus = 'processing' | 'succeeded' | 'declined' | 'failed' | 'canceled' | 'unknown' | 'refunding' | 'refunded';
/** A charge at the card service (see ChargeState in server/payments/gateway.ts). */
export type ProviderChargeStatus = 'succeeded' | 'declined' | 'open' | 'canceled' | 'pending';

export interface ProviderCharge {
  providerId: string;
  status: ProviderChargeStatus;
  amountCents: number;
  receivedCents: number;
  createdAt: string;
  /** the Jugline attempt it was made for (from its metadata) */
  paymentId: number | null;
}
export interface ProviderRefundLine {
  providerId: string;
  chargeId: string | null;
  amountCents: number;
  status: string;
  createdAt: string;
}
export interface AttemptLine {
  paymentId: number;
  orderId: number;
  orderNumber: number;
  status: AttemptStatus;
  amountCents: number;
  providerId: string | null;
  createdAt: string;
}
export interface RefundLine {
  refundId: number;
  orderId: number;
  orderNumber: number;
  amountCents: number;
  reason: string;
  cause: AutoRefundCause | null;
  providerId: string | null;
  createdAt: string;
  /** who gave it; null for an automatic refund */
  by: string | null;
}

/** How a line stands: in step, or a mismatch; `unchecked` when the card service did not answer. */
export type Match = 'recorded' | 'given_back' | 'no_money' | 'matched' | 'mismatch' | 'unchecked';

/** What each line's note says, keyed so the screen words it and tests can name it. */
export const CHECK_NOTES = {
  recorded: 'Taken and recorded against the order.',
  given_back: 'Taken, and given back automatically: the order could not take it (see the refunds).',
  refund_pending: 'Jugline is giving this back, but the card service has not confirmed the refund yet. Settle to try again.',
  not_recorded: 'Taken by the card service, but not recorded in Jugline. Settle to record it against the order or give it back.',
  no_attempt: 'Taken by the card service for an attempt Jugline has no record of on this day.',
  amount_differs: 'The card service and Jugline have different amounts.',
  still_processing: 'The card service is still working on this charge.',
  not_taken: 'Recorded in Jugline, but the card service took no money.',
  no_charge_found: 'Recorded in Jugline, but the card service has no such charge on this day.',
  declined: 'Declined: no money taken.',
  not_run: 'The card was never run: no money taken.',
  unresolved: 'No money taken; Jugline had not heard the outcome yet. Settle to close it.',
  refund_matched: 'Given back, and recorded in Jugline.',
  refund_not_recorded: 'Refunded by the card service, but not recorded in Jugline.',
  refund_not_found: 'Recorded in Jugline, but the card service has no such refund on this day.',
  unchecked: 'Not checked: the card service did not answer.',
} as const;
export type CheckNote = keyof typeof CHECK_NOTES;

export interface CardCheckCharge {
  providerId: string | null;
  paymentId: number | null;
  orderId: number | null;
  orderNumber: number | null;
  at: string;
  /** what was taken when the card service took money, else what was asked */
  amountCents: number;
  /** 'missing': the card service has no such charge on this day; null: not asked */
  providerStatus: ProviderChargeStatus | 'missing' | null;
  juglineStatus: AttemptStatus | null;
  match: Match;
  note: CheckNote;
}
export interface CardCheckRefund {
  providerId: string | null;
  refundId: number | null;
  orderId: number | null;
  orderNumber: number | null;
  at: string;
  amountCents: number;
  reason: string | null;
  automatic: boolean;
  by: string | null;
  match: Match;
  note: CheckNote;
}
export interface CardCheckTotals {
  chargedCents: number;
  refundedCents: number;
  netCents: number;
  charges: number;
  refunds: number;
}
export interface CardCheckResult {
  /** null when the card service did not answer */
  provider: CardCheckTotals | null;
  jugline: CardCheckTotals & { recordedCents: number; givenBackCents: number };
  /** the card service's net less Jugline's; null when not checked */
  differenceCents: number | null;
  mismatches: number;
  charges: CardCheckCharge[];
  refunds: CardCheckRefund[];
}
export interface CardCheckView extends CardCheckResult {
  /** the café-local date checked (YYYY-MM-DD) */
  date: string;
  currency: string;
  locale: string;
  timeZone: string;
  /** why the card service's side is missing, when it is */
  providerNote: string | null;
}

const TAKEN: AttemptStatus[] = ['succeeded', 'refunding', 'refunded'];

function chargeVerdict(p: ProviderCharge | undefined, a: AttemptLine | undefined): { match: Match; note: CheckNote } {
  if (p?.status === 'succeeded') {
    if (!a) return { match: 'mismatch', note: 'no_attempt' };
    if (a.status === 'succeeded') {
      return p.receivedCents === a.amountCents ? { match: 'recorded', note: 'recorded' } : { match: 'mismatch', note: 'amount_differs' };
    }
    if (a.status === 'refunded') return { match: 'given_back', note: 'given_back' };
    if (a.status === 'refunding') return { match: 'mismatch', note: 'refund_pending' };
    return { match: 'mismatch', note: 'not_recorded' };
  }
  if (p?.status === 'pending') return { match: 'mismatch', note: 'still_processing' };
  if (a && TAKEN.includes(a.status)) return { match: 'mismatch', note: p ? 'not_taken' : 'no_charge_found' };
  if (a && (a.status === 'unknown' || a.status === 'processing')) return { match: 'no_money', note: 'unresolved' };
  if (p?.status === 'declined' || a?.status === 'declined') return { match: 'no_money', note: 'declined' };
  return { match: 'no_money', note: 'not_run' };
}

function chargeLines(provider: ProviderCharge[] | null, attempts: AttemptLine[]): CardCheckCharge[] {
  const byPayment = new Map(attempts.map((a) => [a.paymentId, a]));
  const byProviderId = new Map(attempts.filter((a) => a.providerId).map((a) => [a.providerId!, a]));
  const paired = new Set<number>();
  const lines: CardCheckCharge[] = [];
  for (const p of provider ?? []) {
    const a = (p.paymentId !== null ? byPayment.get(p.paymentId) : undefined) ?? byProviderId.get(p.providerId);
    if (a) paired.add(a.paymentId);
    lines.push({
      providerId: p.providerId,
      paymentId: a?.paymentId ?? p.paymentId,
      orderId: a?.orderId ?? null,
      orderNumber: a?.orderNumber ?? null,
      at: a?.createdAt ?? p.createdAt,
      amountCents: p.status === 'succeeded' ? p.receivedCents : (a?.amountCents ?? p.amountCents),
      providerStatus: p.status,
      juglineStatus: a?.status ?? null,
      ...chargeVerdict(p, a),
    });
  }
  for (const a of attempts) {
    if (paired.has(a.paymentId)) continue;
    lines.push({
      providerId: a.providerId,
      paymentId: a.paymentId,
      orderId: a.orderId,
      orderNumber: a.orderNumber,
      at: a.createdAt,
      amountCents: a.amountCents,
      providerStatus: provider ? 'missing' : null,
      juglineStatus: a.status,
      ...(provider ? chargeVerdict(undefined, a) : { match: 'unchecked' as const, note: 'unchecked' as const }),
    });
  }
  return lines.sort((x, y) => x.at.localeCompare(y.at) || (x.paymentId ?? Infinity) - (y.paymentId ?? Infinity));
}

function refundLines(provider: ProviderRefundLine[] | null, refunds: RefundLine[]): CardCheckRefund[] {
  const ours = new Map(refunds.filter((r) => r.providerId).map((r) => [r.providerId!, r]));
  const paired = new Set<number>();
  const lines: CardCheckRefund[] = [];
  const fromJugline = (r: RefundLine) => ({
    refundId: r.refundId,
    orderId: r.orderId,
    orderNumber: r.orderNumber,
    reason: r.reason,
    automatic: r.cause !== null,
    by: r.by,
  });
  for (const p of provider ?? []) {
    const r = ours.get(p.providerId);
    if (r) paired.add(r.refundId);
    const base = r ? fromJugline(r) : { refundId: null, orderId: null, orderNumber: null, reason: null, automatic: false, by: null };
    const verdict = !r
      ? { match: 'mismatch' as const, note: 'refund_not_recorded' as const }
      : r.amountCents === p.amountCents
        ? { match: 'matched' as const, note: 'refund_matched' as const }
        : { match: 'mismatch' as const, note: 'amount_differs' as const };
    lines.push({ providerId: p.providerId, at: r?.createdAt ?? p.createdAt, amountCents: p.amountCents, ...base, ...verdict });
  }
  for (const r of refunds) {
    if (paired.has(r.refundId)) continue;
    const note: CheckNote = !provider ? 'unchecked' : r.providerId ? 'refund_not_found' : 'refund_pending';
    lines.push({ providerId: r.providerId, at: r.createdAt, amountCents: r.amountCents, ...fromJugline(r), match: provider ? 'mismatch' : 'unchecked', note });
  }
  return lines.sort((x, y) => x.at.localeCompare(y.at) || (x.refundId ?? Infinity) - (y.refundId ?? Infinity));
}

const sum = <T>(xs: T[], f: (x: T) => number) => xs.reduce((n, x) => n + f(x), 0);

/**
 * Pairs the card service's charges and refunds of a day with Jugline's attempts and refunds of
 * the same day, and adds both sides up. `provider` null: the card service was not reached.
 */
export function reconcileDay(input: {
  provider: { charges: ProviderCharge[]; refunds: ProviderRefundLine[] } | null;
  attempts: AttemptLine[];
  refunds: RefundLine[];
}): CardCheckResult {
  const { provider, attempts, refunds } = input;
  const charges = chargeLines(provider?.charges ?? null, attempts);
  const refundRows = refundLines(provider?.refunds ?? null, refunds);

  const taken = attempts.filter((a) => TAKEN.includes(a.status));
  const jugline = {
    chargedCents: sum(taken, (a) => a.amountCents),
    refundedCents: sum(refunds, (r) => r.amountCents),
    netCents: 0,
    charges: taken.length,
    refunds: refunds.length,
    recordedCents: sum(
      taken.filter((a) => a.status === 'succeeded'),
      (a) => a.amountCents,
    ),
    givenBackCents: sum(
      refunds.filter((r) => r.cause !== null),
      (r) => r.amountCents,
    ),
  };
  jugline.netCents = jugline.chargedCents - jugline.refundedCents;

  let totals: CardCheckTotals | null = null;
  if (provider) {
    const succeeded = provider.charges.filter((c) => c.status === 'succeeded');
    const given = provider.refunds.filter((r) => r.status !== 'failed' && r.status !== 'canceled');
    const chargedCents = sum(succeeded, (c) => c.receivedCents);
    const refundedCents = sum(given, (r) => r.amountCents);
    totals = { chargedCents, refundedCents, netCents: chargedCents - refundedCents, charges: succeeded.length, refunds: given.length };
  }
  return {
    provider: totals,
    jugline,
    differenceCents: totals ? totals.netCents - jugline.netCents : null,
    mismatches: [...charges, ...refundRows].filter((l) => l.match === 'mismatch').length,
    charges,
    refunds: refundRows,
  };
}
