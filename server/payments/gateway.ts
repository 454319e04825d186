// Card payments through the provider's official SDK. In dev and test the SDK talks to the local
// fake (server/fakes/payment-fake.ts); with a real key it talks to the provider.
import Stripe from 'stripe';

export class CardDeclined extends Error {
  constructor(
    message: string,
    readonly code: string,
    readonly declineCode: string | null,
    readonly providerId: string | null,
  ) {
    super(message);
  }
}

export class GatewayUnavailable extends Error {}
/** The provider looked at the request and said no (e.g. nothing left to refund). */
export class GatewayRefused extends Error {}

/** What the provider says about one charge (one PaymentIntent). */
export interface ChargeState {
  providerId: string;
  /**
   * succeeded: money taken. declined: the card said no. open: never confirmed, so no money moved.
   * canceled: closed without money. pending: the provider is still working on it.
   */
  status: 'succeeded' | 'declined' | 'open' | 'canceled' | 'pending';
  amountCents: number;
  /** what was taken (0 unless succeeded) */
  receivedCents: number;
  currency: string;
  metadata: Record<string, string>;
  createdAt: string;
  declineCode: string | null;
}

/** A refund the provider made. */
export interface ProviderRefund {
  providerId: string;
  /** the charge (PaymentIntent) it gives money back from */
  chargeId: string | null;
  amountCents: number;
  status: string;
  createdAt: string;
}

export interface PaymentGateway {
  /**
   * Create the charge without taking money yet, so its id can be stored before the card is run:
   * if the answer to the next step is lost, Jugline can still ask what became of it.
   */
  createCharge(input: {
    amountCents: number;
    currency: string;
    paymentMethod: string;
    idempotencyKey: string;
    metadata: Record<string, string>;
  }): Promise<{ providerId: string }>;
  /** Run the card; resolves once the charge has succeeded, throws CardDeclined otherwise. */
  confirmCharge(input: { providerId: string; idempotencyKey: string }): Promise<ChargeState>;
  /** The charge as the provider has it now; null when it has none by that id. */
  lookupCharge(providerId: string): Promise<ChargeState | null>;
  cancel(providerId: string): Promise<void>;
  refund(input: {
    providerId: string;
    amountCents: number;
    idempotencyKey: string;
    /** kept with the refund at the provider */
    reason: string;
    /** the provider's own reason code, when one fits */
    providerReason?: 'duplicate' | 'requested_by_customer';
    metadata?: Record<string, string>;
  }): Promise<{ providerId: string }>;
  /** Every charge the provider created in [fromMs, toMs), whatever became of it. */
  listCharges(fromMs: number, toMs: number): Promise<ChargeState[]>;
  /** Every refund the provider made in [fromMs, toMs). */
  listRefunds(fromMs: number, toMs: number): Promise<ProviderRefund[]>;
  /** Verify the provider's signature on a webhook; throws on a bad or stale signature. */
  parseWebhook(rawBody: Buffer, signature: string): Stripe.Event;
}

const iso = (unixSeconds: number) => new Date(unixSeconds * 1000).toISOString();

function chargeState(pi: Stripe.PaymentIntent): ChargeState {
  const status: ChargeState['status'] =
    pi.status === 'succeeded'
      ? 'succeeded'
      : pi.status === 'canceled'
        ? 'canceled'
        : pi.status === 'requires_payment_method' && pi.last_payment_error
          ? 'declined'
          : pi.status === 'requires_payment_method' || pi.status === 'requires_confirmation'
            ? 'open'
            : 'pending';
  return {
    providerId: pi.id,
    status,
    amountCents: pi.amount,
    receivedCents: pi.amount_received ?? 0,
    currency: pi.currency,
    metadata: (pi.metadata ?? {}) as Record<string, string>,
    createdAt: iso(pi.created),
    declineCode: pi.last_payment_error?.decline_code ?? pi.last_payment_error?.code ?? null,
  };
}

