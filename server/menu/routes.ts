// 86ing an item from the floor (GET /menu, what the Counter and the Bar read, is in src/reads.ts).
import { availabilityBody, idParam } from '@/domain/schemas';
import { userOf } from '@server/auth/guards';
import type { Deps } from '@server/deps';
import { parse } from '@server/errors';
import type { ApiRoute } from '@server/routes';
import { setItemAvailability } from './availability';

export function menuRoutes(deps: Deps): ApiRoute[] {
  const id = (params: unknown) => parse(idParam, params, 'params').id;
  return [
    {
      method: 'post',
      path: '/menu/items/:id/availability',
      capability: 'eightySix',
      handler: async (req, res) => {
        const itemId = id(req.params);
        const { available } = parse(availabilityBody, req.body);
        res.json({ item: await setItemAvailability(deps, userOf(req), itemId, available) });
      },
    },
  ];
}
