// Drinks waiting on the hand-off shelf: tap when the customer has taken them, and they leave the
// Pickup board.
import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { TicketView } from '../../domain/types';
import { Button } from '../../components/ui/button';
import { http } from '../../lib/http';
import { applyTicket } from '../board/use-live-board';

export function ReadyStrip({ tickets }: { tickets: TicketView[] }) {
  const qc = useQueryClient();
  const collect = useMutation({
    mutationFn: (id: number) => http<{ ticket: TicketView }>('POST', `/tickets/${id}/collect`),
    onSuccess: ({ ticket }) => applyTicket(qc, ticket),
  });
  const ready = tickets.filter((t) => t.status === 'ready');
  if (ready.length === 0) return null;
  return (
    <section aria-label="Ready for pickup" className="flex flex-wrap items-center gap-2 border-b border-steam-200 bg-steam-100 px-5 py-2">
      <h2 className="text-base font-semibold tracking-widest text-ink-600 uppercase">Ready ✓</h2>
      {ready.map((t) => (
        <Button key={t.id} tone="quiet" disabled={collect.isPending} onClick={() => collect.mutate(t.id)}>
          #{t.number} {t.customerName} · handed over
        </Button>
      ))}
    </section>
  );
}
