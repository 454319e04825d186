// Where the throttles keep their counts: in this process (one process), or in Redis (REDIS_URL,
// several processes behind a load balancer), so sign-in pacing, wrong PINs and wrong passwords
// are counted once for the whole café group rather than once per process.
// While Redis is away each count falls back to the process's own, logged: the morning rush goes on
// signing in, with each process limiting on its own until Redis is back.
import { Redis } from 'ioredis';
import { MemoryStore, type ClientRateLimitInfo, type Options, type Store } from 'express-rate-limit';
import { MemorySignInCounts, type SignInCounts } from './sign-in-throttle';
import { RedisSignInCounts } from './redis-sign-in-counts';

export interface Limits {
  /** Resolves once the counts can be reached (at once in one process). */
  ready: Promise<void>;
  signIn: SignInCounts;
  /** A store for express-rate-limit; `prefix` keeps one limiter's keys apart from another's. */
  rateLimitStore(prefix: string): Store;
  close(): Promise<void>;
}

export function processLimits(): Limits {
  return { ready: Promise.resolve(), signIn: new MemorySignInCounts(), rateLimitStore: () => new MemoryStore(), close: async () => {} };
}

// a fixed window per key, as express-rate-limit's own MemoryStore counts
const INCREMENT = `
local hits = redis.call('INCR', KEYS[1])
if hits == 1 then redis.call('PEXPIRE', KEYS[1], ARGV[1]) end
return { hits, redis.call('PTTL', KEYS[1]) }`;

/** express-rate-limit's counts in Redis (a fixed window per key, like its MemoryStore). */
class RedisRateLimitStore implements Store {
  private windowMs = 60_000;
  constructor(
    private readonly redis: Redis,
    readonly prefix: string,
  ) {}

  init(options: Options) {
    this.windowMs = options.windowMs;
  }

  private info(hits: number, ttl: number): ClientRateLimitInfo {
    return { totalHits: hits, resetTime: new Date(Date.now() + Math.max(0, ttl)) };
  }

  async get(key: string) {
    const [hits, ttl] = await Promise.all([this.redis.get(this.prefix + key), this.redis.pttl(this.prefix + key)]);
    return hits === null ? undefined : this.info(Number(hits), ttl);
  }

  async increment(key: string) {
    const [hits, ttl] = (await this.redis.eval(INCREMENT, 1, this.prefix + key, this.windowMs)) as [number, number];
    return this.info(hits, ttl);
  }

  async decrement(key: string) {
    await this.redis.decr(this.prefix + key);
  }

  async resetKey(key: string) {
    await this.redis.del(this.prefix + key);
  }
}

/** Runs `shared`, or `own` when it fails (Redis away). */
type Fallback = <R>(shared: () => Promise<R>, own: () => R | Promise<R>) => Promise<R>;

/** Sign-in counts in Redis, in this process's own while Redis is away. */
function signInCounts(shared: SignInCounts, own: SignInCounts, attempt: Fallback): SignInCounts {
  return {
    failures: (log, key, now) =>
      attempt(
        () => shared.failures(log, key, now),
        () => own.failures(log, key, now),
      ),
    nextTurn: (name, now) =>
      attempt(
        () => shared.nextTurn(name, now),
        () => own.nextTurn(name, now),
      ),
    takeTurn: (name, now) =>
      attempt(
        () => shared.takeTurn(name, now),
        () => own.takeTurn(name, now),
      ),
    settle: (keys, failed, now) =>
      attempt(
        () => shared.settle(keys, failed, now),
        () => own.settle(keys, failed, now),
      ),
  };
}

/** A rate limiter's counts in Redis, in this process's own while Redis is away. */
function rateLimitStore(shared: RedisRateLimitStore, own: MemoryStore, attempt: Fallback): Store {
  return {
    localKeys: false,
    prefix: shared.prefix,
    init: (options) => {
      shared.init(options);
      own.init(options);
    },
    get: (key) =>
      attempt(
        () => shared.get(key),
        () => own.get(key),
      ),
    increment: (key) =>
      attempt(
        () => shared.increment(key),
        () => own.increment(key),
      ),
    decrement: (key) =>
      attempt(
        () => shared.decrement(key),
        () => own.decrement(key),
      ),
    resetKey: (key) =>
      attempt(
        () => shared.resetKey(key),
        () => own.resetKey(key),
      ),
  };
}

export function redisLimits(url: string, log: (message: string) => void = console.warn): Limits {
  // fail at once while Redis is away (the fallback counts instead), never wait in a queue
  const redis = new Redis(url, { enableOfflineQueue: false, maxRetriesPerRequest: 1 });
  redis.on('error', () => {}); // reported once per fallback below, not per reconnect attempt
  let warned = false;
  const attempt: Fallback = async (shared, own) => {
    try {
      return await shared();
    } catch (err) {
      if (!warned) log(`Redis is away; throttles count in this process until it is back (${err instanceof Error ? err.message : String(err)})`);
      warned = true;
      return own();
    }
  };
  redis.on('ready', () => (warned = false));
  return {
    ready: new Promise<void>((resolve) => (redis.status === 'ready' ? resolve() : redis.once('ready', () => resolve()))),
    signIn: signInCounts(new RedisSignInCounts(redis), new MemorySignInCounts(), attempt),
    rateLimitStore: (prefix) => rateLimitStore(new RedisRateLimitStore(redis, `jugline:limit:${prefix}:`), new MemoryStore(), attempt),
    close: async () => {
      redis.disconnect();
    },
  };
}
