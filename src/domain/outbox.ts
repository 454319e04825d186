// A mail as the Outbox screen shows it: what the local SMTP fake caught. Shared by the API,
// the server-side render and the screen.
export interface OutboxMail {
  id: number;
  messageId: string;
  from: string;
  to: string[];
  subject: string;
  text: string;
  html: string | null;
  receivedAt: string;
}

/** GET /api/outbox: the café's caught mail, newest first, and how to write its times. */
export interface OutboxView {
  mails: OutboxMail[];
  timeZone: string;
  locale: string;
}
