// Bar commands. Each answers with the ticket's new state, shown at once; the live event
// that follows brings every other screen along.
import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { TicketView } from '../../domain/types';
import { http } from '../../lib/http';
import { applyTicket } from '../board/use-live-board';

type OneKind = 'start-drink' | 'bump-drink' | 'acknowledge-allergy' | 'bump-ticket' | 'recall-ticket' | 'rush-ticket';
export type BarCommand = { kind: OneKind; id: number } | { kind: 'start-batch' | 'bump-batch'; drinkIds: number[] };

const PATHS: Record<OneKind, (id: number) => string> = {
  'start-drink': (id) => `/drinks/${id}/start`,
  'bump-drink': (id) => `/drinks/${id}/bump`,
  'acknowledge-allergy': (id) => `/drinks/${id}/acknowledge-allergy`,
  'bump-ticket': (id) => `/tickets/${id}/bump`,
  'recall-ticket': (id) => `/tickets/${id}/recall`,
  'rush-ticket': (id) => `/tickets/${id}/rush`,
};

async function run(c: BarCommand): Promise<TicketView[]> {
  if ('drinkIds' in c) {
    const path = c.kind === 'start-batch' ? '/drinks/start' : '/drinks/bump';
    return (await http<{ tickets: TicketView[] }>('POST', path, { drinkIds: c.drinkIds })).tickets;
  }
  return [(await http<{ ticket: TicketView }>('POST', PATHS[c.kind](c.id))).ticket];
}

export function useBarCommand() {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: run,
    onSuccess: (tickets) => tickets.forEach((t) => applyTicket(qc, t)),
  });
}
