// The events table is the realtime log: appended inside each command's transaction, published
// after commit, replayed to screens that resume.
import type { Knex } from 'knex';
import type { AnyLiveEvent, MenuEvent, ShiftView, TicketEventType, TicketView } from '@/domain/types';
import { lockingRead } from './db/dialect';
import type { Deps } from './deps';
import type { Db } from './db/knex';

export interface PendingEvent {
  locationId: number;
  /** Its number is taken when the command's transaction writes it, as its last step. */
  event: AnyLiveEvent;
  actorId: number | null;
}

/** An event the command will write at its end; `seq` is filled in then (writeEvents). */
function pending(locationId: number, event: AnyLiveEvent, actorId: number | null): PendingEvent {
  return { locationId, event, actorId };
}

/** The events of a command that changed what loadMenu reads: the menu, the café's settings, the
 * baristas on bar (the quote's). Every such command writes one (screens reload on it). */
const MENU_CHANGES: ReadonlySet<string> = new Set(['menu.availability', 'menu.changed', 'shift.changed']);

/**
 * Write the command's events as the last step of its transaction: take their numbers from the
 * café's counter row (one upsert, RETURNING the new last number), which the transaction then holds
 * until it commits. So a command's numbers follow every number committed before it, a command
 * that takes numbers after it waits for its commit, and a rolled-back command gives its numbers
 * back: per café the sequence is gap-free and in commit order, and a screen that resumes from n
 * can't later miss a smaller number. Same SQL on SQLite and PostgreSQL.
 */
async function writeEvents(trx: Knex.Transaction, events: PendingEvent[]): Promise<void> {
  const cafes = [...new Set(events.map((e) => e.locationId))].sort((a, b) => a - b); // one lock order
  for (const locationId of cafes) {
    const mine = events.filter((e) => e.locationId === locationId);
    // a command that changed what the menu reads moves the café's menu version with its number
    const menuChanges = mine.filter((e) => MENU_CHANGES.has(e.event.type)).length;
    const [{ last_seq: last }] = await trx('event_seqs')
      .insert({ location_id: locationId, last_seq: mine.length, menu_version: menuChanges })
      .onConflict('location_id')
      .merge({
        last_seq: trx.raw('?? + ?', ['event_seqs.last_seq', mine.length]),
        ...(menuChanges ? { menu_version: trx.raw('?? + ?', ['event_seqs.menu_version', menuChanges]) } : {}),
      })
      .returning('last_seq');
    mine.forEach((e, i) => (e.event.seq = Number(last) - mine.length + 1 + i));
    await trx('events').insert(
      mine.map(({ event: { seq, type, at, ...payload }, actorId }) => ({
        location_id: locationId,
        seq,
        type,
        payload: JSON.stringify(payload),
        actor_id: actorId,
        created_at: at,
      })),
    );
  }
}

export async function appendEvent(
  _trx: Knex.Transaction, // the command's own: its event is written as its transaction's last step
  locationId: number,
  type: TicketEventType,
  ticket: TicketView,
  at: string,
  actorId: number | null,
): Promise<PendingEvent> {
  return pending(locationId, { seq: 0, type, at, ticket }, actorId);
}

export async function appendShiftEvent(
  _trx: Knex.Transaction, // the command's own: its event is written as its transaction's last step
  locationId: number,
  shift: ShiftView,
  at: string,
  actorId: number | null,
): Promise<PendingEvent> {
  return pending(locationId, { seq: 0, type: 'shift.changed', at, shift }, actorId);
}

export async function appendMenuEvent(
  _trx: Knex.Transaction, // the command's own: its event is written as its transaction's last step
  locationId: number,
  item: MenuEvent['item'],
  at: string,
  actorId: number | null,
): Promise<PendingEvent> {
  return pending(locationId, { seq: 0, type: 'menu.availability', at, item }, actorId);
}

/** The menu changed in the back office; every screen reloads it. */
export async function appendMenuChangedEvent(_trx: Knex.Transaction, locationId: number, at: string, actorId: number | null): Promise<PendingEvent> {
  return pending(locationId, { seq: 0, type: 'menu.changed', at }, actorId);
}

/** A dial-in shot was logged; the Bar's grinder line reloads (the menu does not). */
export async function appendBeansChangedEvent(_trx: Knex.Transaction, locationId: number, at: string, actorId: number | null): Promise<PendingEvent> {
  return pending(locationId, { seq: 0, type: 'beans.changed', at }, actorId);
}

/** Run a command in one transaction; publish its events only once it has committed. */
export async function runCommand<T>(deps: Deps, work: (trx: Knex.Transaction) => Promise<{ result: T; events: PendingEvent[] }>): Promise<T> {
  const { result, events } = await deps.db.transaction(async (trx) => {
    const done = await work(trx);
    await writeEvents(trx, done.events);
    return done;
  });
  for (const { locationId, event } of events) deps.hub.publish(locationId, event);
  return result;
}

/**
 * Holds the café's own row until the command commits, for a command that numbers something by
 * reading the last number (order numbers, bump numbers): the next such command of the café waits
 * here, so it reads the number this one wrote. Taken before any other row lock of the command.
 */
export async function lockCafe(trx: Knex.Transaction, locationId: number): Promise<void> {
  await lockingRead(trx, trx('locations').where({ id: locationId })).first('id');
}

export async function latestSeq(db: Db, locationId: number): Promise<number> {
  const row = await db('events').where({ location_id: locationId }).max<{ seq: number | null }>({ seq: 'seq' }).first();
  return Number(row?.seq ?? 0);
}

/** Events after `since`, oldest first; `limit + 1` rows tell the caller it is too far behind. */
export async function eventsSince(db: Knex, locationId: number, since: number, limit: number): Promise<AnyLiveEvent[]> {
  const rows = await db('events')
    .where({ location_id: locationId })
    .andWhere('seq', '>', since)
    .orderBy('seq')
    .limit(limit + 1)
    .select('seq', 'type', 'payload', 'created_at');
  return rows.map((r) => ({
    seq: r.seq,
    type: r.type,
    at: r.created_at,
    ...(typeof r.payload === 'string' ? JSON.parse(r.payload) : r.payload),
  }));
}

/**
 * Whether more than `n` events follow `since`: one probe along the (location_id, seq) index, so a
 * screen too far behind for a replay costs no read of the payloads it would never be sent.
 */
export async function moreEventsThan(db: Knex, locationId: number, since: number, n: number): Promise<boolean> {
  const row = await db('events').where({ location_id: locationId }).andWhere('seq', '>', since).orderBy('seq').offset(n).first('seq');
  return row !== undefined;
}
