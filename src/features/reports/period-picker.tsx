// Which period the report covers: today, one of the recent shifts, or a range of dates. Plain GET
// forms and a link, so the picker works before the page's script has loaded.
import { Form, Link } from 'react-router';
import type { ReportShiftsView } from '@/domain/reports';
import { buttonStyles } from '@/components/ui/button';
import { cn } from '@/lib/cn';
import type { PeriodChoice } from './params';

const field = 'min-h-11 rounded-lg border border-steam-200 bg-white px-3 text-base text-ink-900';
const legend = 'mb-1 text-sm font-semibold tracking-widest text-ink-600 uppercase';

export function shiftLabel(shift: { id: number; openedAt: string; closedAt: string | null }, locale: string, timeZone: string): string {
  const day = new Intl.DateTimeFormat(locale, { weekday: 'short', day: 'numeric', month: 'short', timeZone });
  const time = new Intl.DateTimeFormat(locale, { timeStyle: 'short', timeZone });
  const opened = new Date(shift.openedAt);
  const end = shift.closedAt ? time.format(new Date(shift.closedAt)) : 'open now';
  return `${day.format(opened)}, ${time.format(opened)} – ${end}`;
}

export function PeriodPicker({
  choice,
  shifts,
  dates,
  locale,
}: {
  choice: PeriodChoice;
  shifts: ReportShiftsView;
  /** the dates the report shows, to start the range fields from */
  dates: { from: string; to: string };
  locale: string;
}) {
  const selectedShift = choice.kind === 'shift' ? choice.id : undefined;
  return (
    <section aria-label="Period" className="flex flex-wrap items-end gap-6 rounded-xl border border-steam-200 bg-white p-4">
      <div>
        <p className={legend}>Quick</p>
        <Link
          to="/reports"
          aria-current={choice.kind === 'today' ? 'page' : undefined}
          className={cn(buttonStyles({ tone: choice.kind === 'today' ? 'primary' : 'quiet' }))}
        >
          {choice.kind === 'today' && <span aria-hidden>✓</span>}
          Today
        </Link>
      </div>

      <Form method="get" action="/reports" className="flex max-w-full flex-wrap items-end gap-2">
        <label>
          <span className={cn(legend, 'block')}>Shift</span>
          <select name="shift" defaultValue={selectedShift ?? ''} required className={cn(field, 'w-64 max-w-full')}>
            <option value="" disabled>
              {shifts.shifts.length ? 'Choose a shift' : 'No shifts yet'}
            </option>
            {shifts.shifts.map((s) => (
              <option key={s.id} value={s.id}>
                {shiftLabel(s, locale, shifts.timeZone)}
              </option>
            ))}
          </select>
        </label>
        <button type="submit" className={buttonStyles({ tone: 'quiet' })} disabled={!shifts.shifts.length}>
          Show shift
        </button>
      </Form>

      <Form method="get" action="/reports" className="flex max-w-full flex-wrap items-end gap-2">
        <label>
          <span className={cn(legend, 'block')}>From</span>
          <input type="date" name="from" required defaultValue={dates.from} className={field} />
        </label>
        <label>
          <span className={cn(legend, 'block')}>To</span>
          <input type="date" name="to" required defaultValue={dates.to} className={field} />
        </label>
        <button type="submit" className={buttonStyles({ tone: 'quiet' })}>
          Show dates
        </button>
      </Form>
    </section>
  );
}
