// The back-office menu editor: categories, items, sizes and recipes, milks, groups of extras.
// Every command answers { id, menu } with the whole editable menu as it now is. Each kind has the
// same four commands: create, update (the whole row), retired { retired } and move { direction }.
import type { z } from 'zod';
import { categoryBody, itemBody, milkBody, modifierBody, modifierGroupBody, moveBody, retiredBody, type MoveBody } from '@/domain/menu-admin-schemas';
import type { MenuAdminResult } from '@/domain/menu-admin-view';
import { idParam } from '@/domain/schemas';
import type { SessionUser } from '@/domain/types';
import { userOf } from '@server/auth/guards';
import { parse } from '@server/errors';
import type { Deps } from '@server/deps';
import { createCategory, moveCategory, restoreCategory, retireCategory, updateCategory } from './admin-categories';
import { createItem, moveItem, restoreItem, retireItem, retireSize, restoreSize, updateItem } from './admin-items';
import { createMilk, moveMilk, restoreMilk, retireMilk, updateMilk } from './admin-milks';
import {
  createGroup,
  createModifier,
  moveGroup,
  moveModifier,
  restoreGroup,
  restoreModifier,
  retireGroup,
  retireModifier,
  updateGroup,
  updateModifier,
} from './admin-modifiers';
import type { ApiRoute } from '@server/routes';

type Command<B> = (deps: Deps, user: SessionUser, body: B) => Promise<MenuAdminResult>;
type IdCommand<B> = (deps: Deps, user: SessionUser, id: number, body: B) => Promise<MenuAdminResult>;

interface Kind<S extends z.ZodType> {
  path: string;
  body: S;
  create: Command<z.infer<S>>;
  update: IdCommand<z.infer<S>>;
  retire: IdCommand<void>;
  restore: IdCommand<void>;
  move: IdCommand<MoveBody>;
}

const kind = <S extends z.ZodType>(k: Kind<S>) => k;

const KINDS = [
  kind({
    path: 'categories',
    body: categoryBody,
    create: createCategory,
    update: updateCategory,
    retire: retireCategory,
    restore: restoreCategory,
    move: moveCategory,
  }),
  kind({ path: 'items', body: itemBody, create: createItem, update: updateItem, retire: retireItem, restore: restoreItem, move: moveItem }),
  kind({ path: 'milks', body: milkBody, create: createMilk, update: updateMilk, retire: retireMilk, restore: restoreMilk, move: moveMilk }),
  kind({
    path: 'modifier-groups',
    body: modifierGroupBody,
    create: createGroup,
    update: updateGroup,
    retire: retireGroup,
    restore: restoreGroup,
    move: moveGroup,
  }),
  kind({
    path: 'modifiers',
    body: modifierBody,
    create: createModifier,
    update: updateModifier,
    retire: retireModifier,
    restore: restoreModifier,
    move: moveModifier,
  }),
];

export function menuAdminRoutes(deps: Deps): ApiRoute[] {
  const id = (params: unknown) => parse(idParam, params, 'params').id;
  const route = (method: ApiRoute['method'], path: string, handler: ApiRoute['handler']): ApiRoute => ({
    method,
    path: `/menu-admin${path}`,
    capability: 'editMenu',
    handler,
  });
  /** Retire or restore: never a delete, since past orders point at menu rows. */
  const retired = (path: string, retire: IdCommand<void>, restore: IdCommand<void>) =>
    route('post', `${path}/:id/retired`, async (req, res) => {
      const rowId = id(req.params);
      const body = parse(retiredBody, req.body);
      res.json(await (body.retired ? retire : restore)(deps, userOf(req), rowId));
    });

  const routes: ApiRoute[] = [];
  for (const k of KINDS as Kind<z.ZodType>[]) {
    routes.push(
      route('post', `/${k.path}`, async (req, res) => res.status(201).json(await k.create(deps, userOf(req), parse(k.body, req.body)))),
      route('put', `/${k.path}/:id`, async (req, res) => {
        const rowId = id(req.params);
        res.json(await k.update(deps, userOf(req), rowId, parse(k.body, req.body)));
      }),
      retired(`/${k.path}`, k.retire, k.restore),
      route('post', `/${k.path}/:id/move`, async (req, res) => {
        const rowId = id(req.params);
        res.json(await k.move(deps, userOf(req), rowId, parse(moveBody, req.body)));
      }),
    );
  }
  routes.push(retired('/sizes', retireSize, restoreSize));
  return routes;
}
