// What every service receives: the database, the clock and the realtime hub.
import type { Knex } from 'knex';
import type { Hub } from '../realtime/hub';

export type Clock = () => Date;

export interface Deps {
  db: Knex;
  clock: Clock;
  hub: Hub;
}
