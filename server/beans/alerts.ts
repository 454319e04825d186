// What Pulse says about the coffee: grinders running low or out, lots past their best.
import type { Knex } from 'knex';
import { beanAlerts, type BeanAlert } from '@/domain/bean-stock';
import { loadLotViews } from './views';

export async function pulseBeanAlerts(db: Knex, locationId: number, now: Date, timeZone: string): Promise<BeanAlert[]> {
  return beanAlerts(await loadLotViews(db, { locationId, timeZone, now, includeRetired: false }));
}
