// The words every report screen and export uses for a ticket's status and payment: one word per
// concept, so the CSV says "At the bar" where the screen does.
import type { TicketHistoryRow } from './reports';

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
};

// One formatter per zone: a ticket CSV formats two instants a row, and building an
// Intl.DateTimeFormat costs far more than using one.
const wallClocks = new Map<string, Intl.DateTimeFormat>();
function wallClock(timeZone: string): Intl.DateTimeFormat {
  let f = wallClocks.get(timeZone);
  if (!f) {
    f = new Intl.DateTimeFormat('en-US', {
      timeZone,
      hourCycle: 'h23',
      year: 'numeric',
      month: '2-digit',
      day: '2-digit',
      hour: '2-digit',
      minute: '2-digit',
      second: '2-digit',
      timeZoneName: 'longOffset',
    });
    wallClocks.set(timeZone, f);
  }
  return f;
}

/**
 * An instant as the café's wall clock with its offset, ISO-8601: 2026-03-02T14:00:00Z in New York
 * → "2026-03-02T09:00:00-05:00". A spreadsheet reads it, and the café reads its own hours.
 */
export function localIsoWithOffset(iso: string, timeZone: string): string {
  const parts = Object.fromEntries(
    wallClock(timeZone)
      .formatToParts(new Date(iso))
      .map((p) => [p.type, p.value]),
  );
  // "GMT-05:00" → "-05:00"; "GMT" alone is UTC itself
  const offset = parts.timeZoneName === 'GMT' ? '+00:00' : parts.timeZoneName.replace('GMT', '');
  return `${parts.year}-${parts.month}-${parts.day}T${parts.hour}:${parts.minute}:${parts.second}${offset}`;
}
