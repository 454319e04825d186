// How sign-in attempts are paced. Three counts of failed sign-ins over the last hour:
// - per name and address together, and per address across names: hard limits (429), so one
//   address can't keep guessing one person's password or spray guesses over many names;
// - per name across all addresses: no lock-out (that would let anyone lock the owner out), but a
//   pause before each further attempt from a browser the name has not signed in on, growing with
//   the failures and capped, with at most a few attempts waiting at once (then 429).
// A browser that has signed in as the name before (a signed "known terminal" cookie, OWASP "Slow
// Down Online Guessing Attacks with Device Cookies") is judged by its own count only.

/** OWASP ASVS 4.0.3 V2.2.1: no more than 100 failed attempts an hour on one account. */
export const FAILED_SIGN_INS_PER_HOUR = 100;
export const FAILURE_WINDOW_MS = 60 * 60_000;
/** Failures of one name from one address (or one known terminal) before 429. */
export const PAIR_FAILURES_PER_HOUR = 20;
/** Failures from one address over all names before 429. */
export const ADDRESS_FAILURES_PER_HOUR = FAILED_SIGN_INS_PER_HOUR;
/** Failures of a name that cost nothing: typos happen. */
export const FREE_FAILURES = 5;
export const FIRST_PAUSE_MS = 1_000;
export const MAX_SIGN_IN_PAUSE_MS = 60_000;
/** Attempts of one name waiting for their turn at once; more answer 429 with Retry-After. */
export const WAITING_SIGN_INS_PER_NAME = 3;
/** Attempts waiting over all names at once; more answer 503 with Retry-After. */
export const WAITING_SIGN_INS_IN_ALL = 200;

/**
 * The pause before the next attempt from an unknown browser for a name with `failures` failed
 * sign-ins in the last hour: none for the first FREE_FAILURES, then 1 s doubling to the 60 s cap
 * (1, 2, 4 … 32, 60, 60 …). At the cap a name gets at most one attempt a minute, so with the free
 * ones and the steps before the cap it stays under FAILED_SIGN_INS_PER_HOUR however many
 * addresses try.
 */
export function signInPauseMs(failures: number): number {
  if (failures < FREE_FAILURES) return 0;
  const steps = failures - FREE_FAILURES;
  return steps >= 16 ? MAX_SIGN_IN_PAUSE_MS : Math.min(MAX_SIGN_IN_PAUSE_MS, FIRST_PAUSE_MS * 2 ** steps);
}
