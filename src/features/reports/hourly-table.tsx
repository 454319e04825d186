// The day by the hour, and the tickets that waited past the target.
import { ScrollBox } from '@/components/ui/scroll-box';
import { formatCents } from '@/domain/money';
import { formatDuration } from '@/domain/format';
import { formatCount, hourLabel, type ReportView } from '@/domain/reports';
import { cn } from '@/lib/cn';
import { Panel, ShareBar, numClass, tdClass, thClass } from '@/components/report/report-breakdowns';

export function HourlyTable({ report }: { report: ReportView }) {
  const money = (c: number) => formatCents(c, report.currency, report.locale);
  const busiest = Math.max(1, ...report.hourly.map((h) => h.orders));
  return (
    <Panel title="By the hour" className="md:col-span-2">
      {report.hourly.length === 0 ? (
        <p className="text-base text-ink-600">No paid orders in this period.</p>
      ) : (
        <ScrollBox label="Hourly table">
          <table className="w-full text-base" data-testid="hourly">
            <caption className="mb-1 text-left text-sm text-ink-600">Hour the order was taken, café time ({report.timeZone}).</caption>
            <thead>
              <tr>
                <th className={thClass}>Hour</th>
                <th className={cn(thClass, 'w-2/5')}>Orders</th>
                <th className={cn(thClass, 'text-right')}>Drinks</th>
                <th className={cn(thClass, 'text-right')}>Sales</th>
                <th className={cn(thClass, 'text-right')}>Median wait</th>
              </tr>
            </thead>
            <tbody>
              {report.hourly.map((h) => (
                <tr key={h.hour}>
                  <td className={cn(tdClass, 'tabular-nums')}>{hourLabel(h.hour)}</td>
                  <td className={tdClass}>
                    <ShareBar share={h.orders / busiest} label={formatCount(h.orders, report.locale)} />
                  </td>
                  <td className={cn(tdClass, numClass)}>{formatCount(h.drinks, report.locale)}</td>
                  <td className={cn(tdClass, numClass)}>{money(h.cents)}</td>
                  <td className={cn(tdClass, numClass)}>{formatDuration(h.medianWaitSeconds)}</td>
                </tr>
              ))}
            </tbody>
          </table>
        </ScrollBox>
      )}
    </Panel>
  );
}

export function OverTargetList({ report, multiDay }: { report: ReportView; multiDay: boolean }) {
  return (
    <Panel title={`Over the ${formatDuration(report.targetSeconds)} target`}>
      {report.overTarget.length === 0 ? (
        <p className="text-base text-ink-600">No ticket waited past the target.</p>
      ) : (
        <ScrollBox label="Over-target tickets table">
          <table className="w-full text-base" data-testid="over-target">
            <caption className="mb-1 text-left text-sm text-ink-600">Longest first{report.overTarget.length === 20 ? ', the 20 longest' : ''}.</caption>
            <thead>
              <tr>
                <th className={thClass}>Ticket</th>
                <th className={thClass}>Customer</th>
                <th className={cn(thClass, 'text-right')}>Wait</th>
              </tr>
            </thead>
            <tbody>
              {report.overTarget.map((t) => (
                <tr key={t.orderId}>
                  <td className={cn(tdClass, 'tabular-nums whitespace-nowrap')}>
                    #{t.number}
                    {multiDay && <span className="ml-1 text-sm text-ink-600">{t.businessDate}</span>}
                  </td>
                  <td className={cn(tdClass, 'max-w-40 truncate')}>{t.customerName}</td>
                  <td className={cn(tdClass, numClass)}>
                    {formatDuration(t.waitSeconds)} <span className="text-sm text-ink-600">(+{formatDuration(t.waitSeconds - report.targetSeconds)})</span>
                  </td>
                </tr>
              ))}
            </tbody>
          </table>
        </ScrollBox>
      )}
    </Panel>
  );
}
