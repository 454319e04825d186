// Signing a person out everywhere: their session rows go, and their live screens are told
// (deps.sessions 'signed-out' closes the sockets opened with each session, see the socket server).
import { dialectOf, jsonNumberSql } from '@server/db/dialect';
import type { Deps } from '@server/deps';
import type { Db } from '@server/db/knex';

/** The ids of the sessions signed in as this person (express-session rows, stored as JSON text). */
export async function sessionIdsOf(db: Db, userId: number): Promise<string[]> {
  const rows = await db('sessions')
    .whereRaw(`${jsonNumberSql(dialectOf(db), 'sess', ['passport', 'user'])} = ?`, [userId])
    .select('sid');
  return rows.map((r) => r.sid as string);
}

/** Ends every session of the person except `keepSid`; their open screens go to sign-in. */
export async function signOutEverywhere(deps: Deps, userId: number, keepSid?: string): Promise<number> {
  const sids = (await sessionIdsOf(deps.db, userId)).filter((sid) => sid !== keepSid);
  if (sids.length === 0) return 0;
  await deps.db('sessions').whereIn('sid', sids).delete();
  for (const sid of sids) deps.sessions.emit('signed-out', sid);
  return sids.length;
}
