// The all-day line under the grinder strip: every drink still to make, counted by name across
// all lanes ("All day: 4 Flat white · 2 Latte"), big enough to read from the machine.
import { useMemo } from 'react';
import { allDayCounts } from '@/domain/all-day';
import type { DrinkView } from '@/domain/types';

export function AllDayLine({ drinks }: { drinks: readonly DrinkView[] }) {
  const counts = useMemo(() => allDayCounts(drinks), [drinks]);
  if (counts.length === 0) return null;
  return (
    <section aria-label="All day" data-testid="all-day" className="flex flex-wrap items-baseline gap-x-5 gap-y-1 px-3 py-2 text-2xl md:px-5">
      <h2 className="font-semibold text-crema-300">All day</h2>
      {counts.map((c) => (
        <span key={c.itemName} data-testid="all-day-count" className="whitespace-nowrap">
          <strong className="font-display text-3xl">{c.count}</strong> {c.itemName}
        </span>
      ))}
    </section>
  );
}
