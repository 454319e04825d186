// The café group's report: every café of the group, each through its own range report over the
// same café-local dates, side by side (src/domain/group-report.ts picks the rows and sums).
import type { Knex } from 'knex';
import { groupReportView, type GroupReportView } from '@/domain/group-report';
import { groupCafes } from '@server/auth/cafe-in-view';
import { rangeReport } from './report';

/** The group of the café `locationId`, oldest café first. */
export async function groupReport(db: Knex, locationId: number, fromDate: string, toDate: string, now = new Date()): Promise<GroupReportView> {
  const reports = [];
  // one café after another: a past day's first report stores its partials (./days.ts), and a
  // group is a handful of cafés, so nothing is gained by racing them for the one connection
  for (const cafe of await groupCafes(db, locationId)) reports.push({ cafe, report: await rangeReport(db, cafe.id, fromDate, toDate, now) });
  return groupReportView(fromDate, toDate, reports);
}
