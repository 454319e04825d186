// Bar commands. Each answers with the ticket's new state, shown at once; the live event
// that follows brings every other screen along.
import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { TicketView } from '@/domain/types';
import type { CommandName } from '@/commands';
import { send } from '@/lib/commands';
import { applyTicket } from '@/live/use-live-board';

type OneKind = 'start-drink' | 'bump-drink' | 'acknowledge-allergy' | 'bump-ticket' | 'recall-ticket' | 'rush-ticket';
export type BarCommand =
  | { kind: OneKind; id: number }
  /** The drinks the screen shows in the jug: they become that jug for good. */
  | { kind: 'start-jug'; drinkIds: number[] }
  /** A started jug and the drinks the screen shows in it: refused (409) if they changed meanwhile. */
  | { kind: 'bump-jug'; jugId: number; drinkIds: number[] };

const ONE: Record<OneKind, Extract<CommandName, 'startDrink' | 'bumpDrink' | 'acknowledgeAllergy' | 'bumpTicket' | 'recallTicket' | 'rushTicket'>> = {
  'start-drink': 'startDrink',
  'bump-drink': 'bumpDrink',
  'acknowledge-allergy': 'acknowledgeAllergy',
  'bump-ticket': 'bumpTicket',
  'recall-ticket': 'recallTicket',
  'rush-ticket': 'rushTicket',
};

async function run(c: BarCommand): Promise<TicketView[]> {
  if (c.kind === 'start-jug') return (await send.startJug({ drinkIds: c.drinkIds })).tickets;
  if (c.kind === 'bump-jug') return (await send.bumpJug({ id: c.jugId, drinkIds: c.drinkIds })).tickets;
  return [(await send[ONE[c.kind]]({ id: c.id })).ticket];
}

export function useBarCommand() {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: run,
    onSuccess: (tickets) => tickets.forEach((t) => applyTicket(qc, t)),
  });
}
