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
      settle(outcome: Outcome): void;
    }
  | { ok: false; status: 429 | 503; retryAfterMs: number; message: string };

/** Per name: when the next attempt from an unknown browser may be checked, and who is in line. */
interface NameLine {
  nextAt: number;
  waiting: number;
  checking: number;
}

const count = (n: number, unit: string) => `${n} ${unit}${n === 1 ? '' : 's'}`;
const minutes = (ms: number) => count(Math.max(1, Math.ceil(ms / 60_000)), 'minute');
const seconds = (ms: number) => count(Math.max(1, Math.ceil(ms / 1000)), 'second');

export class SignInThrottle {
  private readonly pairs = new FailureLog(PAIR_FAILURES_PER_HOUR);
  private readonly addresses = new FailureLog(ADDRESS_FAILURES_PER_HOUR);
  /** Only needs to count up to where the pause stops growing; the hour's worth is kept anyway. */
  private readonly names = new FailureLog(ADDRESS_FAILURES_PER_HOUR);
  private readonly lines = new Map<string, NameLine>();
  private waitingInAll = 0;

  constructor(
    private readonly now: () => number,
    private readonly sleep: (ms: number) => Promise<void>,
  ) {}

  admit(a: SignInAttempt): Admission {
    const now = this.now();
    const pair = a.terminal ? `${a.name}\u0000terminal:${a.terminal}` : `${a.name}\u0000address:${a.address}`;
    if (this.pairs.count(pair, now) >= PAIR_FAILURES_PER_HOUR) {
      const ms = this.pairs.msUntilOneExpires(pair, now);
      const where = a.terminal ? 'on this terminal' : 'from this address';
      return this.refuse(
        429,
        ms,
        `Too many failed sign-ins for this name ${where}. Try again in about ${minutes(ms)}, or sign in on a terminal this person has used before.`,
      );
    }
    // A terminal this name has signed in on is judged by its own count only (OWASP device cookies).
    if (a.terminal) return this.admitted(0, pair, null);

    if (this.addresses.count(a.address, now) >= ADDRESS_FAILURES_PER_HOUR) {
      const ms = this.addresses.msUntilOneExpires(a.address, now);
      return this.refuse(429, ms, `Too many failed sign-ins from this address. Try again in about ${minutes(ms)}.`);
    }
    const line = this.lines.get(a.name) ?? { nextAt: now, waiting: 0, checking: 0 };
    const slot = Math.max(now, line.nextAt);
    const wait = slot - now;
    if (wait > 0 && line.waiting >= WAITING_SIGN_INS_PER_NAME) {
      return this.refuse(
        429,
        wait,
        `Sign-ins for this name are being slowed after many wrong passwords. Try again in ${seconds(wait)}; a terminal this person has signed in on before is not slowed.`,
      );
    }
    if (wait > 0 && this.waitingInAll >= WAITING_SIGN_INS_IN_ALL) {
      return this.refuse(503, wait, `Too many sign-ins are waiting. Try again in ${seconds(wait)}.`);
    }
    // Each attempt in line is counted as a failure to come, so attempts fired together are spaced
    // as if they had failed one after another.
    line.nextAt = slot + signInPauseMs(this.names.count(a.name, now) + line.checking + 1);
    line.checking += 1;
    this.lines.set(a.name, line);
    return this.admitted(wait, pair, { name: a.name, address: a.address, line });
  }

  private refuse(status: 429 | 503, retryAfterMs: number, message: string): Admission {
    return { ok: false, status, retryAfterMs: Math.max(1000, retryAfterMs), message };
  }

  private admitted(wait: number, pair: string, unknown: { name: string; address: string; line: NameLine } | null): Admission {
    const waits = wait > 0 && unknown !== null;
    let inLine = waits;
    if (waits) {
      unknown.line.waiting += 1;
      this.waitingInAll += 1;
    }
    const leaveLine = () => {
      if (!inLine || !unknown) return;
      inLine = false;
      unknown.line.waiting -= 1;
      this.waitingInAll -= 1;
    };
    let settled = false;
    return {
      ok: true,
      turn: async () => {
        try {
          if (waits) await this.sleep(wait);
        } finally {
          leaveLine();
        }
      },
      settle: (outcome) => {
        if (settled) return;
        settled = true;
        leaveLine();
        const now = this.now();
        if (outcome === 'failed') {
          this.pairs.add(pair, now);
          if (unknown) {
            this.addresses.add(unknown.address, now);
            this.names.add(unknown.name, now);
          }
        }
        if (unknown) {
          const { line, name } = unknown;
          line.checking -= 1;
          if (line.checking === 0 && line.waiting === 0 && line.nextAt <= now) this.lines.delete(name);
          if (this.lines.size > MAX_KEYS) this.dropIdleLines(now);
        }
      },
    };
  }

  private dropIdleLines(now: number) {
    for (const [name, line] of this.lines) if (line.checking === 0 && line.waiting === 0 && line.nextAt <= now) this.lines.delete(name);
  }
}
