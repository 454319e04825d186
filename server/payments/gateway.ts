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

export interface PaymentGateway {
  /** Create and confirm a payment; resolves once it has succeeded, throws CardDeclined otherwise. */
  chargeCard(input: {
    amountCents: number;
    currency: string;
    paymentMethod: string;
    idempotencyKey: string;
    metadata: Record<string, string>;
  }): Promise<{ providerId: string }>;
  cancel(providerId: string): Promise<void>;
  refund(input: { providerId: string; amountCents: number; idempotencyKey: string; reason: string }): Promise<{ providerId: string }>;
  /** Verify the provider's signature on a webhook; throws on a bad or stale signature. */
  parseWebhook(rawBody: Buffer, signature: string): Stripe.Event;
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

  return {
    async chargeCard({ amountCents, currency, paymentMethod, idempotencyKey, metadata }) {
      try {
        const pi = await stripe.paymentIntents.create(
          {
            amount: amountCents,
            currency: currency.toLowerCase(),
            payment_method: paymentMethod,
            confirm: true,
            metadata,
          },
          { idempotencyKey },
        );
        if (pi.status !== 'succeeded') throw new CardDeclined('The card was not charged', 'not_succeeded', null, pi.id);
        return { providerId: pi.id };
      } catch (err) {
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
    async refund({ providerId, amountCents, idempotencyKey, reason }) {
      try {
        const refund = await stripe.refunds.create(
          { payment_intent: providerId, amount: amountCents, metadata: { reason } },
          { idempotencyKey },
        );
        return { providerId: refund.id };
      } catch (err) {
        return wrap(err);
      }
    },
    parseWebhook(rawBody, signature) {
      return stripe.webhooks.constructEvent(rawBody, signature, config.webhookSecret);
    },
  };
}