export interface GatewayConfig {
  secretKey: string;
  webhookSecret: string;
  /** Where the API is; left out for the provider's own. */
  endpoint?: { host: string; port: number; protocol: 'http' | 'https' };
}

export function createStripeGateway(config: GatewayConfig): PaymentGateway {
  const stripe = new Stripe(config.secretKey, {
    ...(config.endpoint ?? {}),
    maxNetworkRetries: 2, // retried with the same idempotency key, so never a second charge
    timeout: 15_000,
  });

  const wrap = (err: unknown): never => {
    if (err instanceof Stripe.errors.StripeCardError) {
      const pi = (err.raw as { payment_intent?: { id?: string } } | undefined)?.payment_intent;
      throw new CardDeclined(err.message, err.code ?? 'card_declined', err.decline_code ?? null, pi?.id ?? null);
    }
    if (err instanceof Stripe.errors.StripeConnectionError || err instanceof Stripe.errors.StripeAPIError) {
      throw new GatewayUnavailable(err.message);
    }
    if (err instanceof Stripe.errors.StripeInvalidRequestError || err instanceof Stripe.errors.StripeIdempotencyError) {
      throw new GatewayRefused(err.message);
    }
    throw err;
  };

  const range = (fromMs: number, toMs: number) => ({ gte: Math.ceil(fromMs / 1000), lt: Math.ceil(toMs / 1000) });

  return {
    async createCharge({ amountCents, currency, paymentMethod, idempotencyKey, metadata }) {
      try {
        const pi = await stripe.paymentIntents.create(
          { amount: amountCents, currency: currency.toLowerCase(), payment_method: paymentMethod, metadata },
          { idempotencyKey },
        );
        return { providerId: pi.id };
      } catch (err) {
        return wrap(err);
      }
    },
    async confirmCharge({ providerId, idempotencyKey }) {
      try {
        const pi = await stripe.paymentIntents.confirm(providerId, {}, { idempotencyKey });
        if (pi.status !== 'succeeded') throw new CardDeclined('The card was not charged', 'not_succeeded', null, pi.id);
        return chargeState(pi);
      } catch (err) {
        return wrap(err);
      }
    },
    async lookupCharge(providerId) {
      try {
        return chargeState(await stripe.paymentIntents.retrieve(providerId));
      } catch (err) {
        if (err instanceof Stripe.errors.StripeInvalidRequestError && err.statusCode === 404) return null;
        return wrap(err);
      }
    },
    async cancel(providerId) {
      try {
        await stripe.paymentIntents.cancel(providerId);
      } catch (err) {
        wrap(err);
      }
    },
    async refund({ providerId, amountCents, idempotencyKey, reason, providerReason, metadata }) {
      try {
        const refund = await stripe.refunds.create(
          { payment_intent: providerId, amount: amountCents, reason: providerReason, metadata: { ...metadata, reason } },
          { idempotencyKey },
        );
        return { providerId: refund.id };
      } catch (err) {
        return wrap(err);
      }
    },
    async listCharges(fromMs, toMs) {
      try {
        const out: ChargeState[] = [];
        for await (const pi of stripe.paymentIntents.list({ created: range(fromMs, toMs), limit: 100 })) out.push(chargeState(pi));
        return out;
      } catch (err) {
        return wrap(err);
      }
    },
    async listRefunds(fromMs, toMs) {
      try {
        const out: ProviderRefund[] = [];
        for await (const r of stripe.refunds.list({ created: range(fromMs, toMs), limit: 100 })) {
          out.push({
            providerId: r.id,
            chargeId: typeof r.payment_intent === 'string' ? r.payment_intent : (r.payment_intent?.id ?? null),
            amountCents: r.amount,
            status: r.status ?? 'succeeded',
            createdAt: iso(r.created),
          });
        }
        return out;
      } catch (err) {
        return wrap(err);
      }
    },
    parseWebhook(rawBody, signature) {
      return stripe.webhooks.constructEvent(rawBody, signature, config.webhookSecret);
    },
  };
}
