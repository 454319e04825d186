// Reports for the lead and the owner: the CSV downloads of a shift's or a date range's numbers, of
// a range day by day and of the ticket history (plain routes: they answer a file, not JSON), and
// "settle" of the day's card check (a command, src/commands.ts). The reports themselves are reads (src/reads.ts).
import type { Response } from 'express';
import { idParam, reportDaysQuery, reportRangeQuery, ticketCsvQuery } from '@/domain/schemas';
import { userOf } from '@server/auth/guards';
import { parse } from '@server/errors';
import { settleCardDay } from '@server/payments/card-check';
import type { Deps } from '@server/deps';
import { rangeReport, reportCsv, reportDays, reportDaysCsv, shiftReport, ticketRows, ticketsCsv } from './index';
import { loadReportLocation } from './scope';
import type { ApiRoute } from '@server/routes';
import type { CommandHandlers } from '@server/commands';

function sendCsv(res: Response, fileName: string, csv: string) {
  res.set('Content-Type', 'text/csv; charset=utf-8');
  res.set('Content-Disposition', `attachment; filename="${fileName}"`);
  res.set('Cache-Control', 'no-store');
  res.send(csv);
}

const span = (from?: string, to?: string) => (from || to ? `${from ?? 'start'}_to_${to ?? 'now'}` : 'all');

export function reportRoutes(deps: Deps): ApiRoute[] {
  const shiftId = (params: unknown) => parse(idParam, params, 'params').id;
  return [
    {
      // mounted before the reads (server/app.ts): /reports/shift/:id would otherwise take "12.csv" as its id
      method: 'get',
      path: '/reports/shift/:id.csv',
      capability: 'viewReports',
      handler: async (req, res) => {
        const id = shiftId(req.params);
        const report = await shiftReport(deps.db, userOf(req).locationId, id, deps.clock());
        sendCsv(res, `jugline-shift-${id}-${report.period.from}.csv`, reportCsv(report));
      },
    },
    {
      method: 'get',
      path: '/reports/range.csv',
      capability: 'viewReports',
      handler: async (req, res) => {
        const { from, to } = parse(reportRangeQuery, req.query, 'query');
        sendCsv(res, `jugline-report-${span(from, to)}.csv`, reportCsv(await rangeReport(deps.db, userOf(req).locationId, from, to, deps.clock())));
      },
    },
    {
      method: 'get',
      path: '/reports/days.csv',
      capability: 'viewReports',
      handler: async (req, res) => {
        const { from, to } = parse(reportDaysQuery, req.query, 'query');
        sendCsv(res, `jugline-days-${span(from, to)}.csv`, reportDaysCsv(await reportDays(deps.db, userOf(req).locationId, from, to, deps.clock())));
      },
    },
    {
      method: 'get',
      path: '/reports/tickets.csv',
      capability: 'viewReports',
      handler: async (req, res) => {
        const query = parse(ticketCsvQuery, req.query, 'query');
        const { locationId } = userOf(req);
        const location = await loadReportLocation(deps.db, locationId);
        const rows = await ticketRows(deps.db, locationId, query, null);
        sendCsv(res, `jugline-tickets-${span(query.from, query.to)}.csv`, ticketsCsv(rows, location.currency, location.timeZone));
      },
    },
  ];
}

/** The day's card check settled (it may give money back): the handler of its command (src/commands.ts). */
export const reportCommands: CommandHandlers<'settleCards'> = {
  settleCards: ({ deps, user }, { date }) => settleCardDay(deps, user.locationId, date),
};
