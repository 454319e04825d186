// Card payments for this process: the real provider when keys are configured, otherwise the
// local fake on loopback, so dev, tests and the demo take cards with no outside service.
import { startPaymentFake, type PaymentFake } from '@server/fakes/payment-fake';
import { createStripeGateway, type PaymentGateway } from './gateway';

export interface Payments {
  gateway: PaymentGateway;
  /** The secret webhooks are signed with (tests sign their own events with it). */
  webhookSecret: string;
  /** The local fake when no keys are set (tests flip its faults), null with the real provider. */
  fake: PaymentFake | null;
  /** Tell the fake where to send webhooks once the app is listening. */
  listening(appUrl: string, webhookPath: string): void;
  close(): Promise<void>;
}

export async function startPayments(opts: {
  secretKey?: string;
  webhookSecret?: string;
  log?: (line: string) => void;
  /** Dates the fake's objects, so a test clock and the fake agree on the day. */
  clock?: () => Date;
}): Promise<Payments> {
  if (opts.secretKey && opts.webhookSecret) {
    const gateway = createStripeGateway({ secretKey: opts.secretKey, webhookSecret: opts.webhookSecret });
    return { gateway, webhookSecret: opts.webhookSecret, fake: null, listening: () => {}, close: async () => {} };
  }
  const fake = await startPaymentFake({ clock: opts.clock });
  opts.log?.(`Card payments go to the local payment fake at ${fake.url} (no real money moves).`);
  const gateway = createStripeGateway({
    secretKey: fake.secretKey,
    webhookSecret: fake.webhookSecret,
    endpoint: { host: fake.host, port: fake.port, protocol: 'http' },
  });
  return {
    gateway,
    webhookSecret: fake.webhookSecret,
    fake,
    listening: (appUrl, webhookPath) => fake.setWebhookUrl(`${appUrl}/api${webhookPath}`),
    close: () => fake.close(),
  };
}
