// Keeping a screen's copy of the board in step with live events, and ticket ages.
import type { BoardSnapshot, LiveEvent, TicketView } from './types';

/** Open tickets (the bar), or open plus ready ones still on the Pickup board. */
export type BoardFilter = (ticket: TicketView, nowMs: number) => boolean;

export const openTickets: BoardFilter = (t) => t.status === 'open';

export function pickupBoard(timeoutSeconds: number): BoardFilter {
  return (t, nowMs) =>
    t.status === 'open' ||
    (t.status === 'ready' && t.readyAt !== null && nowMs - Date.parse(t.readyAt) < timeoutSeconds * 1000);
}

/**
 * Apply one event. Events at or below the snapshot's sequence number were already applied
 * (a resume may repeat them), so they change nothing.
 */
export function applyEvent(board: BoardSnapshot, event: LiveEvent, keep: BoardFilter): BoardSnapshot {
  if (event.seq <= board.seq) return board;
  return { ...upsertTicket(board, event.ticket, keep, Date.parse(event.at)), seq: event.seq, now: event.at };
}

/** Put a ticket's newest state on the board (or take it off), oldest ticket first. */
export function upsertTicket(board: BoardSnapshot, ticket: TicketView, keep: BoardFilter, nowMs: number): BoardSnapshot {
  const others = board.tickets.filter((t) => t.id !== ticket.id);
  const tickets = keep(ticket, nowMs)
    ? [...others, ticket].sort((a, b) => a.firedAt.localeCompare(b.firedAt) || a.id - b.id)
    : others;
  return { ...board, tickets };
}

export function ticketAgeSeconds(firedAt: string, nowMs: number): number {
  return Math.max(0, Math.floor((nowMs - Date.parse(firedAt)) / 1000));
}

/** Only the first name goes on the public Pickup board. */
export function firstName(customerName: string): string {
  return customerName.trim().split(/\s+/)[0] ?? '';
}

/** What the public Pickup board needs of a ticket: number, first name and state, nothing else. */
export function pickupTicket(t: TicketView): TicketView {
  return { ...t, customerName: firstName(t.customerName), drinks: [] };
}

export function pickupView(board: BoardSnapshot): BoardSnapshot {
  return { ...board, tickets: board.tickets.map(pickupTicket) };
}
