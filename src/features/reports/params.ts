// What the Reports screen shows, read from its URL so a view can be bookmarked, reloaded and
// rendered on the server: ?shift=12 or ?from=…&to=… (none: today), and the ticket table's
// q, status, sort, dir and page. A value that doesn't parse is left out, never an error page.
import { z } from 'zod';
import { calendarDate, ticketHistoryQuery, type TicketHistoryQuery } from '@/domain/schemas';

export type PeriodChoice = { kind: 'today' } | { kind: 'shift'; id: number } | { kind: 'range'; from: string; to: string };

export const TICKETS_PAGE_SIZE = 20;

export function periodFrom(params: URLSearchParams): PeriodChoice {
  const shift = z.coerce.number().int().positive().safeParse(params.get('shift'));
  if (params.has('shift') && shift.success) return { kind: 'shift', id: shift.data };
  const from = calendarDate.safeParse(params.get('from'));
  const to = calendarDate.safeParse(params.get('to'));
  if (from.success && to.success && from.data <= to.data) return { kind: 'range', from: from.data, to: to.data };
  return { kind: 'today' };
}

const TABLE_KEYS = ['q', 'status', 'sort', 'dir', 'page'] as const;

/** The ticket table's own settings, each dropped on its own when it doesn't parse. */
export function tableFrom(params: URLSearchParams): Pick<TicketHistoryQuery, 'q' | 'status' | 'sort' | 'dir' | 'page'> {
  const raw: Record<string, string> = {};
  for (const key of TABLE_KEYS) {
    const value = params.get(key);
    if (value === null) continue;
    if (ticketHistoryQuery.safeParse({ [key]: value }).success) raw[key] = value;
  }
  const { q, status, sort, dir, page } = ticketHistoryQuery.parse(raw);
  return { q, status, sort, dir, page };
}

/** The report's dates, which the ticket table follows. */
export function ticketParams(dates: { from: string; to: string }, params: URLSearchParams): TicketHistoryQuery {
  return { from: dates.from, to: dates.to, ...tableFrom(params), pageSize: TICKETS_PAGE_SIZE };
}

/** The URL with some settings changed (undefined removes one); a new filter or sort starts at page 1. */
export function withParams(params: URLSearchParams, changes: Record<string, string | number | undefined>): URLSearchParams {
  const next = new URLSearchParams(params);
  for (const [k, v] of Object.entries(changes)) {
    if (v === undefined || v === '') next.delete(k);
    else next.set(k, String(v));
  }
  if (!('page' in changes)) next.delete('page');
  return next;
}
