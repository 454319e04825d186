import { drinkBatchBody, idParam } from '@/domain/schemas';
import { userOf } from '@server/auth/guards';
import { parse } from '@server/errors';
import type { Deps } from '@server/deps';
import { acknowledgeAllergy, collectTicket, rushTicket } from './ticket-care';
import { bumpJug, startJug } from './jugs';
import { bumpDrink, bumpDrinks, bumpTicket, recallTicket, startDrink, startDrinks } from './tickets';
import type { ApiRoute } from '@server/routes';

type Command = typeof bumpDrink;

export function ticketRoutes(deps: Deps): ApiRoute[] {
  const command =
    (run: Command): ApiRoute['handler'] =>
    async (req, res) => {
      const { id } = parse(idParam, req.params, 'params');
      res.json({ ticket: await run(deps, userOf(req), id) });
    };
  return [
    {
      method: 'post',
      path: '/drinks/start',
      capability: 'makeDrinks',
      handler: async (req, res) => res.json({ tickets: await startDrinks(deps, userOf(req), parse(drinkBatchBody, req.body).drinkIds) }),
    },
    {
      method: 'post',
      path: '/drinks/bump',
      capability: 'makeDrinks',
      handler: async (req, res) => res.json({ tickets: await bumpDrinks(deps, userOf(req), parse(drinkBatchBody, req.body).drinkIds) }),
    },
    {
      method: 'post',
      path: '/jugs',
      capability: 'makeDrinks',
      handler: async (req, res) => res.status(201).json(await startJug(deps, userOf(req), parse(drinkBatchBody, req.body).drinkIds)),
    },
    {
      method: 'post',
      path: '/jugs/:id/bump',
      capability: 'makeDrinks',
      handler: async (req, res) => {
        const { id } = parse(idParam, req.params, 'params');
        res.json({ tickets: await bumpJug(deps, userOf(req), id, parse(drinkBatchBody, req.body).drinkIds) });
      },
    },
    { method: 'post', path: '/drinks/:id/start', capability: 'makeDrinks', handler: command(startDrink) },
    { method: 'post', path: '/drinks/:id/acknowledge-allergy', capability: 'makeDrinks', handler: command(acknowledgeAllergy) },
    { method: 'post', path: '/tickets/:id/rush', capability: 'rushTickets', handler: command(rushTicket) },
    { method: 'post', path: '/tickets/:id/collect', capability: 'collectTickets', handler: command(collectTicket) },
    { method: 'post', path: '/drinks/:id/bump', capability: 'makeDrinks', handler: command(bumpDrink) },
    { method: 'post', path: '/tickets/:id/bump', capability: 'makeDrinks', handler: command(bumpTicket) },
    { method: 'post', path: '/tickets/:id/recall', capability: 'makeDrinks', handler: command(recallTicket) },
  ];
}
