// Reports, for the lead and the owner: a shift's, today's or some dates' numbers (several dates
// also day by day), the bar's use of milk and coffee, the day by the hour, and every ticket, with
// CSV downloads; for an owner of a group of cafés, the cafés side by side over the same dates.
// Light theme.
import { useSuspenseQuery } from '@tanstack/react-query';
import { useMemo } from 'react';
import { data, Link, useSearchParams, type LoaderFunctionArgs } from 'react-router';
import type { ReportView } from '@/domain/reports';
import { daysInRange, MAX_REPORT_DAYS } from '@/domain/report-days';
import { buttonStyles } from '@/components/ui/button';
import { HourlyTable, OverTargetList } from '@/features/reports/hourly-table';
import { periodFrom, ticketParams, type PeriodChoice } from '@/features/reports/params';
import { PeriodPicker, shiftLabel } from '@/features/reports/period-picker';
import { groupReportQuery, reportDaysQuery, reportQuery, reportShiftsQuery, ticketHistoryQuery } from '@/queries/reports';
import { sessionQuery } from '@/queries/session';
import type { SessionView } from '@/domain/types';
import { BarUse, PaymentMix, RemakeWastePanel, TopItems } from '@/components/report/report-breakdowns';
import { ReportTiles } from '@/components/report/report-tiles';
import { DaysTable } from '@/features/reports/days-table';
import { GroupTable } from '@/features/reports/group-table';
import { TicketTable } from '@/features/reports/ticket-table';
import { useApi } from '@/lib/api-context';
import { queryString } from '@/lib/http';
import { requireScreen, type RouteDeps } from './deps';
import { SCREENS } from '@/domain/screens';

type Period = Exclude<PeriodChoice, { kind: 'today' }>;
const periodOf = (choice: PeriodChoice, today: string): Period => (choice.kind === 'today' ? { kind: 'range', from: today, to: today } : choice);

function dayLabel(date: string, locale: string) {
  return new Intl.DateTimeFormat(locale, { weekday: 'short', day: 'numeric', month: 'short', year: 'numeric', timeZone: 'UTC' }).format(
    new Date(`${date}T00:00:00Z`),
  );
}

function periodTitle(choice: PeriodChoice, report: ReportView): string {
  const { period, locale, timeZone } = report;
  if (period.shift) return `Shift · ${shiftLabel(period.shift, locale, timeZone)}`;
  const days = period.from === period.to ? dayLabel(period.from, locale) : `${dayLabel(period.from, locale)} – ${dayLabel(period.to, locale)}`;
  return choice.kind === 'today' ? `Today · ${days}` : days;
}

/** The dates the group's cafés are shown side by side over: only an owner with more than one
 * café, and never for a shift (a shift is one café's). */
function groupDates(session: SessionView, period: Period): { from: string; to: string } | null {
  return session.groupCafes.length > 1 && period.kind === 'range' ? { from: period.from, to: period.to } : null;
}

function GroupSection({ dates, inView }: { dates: { from: string; to: string }; inView: string | null }) {
  const { data: group } = useSuspenseQuery(groupReportQuery(useApi(), dates));
  return (
    <div data-testid="group-section">
      <GroupTable group={group} inView={inView} />
    </div>
  );
}

/** The dates shown day by day: a range of more than one date (a shift is not cut into dates). */
function dayByDayDates(period: Period): { from: string; to: string } | null {
  return period.kind === 'range' && period.from !== period.to ? { from: period.from, to: period.to } : null;
}

function DaysSection({ dates }: { dates: { from: string; to: string } }) {
  const { data: view } = useSuspenseQuery(reportDaysQuery(useApi(), dates));
  return <DaysTable view={view} />;
}

/** Day by day, or why not: a range past a year is shown whole only. */
function DayByDay({ dates }: { dates: { from: string; to: string } }) {
  if (daysInRange(dates.from, dates.to) <= MAX_REPORT_DAYS) return <DaysSection dates={dates} />;
  return (
    <p className="rounded-xl border border-steam-200 bg-white p-4 text-base text-ink-600" data-testid="days-too-long">
      Day by day covers at most {MAX_REPORT_DAYS} days: pick a shorter range to see each day.
    </p>
  );
}

