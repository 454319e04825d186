// Drinks waiting on the pickup shelf. Each chip is a button that says what tapping does: mark
// the order collected (it leaves the Pickup board). One row whatever the rush — the newest first, as
// many as the width holds — and "+n more ready" opens the rest, so the order below never moves.
import { useMutation, useQueryClient } from '@tanstack/react-query';
import { useEffect, useRef, useState } from 'react';
import type { TicketView } from '@/domain/types';
import { Button } from '@/components/ui/button';
import { send } from '@/lib/commands';
import { applyTicket } from '@/live/use-live-board';

/** Chips that fit one row beside the heading and the "more" button, by window width. */
const CHIPS_BY_WIDTH: [minWidth: number, chips: number][] = [
  [1536, 7],
  [1280, 5],
  [1024, 4],
  [768, 3],
  [0, 1],
];

function useChipsThatFit(): number {
  const [count, setCount] = useState(3);
  useEffect(() => {
    const fit = () => setCount(CHIPS_BY_WIDTH.find(([w]) => window.innerWidth >= w)![1]);
    fit();
    window.addEventListener('resize', fit);
    return () => window.removeEventListener('resize', fit);
  }, []);
  return count;
}

/**
 * How many chips to show of `ready`: all when they fit, else `fit` and "+n more". The widths above
 * count the "more" button's room, and a chip is wider than it, so one chip more never fits in its
 * place (at 390 px two chips ran past the edge).
 */
export const chipsToShow = (ready: number, fit: number) => Math.min(ready, fit);

/** Newest on the shelf first; the ticket number breaks a tie. */
export const newestReadyFirst = (tickets: TicketView[]) =>
  tickets.filter((t) => t.status === 'ready').sort((a, b) => (b.readyAt ?? '').localeCompare(a.readyAt ?? '') || b.number - a.number);

export function ReadyStrip({ tickets }: { tickets: TicketView[] }) {
  const qc = useQueryClient();
  const collect = useMutation({
    mutationFn: (id: number) => send.collectTicket({ id }),
    onSuccess: ({ ticket }) => applyTicket(qc, ticket),
  });
  const [allOpen, setAllOpen] = useState(false);
  const fit = useChipsThatFit();
  const ready = newestReadyFirst(tickets);
  if (ready.length === 0) return null;
  const shown = ready.slice(0, chipsToShow(ready.length, fit));
  // two lines: what tapping does, then whose order — the number and name never cut off first
  const chip = (t: TicketView) => (
    <Button
      key={t.id}
      tone="quiet"
      className="max-w-[10rem] shrink-0 flex-col items-start gap-0 px-3 py-0.5 leading-tight md:max-w-[13rem]"
      aria-label={`Mark collected #${t.number} ${t.customerName}`}
      disabled={collect.isPending}
      onClick={() => collect.mutate(t.id)}
    >
      <span className="text-xs font-semibold tracking-wide text-ink-600 uppercase">Mark collected</span>
      <span className="max-w-full truncate whitespace-nowrap">
        #{t.number} {t.customerName}
      </span>
    </Button>
  );
  return (
    <section
      aria-label="Ready for pickup"
      className="flex flex-nowrap items-center gap-2 overflow-hidden border-b border-steam-200 bg-steam-100 px-3 py-2 md:px-5"
    >
      <h2 className="shrink-0 text-base font-semibold text-ink-600 uppercase md:tracking-widest">
        Ready <span aria-hidden>✓</span> {ready.length}
      </h2>
      {shown.map(chip)}
      {shown.length < ready.length && (
        <Button
          tone="quiet"
          className="shrink-0 whitespace-nowrap"
          aria-haspopup="dialog"
          aria-label={`+${ready.length - shown.length} more ready`}
          onClick={() => setAllOpen(true)}
        >
          +{ready.length - shown.length} more<span className="hidden md:inline">ready</span>
        </Button>
      )}
      {allOpen && <AllReady ready={ready} chip={chip} onClose={() => setAllOpen(false)} />}
    </section>
  );
}

function AllReady({ ready, chip, onClose }: { ready: TicketView[]; chip(t: TicketView): React.ReactNode; onClose(): void }) {
  const panel = useRef<HTMLDivElement>(null);
  useEffect(() => {
    const back = document.activeElement as HTMLElement | null;
    panel.current?.querySelector<HTMLElement>('button')?.focus();
    const onKey = (e: KeyboardEvent) => e.key === 'Escape' && onClose();
    window.addEventListener('keydown', onKey);
    return () => {
      window.removeEventListener('keydown', onKey);
      back?.focus();
    };
  }, [onClose]);
  useEffect(() => {
    if (ready.length === 0) onClose();
  }, [ready.length, onClose]);
  return (
    <div role="dialog" aria-modal="true" aria-label="Ready for pickup" className="fixed inset-0 z-20 flex items-start justify-center bg-ink-900/40 p-4">
      <div ref={panel} className="flex max-h-full w-full max-w-3xl flex-col rounded-2xl bg-steam-50 p-4 shadow-2xl">
        <div className="flex items-center gap-3">
          <h2 className="text-2xl font-semibold">Ready — tap when collected</h2>
          <Button tone="quiet" className="ml-auto" onClick={onClose}>
            Close
          </Button>
        </div>
        <div className="mt-3 flex flex-wrap gap-2 overflow-y-auto">{ready.map(chip)}</div>
      </div>
    </div>
  );
}
