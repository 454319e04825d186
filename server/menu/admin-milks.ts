// Milks: each a lane on the Bar, with its own two-letter badge (unique in the café, retired milks
// included, since past tickets carry the code).
import type { MilkBody, MoveBody } from '@/domain/menu-admin-schemas';
import type { SessionUser } from '@/domain/types';
import { isUniqueViolation } from '@server/db/rows';
import { conflict } from '@server/domain-errors';
import type { Deps } from '@server/deps';
import { assertMenuOrderable, menuCommand, moveRow, nextSort, ownedRow, type Trx } from './admin-shared';

async function assertCodeFree(trx: Trx, locationId: number, code: string, milkId: number | null) {
  const clash = await trx('milk_options')
    .where({ location_id: locationId, code })
    .modify((q) => (milkId === null ? q : q.whereNot({ id: milkId })))
    .first('name', 'retired_at');
  if (clash) throw conflict(`The code ${code} is already ${clash.name}'s${clash.retired_at ? ' (retired)' : ''}`, [{ path: 'code', message: 'Already used' }]);
}

const row = (body: MilkBody) => ({
  name: body.name,
  code: body.code,
  upcharge_cents: body.upchargeCents,
  ingredients: JSON.stringify(body.ingredients),
});

/** The unique index is the last word if two owners save at once. */
async function guarded<T>(code: string, work: () => Promise<T>): Promise<T> {
  try {
    return await work();
  } catch (err) {
    if (isUniqueViolation(err)) throw conflict(`The code ${code} is already in use`);
    throw err;
  }
}

export const createMilk = (deps: Deps, user: SessionUser, body: MilkBody) =>
  menuCommand(deps, user, async ({ trx, locationId }) => {
    await assertCodeFree(trx, locationId, body.code, null);
    const sort = await nextSort(trx('milk_options').where({ location_id: locationId }));
    const [{ id }] = await guarded(body.code, () =>
      trx('milk_options')
        .insert({ ...row(body), location_id: locationId, sort })
        .returning('id'),
    );
    return id;
  });

export const updateMilk = (deps: Deps, user: SessionUser, id: number, body: MilkBody) =>
  menuCommand(deps, user, async ({ trx, locationId }) => {
    await ownedRow(trx, 'milk_options', locationId, id, 'Milk');
    await assertCodeFree(trx, locationId, body.code, id);
    await guarded(body.code, () => trx('milk_options').where({ id }).update(row(body)));
    return id;
  });

/** A milk some item on sale comes with can't go until that item has another default. */
export const retireMilk = (deps: Deps, user: SessionUser, id: number) =>
  menuCommand(deps, user, async ({ trx, locationId, at }) => {
    const milk = await ownedRow(trx, 'milk_options', locationId, id, 'Milk');
    if (milk.retired_at) throw conflict(`${milk.name} is already retired`);
    await trx('milk_options').where({ id }).update({ retired_at: at });
    await assertMenuOrderable(trx, locationId);
    return id;
  });

export const restoreMilk = (deps: Deps, user: SessionUser, id: number) =>
  menuCommand(deps, user, async ({ trx, locationId }) => {
    const milk = await ownedRow(trx, 'milk_options', locationId, id, 'Milk');
    if (!milk.retired_at) throw conflict(`${milk.name} is in use`);
    const sort = await nextSort(trx('milk_options').where({ location_id: locationId }).whereNull('retired_at'));
    await trx('milk_options').where({ id }).update({ retired_at: null, sort });
    return id;
  });

export const moveMilk = (deps: Deps, user: SessionUser, id: number, { direction }: MoveBody) =>
  menuCommand(deps, user, async ({ trx, locationId }) => {
    const milk = await ownedRow(trx, 'milk_options', locationId, id, 'Milk');
    if (milk.retired_at) throw conflict('Restore it before moving it');
    const siblings = await trx('milk_options').where({ location_id: locationId }).whereNull('retired_at').orderBy(['sort', 'id']).pluck('id');
    await moveRow(trx, 'milk_options', siblings, id, direction);
    return id;
  });
