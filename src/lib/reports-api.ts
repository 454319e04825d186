// The Reports part of the Api: over HTTP in the browser (server/ssr/reports-api.ts has the
// server-rendering side). Query strings use the same names the routes validate.
import type { CardCheckView } from '@/domain/card-check';
import type { ReportShiftsView, ReportView, TicketHistoryPage, TicketSort } from '@/domain/reports';
import type { TicketStatus } from '@/domain/types';
import { http } from './http';

export interface TicketHistoryParams {
  from?: string;
  to?: string;
  q?: string;
  status?: TicketStatus;
  sort: TicketSort;
  dir: 'asc' | 'desc';
  page: number;
  pageSize: number;
}

export interface ReportsApi {
  /** Recent shifts, newest first, and the café's date today. */
  shifts(): Promise<ReportShiftsView>;
  shift(id: number): Promise<ReportView>;
  /** Café-local dates, both included. */
  range(from: string, to: string): Promise<ReportView>;
  tickets(params: TicketHistoryParams): Promise<TicketHistoryPage>;
  /** The card check of a café-local date (today when left out). */
  cardCheck(date?: string): Promise<CardCheckView>;
}

/** "?a=1&b=x" from the defined values, in the given order. */
export function queryString(params: object): string {
  const search = new URLSearchParams();
  for (const [k, v] of Object.entries(params)) if (v !== undefined && v !== null && v !== '') search.set(k, String(v));
  const text = search.toString();
  return text ? `?${text}` : '';
}

export const httpReportsApi: ReportsApi = {
  shifts: () => http('GET', '/reports/shifts'),
  shift: (id) => http('GET', `/reports/shift/${id}`),
  range: (from, to) => http('GET', `/reports/range${queryString({ from, to })}`),
  tickets: (params) => http('GET', `/reports/tickets${queryString(params)}`),
  cardCheck: (date) => http('GET', `/reports/cards${queryString({ date })}`),
};
