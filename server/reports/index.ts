// Reports for the lead and the owner: a shift's or a date range's numbers, the ticket history,
// their CSV exports and the shift report mail. The parts live in ./reports/.
import type { Knex } from 'knex';
import type { ReportShiftsView } from '@/domain/reports';
import { businessDate } from '@/domain/business-date';
import { loadReportLocation } from './scope';

export { reportCsv, reportDaysCsv, ticketsCsv } from './csv';
export { groupReport } from './group';
export { shiftReportEmail, type ReportEmail, type ReportMailLocation } from './email';
export { rangeReport, reportDays, shiftReport } from './report';
export { ticketHistory, ticketRows, type TicketFilter, type TicketQuery } from './tickets';

/** The café's most recent shifts, newest first, and its date today. */
export async function reportShifts(db: Knex, locationId: number, now: Date, limit = 60): Promise<ReportShiftsView> {
  const location = await loadReportLocation(db, locationId);
  const rows = await db('shifts')
    .where({ location_id: locationId })
    .orderBy([
      { column: 'opened_at', order: 'desc' },
      { column: 'id', order: 'desc' },
    ])
    .limit(limit)
    .select('id', 'opened_at', 'closed_at');
  return {
    today: businessDate(now, location.timeZone),
    timeZone: location.timeZone,
    shifts: rows.map((r) => ({ id: r.id, openedAt: r.opened_at, closedAt: r.closed_at ?? null })),
  };
}
