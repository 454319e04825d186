// Query keys and options for the Reports screen.
import { queryOptions } from '@tanstack/react-query';
import type { Api } from '@/lib/api';
import type { TicketHistoryQuery } from '@/domain/schemas';
import type { PeriodChoice } from '@/features/reports/params';

export const reportKeys = {
  all: ['reports'] as const,
  shifts: () => ['reports', 'shifts'] as const,
  report: (period: Exclude<PeriodChoice, { kind: 'today' }>) => ['reports', 'report', period] as const,
  tickets: (params: TicketHistoryQuery) => ['reports', 'tickets', params] as const,
  group: (dates: { from: string; to: string }) => ['reports', 'group', dates.from, dates.to] as const,
  days: (dates: { from: string; to: string }) => ['reports', 'days', dates.from, dates.to] as const,
};

export const reportShiftsQuery = (api: Api) => queryOptions({ queryKey: reportKeys.shifts(), queryFn: () => api.reportShifts(), staleTime: 30_000 });

/** A shift's report, or a range's ("today" is the range from today to today). */
export const reportQuery = (api: Api, period: Exclude<PeriodChoice, { kind: 'today' }>) =>
  queryOptions({
    queryKey: reportKeys.report(period),
    queryFn: () => (period.kind === 'shift' ? api.reportShift({ id: period.id }) : api.reportRange({ from: period.from, to: period.to })),
    staleTime: 15_000,
  });

export const ticketHistoryQuery = (api: Api, params: TicketHistoryQuery) =>
  queryOptions({ queryKey: reportKeys.tickets(params), queryFn: () => api.reportTickets(params), staleTime: 15_000 });

/** The owner's cafés side by side over some dates (a shift belongs to one café, so dates only). */
export const groupReportQuery = (api: Api, dates: { from: string; to: string }) =>
  queryOptions({ queryKey: reportKeys.group(dates), queryFn: () => api.reportGroup({ from: dates.from, to: dates.to }), staleTime: 15_000 });

/** A range of dates day by day, with the range's total. */
export const reportDaysQuery = (api: Api, dates: { from: string; to: string }) =>
  queryOptions({ queryKey: reportKeys.days(dates), queryFn: () => api.reportDays({ from: dates.from, to: dates.to }), staleTime: 15_000 });
