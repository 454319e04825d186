// Sending mail through a real SMTP client (nodemailer), and the outbox table the local SMTP fake
// fills. The same mailer talks to the fake in the demo and to SMTP_URL in real use.
import type { Knex } from 'knex';
import nodemailer from 'nodemailer';
import type { OutboxMail, OutboxView } from '@/domain/outbox';
import { json } from '@server/db/rows';
import { LOCATION_HEADER, OWNER_ONLY_HEADER, startSmtpFake, type ReceivedMail } from '@server/fakes/smtp-fake';
import type { Role } from '@/domain/roles';

export type MailTransport = { host: string; port: number } | { url: string };

export interface OutgoingMail {
  to: string | string[];
  subject: string;
  text: string;
  html?: string;
  /** Shown as the sender's name (e.g. the café's), keeping the mailer's address. */
  fromName?: string;
  /** The café the mail is for, so the Outbox lists it only to that café's people. */
  locationId?: number;
  /** Carries a sign-in link: the Outbox lists it to the owner only. */
  ownerOnly?: boolean;
}

export interface Mailer {
  send(mail: OutgoingMail): Promise<{ messageId: string }>;
  close(): void;
}

// A sending request waits on SMTP; a dead server should fail the request in seconds, not minutes.
const TIMEOUTS = { connectionTimeout: 10_000, greetingTimeout: 10_000, socketTimeout: 30_000 };

/** `from` is the default sender, e.g. { name: 'Harbour & Hearth Coffee', address: 'receipts@jugline.local' }. */
export function createMailer(transport: MailTransport, from: { name: string; address: string }): Mailer {
  const transporter =
    'url' in transport
      ? nodemailer.createTransport({ url: transport.url, ...TIMEOUTS })
      : nodemailer.createTransport({ host: transport.host, port: transport.port, secure: false, ...TIMEOUTS });
  return {
    async send(mail) {
      const info = await transporter.sendMail({
        from: { name: mail.fromName ?? from.name, address: from.address },
        to: mail.to,
        subject: mail.subject,
        text: mail.text,
        html: mail.html,
        headers: {
          ...(mail.locationId ? { [LOCATION_HEADER]: String(mail.locationId) } : {}),
          ...(mail.ownerOnly ? { [OWNER_ONLY_HEADER]: 'yes' } : {}),
        },
      });
      return { messageId: info.messageId };
    },
    close: () => transporter.close(),
  };
}

export async function storeReceivedMail(db: Knex, mail: ReceivedMail): Promise<void> {
  await db('outbox').insert({
    message_id: mail.messageId,
    from_address: mail.from,
    to_addresses: JSON.stringify(mail.to),
    subject: mail.subject,
    text_body: mail.text,
    html_body: mail.html,
    location_id: mail.locationId,
    owner_only: mail.ownerOnly,
    received_at: mail.receivedAt,
  });
}

/** The café's caught mail, newest first; sign-in links only for the owner. */
export async function listOutbox(db: Knex, locationId: number, role: Role, limit = 100): Promise<OutboxMail[]> {
  const rows = await db('outbox')
    .where({ location_id: locationId })
    .whereIn('owner_only', role === 'owner' ? [0, 1] : [0])
    .orderBy([
      { column: 'received_at', order: 'desc' },
      { column: 'id', order: 'desc' },
    ])
    .limit(limit);
  return rows.map((r) => ({
    id: r.id,
    messageId: r.message_id,
    from: r.from_address,
    to: json<string[]>(r.to_addresses, []),
    subject: r.subject,
    text: r.text_body,
    html: r.html_body,
    receivedAt: r.received_at,
  }));
}

/** The Outbox screen's data: the mail and the café's zone and locale, so the server's HTML and the
 * browser write the same times. */
export async function outboxView(db: Knex, locationId: number, role: Role, limit = 100): Promise<OutboxView> {
  const l = await db('locations').where({ id: locationId }).first('time_zone', 'locale');
  return { mails: await listOutbox(db, locationId, role, limit), timeZone: l?.time_zone ?? 'UTC', locale: l?.locale ?? 'en-US' };
}

export interface MailSetup {
  mailer: Mailer;
  close(): Promise<void>;
}

/**
 * The mailer the app sends with: to SMTP_URL when set, else to a local SMTP fake started here
 * whose mail is stored in the outbox table (so the demo needs no outside service).
 */
export async function startMail(
  opts: { smtpUrl?: string; db: Knex; clock?: () => Date; log?: (line: string) => void },
  from = { name: 'Jugline', address: 'receipts@jugline.local' },
): Promise<MailSetup> {
  if (opts.smtpUrl) {
    const mailer = createMailer({ url: opts.smtpUrl }, from);
    return { mailer, close: async () => mailer.close() };
  }
  const fake = await startSmtpFake({ onMessage: (mail) => storeReceivedMail(opts.db, mail), clock: opts.clock });
  opts.log?.(`Mail is caught by a local SMTP fake on ${fake.host}:${fake.port} and shown at /outbox; set SMTP_URL to send for real.`);
  const mailer = createMailer({ host: fake.host, port: fake.port }, from);
  return {
    mailer,
    close: async () => {
      mailer.close();
      await fake.close(); // waits for a mail still being stored, so close the database after this
    },
  };
}
