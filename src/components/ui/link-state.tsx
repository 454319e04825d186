import type { LinkState } from '@/lib/live-socket';
import { cn } from '@/lib/cn';

const TEXT: Record<LinkState, string> = {
  connecting: 'Connecting…',
  live: 'Live',
  offline: 'Offline — showing the last queue we had; reconnecting',
};

/** Connection state in words and a shape (filled dot = live, ring = not), never colour alone. */
export function LinkStateBadge({ state, className }: { state: LinkState; className?: string }) {
  return (
    <span role="status" aria-live="polite" data-link-state={state} className={cn('inline-flex items-center gap-2', className)}>
      <span aria-hidden className={cn('inline-block size-3 rounded-full border-2 border-current', state === 'live' && 'bg-current')} />
      {TEXT[state]}
    </span>
  );
}
