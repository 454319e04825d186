// The Bar's commands and the Counter's collect and rush: their handlers (src/commands.ts).
import type { SessionUser } from '@/domain/types';
import type { CommandHandlers } from '@server/commands';
import type { Deps } from '@server/deps';
import { acknowledgeAllergy, collectTicket, rushTicket } from './ticket-care';
import { bumpJug, startJug } from './jugs';
import { bumpDrink, bumpDrinks, bumpTicket, recallTicket, startDrink, startDrinks } from './tickets';

/** A command on one drink or ticket, answering the ticket as it now is. */
const one =
  (run: typeof bumpDrink) =>
  async ({ deps, user, params }: { deps: Deps; user: SessionUser; params: { id: number } }) => ({ ticket: await run(deps, user, params.id) });

export const ticketCommands: CommandHandlers<
  | 'startDrinks'
  | 'bumpDrinks'
  | 'startJug'
  | 'bumpJug'
  | 'startDrink'
  | 'acknowledgeAllergy'
  | 'rushTicket'
  | 'collectTicket'
  | 'bumpDrink'
  | 'bumpTicket'
  | 'recallTicket'
> = {
  startDrinks: async ({ deps, user }, { drinkIds }) => ({ tickets: await startDrinks(deps, user, drinkIds) }),
  bumpDrinks: async ({ deps, user }, { drinkIds }) => ({ tickets: await bumpDrinks(deps, user, drinkIds) }),
  startJug: ({ deps, user }, { drinkIds }) => startJug(deps, user, drinkIds),
  bumpJug: async ({ deps, user, params }, { drinkIds }) => ({ tickets: await bumpJug(deps, user, params.id, drinkIds) }),
  startDrink: one(startDrink),
  acknowledgeAllergy: one(acknowledgeAllergy),
  rushTicket: one(rushTicket),
  collectTicket: one(collectTicket),
  bumpDrink: one(bumpDrink),
  bumpTicket: one(bumpTicket),
  recallTicket: one(recallTicket),
};
