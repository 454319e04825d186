// Freshness and stock as words with a shape beside them, never colour alone. Colour pairs are the
// theme's tested ones (tests/unit/contrast.test.ts): ink-900 on steam-100, steam-50 on ink-900,
// ink-900 on alert-ink.
import { FRESHNESS_LABEL, type FreshnessState } from '@/domain/freshness';
import type { StockState } from '@/domain/bean-stock';
import { cn } from '@/lib/cn';

const badge = 'inline-flex items-center gap-1.5 rounded-full px-3 py-0.5 text-base font-semibold whitespace-nowrap';

const FRESHNESS_STYLE: Record<FreshnessState, { icon: string; className: string }> = {
  resting: { icon: '◔', className: 'border border-dashed border-ink-600 bg-steam-100 text-ink-900' },
  best: { icon: '★', className: 'bg-ink-900 text-steam-50' },
  fading: { icon: '↘', className: 'border border-ink-900 bg-alert-ink text-ink-900' },
};

export function FreshnessBadge({ state }: { state: FreshnessState }) {
  const s = FRESHNESS_STYLE[state];
  return (
    <span className={cn(badge, s.className)} data-testid="freshness">
      <span aria-hidden>{s.icon}</span>
      {FRESHNESS_LABEL[state]}
    </span>
  );
}

export function StockBadge({ state }: { state: StockState }) {
  if (state === 'ok') return null;
  return (
    <span className={cn(badge, state === 'low' ? 'border border-ink-900 bg-alert-ink text-ink-900' : 'border-2 border-ink-900 bg-steam-50 text-ink-900')}>
      <span aria-hidden>{state === 'low' ? '▼' : '✕'}</span>
      {state === 'low' ? 'Low' : 'Empty'}
    </span>
  );
}
