// The lead's card check for one café-local day: the card service's charges and refunds of the day
// beside Jugline's card attempts and refunds (src/domain/card-check.ts pairs and adds them up),
// and "settle", which asks the card service about every line still open and applies its answer
// (a charge is recorded against its order or given back; nothing is left unknown).
import type { Knex } from 'knex';
import { reconcileDay, type AttemptLine, type CardCheckView, type ProviderCharge, type ProviderRefundLine, type RefundLine } from '@/domain/card-check';
import { notSetUp, upstreamFailed } from '@server/domain-errors';
import { GatewayRefused, GatewayUnavailable, type ChargeState } from './gateway';
import { applyChargeState, settleOpenAttempts } from './card-settle';
import type { Deps } from '@server/deps';
import { businessDate } from '@/domain/business-date';
import { dayBounds } from '@server/reports/local-hours';
import { loadReportLocation } from '@server/reports/scope';

async function juglineSide(db: Knex, locationId: number, [from, to]: [string, string]) {
  const attempts: AttemptLine[] = (
    await db('payments as p')
      .join('orders as o', 'o.id', 'p.order_id')
      .where({ 'o.location_id': locationId, 'p.method': 'card' })
      .andWhere('p.created_at', '>=', from)
      .andWhere('p.created_at', '<', to)
      .orderBy('p.id')
      .select('p.id', 'p.order_id', 'o.number', 'p.status', 'p.amount_cents', 'p.provider_id', 'p.created_at')
  ).map((r) => ({
    paymentId: r.id,
    orderId: r.order_id,
    orderNumber: r.number,
    status: r.status,
    amountCents: r.amount_cents,
    providerId: r.provider_id ?? null,
    createdAt: r.created_at,
  }));
  const refunds: RefundLine[] = (
    await db('refunds as r')
      .join('payments as p', 'p.id', 'r.payment_id')
      .join('orders as o', 'o.id', 'r.order_id')
      .leftJoin('users as u', 'u.id', 'r.created_by')
      .where({ 'o.location_id': locationId, 'p.method': 'card' })
      .andWhere('r.created_at', '>=', from)
      .andWhere('r.created_at', '<', to)
      .orderBy('r.id')
      .select('r.id', 'r.order_id', 'o.number', 'r.amount_cents', 'r.reason', 'r.cause', 'r.provider_id', 'r.created_at', 'u.name')
  ).map((r) => ({
    refundId: r.id,
    orderId: r.order_id,
    orderNumber: r.number,
    amountCents: r.amount_cents,
    reason: r.reason,
    cause: r.cause ?? null,
    providerId: r.provider_id ?? null,
    createdAt: r.created_at,
    by: r.name ?? null,
  }));
  return { attempts, refunds };
}

/** Card payments of this café (any day) among these charge ids: for charges made before metadata named the café. */
async function ourChargeIds(db: Knex, locationId: number, chargeIds: string[]): Promise<Set<string>> {
  const found = new Set<string>();
  for (let i = 0; i < chargeIds.length; i += 500) {
    const rows = await db('payments as p')
      .join('orders as o', 'o.id', 'p.order_id')
      .where({ 'o.location_id': locationId })
      .whereIn('p.provider_id', chargeIds.slice(i, i + 500))
      .select('p.provider_id');
    for (const r of rows) found.add(r.provider_id);
  }
  return found;
}

/** The card service's charges and refunds of the day that are this café's. */
async function providerSide(deps: Deps, locationId: number, [from, to]: [number, number]) {
  const gateway = deps.payments!;
  const listed = await gateway.listCharges(from, to);
  const refundsListed = await gateway.listRefunds(from, to);
  const known = await ourChargeIds(deps.db, locationId, [
    ...listed.filter((c) => c.metadata.paymentId && !c.metadata.locationId).map((c) => c.providerId),
    ...refundsListed.flatMap((r) => (r.chargeId ? [r.chargeId] : [])),
  ]);
  const charges = listed.filter((c) => c.metadata.locationId === String(locationId) || known.has(c.providerId));
  const ours = new Set(charges.map((c) => c.providerId));
  const refunds: ProviderRefundLine[] = refundsListed.filter((r) => r.chargeId && (ours.has(r.chargeId) || known.has(r.chargeId)));
  return { states: charges, charges: charges.map(toLine), refunds };
}

