import { createOrderBody } from '../../src/domain/schemas';
import { userOf } from '../auth/guards';
import { parse } from '../errors';
import type { Deps } from '../services/deps';
import { loadMenu } from '../services/menu';
import { createOrder } from '../services/orders';
import type { ApiRoute } from './define';

export function orderRoutes(deps: Deps): ApiRoute[] {
  return [
    {
      method: 'get',
      path: '/menu',
      capability: 'viewQueue',
      handler: async (req, res) => res.json(await loadMenu(deps.db, userOf(req).locationId)),
    },
    {
      method: 'post',
      path: '/orders',
      capability: 'takeOrders',
      handler: async (req, res) => {
        const body = parse(createOrderBody, req.body);
        const { order, created } = await createOrder(deps, userOf(req), body);
        res.status(created ? 201 : 200).json({ order });
      },
    },
  ];
}
