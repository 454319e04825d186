// Bean lots with their freshness and stock (the owner), and the dial-in log (barista and up).
import { beanLotBody, beanSettingsBody, dialInShotBody } from '@/domain/beans-schemas';
import { idParam } from '@/domain/schemas';
import { userOf } from '@server/auth/guards';
import { parse } from '@server/errors';
import { createLot, retireLot, saveBeanSettings, updateLot } from './beans';
import type { Deps } from '@server/deps';
import { logShot } from './dial-in';
import type { ApiRoute } from '@server/routes';

export function beanRoutes(deps: Deps): ApiRoute[] {
  const id = (params: unknown) => parse(idParam, params, 'params').id;
  return [
    {
      method: 'post',
      path: '/beans/lots',
      capability: 'manageBeans',
      handler: async (req, res) => res.status(201).json({ lot: await createLot(deps, userOf(req), parse(beanLotBody, req.body)) }),
    },
    {
      method: 'put',
      path: '/beans/lots/:id',
      capability: 'manageBeans',
      handler: async (req, res) => {
        const lotId = id(req.params);
        res.json({ lot: await updateLot(deps, userOf(req), lotId, parse(beanLotBody, req.body)) });
      },
    },
    {
      method: 'post',
      path: '/beans/lots/:id/retire',
      capability: 'manageBeans',
      handler: async (req, res) => res.json({ lot: await retireLot(deps, userOf(req), id(req.params)) }),
    },
    {
      method: 'put',
      path: '/beans/settings',
      capability: 'manageBeans',
      handler: async (req, res) => res.json({ settings: await saveBeanSettings(deps, userOf(req), parse(beanSettingsBody, req.body)) }),
    },
    {
      method: 'post',
      path: '/dial-in/shots',
      capability: 'logDialIn',
      handler: async (req, res) => res.status(201).json(await logShot(deps, userOf(req), parse(dialInShotBody, req.body))),
    },
  ];
}
