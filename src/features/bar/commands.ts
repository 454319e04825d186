// Bar commands. Each answers with the ticket's new state, shown at once; the live event
// that follows brings every other screen along.
import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { TicketView } from '@/domain/types';
import { http } from '@/lib/http';
import { applyTicket } from '@/live/use-live-board';

type OneKind = 'start-drink' | 'bump-drink' | 'acknowledge-allergy' | 'bump-ticket' | 'recall-ticket' | 'rush-ticket';
export type BarCommand =
  | { kind: OneKind; id: number }
  /** The drinks the screen shows in the jug: they become that jug for good. */
  | { kind: 'start-jug'; drinkIds: number[] }
  /** A started jug and the drinks the screen shows in it: refused (409) if they changed meanwhile. */
  | { kind: 'bump-jug'; jugId: number; drinkIds: number[] };

const PATHS: Record<OneKind, (id: number) => string> = {
  'start-drink': (id) => `/drinks/${id}/start`,
  'bump-drink': (id) => `/drinks/${id}/bump`,
  'acknowledge-allergy': (id) => `/drinks/${id}/acknowledge-allergy`,
  'bump-ticket': (id) => `/tickets/${id}/bump`,
  'recall-ticket': (id) => `/tickets/${id}/recall`,
  'rush-ticket': (id) => `/tickets/${id}/rush`,
};

async function run(c: BarCommand): Promise<TicketView[]> {
  if (c.kind === 'start-jug') return (await http<{ jugId: number; tickets: TicketView[] }>('POST', '/jugs', { drinkIds: c.drinkIds })).tickets;
  if (c.kind === 'bump-jug') return (await http<{ tickets: TicketView[] }>('POST', `/jugs/${c.jugId}/bump`, { drinkIds: c.drinkIds })).tickets;
  return [(await http<{ ticket: TicketView }>('POST', PATHS[c.kind](c.id))).ticket];
}

export function useBarCommand() {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: run,
    onSuccess: (tickets) => tickets.forEach((t) => applyTicket(qc, t)),
  });
}
