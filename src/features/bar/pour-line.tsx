// The pour line: a thin bar along the card that fills toward the wait target and turns to a
// diagonal hatch past it. The age is always written out beside it, as it is (m:ss).
import { formatDuration } from '@/domain/format';
import { cn } from '@/lib/cn';

export function ageLabel(ageSeconds: number, targetSeconds: number): string {
  if (ageSeconds <= targetSeconds) return formatDuration(Math.floor(ageSeconds));
  return `+${formatDuration(Math.floor(ageSeconds - targetSeconds))} late`;
}

export function PourLine({ ageSeconds, targetSeconds }: { ageSeconds: number; targetSeconds: number }) {
  const late = ageSeconds > targetSeconds;
  const fill = Math.min(1, ageSeconds / Math.max(1, targetSeconds));
  return (
    <div
      className="h-2.5 w-full overflow-hidden rounded-full bg-roast-950"
      role="meter"
      aria-label="Time since fired against target"
      aria-valuemin={0}
      aria-valuemax={targetSeconds}
      aria-valuenow={Math.min(ageSeconds, targetSeconds)}
      aria-valuetext={ageLabel(ageSeconds, targetSeconds)}
    >
      <div
        data-late={late || undefined}
        className={cn('h-full rounded-full', late ? 'pour-hatch w-full' : 'bg-copper-500')}
        style={late ? undefined : { width: `${fill * 100}%` }}
      />
    </div>
  );
}
