// Sign-in pacing: the pause per failure count, and the bound it gives on a virtual clock: however
// many addresses guess at once, one name gets no more than 100 failed checks in any hour (OWASP
// ASVS 4.0.3 V2.2.1), while attempts are paused or told when to come back, never locked out.
import { describe, expect, it } from 'vitest';
import { FailureLog, SignInThrottle } from '@server/auth/sign-in-throttle';
import { guessersAtOnce, virtualTime } from '../support/virtual-time';
import {
  FAILED_SIGN_INS_PER_HOUR,
  FAILURE_WINDOW_MS,
  FREE_FAILURES,
  MAX_SIGN_IN_PAUSE_MS,
  WAITING_SIGN_INS_IN_ALL,
  WAITING_SIGN_INS_PER_NAME,
  signInPauseMs,
} from '@/domain/sign-in-pacing';

describe('signInPauseMs', () => {
  it('is free for the first failures, then doubles from 1 s and stops at the cap', () => {
    // the steps chosen here (common practice: exponential backoff with a cap)
    expect([0, 1, 4].map(signInPauseMs)).toEqual([0, 0, 0]);
    expect(FREE_FAILURES).toBe(5);
    expect([5, 6, 7, 8, 9, 10].map(signInPauseMs)).toEqual([1000, 2000, 4000, 8000, 16000, 32000]);
    expect([11, 12, 50, 100, 10_000].map(signInPauseMs)).toEqual(Array(5).fill(MAX_SIGN_IN_PAUSE_MS));
  });

  it('never shrinks as failures grow', () => {
    for (let n = 0; n < 200; n++) expect(signInPauseMs(n + 1)).toBeGreaterThanOrEqual(signInPauseMs(n));
  });
});

describe('SignInThrottle on a virtual clock', () => {
  it(`lets no name get more than ${FAILED_SIGN_INS_PER_HOUR} failed checks in any hour, with 12 guessers at once from fresh addresses`, async () => {
    const time = virtualTime();
    const throttle = new SignInThrottle(time.now, time.sleep);
    const { checks, refusals } = await guessersAtOnce(time, [throttle], 12, 3 * FAILURE_WINDOW_MS);

    const worstHour = Math.max(...checks.map((t) => checks.filter((u) => u >= t && u < t + FAILURE_WINDOW_MS).length));
    expect(worstHour).toBeLessThanOrEqual(FAILED_SIGN_INS_PER_HOUR); // ASVS V2.2.1
    expect(checks.length).toBeGreaterThan(100); // slowed, not shut: guesses are still checked
    expect(refusals.length).toBeGreaterThan(0); // the line filled: the rest were told when to come back
    expect(Math.max(...refusals)).toBeLessThanOrEqual((WAITING_SIGN_INS_PER_NAME + 1) * MAX_SIGN_IN_PAUSE_MS);
  });

  it('a terminal that has signed in as the name is not paused by the flood; an unknown browser waits the capped pause', async () => {
    let now = 0;
    const slept: number[] = [];
    const throttle = new SignInThrottle(
      () => now,
      async (ms) => {
        slept.push(ms);
        now += ms;
      },
    );
    const attempt = async (terminal: string | null, outcome: 'failed' | 'signed-in') => {
      const a = await throttle.admit({ name: 'owner', address: `192.0.2.${slept.length % 250}`, terminal });
      if (!a.ok) throw new Error(a.message);
      await a.turn();
      await a.settle(outcome);
    };
    for (let i = 0; i < 20; i++) await attempt(null, 'failed');
    expect(slept.at(-1)).toBe(MAX_SIGN_IN_PAUSE_MS);
    const before = slept.length;
    await attempt('terminal-1', 'signed-in');
    expect(slept.length).toBe(before);
    await attempt(null, 'signed-in');
    expect(slept.slice(before)).toEqual([MAX_SIGN_IN_PAUSE_MS]);
  });
  it(`holds at most ${WAITING_SIGN_INS_IN_ALL} attempts waiting over all names; past that 503 with a time to come back`, async () => {
    const throttle = new SignInThrottle(
      () => 0,
      () => new Promise(() => {}),
    );
    let address = 0;
    const admit = (name: string) => throttle.admit({ name, address: `2001:db8:${(address++).toString(16)}::`, terminal: null });
    const waitFor = async (name: string) => {
      for (let i = 0; i < FREE_FAILURES; i++) {
        const a = await admit(name);
        if (!a.ok) throw new Error(a.message);
        await a.settle('failed'); // the free ones: checked at once
      }
      return await admit(name); // has to wait its turn now
    };
    for (let n = 0; n < WAITING_SIGN_INS_IN_ALL; n++) expect((await waitFor(`name-${n}`)).ok, `name-${n}`).toBe(true);
    const refused = await waitFor('one-too-many');
    expect(refused).toMatchObject({ ok: false, status: 503 });
    if (!refused.ok) expect(refused.retryAfterMs).toBeGreaterThanOrEqual(1000);
  });
});

describe('FailureLog', () => {
  it('forgets failures after the hour and keeps at most its cap per key', () => {
    const log = new FailureLog(3);
    for (let i = 0; i < 5; i++) log.add('a', i * 1000);
    expect(log.count('a', 5000)).toBe(3);
    expect(log.msUntilOneExpires('a', 5000)).toBe(2000 + FAILURE_WINDOW_MS - 5000);
    expect(log.count('a', 4000 + FAILURE_WINDOW_MS)).toBe(0);
  });

  it('holds a bounded number of keys, dropping the one that failed longest ago', () => {
    const log = new FailureLog(1);
    log.add('first', 0);
    for (let i = 0; i < 20_000; i++) log.add(`k${i}`, 1);
    expect(log.count('first', 2)).toBe(0);
    expect(log.count('k19999', 2)).toBe(1);
  });
});
