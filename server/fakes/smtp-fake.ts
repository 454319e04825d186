// A local stand-in for a hosted mail service: a real SMTP server on loopback that the real
// mail client (nodemailer) talks to. It parses what arrives and hands it on to be stored, so the
// demo shows its mail in the Outbox and nothing leaves the machine.
import type { AddressInfo } from 'node:net';
import { simpleParser, type AddressObject } from 'mailparser';
import { SMTPServer } from 'smtp-server';

/** Header a sender may set so the fake knows which café a mail belongs to (see server/mail/outbox.ts). */
export const LOCATION_HEADER = 'x-jugline-location';
/** Set on mail with a sign-in link; the Outbox shows such mail to the owner only. */
export const OWNER_ONLY_HEADER = 'x-jugline-owner-only';

export interface ReceivedMail {
  messageId: string;
  from: string;
  to: string[];
  subject: string;
  text: string;
  html: string | null;
  /** The café the mail was sent for, from LOCATION_HEADER; null when the sender gave none. */
  locationId: number | null;
  ownerOnly: boolean;
  receivedAt: string;
}

export interface SmtpFake {
  host: '127.0.0.1';
  port: number;
  close(): Promise<void>;
}

const MAX_BYTES = 1024 * 1024; // receipts are a few kilobytes; anything near this is a mistake

function addresses(field: AddressObject | AddressObject[] | undefined): string[] {
  return ([] as AddressObject[])
    .concat(field ?? [])
    .flatMap((a) => a.value)
    .map((v) => v.address ?? '')
    .filter(Boolean);
}

export async function startSmtpFake(opts: {
  onMessage(mail: ReceivedMail): Promise<void> | void;
  port?: number;
  /** The app's clock, so receivedAt agrees with the times the rest of Jugline writes. */
  clock?: () => Date;
}): Promise<SmtpFake> {
  const clock = opts.clock ?? (() => new Date());
  const server = new SMTPServer({
    name: 'jugline-smtp-fake',
    authOptional: true,
    disabledCommands: ['STARTTLS'], // loopback only, and a self-signed certificate would buy nothing
    size: MAX_BYTES,
    logger: false,
    closeTimeout: 2000,
    onData(stream, session, callback) {
      simpleParser(stream)
        .then(async (parsed) => {
          // smtp-server still drains an oversized message; refuse it once it has been read
          if (stream.sizeExceeded) {
            const err = Object.assign(new Error('Message exceeds the 1 MB limit'), { responseCode: 552 });
            return callback(err);
          }
          const envelopeTo = session.envelope.rcptTo.map((r) => r.address);
          const headerTo = addresses(parsed.to);
          const location = Number(parsed.headers.get(LOCATION_HEADER));
          await opts.onMessage({
            messageId: parsed.messageId ?? `<fake-${clock().getTime()}@jugline.local>`,
            from: parsed.from?.text ?? (session.envelope.mailFrom ? session.envelope.mailFrom.address : ''),
            to: headerTo.length ? headerTo : envelopeTo,
            subject: parsed.subject ?? '',
            text: parsed.text ?? '',
            html: parsed.html === false ? null : (parsed.html ?? null),
            locationId: Number.isInteger(location) && location > 0 ? location : null,
            ownerOnly: parsed.headers.get(OWNER_ONLY_HEADER) === 'yes',
            receivedAt: clock().toISOString(),
          });
          callback(null, 'Stored');
        })
        // a message we could not parse or store is refused, so the sender sees the failure
        .catch((err: Error) => callback(Object.assign(err, { responseCode: 451 })));
    },
  });
  // A client dropping its connection is that client's problem; it must not crash the app.
  server.on('error', () => {});

  await new Promise<void>((resolve, reject) => {
    server.server.once('error', reject);
    server.listen(opts.port ?? 0, '127.0.0.1', () => resolve());
  });
  const { port } = server.server.address() as AddressInfo;

  let closing: Promise<void> | undefined;
  return {
    host: '127.0.0.1',
    port,
    close: () => (closing ??= new Promise<void>((resolve) => server.close(() => resolve()))),
  };
}
