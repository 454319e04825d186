// The lot's recent test shots, newest first, with the advice each one got.
import { ScrollBox } from '@/components/ui/scroll-box';
import { ADVICE_HEADLINE, formatGrams, formatSeconds, type DialInShotView } from '@/domain/dial-in';
import { formatRatio } from '@/domain/format';
import { cn } from '@/lib/cn';
import { keepUnits } from '@/lib/keep-units';
import { timeOfDay } from './shot-view';

const th = 'border-b-2 border-steam-200 px-3 py-2 text-left text-sm font-semibold tracking-wide text-ink-600 uppercase';
const td = 'border-b border-steam-100 px-3 py-2';

export function ShotList({ shots, timeZone, locale }: { shots: DialInShotView[]; timeZone: string; locale: string }) {
  return (
    <ScrollBox label="Recent shots table">
      <table className="w-full text-lg" data-testid="shot-list">
        <caption className="mb-1 text-left text-xl font-semibold">Recent shots</caption>
        <thead>
          <tr>
            {['When', 'Grind', 'In → out', 'Time', 'Ratio', 'Advice', 'By'].map((h) => (
              <th key={h} scope="col" className={th}>
                {h}
              </th>
            ))}
          </tr>
        </thead>
        <tbody>
          {shots.length === 0 && (
            <tr>
              <td colSpan={7} className={cn(td, 'text-ink-600')}>
                No shots logged for this lot yet.
              </td>
            </tr>
          )}
          {shots.map((s) => (
            <tr key={s.id} data-testid="shot-row">
              <td className={td}>
                <time dateTime={s.pulledAt} suppressHydrationWarning>
                  {timeOfDay(s.pulledAt, timeZone, locale)}
                </time>
              </td>
              <td className={cn(td, 'font-semibold')}>{s.grind}</td>
              <td className={cn(td, 'tabular-nums')}>{keepUnits(`${formatGrams(s.doseDg)} → ${formatGrams(s.yieldDg)}`)}</td>
              <td className={cn(td, 'tabular-nums')}>{keepUnits(formatSeconds(s.timeDs))}</td>
              <td className={cn(td, 'tabular-nums')}>{formatRatio(s.ratioX10)}</td>
              <td className={td}>
                <span className={cn(s.good && 'font-semibold')}>
                  {s.good && <span aria-hidden>✓ </span>}
                  {ADVICE_HEADLINE[s.advice]}
                </span>
                {s.tasteNote && <span className="block text-base text-ink-600">“{s.tasteNote}”</span>}
              </td>
              <td className={td}>{s.pulledBy}</td>
            </tr>
          ))}
        </tbody>
      </table>
    </ScrollBox>
  );
}
