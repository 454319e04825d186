// Sign-in pacing's counts in Redis, for several processes behind a load balancer: a name's
// failures and its turns are the same on every process, so adding processes adds no guesses
// (each process keeping its own counts would give an attacker one share per process).
// Each step is one Lua script, so two processes taking a name's turn at once get two turns.
import type { Redis } from 'ioredis';
import { ADDRESS_FAILURES_PER_HOUR, FAILURE_WINDOW_MS, PAIR_FAILURES_PER_HOUR } from '@/domain/sign-in-pacing';
import { PAUSES_MS, type Settled, type SignInCounts } from './sign-in-throttle';

const PREFIX = 'jugline:sign-in:';
/** A line is kept this long past its last turn, so a process that died mid-check frees it. */
const LINE_TTL_MS = 5 * 60_000;

// A failure log is a sorted set of failure times; a member is the time and a random tail.
const FAILURES = `
redis.call('ZREMRANGEBYSCORE', KEYS[1], '-inf', tonumber(ARGV[1]) - tonumber(ARGV[2]))
local oldest = redis.call('ZRANGE', KEYS[1], 0, 0, 'WITHSCORES')
return { redis.call('ZCARD', KEYS[1]), oldest[2] or '-1' }`;

const ADD_FAILURE = `
redis.call('ZREMRANGEBYSCORE', KEYS[1], '-inf', tonumber(ARGV[1]) - tonumber(ARGV[2]))
redis.call('ZADD', KEYS[1], ARGV[1], ARGV[4])
redis.call('ZREMRANGEBYRANK', KEYS[1], 0, -(tonumber(ARGV[3]) + 1))
redis.call('PEXPIRE', KEYS[1], ARGV[2])
return 1`;

// KEYS: the name's failures, its line. ARGV: now, window, ttl, then the pause per failure count.
const TAKE_TURN = `
local now = tonumber(ARGV[1])
redis.call('ZREMRANGEBYSCORE', KEYS[1], '-inf', now - tonumber(ARGV[2]))
local failures = redis.call('ZCARD', KEYS[1])
local nextAt = tonumber(redis.call('HGET', KEYS[2], 'nextAt') or now)
local checking = tonumber(redis.call('HGET', KEYS[2], 'checking') or 0)
local slot = math.max(now, nextAt)
local pauses = #ARGV - 3
local pause = tonumber(ARGV[3 + math.min(failures + checking + 1, pauses - 1) + 1])
redis.call('HSET', KEYS[2], 'nextAt', slot + pause, 'checking', checking + 1)
redis.call('PEXPIRE', KEYS[2], slot + pause - now + tonumber(ARGV[3]))
return slot`;

const END_CHECK = `
local checking = tonumber(redis.call('HGET', KEYS[1], 'checking') or 0)
if checking > 0 then redis.call('HINCRBY', KEYS[1], 'checking', -1) end
return 1`;

const CAPS = { pair: PAIR_FAILURES_PER_HOUR, address: ADDRESS_FAILURES_PER_HOUR, name: ADDRESS_FAILURES_PER_HOUR };
type Log = keyof typeof CAPS;

export class RedisSignInCounts implements SignInCounts {
  constructor(private readonly redis: Redis) {}

  private key(log: Log | 'line', key: string) {
    return `${PREFIX}${log}:${key}`;
  }

  async failures(log: 'pair' | 'address', key: string, now: number) {
    const [count, oldest] = (await this.redis.eval(FAILURES, 1, this.key(log, key), now, FAILURE_WINDOW_MS)) as [number, string];
    const at = Number(oldest);
    return { count, msUntilOneExpires: at < 0 ? 0 : at + FAILURE_WINDOW_MS - now };
  }

  async nextTurn(name: string, now: number) {
    const nextAt = await this.redis.hget(this.key('line', name), 'nextAt');
    return nextAt === null ? now : Number(nextAt);
  }

  async takeTurn(name: string, now: number) {
    const slot = await this.redis.eval(TAKE_TURN, 2, this.key('name', name), this.key('line', name), now, FAILURE_WINDOW_MS, LINE_TTL_MS, ...PAUSES_MS);
    return Number(slot);
  }

  async settle(keys: Settled, failed: boolean, now: number) {
    const logged: [Log, string | null][] = [
      ['pair', keys.pair],
      ['address', keys.address],
      ['name', keys.name],
    ];
    const multi = this.redis.multi();
    if (failed) {
      const member = `${now}:${Math.random().toString(36).slice(2)}`;
      for (const [log, key] of logged) if (key !== null) multi.eval(ADD_FAILURE, 1, this.key(log, key), now, FAILURE_WINDOW_MS, CAPS[log], member);
    }
    if (keys.name !== null) multi.eval(END_CHECK, 1, this.key('line', keys.name));
    // a step that failed inside the transaction is thrown, so the caller's fallback counts it
    const stepFailed = (await multi.exec())?.find(([err]) => err);
    if (stepFailed) throw stepFailed[0];
  }
}
