// The words every report screen and export uses for a ticket's status and payment: one word per
// concept, so the CSV says "At the bar" where the screen does.
import type { TicketHistoryRow } from './reports';
import { wallClock } from './wall-clock';

export const TICKET_STATUS_WORDS: Record<TicketHistoryRow['status'], string> = {
  pending: 'Waiting for payment',
  open: 'At the bar',
  ready: 'Ready',
  collected: 'Collected',
  void: 'Void',
};

export const PAYMENT_STATUS_WORDS: Record<TicketHistoryRow['paymentStatus'], string> = {
  unpaid: 'Not paid',
  paid: 'Paid',
  refunded: 'Refunded',
};

export const PAYMENT_METHOD_WORDS: Record<TicketHistoryRow['paymentMethod'], string> = {
  cash: 'Cash',
  card: 'Card',
  split: 'Split',
};

/**
 * An instant as the café's wall clock with its offset, ISO-8601: 2026-03-02T14:00:00Z in New York
 * → "2026-03-02T09:00:00-05:00". A spreadsheet reads it, and the café reads its own hours.
 */
export function localIsoWithOffset(iso: string, timeZone: string): string {
  const parts = wallClock(new Date(iso), timeZone);
  // "GMT-05:00" → "-05:00"; "GMT" alone is UTC itself
  const offset = parts.timeZoneName === 'GMT' ? '+00:00' : parts.timeZoneName.replace('GMT', '');
  return `${parts.year}-${parts.month}-${parts.day}T${parts.hour}:${parts.minute}:${parts.second}${offset}`;
}
