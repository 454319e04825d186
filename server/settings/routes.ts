// The location's settings: name, money, tax, units, wait target, pitchers, allergen list.
import { idParam } from '@/domain/schemas';
import { pitcherBody, settingsBody } from '@/domain/settings-schemas';
import { userOf } from '@server/auth/guards';
import { parse } from '@server/errors';
import type { Deps } from '@server/deps';
import { addPitcher, removePitcher, updatePitcher, updateSettings } from './settings';
import type { ApiRoute } from '@server/routes';

export function settingsRoutes(deps: Deps): ApiRoute[] {
  const id = (params: unknown) => parse(idParam, params, 'params').id;
  return [
    {
      method: 'put',
      path: '/settings',
      capability: 'editSettings',
      handler: async (req, res) => res.json(await updateSettings(deps, userOf(req), parse(settingsBody, req.body))),
    },
    {
      method: 'post',
      path: '/settings/pitchers',
      capability: 'editSettings',
      handler: async (req, res) => res.status(201).json(await addPitcher(deps, userOf(req), parse(pitcherBody, req.body))),
    },
    {
      method: 'put',
      path: '/settings/pitchers/:id',
      capability: 'editSettings',
      handler: async (req, res) => {
        const pitcherId = id(req.params);
        res.json(await updatePitcher(deps, userOf(req), pitcherId, parse(pitcherBody, req.body)));
      },
    },
    {
      method: 'delete',
      path: '/settings/pitchers/:id',
      capability: 'editSettings',
      handler: async (req, res) => res.json(await removePitcher(deps, userOf(req), id(req.params))),
    },
  ];
}
