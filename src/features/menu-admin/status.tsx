// On / 86'd / retired, always as a word with a shape, never by colour alone.
import type { ItemStatus } from '@/domain/menu-admin-view';
import { cn } from '@/lib/cn';

const LOOK: Record<ItemStatus | 'in-use', { word: string; mark: string; className: string }> = {
  on: { word: 'On', mark: '●', className: 'border-ink-900 bg-white text-ink-900' },
  'in-use': { word: 'In use', mark: '●', className: 'border-ink-900 bg-white text-ink-900' },
  '86': { word: "86'd", mark: '⊘', className: 'border-copper-700 bg-white text-copper-700' },
  retired: { word: 'Retired', mark: '—', className: 'border-dashed border-ink-600 bg-steam-100 text-ink-600' },
};

export function StatusBadge({ status }: { status: ItemStatus | 'in-use' }) {
  const look = LOOK[status];
  return (
    <span
      data-status={status}
      className={cn('inline-flex min-h-9 items-center gap-1.5 rounded-full border-2 px-3 text-base font-semibold whitespace-nowrap', look.className)}
    >
      <span aria-hidden>{look.mark}</span>
      {look.word}
    </span>
  );
}
