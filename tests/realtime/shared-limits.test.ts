// The throttles' counts in Redis (server/auth/shared-limits.ts), against a real redis-server:
// three processes' sign-in pacing on one Redis holds the same bound as one process, where three
// processes counting on their own would let a name be guessed three times as often; a rate
// limiter's counts add up across processes; and while Redis is away each process counts alone.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { FAILED_SIGN_INS_PER_HOUR, FAILURE_WINDOW_MS } from '@/domain/sign-in-pacing';
import { redisLimits, type Limits } from '@server/auth/shared-limits';
import { MemorySignInCounts, SignInThrottle } from '@server/auth/sign-in-throttle';
import { freePort } from '@scripts/services/free-port';
import { startRedis, type RedisServer } from '@scripts/services/redis';
import { guessersAtOnce, virtualTime } from '../support/virtual-time';

let redis: RedisServer;
const opened: Limits[] = [];
const limitsOn = async (url: string, log: (m: string) => void = () => {}, ready = true) => {
  const limits = redisLimits(url, log);
  opened.push(limits);
  if (ready) await limits.ready;
  return limits;
};

beforeAll(async () => {
  redis = await startRedis();
});
afterAll(async () => {
  for (const limits of opened) await limits.close();
  await redis?.stop();
});

/** The most failed checks of the name in any hour. */
const worstHour = (checks: number[]) => Math.max(...checks.map((t) => checks.filter((u) => u >= t && u < t + FAILURE_WINDOW_MS).length));

describe('sign-in pacing on several processes', () => {
  it(`holds ${FAILED_SIGN_INS_PER_HOUR} failed checks an hour for a name across three processes sharing Redis`, async () => {
    const time = virtualTime();
    const throttles = await Promise.all([0, 1, 2].map(async () => new SignInThrottle(time.now, time.sleep, (await limitsOn(redis.url)).signIn)));
    const { checks } = await guessersAtOnce(time, throttles, 12, 2 * FAILURE_WINDOW_MS);
    expect(worstHour(checks)).toBeLessThanOrEqual(FAILED_SIGN_INS_PER_HOUR); // OWASP ASVS 4.0.3 V2.2.1
    expect(checks.length).toBeGreaterThan(100); // slowed, not shut
  });

  it('(what sharing buys) three processes counting on their own let the same flood past the bound', async () => {
    const time = virtualTime();
    const throttles = [0, 1, 2].map(() => new SignInThrottle(time.now, time.sleep, new MemorySignInCounts()));
    const { checks } = await guessersAtOnce(time, throttles, 12, 2 * FAILURE_WINDOW_MS);
    expect(worstHour(checks)).toBeGreaterThan(FAILED_SIGN_INS_PER_HOUR);
  });
});

describe('rate limiters on several processes', () => {
  it('count one client’s hits together, and forget them when the window ends', async () => {
    const [one, two] = (await Promise.all([limitsOn(redis.url), limitsOn(redis.url)])).map((l) => l.rateLimitStore('test-hits'));
    for (const store of [one, two]) await store.init?.({ windowMs: 60_000 } as never);
    await one.increment('192.0.2.7');
    await two.increment('192.0.2.7');
    expect((await one.increment('192.0.2.7')).totalHits).toBe(3);
    expect((await two.get!('192.0.2.7'))?.totalHits).toBe(3);
    expect((await two.increment('192.0.2.8')).totalHits).toBe(1); // another client
    await one.decrement('192.0.2.7'); // a request that turned out fine gives its hit back
    expect((await two.get!('192.0.2.7'))?.totalHits).toBe(2);
    await two.resetKey('192.0.2.7');
    expect(await one.get!('192.0.2.7')).toBeUndefined();
  });
});

describe('while Redis is away', () => {
  it('each process counts on its own, says so once, and refuses no one for it', async () => {
    const said: string[] = [];
    const nowhere = `redis://127.0.0.1:${await freePort()}`; // nothing listens there
    const limits = await limitsOn(nowhere, (m) => said.push(m), false);
    const throttle = new SignInThrottle(
      () => 0,
      async () => {},
      limits.signIn,
    );
    for (let i = 0; i < 3; i++) {
      const a = await throttle.admit({ name: 'owner', address: '192.0.2.9', terminal: null });
      expect(a.ok).toBe(true);
      if (a.ok) await a.settle('failed');
    }
    expect(await limits.signIn.failures('pair', 'owner\u0000address:192.0.2.9', 0)).toEqual({ count: 3, msUntilOneExpires: FAILURE_WINDOW_MS });
    const store = limits.rateLimitStore('test-away');
    await store.init?.({ windowMs: 60_000 } as never);
    expect((await store.increment('192.0.2.9')).totalHits).toBe(1);
    expect((await store.increment('192.0.2.9')).totalHits).toBe(2);
    expect(said).toHaveLength(1);
    expect(said[0]).toMatch(/Redis is away/);
  });
});
