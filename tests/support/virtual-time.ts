// A virtual clock for sign-in pacing: sleeps wake in time order when the test moves it, so an
// hour of guessing runs in a moment and nothing waits in real time.
import type { SignInThrottle } from '@server/auth/sign-in-throttle';

export interface VirtualTime {
  now(): number;
  sleep(ms: number): Promise<void>;
  /** How many are asleep now. */
  sleeping(): number;
  /** Wakes the earliest sleeper once `ready()` says everyone who will sleep is asleep; false when none is left. */
  step(ready?: () => boolean): Promise<boolean>;
}

export function virtualTime(): VirtualTime {
  let now = 0;
  const timers: { at: number; wake: () => void }[] = [];
  return {
    now: () => now,
    sleep: (ms: number) => new Promise<void>((wake) => timers.push({ at: now + ms, wake })),
    sleeping: () => timers.length,
    async step(ready = () => true) {
      // let the woken work run up to its next sleep (with Redis in between, that takes round trips)
      do await new Promise((r) => setImmediate(r));
      while (!ready());
      if (timers.length === 0) return false;
      timers.sort((a, b) => a.at - b.at);
      const next = timers.shift()!;
      now = Math.max(now, next.at);
      next.wake();
      return true;
    },
  };
}

/**
 * `count` guessers at once, each from fresh addresses, at one name until `end`: each attempt
 * goes to the next throttle in turn (one per process), is checked and fails; a refused one comes
 * back exactly when told. Returns when each check happened and each refusal's Retry-After.
 */
export async function guessersAtOnce(time: VirtualTime, throttles: SignInThrottle[], count: number, end: number) {
  const checks: number[] = [];
  const refusals: number[] = [];
  let address = 0;
  let running = count;
  const guesser = async () => {
    while (time.now() < end) {
      const throttle = throttles[address % throttles.length];
      const a = await throttle.admit({ name: 'owner', address: `2001:db8:${address++}::`, terminal: null });
      if (!a.ok) {
        refusals.push(a.retryAfterMs);
        await time.sleep(a.retryAfterMs);
        continue;
      }
      await a.turn();
      checks.push(time.now());
      await a.settle('failed');
    }
    running -= 1;
  };
  const all = Promise.all(Array.from({ length: count }, guesser));
  while (await time.step(() => time.sleeping() >= running));
  await all;
  return { checks, refusals };
}
