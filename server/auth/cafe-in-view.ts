// Which café a session works on. Everyone works on their own café (users.location_id); an owner
// may choose another café of the same group, and from then on every request of that session (and
// its live socket) works on the chosen one. The choice lives in the session row, so a new
// sign-in or a PIN switch starts again on the person's own café.
import type { Knex } from 'knex';
import type { CafeRef, SessionUser, SessionView } from '@/domain/types';
import { can } from '@/domain/roles';
import { dialectOf, jsonSetNumbersSql } from '@server/db/dialect';
import { notFound } from '@server/domain-errors';

/** The cafés of the group `locationId` belongs to, oldest first. */
export async function groupCafes(db: Knex, locationId: number): Promise<CafeRef[]> {
  return db('locations')
    .whereIn('group_id', db('locations').where({ id: locationId }).select('group_id'))
    .orderBy('id')
    .select('id', 'name');
}

/** True when both cafés are in one group. */
async function sameGroup(db: Knex, a: number, b: number): Promise<boolean> {
  const rows = await db('locations').whereIn('id', [a, b]).select('group_id');
  return rows.length === (a === b ? 1 : 2) && rows.every((r) => r.group_id === rows[0].group_id);
}

/**
 * The person as this session works: an owner on the café the session chose, as long as it is
 * still in the owner's group; anyone else, or an owner without a choice, on their own café.
 */
export async function inView(db: Knex, user: SessionUser, chosen: unknown): Promise<SessionUser> {
  if (user.role !== 'owner' || typeof chosen !== 'number' || chosen === user.locationId) return user;
  return (await sameGroup(db, user.locationId, chosen)) ? { ...user, locationId: chosen } : user;
}

/**
 * An owner chooses the café of their group this session works on. A café outside the group is
 * "not found", whether or not it exists. Written into the stored session row (an UPDATE, as
 * recordActivity does), so a session a sign-out just deleted is not brought back.
 */
export async function chooseCafe(db: Knex, user: SessionUser, sid: string, locationId: number): Promise<CafeRef> {
  const cafe = (await groupCafes(db, user.locationId)).find((c) => c.id === locationId);
  if (!cafe) throw notFound('Café');
  await db('sessions')
    .where({ sid })
    .update({ sess: db.raw(jsonSetNumbersSql(dialectOf(db), 'sess', [['cafeId', '?']]), [locationId]) });
  return cafe;
}

/** The signed-in person as the API shows them. */
export const publicUser = (u: SessionUser) => ({ id: u.id, name: u.name, role: u.role });

/** Who is signed in and on which café, with the cafés an owner may choose (GET /api/session, and the sign-in's answer). */
export async function sessionView(db: Knex, user: SessionUser | undefined): Promise<SessionView> {
  if (!user) return { user: null, cafe: null, groupCafes: [] };
  const cafes = await groupCafes(db, user.locationId);
  const cafe = cafes.find((c) => c.id === user.locationId) ?? null;
  return { user: publicUser(user), cafe, groupCafes: can(user.role, 'switchCafe') ? cafes : [] };
}