function toLine(c: ChargeState): ProviderCharge {
  const paymentId = Number(c.metadata.paymentId);
  return {
    providerId: c.providerId,
    status: c.status,
    amountCents: c.amountCents,
    receivedCents: c.receivedCents,
    createdAt: c.createdAt,
    paymentId: Number.isInteger(paymentId) && paymentId > 0 ? paymentId : null,
  };
}

export async function cardCheck(deps: Deps, locationId: number, date?: string): Promise<CardCheckView> {
  const location = await loadReportLocation(deps.db, locationId);
  const day = date ?? businessDate(deps.clock(), location.timeZone);
  const bounds = dayBounds(day, location.timeZone);
  const jugline = await juglineSide(deps.db, locationId, [new Date(bounds[0]).toISOString(), new Date(bounds[1]).toISOString()]);
  let provider: Awaited<ReturnType<typeof providerSide>> | null = null;
  let providerNote: string | null = null;
  if (!deps.payments) providerNote = 'Card payments are not set up here.';
  else {
    try {
      provider = await providerSide(deps, locationId, bounds);
    } catch (err) {
      if (!(err instanceof GatewayUnavailable || err instanceof GatewayRefused)) throw err;
      providerNote = 'The card service did not answer, so its side is missing. Try again in a moment.';
    }
  }
  return {
    date: day,
    currency: location.currency,
    locale: location.locale,
    timeZone: location.timeZone,
    providerNote,
    ...reconcileDay({ provider, ...jugline }),
  };
}

/**
 * The lead's "settle": every attempt of the day whose outcome Jugline doesn't know or whose
 * automatic refund isn't confirmed, and every charge the card service made that Jugline hasn't
 * recorded or given back, is asked about and applied. Answers the day's check afterwards.
 */
export async function settleCardDay(deps: Deps, locationId: number, date: string): Promise<CardCheckView> {
  if (!deps.payments) throw notSetUp('Card payments are not set up here');
  const location = await loadReportLocation(deps.db, locationId);
  const bounds = dayBounds(date, location.timeZone);
  const unavailable = () => upstreamFailed('The card service did not answer; some lines are still open. Try again in a moment.');
  let side;
  try {
    side = await providerSide(deps, locationId, bounds);
  } catch (err) {
    if (err instanceof GatewayUnavailable || err instanceof GatewayRefused) throw unavailable();
    throw err;
  }
  const { attempts } = await juglineSide(deps.db, locationId, [new Date(bounds[0]).toISOString(), new Date(bounds[1]).toISOString()]);
  const byId = new Map(attempts.map((a) => [a.paymentId, a]));
  let allKnown = true;
  const remember = (known: boolean) => (allKnown &&= known);
  for (const orderId of new Set(attempts.filter((a) => ['unknown', 'processing', 'refunding'].includes(a.status)).map((a) => a.orderId))) {
    remember(await settleOpenAttempts(deps, orderId));
  }
  for (const state of side.states) {
    const a = byId.get(toLine(state).paymentId ?? 0);
    if (state.status !== 'succeeded' || !a || a.status === 'succeeded' || a.status === 'refunded') continue;
    try {
      await applyChargeState(deps, a.paymentId, state);
    } catch (err) {
      if (!(err instanceof GatewayUnavailable || err instanceof GatewayRefused)) throw err;
      remember(false);
    }
  }
  if (!allKnown) throw unavailable();
  return cardCheck(deps, locationId, date);
}
