// Closing a shift: what the bar still has open (a close with tickets open must be confirmed) and
// how the drawer's difference reads. Pure: the service reads the rows, the screens and the mail
// say it the same way.
import { formatDuration } from './format';

/** A ticket's age: "12:00" under an hour, "1 h 10 min" from an hour on (70:00 reads oddly). */
export function ticketAgeWords(seconds: number | null): string {
  if (seconds === null || seconds < 3600) return formatDuration(seconds);
  const minutes = Math.floor(seconds / 60);
  return `${Math.floor(minutes / 60)} h ${minutes % 60} min`;
}
import { formatCents } from './money';

export interface OpenTicketsAtClose {
  openTickets: number;
  /** seconds since the oldest open ticket was fired; null with none open */
  oldestWaitSeconds: number | null;
}

/** From the fired-at times of the tickets still at the bar and the moment of closing. */
export function openTicketsAt(firedAt: string[], now: Date): OpenTicketsAtClose {
  if (firedAt.length === 0) return { openTickets: 0, oldestWaitSeconds: null };
  const oldest = Math.min(...firedAt.map((iso) => Date.parse(iso)));
  return { openTickets: firedAt.length, oldestWaitSeconds: Math.max(0, Math.round((now.getTime() - oldest) / 1000)) };
}

/** "2, the oldest waiting 12:00", "none" — the report's line. */
export function openTicketsWords(t: OpenTicketsAtClose): string {
  if (t.openTickets === 0) return 'none';
  return `${t.openTickets}, the oldest waiting ${ticketAgeWords(t.oldestWaitSeconds)}`;
}

/** The warning before a close: "2 tickets are still open at the bar; the oldest has waited 12:00." */
export function openTicketsWarning(t: OpenTicketsAtClose): string {
  const one = t.openTickets === 1;
  return `${t.openTickets} ${one ? 'ticket is' : 'tickets are'} still open at the bar; the ${one ? 'ticket' : 'oldest'} has waited ${ticketAgeWords(t.oldestWaitSeconds)}.`;
}

/** Counted less expected: "$1.25 short", "$2.00 over", "$0.00, the drawer matches". */
export function cashDifferenceWords(expectedCents: number, countedCents: number, currency: string, locale = 'en-US'): string {
  const diff = countedCents - expectedCents;
  const money = formatCents(Math.abs(diff), currency, locale);
  if (diff === 0) return `${money}, the drawer matches`;
  return `${money} ${diff < 0 ? 'short' : 'over'}`;
}
