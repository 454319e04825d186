// Bar commands. Each answers with the ticket's new state, shown at once; the live event
// that follows brings every other screen along.
import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { TicketView } from '../../domain/types';
import { http } from '../../lib/http';
import { applyTicket } from '../board/use-live-board';

type Command = { kind: 'start-drink' | 'bump-drink'; id: number } | { kind: 'bump-ticket' | 'recall-ticket'; id: number };

const PATHS: Record<Command['kind'], (id: number) => string> = {
  'start-drink': (id) => `/drinks/${id}/start`,
  'bump-drink': (id) => `/drinks/${id}/bump`,
  'bump-ticket': (id) => `/tickets/${id}/bump`,
  'recall-ticket': (id) => `/tickets/${id}/recall`,
};

export function useBarCommand() {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: (c: Command) => http<{ ticket: TicketView }>('POST', PATHS[c.kind](c.id)),
    onSuccess: ({ ticket }) => applyTicket(qc, ticket),
  });
}
