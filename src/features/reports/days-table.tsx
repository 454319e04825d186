// Day by day: a row per date of the chosen range (a date without orders shows its zeros, so a
// closed day is seen, not skipped) and the range's total, with its CSV download. The total's wait
// is the whole range's median, not a sum of the days'.
import { ScrollBox } from '@/components/ui/scroll-box';
import { Panel, numClass, tdClass } from '@/components/report/report-breakdowns';
import { FiguresHead, TipsCell } from './figures-head';
import { buttonStyles } from '@/components/ui/button';
import { formatDuration } from '@/domain/format';
import { formatCents } from '@/domain/money';
import { formatCount } from '@/domain/reports';
import type { DayFigures, ReportDaysView } from '@/domain/report-days';
import { cn } from '@/lib/cn';
import { queryString } from '@/lib/http';

const footClass = 'border-t-2 border-steam-200 px-2 py-1.5';

export const daysCsvHref = (dates: { from: string; to: string }) => `/api/reports/days.csv${queryString({ from: dates.from, to: dates.to })}`;

function dateLabel(date: string, locale: string) {
  return new Intl.DateTimeFormat(locale, { weekday: 'short', day: 'numeric', month: 'short', timeZone: 'UTC' }).format(new Date(`${date}T00:00:00Z`));
}

/** "2 of 5" timed tickets over the target; "—" when none was timed. */
const overTarget = (f: DayFigures, locale: string) =>
  f.timedTickets === 0 ? '—' : `${formatCount(f.overTargetCount, locale)} of ${formatCount(f.timedTickets, locale)}`;

export function DaysTable({ view }: { view: ReportDaysView }) {
  const { locale, currency } = view;
  const money = (c: number) => formatCents(c, currency, locale);
  // the column only when the range had tips, as the report shows its Tips tile only then
  const tips = view.total.tips.cents > 0;
  return (
    <Panel title="Day by day">
      <div className="mb-2 flex flex-wrap items-center justify-between gap-2">
        <p id="days-note" className="text-sm text-ink-600">
          Each café day on its own, with the whole range below. Over target: tickets that waited longer than {formatDuration(view.targetSeconds)}, of those
          timed.
        </p>
        <a href={daysCsvHref(view)} download className={buttonStyles({ tone: 'quiet' })} data-testid="days-csv">
          Download days CSV
        </a>
      </div>
      <ScrollBox label="Day by day table">
        <table className="w-full text-base" data-testid="report-days" aria-describedby="days-note">
          <FiguresHead rowLabel="Date" tips={tips} />
          <tbody>
            {view.days.map((d) => (
              <tr key={d.date} data-testid="report-day" data-date={d.date} className={d.orders === 0 ? 'text-ink-600' : undefined}>
                <th scope="row" className={cn(tdClass, 'text-left font-normal whitespace-nowrap')}>
                  {dateLabel(d.date, locale)}
                </th>
                <td className={cn(tdClass, numClass)} data-testid="day-orders">
                  {formatCount(d.orders, locale)}
                </td>
                <td className={cn(tdClass, numClass)}>{formatCount(d.drinks, locale)}</td>
                <td className={cn(tdClass, numClass)}>{money(d.netCents)}</td>
                {tips && <TipsCell tips={d.tips} money={money} className={cn(tdClass, numClass)} />}
                <td className={cn(tdClass, numClass)}>{formatDuration(d.medianWaitSeconds)}</td>
                <td className={cn(tdClass, numClass, 'whitespace-nowrap')}>{overTarget(d, locale)}</td>
              </tr>
            ))}
          </tbody>
          <tfoot>
            <tr data-testid="days-total" className="font-semibold">
              <th scope="row" className={cn(footClass, 'text-left whitespace-nowrap')}>
                All {formatCount(view.days.length, locale)} days
              </th>
              <td className={cn(footClass, numClass)}>{formatCount(view.total.orders, locale)}</td>
              <td className={cn(footClass, numClass)}>{formatCount(view.total.drinks, locale)}</td>
              <td className={cn(footClass, numClass)}>{money(view.total.netCents)}</td>
              {tips && <TipsCell tips={view.total.tips} money={money} className={cn(footClass, numClass)} />}
              <td className={cn(footClass, numClass)}>{formatDuration(view.total.medianWaitSeconds)}</td>
              <td className={cn(footClass, numClass, 'whitespace-nowrap')}>{overTarget(view.total, locale)}</td>
            </tr>
          </tfoot>
        </table>
      </ScrollBox>
    </Panel>
  );
}
