// Which lot the test shots are for: big buttons, the lot in the espresso grinder first.
import { HOPPER_LABEL, type BeanLotView } from '@/domain/bean-stock';
import { FRESHNESS_LABEL } from '@/domain/freshness';
import { cn } from '@/lib/cn';

const ORDER = { espresso: 0, decaf: 1, shelf: 2 } as const;

export function LotPicker({ lots, value, onChange }: { lots: BeanLotView[]; value: number | null; onChange(id: number): void }) {
  const sorted = [...lots].sort((a, b) => ORDER[a.hopper] - ORDER[b.hopper] || a.name.localeCompare(b.name));
  return (
    <fieldset>
      <legend className="mb-2 text-sm font-semibold tracking-widest text-ink-600 uppercase">Lot</legend>
      <div role="radiogroup" aria-label="Lot" className="flex flex-wrap gap-3">
        {sorted.map((l) => {
          const on = l.id === value;
          return (
            <button
              key={l.id}
              type="button"
              role="radio"
              aria-checked={on}
              onClick={() => onChange(l.id)}
              className={cn(
                'flex min-h-16 flex-col items-start justify-center rounded-xl border-2 px-4 py-2 text-left',
                on ? 'border-ink-900 bg-ink-900 text-steam-50' : 'border-steam-200 bg-white text-ink-900',
              )}
            >
              <span className="text-xl font-semibold">
                {on && <span aria-hidden>✓ </span>}
                {l.name}
              </span>
              <span className={cn('text-base', on ? 'text-steam-100' : 'text-ink-600')}>
                {HOPPER_LABEL[l.hopper]}
                {l.hopper !== 'shelf' && ' grinder'} · day {l.daysSinceRoast} · {FRESHNESS_LABEL[l.freshness]}
              </span>
            </button>
          );
        })}
      </div>
    </fieldset>
  );
}
