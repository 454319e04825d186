// The owner's staff accounts: list, add (with an invitation mail), change role, deactivate.
// The café keeps at least one active owner, or nobody could manage the team any more.
import { randomBytes } from 'node:crypto';
import type { Knex } from 'knex';
import type { NewPersonBody, PersonPatchBody, TeamMember, TeamView } from '@/domain/team-schemas';
import type { SessionUser } from '@/domain/types';
import { hashPassword } from '@server/auth/passwords';
import { bool, isUniqueViolation } from '@server/db/rows';
import { conflict, notFound } from '@server/domain-errors';
import type { Deps } from '@server/deps';
import { runCommand } from '@server/events';
import { createLink, mailLink, mailUnavailable, voidLinks } from './invitations';
import { signOutEverywhere } from './sessions';
import type { Db } from '@server/db/knex';
import type { Row } from '@server/db/tables';

function toMember(u: Row<'users'>, link: Row<'invitations'> | undefined, now: Date): TeamMember {
  return {
    id: u.id,
    name: u.name,
    username: u.username,
    role: u.role,
    email: u.email ?? null,
    active: bool(u.active),
    awaitingPassword: bool(u.awaiting_password),
    hasPin: !!u.pin_hash,
    link: link
      ? {
          purpose: link.purpose,
          createdAt: link.created_at,
          sentAt: link.sent_at ?? null,
          expiresAt: link.expires_at,
          expired: link.expires_at <= now.toISOString(),
        }
      : null,
  };
}

async function members(db: Db, locationId: number, now: Date, onlyId?: number): Promise<TeamMember[]> {
  const q = db('users').where({ location_id: locationId });
  if (onlyId) q.andWhere({ id: onlyId });
  const users = await q.orderBy([{ column: 'active', order: 'desc' }, { column: 'name' }]);
  const links = await db('invitations')
    .whereIn(
      'user_id',
      users.map((u) => u.id),
    )
    .whereNull('used_at')
    .whereNull('voided_at')
    .orderBy('id');
  const newest = new Map(links.map((l) => [l.user_id as number, l])); // later rows win
  return users.map((u) => toMember(u, newest.get(u.id), now));
}

export async function listTeam(deps: Deps, owner: SessionUser): Promise<TeamView> {
  const l = await deps.db('locations').where({ id: owner.locationId }).first('time_zone', 'locale');
  return {
    members: await members(deps.db, owner.locationId, deps.clock()),
    youId: owner.id,
    timeZone: l?.time_zone ?? 'UTC',
    locale: l?.locale ?? 'en-US',
  };
}

async function memberById(db: Db, locationId: number, id: number, now: Date): Promise<TeamMember> {
  const [m] = await members(db, locationId, now, id);
  if (!m) throw notFound('Person');
  return m;
}

/** Adds a person who can't sign in until they set a password from the invitation mailed to them. */
export async function addPerson(deps: Deps, owner: SessionUser, body: NewPersonBody, origin: string) {
  if (!deps.mailer) throw mailUnavailable();
  // Nobody knows this password; the person sets their own from the link.
  const placeholder = await hashPassword(randomBytes(32).toString('hex'));
  let created: { userId: number; link: { id: number; token: string } };
  try {
    created = await runCommand(deps, async (trx) => {
      const now = deps.clock();
      // names are unique within the group (the unique index decides when two owners add one at
      // once); another group's names are never looked at, so none is ever told apart
      const { group_id: groupId } = await trx('locations').where({ id: owner.locationId }).first('group_id');
      if (await trx('users').where({ group_id: groupId }).whereRaw('lower(username) = ?', [body.username]).first('id')) {
        throw conflict(`The sign-in name "${body.username}" is taken`, [{ path: 'username', message: 'Taken: choose another' }]);
      }
      const [{ id: userId }] = await trx('users')
        .insert({
          location_id: owner.locationId,
          group_id: groupId,
          username: body.username,
          name: body.name,
          email: body.email,
          role: body.role,
          password_hash: placeholder,
          awaiting_password: true,
          created_at: now.toISOString(),
        })
        .returning('id');
      const link = await createLink(trx, { locationId: owner.locationId, userId, purpose: 'invite', createdBy: owner.id, now });
      return { result: { userId, link }, events: [] };
    });
  } catch (err) {
    if (isUniqueViolation(err)) throw conflict(`The sign-in name "${body.username}" is taken`);
    throw err;
  }
  const mailed = await mailLink(deps, owner, { ...created.link, purpose: 'invite' }, body, origin);
  return { member: await memberById(deps.db, owner.locationId, created.userId, deps.clock()), mailed };
}

async function activeOwnersOtherThan(trx: Knex.Transaction, locationId: number, id: number): Promise<number> {
  const row = await trx('users').where({ location_id: locationId, role: 'owner', active: true }).whereNot({ id }).count<{ n: number }>({ n: '*' }).first();
  return Number(row?.n ?? 0);
}

/** Name, e-mail, role or active. Deactivating signs the person out everywhere. */
export async function updatePerson(deps: Deps, owner: SessionUser, id: number, patch: PersonPatchBody): Promise<TeamMember> {
  const deactivated = await runCommand(deps, async (trx) => {
    const person = await trx('users').where({ id, location_id: owner.locationId }).first();
    if (!person) throw notFound('Person');
    const wasActiveOwner = person.role === 'owner' && bool(person.active);
    const staysActiveOwner = (patch.role ?? person.role) === 'owner' && (patch.active ?? bool(person.active));
    if (wasActiveOwner && !staysActiveOwner && (await activeOwnersOtherThan(trx, owner.locationId, id)) === 0) {
      throw conflict(`${person.name} is the only active owner: make someone else an owner first`);
    }
    const at = deps.clock().toISOString();
    const change: Record<string, unknown> = {};
    if (patch.name !== undefined) change.name = patch.name;
    if (patch.email !== undefined) change.email = patch.email;
    if (patch.role !== undefined) change.role = patch.role;
    if (patch.active !== undefined) change.active = patch.active;
    await trx('users').where({ id }).update(change);
    const goingInactive = patch.active === false && bool(person.active);
    if (goingInactive) await voidLinks(trx, id, at); // an old link must not bring them back
    return { result: goingInactive, events: [] };
  });
  if (deactivated) await signOutEverywhere(deps, id);
  return memberById(deps.db, owner.locationId, id, deps.clock());
}
