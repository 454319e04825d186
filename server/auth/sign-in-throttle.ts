// The counts behind sign-in pacing (the rules and numbers: src/domain/sign-in-pacing.ts), kept in
// memory per process like the other throttles. Every map is bounded, so a flood of made-up names
// or addresses costs a fixed amount of memory; a wait is a timer, never a held worker, and the
// number of waiting attempts is capped per name and in all.
import {
  ADDRESS_FAILURES_PER_HOUR,
  FAILURE_WINDOW_MS,
  PAIR_FAILURES_PER_HOUR,
  WAITING_SIGN_INS_IN_ALL,
  WAITING_SIGN_INS_PER_NAME,
  signInPauseMs,
} from '@/domain/sign-in-pacing';

/** Keys a log keeps at most; past it the least recently failed key is forgotten. */
const MAX_KEYS = 20_000;

/** Failure times per key over the last window, at most `cap` per key (all a limit needs). */
export class FailureLog {
  private readonly times = new Map<string, number[]>();
  constructor(private readonly cap: number) {}

  private recent(key: string, now: number): number[] {
    const list = this.times.get(key);
    if (!list) return [];
    const kept = list.filter((t) => now - t < FAILURE_WINDOW_MS);
    if (kept.length === 0) this.times.delete(key);
    else if (kept.length !== list.length) this.times.set(key, kept);
    return kept;
  }

  count(key: string, now: number): number {
    return this.recent(key, now).length;
  }

  /** When the oldest failure of the key leaves the window (ms from now). */
  msUntilOneExpires(key: string, now: number): number {
    const list = this.recent(key, now);
    return list.length ? list[0] + FAILURE_WINDOW_MS - now : 0;
  }

  add(key: string, now: number): void {
    const list = [...this.recent(key, now), now].slice(-this.cap);
    this.times.delete(key); // re-inserted last: Map order is the eviction order
    this.times.set(key, list);
    if (this.times.size > MAX_KEYS) this.times.delete(this.times.keys().next().value!);
  }
}

export interface SignInAttempt {
  /** Trimmed, lower case. */
  name: string;
  /** The client address, an IPv6 address cut to its /56 (one customer's network). */
  address: string;
  /** The known-terminal id when the browser has signed in as this name before; else null. */
  terminal: string | null;
}

export type Outcome = 'failed' | 'signed-in' | 'not-checked';

export type Admission =
  | {
      ok: true;
      /** Waits the attempt's turn (at once when it has none to wait). */
      turn(): Promise<void>;
      /** Counts the outcome (a failure) and ends the attempt's turn. */
      settle(outcome: Outcome): Promise<void>;
    }
  | { ok: false; status: 429 | 503; retryAfterMs: number; message: string };

const count = (n: number, unit: string) => `${n} ${unit}${n === 1 ? '' : 's'}`;
const minutes = (ms: number) => count(Math.max(1, Math.ceil(ms / 60_000)), 'minute');
const seconds = (ms: number) => count(Math.max(1, Math.ceil(ms / 1000)), 'second');

/** The keys an admitted attempt counts under: name and address only for an unknown browser. */
export interface Settled {
  pair: string;
  address: string | null;
  name: string | null;
}

/**
 * The counts behind the pacing, kept in this process (MemorySignInCounts) or in Redis for several
 * processes (redis-sign-in-counts.ts), so a name's failures, and its turns, are the same wherever
 * an attempt lands.
 */
export interface SignInCounts {
  /** A log's failures of the key over the last window, and when the oldest of them leaves it. */
  failures(log: 'pair' | 'address', key: string, now: number): Promise<{ count: number; msUntilOneExpires: number }>;
  /** When the name's next attempt from an unknown browser may be checked (`now` or earlier: at once). */
  nextTurn(name: string, now: number): Promise<number>;
  /**
   * Takes the name's next turn and returns when it starts. The turn after it is paced by the name's
   * failures plus the attempts being checked, each counted as a failure to come, so attempts fired
   * together are spaced as if they had failed one after another.
   */
  takeTurn(name: string, now: number): Promise<number>;
  /** Counts a failure under each key given, and ends the name's attempt being checked. */
  settle(keys: Settled, failed: boolean, now: number): Promise<void>;
}

/** The pause after `failures` failures, for n = 0 … past the cap (beyond the end: the last). */
export const PAUSES_MS = Array.from({ length: 24 }, (_, n) => signInPauseMs(n));
export const pauseAfter = (failures: number) => PAUSES_MS[Math.min(failures, PAUSES_MS.length - 1)];

/** Per name: when the next attempt from an unknown browser may be checked, and how many are being checked. */
interface NameLine {
  nextAt: number;
  checking: number;
}

export class MemorySignInCounts implements SignInCounts {
  private readonly logs = {
    pair: new FailureLog(PAIR_FAILURES_PER_HOUR),
    address: new FailureLog(ADDRESS_FAILURES_PER_HOUR),
    /** Only needs to count up to where the pause stops growing; the hour's worth is kept anyway. */
    name: new FailureLog(ADDRESS_FAILURES_PER_HOUR),
  };
  private readonly lines = new Map<string, NameLine>();

