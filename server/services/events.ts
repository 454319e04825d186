// The events table is the realtime log: appended inside each command's transaction, published
// after commit, replayed to screens that resume.
import type { Knex } from 'knex';
import type { AnyLiveEvent, MenuEvent, ShiftView, TicketEventType, TicketView } from '../../src/domain/types';
import type { Deps } from './deps';

export interface PendingEvent {
  locationId: number;
  event: AnyLiveEvent;
}

async function insertEvent(trx: Knex.Transaction, locationId: number, type: string, payload: object, at: string, actorId: number | null) {
  const [{ id }] = await trx('events')
    .insert({ location_id: locationId, type, payload: JSON.stringify(payload), actor_id: actorId, created_at: at })
    .returning('id');
  return id as number;
}

export async function appendEvent(
  trx: Knex.Transaction,
  locationId: number,
  type: TicketEventType,
  ticket: TicketView,
  at: string,
  actorId: number | null,
): Promise<PendingEvent> {
  const seq = await insertEvent(trx, locationId, type, { ticket }, at, actorId);
  return { locationId, event: { seq, type, at, ticket } };
}

export async function appendShiftEvent(
  trx: Knex.Transaction,
  locationId: number,
  shift: ShiftView,
  at: string,
  actorId: number | null,
): Promise<PendingEvent> {
  const seq = await insertEvent(trx, locationId, 'shift.changed', { shift }, at, actorId);
  return { locationId, event: { seq, type: 'shift.changed', at, shift } };
}

export async function appendMenuEvent(
  trx: Knex.Transaction,
  locationId: number,
  item: MenuEvent['item'],
  at: string,
  actorId: number | null,
): Promise<PendingEvent> {
  const seq = await insertEvent(trx, locationId, 'menu.availability', { item }, at, actorId);
  return { locationId, event: { seq, type: 'menu.availability', at, item } };
}

/** The menu changed in the back office; every screen reloads it. */
export async function appendMenuChangedEvent(trx: Knex.Transaction, locationId: number, at: string, actorId: number | null): Promise<PendingEvent> {
  const seq = await insertEvent(trx, locationId, 'menu.changed', {}, at, actorId);
  return { locationId, event: { seq, type: 'menu.changed', at } };
}

/** A dial-in shot was logged; the Bar's grinder line reloads (the menu does not). */
export async function appendBeansChangedEvent(trx: Knex.Transaction, locationId: number, at: string, actorId: number | null): Promise<PendingEvent> {
  const seq = await insertEvent(trx, locationId, 'beans.changed', {}, at, actorId);
  return { locationId, event: { seq, type: 'beans.changed', at } };
}

/** Run a command in one transaction; publish its events only once it has committed. */
export async function runCommand<T>(
  deps: Deps,
  work: (trx: Knex.Transaction) => Promise<{ result: T; events: PendingEvent[] }>,
): Promise<T> {
  const { result, events } = await deps.db.transaction(work);
  for (const { locationId, event } of events) deps.hub.publish(locationId, event);
  return result;
}

export async function latestSeq(db: Knex | Knex.Transaction, locationId: number): Promise<number> {
  const row = await db('events').where({ location_id: locationId }).max<{ seq: number | null }>({ seq: 'id' }).first();
  return row?.seq ?? 0;
}

/** Events after `since`, oldest first; `limit + 1` rows tell the caller it is too far behind. */
export async function eventsSince(db: Knex, locationId: number, since: number, limit: number): Promise<AnyLiveEvent[]> {
  const rows = await db('events')
    .where({ location_id: locationId })
    .andWhere('id', '>', since)
    .orderBy('id')
    .limit(limit + 1)
    .select('id', 'type', 'payload', 'created_at');
  return rows.map((r) => ({
    seq: r.id,
    type: r.type,
    at: r.created_at,
    ...(typeof r.payload === 'string' ? JSON.parse(r.payload) : r.payload),
  }));
}

/**
 * Whether more than `n` events follow `since`: one probe along the (location_id, id) index, so a
 * screen too far behind for a replay costs no read of the payloads it would never be sent.
 */
export async function moreEventsThan(db: Knex, locationId: number, since: number, n: number): Promise<boolean> {
  const row = await db('events').where({ location_id: locationId }).andWhere('id', '>', since).orderBy('id').offset(n).first('id');
  return row !== undefined;
}
