// Invitation and reset links: a one-time token in a mailed link sets the person's password.
// The token is 32 random bytes; only its SHA-256 is stored, so a copy of the database can't be
// turned into a working link. A link works once, until it expires, and only while it is the
// person's newest. A reset link does not touch the old password: that keeps working until the
// new one is set, so a mistaken or intercepted reset can't lock anyone out on its own (to shut
// someone out at once, the owner deactivates them).
import { createHash, randomBytes } from 'node:crypto';
import type { Knex } from 'knex';
import { LINK_HOURS, type LinkPurpose, type WelcomeView } from '@/domain/team-schemas';
import type { SessionUser } from '@/domain/types';
import { hashPassword } from '@server/auth/passwords';
import { lockingRead } from '@server/db/dialect';
import { bool } from '@server/db/rows';
import { conflict, gone, notFound, notSetUp, upstreamFailed } from '@server/domain-errors';
import type { Deps } from '@server/deps';
import { runCommand } from '@server/events';
import { linkMail } from './mail';
import type { Db } from '@server/db/knex';

export const newToken = () => randomBytes(32).toString('base64url');
export const hashToken = (token: string) => createHash('sha256').update(token, 'utf8').digest('hex');

/** One answer for an unknown, used, replaced or expired link, so the page gives nothing away. */
export const linkNotValid = () =>
  gone("This link can't be used any more: links work once, for a limited time, and a newer link replaces an older one. Ask the owner to send you a new one.");

export const mailUnavailable = () => notSetUp('No mail service is set up, so no link can be sent');

/** Voids the person's open links. */
export function voidLinks(trx: Db, userId: number, at: string) {
  return trx('invitations').where({ user_id: userId }).whereNull('used_at').whereNull('voided_at').update({ voided_at: at });
}

/** A new link for the person (voiding any older one); the token is returned only to be mailed. */
export async function createLink(
  trx: Knex.Transaction,
  o: { locationId: number; userId: number; purpose: LinkPurpose; createdBy: number; now: Date },
): Promise<{ id: number; token: string }> {
  const at = o.now.toISOString();
  // the person's row held until commit: links sent at once void each other in turn, leaving one
  await lockingRead(trx, trx('users').where({ id: o.userId })).first('id');
  await voidLinks(trx, o.userId, at);
  const token = newToken();
  const [{ id }] = await trx('invitations')
    .insert({
      location_id: o.locationId,
      user_id: o.userId,
      purpose: o.purpose,
      token_hash: hashToken(token),
      created_by: o.createdBy,
      created_at: at,
      expires_at: new Date(o.now.getTime() + LINK_HOURS * 3600_000).toISOString(),
    })
    .returning('id');
  return { id, token };
}

/** Mails a link made by createLink; true once the mail server took it. */
export async function mailLink(
  deps: Deps,
  sender: SessionUser,
  link: { id: number; token: string; purpose: LinkPurpose },
  person: { name: string; username: string; role: string; email: string },
  origin: string,
): Promise<boolean> {
  if (!deps.mailer) return false;
  const location = await deps.db('locations').where({ id: sender.locationId }).first('name');
  const mail = linkMail({
    purpose: link.purpose,
    personName: person.name,
    username: person.username,
    role: person.role,
    locationName: location.name,
    senderName: sender.name,
    link: `${origin}/welcome/${link.token}`,
  });
  try {
    await deps.mailer.send({ to: person.email, ...mail, fromName: location.name, locationId: sender.locationId, ownerOnly: true });
  } catch {
    return false; // the link stays unsent; the Team screen offers to send a new one
  }
  await deps.db('invitations').where({ id: link.id }).update({ sent_at: deps.clock().toISOString() });
  return true;
}

/** The owner sends someone a new invitation or reset link. */
export async function sendLink(deps: Deps, owner: SessionUser, userId: number, purpose: LinkPurpose, origin: string) {
  if (!deps.mailer) throw mailUnavailable();
  const person = await deps.db('users').where({ id: userId, location_id: owner.locationId }).first();
  if (!person) throw notFound('Person');
  if (!bool(person.active)) throw conflict(`${person.name} is inactive: reactivate them first`);
  if (!person.email) throw conflict(`${person.name} has no e-mail address: add one first`);
  // Someone who never set a password gets an invitation whichever was asked for.
  const kind: LinkPurpose = bool(person.awaiting_password) ? 'invite' : purpose;
  const link = await runCommand(deps, async (trx) => ({
    result: await createLink(trx, { locationId: owner.locationId, userId, purpose: kind, createdBy: owner.id, now: deps.clock() }),
    events: [],
  }));
  const sent = await mailLink(deps, owner, { ...link, purpose: kind }, person, origin);
  if (!sent) throw upstreamFailed('The mail server did not take the mail. Try again in a moment.', undefined, 'unavailable');
  return { purpose: kind, to: person.email as string };
}

/** The open link for a token, with its person, or null. */
async function openLink(db: Db, token: string, now: Date) {
  const row = await db('invitations')
    .join('users', 'users.id', 'invitations.user_id')
    .join('locations', 'locations.id', 'invitations.location_id')
    .where('invitations.token_hash', hashToken(token))
    .whereNull('invitations.used_at')
    .whereNull('invitations.voided_at')
    .andWhere('invitations.expires_at', '>', now.toISOString())
    .first('invitations.id', 'invitations.purpose', 'users.id as user_id', 'users.name', 'users.username', 'users.active', 'locations.name as location_name');
  return row && bool(row.active) ? row : null;
}

export async function welcomeView(deps: Deps, token: string): Promise<WelcomeView> {
  const link = await openLink(deps.db, token, deps.clock());
  if (!link) throw linkNotValid();
  return { name: link.name, username: link.username, purpose: link.purpose, locationName: link.location_name };
}

/** Sets the person's password from the link and uses the link up; the person to sign in. */
export async function acceptLink(deps: Deps, token: string, password: string): Promise<SessionUser> {
  if (!(await openLink(deps.db, token, deps.clock()))) throw linkNotValid(); // before spending a hash
  const hash = await hashPassword(password);
  return runCommand(deps, async (trx) => {
    const now = deps.clock();
    const at = now.toISOString();
    const link = await openLink(trx, token, now); // again: another tab may have used it meanwhile
    if (!link) throw linkNotValid();
    // conditional: the same link used from another tab at this moment is used once
    const used = await trx('invitations').where({ id: link.id }).whereNull('used_at').whereNull('voided_at').update({ used_at: at });
    if (used === 0) throw linkNotValid();
    await voidLinks(trx, link.user_id, at);
    await trx('users').where({ id: link.user_id }).update({ password_hash: hash, awaiting_password: false });
    const u = await trx('users').where({ id: link.user_id }).first();
    return { result: { id: u.id, name: u.name, role: u.role, locationId: u.location_id }, events: [] };
  });
}