  async failures(log: 'pair' | 'address', key: string, now: number) {
    return { count: this.logs[log].count(key, now), msUntilOneExpires: this.logs[log].msUntilOneExpires(key, now) };
  }

  async nextTurn(name: string, now: number) {
    return this.lines.get(name)?.nextAt ?? now;
  }

  async takeTurn(name: string, now: number) {
    const line = this.lines.get(name) ?? { nextAt: now, checking: 0 };
    const slot = Math.max(now, line.nextAt);
    line.nextAt = slot + pauseAfter(this.logs.name.count(name, now) + line.checking + 1);
    line.checking += 1;
    this.lines.delete(name); // re-inserted last: Map order is the eviction order
    this.lines.set(name, line);
    if (this.lines.size > MAX_KEYS) this.dropIdleLines(now);
    return slot;
  }

  async settle(keys: Settled, failed: boolean, now: number) {
    if (failed) {
      this.logs.pair.add(keys.pair, now);
      if (keys.address !== null) this.logs.address.add(keys.address, now);
      if (keys.name !== null) this.logs.name.add(keys.name, now);
    }
    if (keys.name === null) return;
    const line = this.lines.get(keys.name);
    if (!line) return;
    line.checking = Math.max(0, line.checking - 1);
    if (line.checking === 0 && line.nextAt <= now) this.lines.delete(keys.name);
  }

  private dropIdleLines(now: number) {
    for (const [name, line] of this.lines) if (line.checking === 0 && line.nextAt <= now) this.lines.delete(name);
  }
}

export class SignInThrottle {
  /** Attempts of each name waiting their turn in this process, and in all: what a process holds. */
  private readonly waiting = new Map<string, number>();
  private waitingInAll = 0;

  constructor(
    private readonly now: () => number,
    private readonly sleep: (ms: number) => Promise<void>,
    /** The counts; several processes share theirs through Redis (redis-sign-in-counts.ts). */
    private readonly counts: SignInCounts = new MemorySignInCounts(),
  ) {}

  async admit(a: SignInAttempt): Promise<Admission> {
    const now = this.now();
    const pair = a.terminal ? `${a.name}\u0000terminal:${a.terminal}` : `${a.name}\u0000address:${a.address}`;
    const pairs = await this.counts.failures('pair', pair, now);
    if (pairs.count >= PAIR_FAILURES_PER_HOUR) {
      const where = a.terminal ? 'on this terminal' : 'from this address';
      return this.refuse(
        429,
        pairs.msUntilOneExpires,
        `Too many failed sign-ins for this name ${where}. Try again in about ${minutes(pairs.msUntilOneExpires)}, or sign in on a terminal this person has used before.`,
      );
    }
    // A terminal this name has signed in on is judged by its own count only (OWASP device cookies).
    if (a.terminal) return this.admitted(0, { pair, address: null, name: null });

    const addresses = await this.counts.failures('address', a.address, now);
    if (addresses.count >= ADDRESS_FAILURES_PER_HOUR) {
      const ms = addresses.msUntilOneExpires;
      return this.refuse(429, ms, `Too many failed sign-ins from this address. Try again in about ${minutes(ms)}.`);
    }
    const wait = Math.max(0, (await this.counts.nextTurn(a.name, now)) - now);
    if (wait > 0 && (this.waiting.get(a.name) ?? 0) >= WAITING_SIGN_INS_PER_NAME) {
      return this.refuse(
        429,
        wait,
        `Sign-ins for this name are being slowed after many wrong passwords. Try again in ${seconds(wait)}; a terminal this person has signed in on before is not slowed.`,
      );
    }
    if (wait > 0 && this.waitingInAll >= WAITING_SIGN_INS_IN_ALL) {
      return this.refuse(503, wait, `Too many sign-ins are waiting. Try again in ${seconds(wait)}.`);
    }
    const slot = await this.counts.takeTurn(a.name, now);
    return this.admitted(Math.max(0, slot - this.now()), { pair, address: a.address, name: a.name });
  }

  private refuse(status: 429 | 503, retryAfterMs: number, message: string): Admission {
    return { ok: false, status, retryAfterMs: Math.max(1000, retryAfterMs), message };
  }

  private admitted(wait: number, keys: Settled): Admission {
    const { name } = keys;
    let inLine = wait > 0 && name !== null;
    if (inLine && name !== null) {
      this.waiting.set(name, (this.waiting.get(name) ?? 0) + 1);
      this.waitingInAll += 1;
    }
    const leaveLine = () => {
      if (!inLine || name === null) return;
      inLine = false;
      const left = (this.waiting.get(name) ?? 1) - 1;
      if (left > 0) this.waiting.set(name, left);
      else this.waiting.delete(name);
      this.waitingInAll -= 1;
    };
    let settled = false;
    return {
      ok: true,
      turn: async () => {
        try {
          if (inLine) await this.sleep(wait);
        } finally {
          leaveLine();
        }
      },
      settle: async (outcome) => {
        if (settled) return;
        settled = true;
        leaveLine();
        await this.counts.settle(keys, outcome === 'failed', this.now());
      },
    };
  }
}
