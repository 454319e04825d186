// Keeping a screen's copy of the board in step with live events, and ticket ages.
import type { BoardSnapshot, LiveEvent, TicketView } from './types';

/** Which tickets a board keeps (the bar: open ones; Pickup: open plus ready for a while). */
export type BoardFilter<T = TicketView> = (ticket: T, nowMs: number) => boolean;

/** What a board filter may look at: the Bar's and the Pickup screen's tickets both have it. */
type TicketState = Pick<TicketView, 'status' | 'readyAt'>;

export const openTickets: BoardFilter<TicketState> = (t) => t.status === 'open';

export function pickupBoard(timeoutSeconds: number): BoardFilter<TicketState> {
  return (t, nowMs) => t.status === 'open' || (t.status === 'ready' && t.readyAt !== null && nowMs - Date.parse(t.readyAt) < timeoutSeconds * 1000);
}

/** Any board: its place in the log and its tickets (each keyed by its row id), in its order. */
export interface Board<T extends { id: number }> {
  seq: number;
  now: string;
  tickets: T[];
}

/** The Bar's order: oldest fired first. */
const byFired = (a: TicketView, b: TicketView) => a.firedAt.localeCompare(b.firedAt) || a.id - b.id;

/**
 * Put a ticket's newest state on a board (or take it off), keeping the board's order. Events at
 * or below the board's sequence number were already applied (a resume may repeat them), so they
 * change nothing.
 */
export function upsertInOrder<T extends { id: number }, B extends Board<T>>(
  board: B,
  ticket: T,
  keep: BoardFilter<T>,
  nowMs: number,
  order: (a: T, b: T) => number,
): B {
  const others = board.tickets.filter((t) => t.id !== ticket.id);
  const tickets = keep(ticket, nowMs) ? [...others, ticket].sort(order) : others;
  return { ...board, tickets };
}

export function applyInOrder<T extends { id: number }, B extends Board<T>>(
  board: B,
  event: { seq: number; at: string; ticket: T },
  keep: BoardFilter<T>,
  order: (a: T, b: T) => number,
): B {
  if (event.seq <= board.seq) return board;
  return { ...upsertInOrder(board, event.ticket, keep, Date.parse(event.at), order), seq: event.seq, now: event.at };
}

/** A board moves on to an event that changes none of its tickets (menu, shift). */
export const moveSeq = <B extends { seq: number }>(board: B, seq: number): B => (seq > board.seq ? { ...board, seq } : board);

/** Apply one event to the full board (Bar, Counter, Pulse). */
export function applyEvent(board: BoardSnapshot, event: LiveEvent, keep: BoardFilter): BoardSnapshot {
  return applyInOrder(board, event, keep, byFired);
}

/** Put a ticket's newest state on the full board (or take it off), oldest ticket first. */
export function upsertTicket(board: BoardSnapshot, ticket: TicketView, keep: BoardFilter, nowMs: number): BoardSnapshot {
  return upsertInOrder(board, ticket, keep, nowMs, byFired);
}

export function ticketAgeSeconds(firedAt: string, nowMs: number): number {
  return Math.max(0, Math.floor((nowMs - Date.parse(firedAt)) / 1000));
}

/** Only the first name goes on the public Pickup board. */
export function firstName(customerName: string): string {
  return customerName.trim().split(/\s+/)[0] ?? '';
}
