// PINs for switching person on a shared terminal. A PIN is stored bcrypt-hashed like a password.
// Four to six digits are few, so the guard is the count of tries: each try is counted before the
// PIN is checked (parallel tries can't slip past the limit), and the PIN_TRIES-th wrong one
// locks that person's PIN for PIN_LOCK_MINUTES. The PIN itself is never logged or stored in clear.
import { PIN_LOCK_MINUTES, PIN_TRIES, type SwitchBody, type SwitchPerson } from '@/domain/team-schemas';
import type { SessionUser } from '@/domain/types';
import { hashPassword, verifyPassword } from '@server/auth/passwords';
import { conflict, DomainError, notFound, tooMany, unauthenticated } from '@server/domain-errors';
import { lockingRead } from '@server/db/dialect';
import type { Deps } from '@server/deps';
import type { Db } from '@server/db/knex';

/** Wrong tries older than this are forgotten, so a slip now and then never adds up to a lock. */
const FAILURE_MEMORY_MS = 15 * 60_000;

export async function setPin(deps: Deps, locationId: number, userId: number, pin: string | null): Promise<void> {
  const person = await deps.db('users').where({ id: userId, location_id: locationId }).first('id');
  if (!person) throw notFound('Person');
  const hash = pin === null ? null : await hashPassword(pin);
  await deps.db('users').where({ id: userId }).update({ pin_hash: hash, pin_failures: 0, pin_failed_at: null, pin_locked_until: null });
}

/** A person sets their own PIN; their password shows it is them and not whoever is at the terminal. */
export async function setOwnPin(deps: Deps, user: SessionUser, password: string, pin: string | null): Promise<void> {
  const row = await deps.db('users').where({ id: user.id }).first('password_hash');
  if (!row || !(await verifyPassword(password, row.password_hash))) {
    throw unauthenticated('That is not your password', [{ path: 'password', message: 'Not your password' }]);
  }
  await setPin(deps, user.locationId, user.id, pin);
}

/** Active people of the terminal's café with a PIN, other than whoever is signed in. */
export async function switchPeople(db: Db, user: SessionUser): Promise<SwitchPerson[]> {
  return db('users')
    .where({ location_id: user.locationId, active: true })
    .whereNotNull('pin_hash')
    .whereNot({ id: user.id })
    .orderBy('name')
    .select('id', 'name', 'role');
}

export type SwitchOutcome = { ok: true; user: SessionUser } | { ok: false; wrongPin: boolean; error: DomainError };

function lockedError(name: string, until: Date, now: Date, loc: { time_zone: string; locale: string }) {
  const minutes = Math.max(1, Math.ceil((until.getTime() - now.getTime()) / 60_000));
  const at = new Intl.DateTimeFormat(loc.locale, { timeStyle: 'short', timeZone: loc.time_zone }).format(until);
  const first = name.trim().split(/\s+/)[0];
  return tooMany(
    `Too many wrong PINs for ${first}. Their PIN works again at ${at} (in ${minutes} minute${minutes === 1 ? '' : 's'}); they can sign in with their password meanwhile.`,
    { retryAt: until.toISOString() },
  );
}

/**
 * Checks a PIN switch from the signed-in `user`'s terminal to another person of the same café.
 * Answers with the person to sign in, or the refusal and whether it was a wrong PIN.
 */
export async function checkPinSwitch(deps: Deps, user: SessionUser, body: SwitchBody): Promise<SwitchOutcome> {
  const now = deps.clock();
  const target = await deps.db('users').where({ id: body.userId, location_id: user.locationId, active: true }).whereNotNull('pin_hash').first();
  if (!target) return { ok: false, wrongPin: false, error: notFound('Person with a PIN') };
  if (target.id === user.id) return { ok: false, wrongPin: false, error: conflict('You are already signed in here') };
  const loc = await deps.db('locations').where({ id: user.locationId }).first('time_zone', 'locale');

  // Count the try first, inside one transaction that holds the person's row (tries at once wait
  // for each other here, so each counts the one before).
  const reserved = await deps.db.transaction(async (trx) => {
    const u = await lockingRead(trx, trx('users').where({ id: target.id })).first('pin_failures', 'pin_failed_at', 'pin_locked_until');
    if (u.pin_locked_until && Date.parse(u.pin_locked_until) > now.getTime()) return { locked: new Date(u.pin_locked_until) };
    const recent = u.pin_failed_at && now.getTime() - Date.parse(u.pin_failed_at) < FAILURE_MEMORY_MS && !u.pin_locked_until;
    const tries = (recent ? u.pin_failures : 0) + 1;
    if (tries > PIN_TRIES) {
      // more tries in flight at once than the limit allows: lock now rather than check this one
      const until = new Date(now.getTime() + PIN_LOCK_MINUTES * 60_000);
      await trx('users').where({ id: target.id }).update({ pin_failures: 0, pin_locked_until: until.toISOString() });
      return { locked: until };
    }
    await trx('users').where({ id: target.id }).update({ pin_failures: tries, pin_failed_at: now.toISOString(), pin_locked_until: null });
    return { tries };
  });
  if (reserved.locked) return { ok: false, wrongPin: false, error: lockedError(target.name, reserved.locked, now, loc) };

  if (await verifyPassword(body.pin, target.pin_hash)) {
    await deps.db('users').where({ id: target.id }).update({ pin_failures: 0, pin_failed_at: null, pin_locked_until: null });
    return { ok: true, user: { id: target.id, name: target.name, role: target.role, locationId: target.location_id } };
  }
  if (reserved.tries >= PIN_TRIES) {
    const until = new Date(now.getTime() + PIN_LOCK_MINUTES * 60_000);
    await deps.db('users').where({ id: target.id }).update({ pin_failures: 0, pin_locked_until: until.toISOString() });
    return { ok: false, wrongPin: true, error: lockedError(target.name, until, now, loc) };
  }
  const left = PIN_TRIES - reserved.tries;
  return {
    ok: false,
    wrongPin: true,
    error: unauthenticated(`That PIN is not right. ${left} more wrong PIN${left === 1 ? '' : 's'} and it locks for ${PIN_LOCK_MINUTES} minutes.`, {
      triesLeft: left,
    }),
  };
}
