// The Reports part of the Api: over HTTP in the browser (server/ssr/reports-api.ts has the
// server-rendering side). Query strings use the same names the routes validate.
import type { CardCheckView } from '@/domain/card-check';
import type { ReportShiftsView, ReportView, TicketHistoryPage } from '@/domain/reports';
import type { TicketHistoryQuery } from '@/domain/schemas';
import { http, queryString } from './http';

export interface ReportsApi {
  /** Recent shifts, newest first, and the café's date today. */
  shifts(): Promise<ReportShiftsView>;
  shift(id: number): Promise<ReportView>;
  /** Café-local dates, both included. */
  range(from: string, to: string): Promise<ReportView>;
  tickets(params: TicketHistoryQuery): Promise<TicketHistoryPage>;
  /** The card check of a café-local date (today when left out). */
  cardCheck(date?: string): Promise<CardCheckView>;
}

export const httpReportsApi: ReportsApi = {
  shifts: () => http('GET', '/reports/shifts'),
  shift: (id) => http('GET', `/reports/shift/${id}`),
  range: (from, to) => http('GET', `/reports/range${queryString({ from, to })}`),
  tickets: (params) => http('GET', `/reports/tickets${queryString(params)}`),
  cardCheck: (date) => http('GET', `/reports/cards${queryString({ date })}`),
};
