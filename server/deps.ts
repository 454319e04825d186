// What every service receives: the database, the clock and the realtime hub.
import type { EventEmitter } from 'node:events';
import type { Knex } from 'knex';
import type { PaymentGateway } from './payments/gateway';
import type { Hub } from './realtime/hub';
import type { Mailer } from './mail/outbox';

export type Clock = () => Date;

export interface Deps {
  db: Knex;
  clock: Clock;
  hub: Hub;
  /** Card payments; null where no card service is set up (cash only). */
  payments: PaymentGateway | null;
  /** Outgoing mail (receipts, shift reports); null where none is set up. */
  mailer: Mailer | null;
  /** 'signed-out' (session id): the live sockets of that session are closed. */
  sessions: EventEmitter;
}