function reportCsvHref(period: Period) {
  return period.kind === 'shift' ? `/api/reports/shift/${period.id}.csv` : `/api/reports/range.csv${queryString({ from: period.from, to: period.to })}`;
}

function Reports() {
  const api = useApi();
  const [search] = useSearchParams();
  const { data: shifts } = useSuspenseQuery(reportShiftsQuery(api));
  const { data: session } = useSuspenseQuery(sessionQuery(api));
  const choice = periodFrom(search);
  const period = periodOf(choice, shifts.today);
  const { data: report } = useSuspenseQuery(reportQuery(api, period));
  const params = ticketParams(report.period, search);
  const { data: tickets } = useSuspenseQuery(ticketHistoryQuery(api, params));
  const group = groupDates(session, period);
  const days = dayByDayDates(period);
  const multiDay = report.period.from !== report.period.to;
  const context = useMemo(
    () => ({ currency: report.currency, locale: report.locale, timeZone: report.timeZone, targetSeconds: report.targetSeconds, multiDay }),
    [report.currency, report.locale, report.timeZone, report.targetSeconds, multiDay],
  );

  return (
    <div className="min-h-screen bg-steam-50 text-ink-900">
      <header className="flex flex-wrap items-center gap-x-6 gap-y-2 border-b border-steam-200 px-5 py-3">
        <h1 className="text-2xl font-semibold">Reports</h1>
        <p className="text-lg text-ink-600" data-testid="period-title">
          {periodTitle(choice, report)}
        </p>
        <a href={reportCsvHref(period)} download className={buttonStyles({ tone: 'quiet' })} data-testid="report-csv">
          Download report CSV
        </a>
        <Link to={SCREENS.cardCheck.path} className={buttonStyles({ tone: 'quiet' })}>
          Card check
        </Link>
        <Link to="/" className="ml-auto text-lg font-semibold underline">
          Back to my screen
        </Link>
      </header>
      <main className="flex flex-col gap-4 p-5">
        <PeriodPicker choice={choice} shifts={shifts} dates={report.period} locale={report.locale} />
        {group && <GroupSection dates={group} inView={session.cafe?.name ?? null} />}
        <ReportTiles report={report} />
        {days && <DayByDay dates={days} />}
        <div className="grid grid-cols-1 items-start gap-4 md:grid-cols-2 xl:grid-cols-3">
          <PaymentMix report={report} />
          <BarUse report={report} />
          <RemakeWastePanel report={report} />
          <TopItems report={report} />
          <HourlyTable report={report} />
          <OverTargetList report={report} multiDay={multiDay} />
        </div>
        <TicketTable key={`${params.from}_${params.to}`} page={tickets} params={params} context={context} />
      </main>
    </div>
  );
}

/** A shift that isn't there (or is another café's) is the 404 page. */
async function loadReport(deps: RouteDeps, period: Period) {
  try {
    return await deps.queryClient.ensureQueryData(reportQuery(deps.api, period));
  } catch (err) {
    if ((err as { status?: number })?.status === 404) throw data({ message: 'There is no such shift.' }, { status: 404, statusText: 'Not Found' });
    throw err;
  }
}

export const reportsRoute = (deps: RouteDeps) => ({
  Component: Reports,
  handle: { title: 'Reports' },
  loader: async ({ request }: LoaderFunctionArgs) => {
    await requireScreen(deps, request, SCREENS.reports.need);
    const search = new URL(request.url).searchParams;
    const shifts = await deps.queryClient.ensureQueryData(reportShiftsQuery(deps.api));
    const period = periodOf(periodFrom(search), shifts.today);
    const report = await loadReport(deps, period);
    const group = groupDates(await deps.queryClient.ensureQueryData(sessionQuery(deps.api)), period);
    if (group) await deps.queryClient.ensureQueryData(groupReportQuery(deps.api, group));
    const days = dayByDayDates(period);
    if (days && daysInRange(days.from, days.to) <= MAX_REPORT_DAYS) await deps.queryClient.ensureQueryData(reportDaysQuery(deps.api, days));
    await deps.queryClient.ensureQueryData(ticketHistoryQuery(deps.api, ticketParams(report.period, search)));
    return null;
  },
});
