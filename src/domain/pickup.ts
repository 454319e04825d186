// What the Pickup screen is sent. It faces customers, so of each ticket it gets the first name,
// the number, the status and the ready time — and the row id that keys the ticket on the board —
// nothing else: no surname, allergy, note, drink, price or staff name. The shape follows the
// screen, not the signed-in role: a lead who sets up the Pickup board gets the same.
// The server shapes GET /api/pickup, the server-rendered page and the live socket's events,
// replays and snapshots with these functions; the Pickup screen keeps its board with them.
import { applyInOrder, firstName, upsertInOrder, type BoardFilter } from './tickets';
import { isTicketEvent, type AnyLiveEvent, type BoardSnapshot, type EventType, type TicketEventType, type TicketStatus, type TicketView } from './types';

export interface PickupTicket {
  id: number;
  number: number;
  firstName: string;
  status: TicketStatus;
  readyAt: string | null;
  /** Being made again: a drink of it is a remake not yet bumped (the word only, never which drink). */
  remake?: true;
}

export interface PickupBoard {
  seq: number;
  now: string;
  location: { name: string; pickupTimeoutSeconds: number };
  tickets: PickupTicket[];
}

/** A ticket event carries the Pickup ticket; any other event only moves the screen's place in the log. */
export type PickupEvent =
  { seq: number; type: TicketEventType; at: string; ticket: PickupTicket } | { seq: number; type: Exclude<EventType, TicketEventType>; at: string };

/** What the server sends a Pickup socket (the same as ServerMessage, in the Pickup shape). */
export type PickupServerMessage =
  | { type: 'hello'; seq: number }
  | { type: 'event'; event: PickupEvent }
  | { type: 'snapshot'; snapshot: PickupBoard }
  | { type: 'pong' }
  | { type: 'error'; code: string; message: string };

/** Pickup shows tickets in the order they were taken: a row id only grows. */
const byTaking = (a: PickupTicket, b: PickupTicket) => a.id - b.id;

export function pickupTicket(t: TicketView): PickupTicket {
  const remake = t.status === 'open' && t.drinks.some((d) => d.remake && d.status !== 'done');
  return {
    id: t.id,
    number: t.number,
    firstName: firstName(t.customerName),
    status: t.status,
    readyAt: t.readyAt,
    ...(remake ? { remake: true as const } : {}),
  };
}

export function pickupView(board: BoardSnapshot): PickupBoard {
  return {
    seq: board.seq,
    now: board.now,
    location: { name: board.location.name, pickupTimeoutSeconds: board.location.pickupTimeoutSeconds },
    tickets: board.tickets.map(pickupTicket).sort(byTaking),
  };
}

export function pickupEvent(event: AnyLiveEvent): PickupEvent {
  if (isTicketEvent(event)) return { seq: event.seq, type: event.type, at: event.at, ticket: pickupTicket(event.ticket) };
  return { seq: event.seq, type: event.type, at: event.at };
}

export const applyPickupEvent = (board: PickupBoard, event: PickupEvent & { ticket: PickupTicket }, keep: BoardFilter<PickupTicket>) =>
  applyInOrder(board, event, keep, byTaking);

export const upsertPickupTicket = (board: PickupBoard, ticket: PickupTicket, keep: BoardFilter<PickupTicket>, nowMs: number) =>
  upsertInOrder(board, ticket, keep, nowMs, byTaking);
