// The bar through one day: each drink waits in the queue for a time that grows with the drinks
// still ahead of it (so it grows at the rushes), then takes 40–120 s to make. The quote is the
// Counter's own quoteWaitSeconds over the same queue and the same recent make times.
import { quoteWaitSeconds } from '@/domain/quote';
import type { Random } from './random';

/** Seconds of queue per drink ahead, per barista on bar: with the rushes of arrivals.ts this keeps
 * about 94 % of tickets under the 4-minute target, with 8–13 % over it at the morning peak. */
const QUEUE_SECONDS_PER_DRINK = 20;
/** Recent drinks that set the quoted pace (as server/orders/quotes.ts). */
const RECENT_DRINKS = 30;

export interface DrinkTiming {
  startedAt: number;
  doneAt: number;
  /** Index into the day's baristas. */
  barista: number;
}

export interface TicketTiming {
  quotedWaitSeconds: number;
  drinks: DrinkTiming[];
  readyAt: number;
  collectedAt: number;
}

export interface Bar {
  /** An order fired at `at` (seconds after local midnight) with this many bar drinks. */
  take(at: number, drinks: number): TicketTiming;
}

/** Make time: 40–120 s, most near 80 (the mean of two uniforms). */
const makeSeconds = (random: Random) => 40 + 40 * (random.next() + random.next());

export function openBar(baristasOnBar: number, baristaCount: number, random: Random): Bar {
  let outstanding: { done: number; make: number }[] = []; // drinks fired and not yet done
  const recent: number[] = []; // make times of the drinks done most recently
  let lastBarista = 0;

  return {
    take(at, drinks) {
      const finished = outstanding.filter((d) => d.done <= at).sort((a, b) => a.done - b.done);
      if (finished.length) {
        recent.push(...finished.map((d) => d.make));
        recent.splice(0, Math.max(0, recent.length - RECENT_DRINKS));
        outstanding = outstanding.filter((d) => d.done > at);
      }
      const quotedWaitSeconds = quoteWaitSeconds({
        drinksAhead: outstanding.length,
        drinksInOrder: drinks,
        baristas: baristasOnBar,
        // each drink here is made on its own, so the pace is the plain mean of the recent make times
        pace: { drinks: recent.length, totalMs: recent.reduce((sum, s) => sum + s * 1000, 0) },
      });
      if (drinks === 0) return { quotedWaitSeconds, drinks: [], readyAt: at, collectedAt: at };

      const queue = 5 + (QUEUE_SECONDS_PER_DRINK * outstanding.length) / baristasOnBar + random.exponential(15);
      // one barista usually takes the whole ticket; the other helps out now and then
      lastBarista = random.chance(0.7) ? lastBarista : (lastBarista + 1) % baristaCount;
      const timings: DrinkTiming[] = [];
      let start = at + queue;
      for (let i = 0; i < drinks; i++) {
        if (i > 0) start += random.between(8, 25);
        const make = makeSeconds(random);
        const barista = random.chance(0.85) ? lastBarista : random.int(0, baristaCount - 1);
        timings.push({ startedAt: start, doneAt: start + make, barista });
        outstanding.push({ done: start + make, make });
      }
      const readyAt = Math.max(...timings.map((t) => t.doneAt));
      return { quotedWaitSeconds, drinks: timings, readyAt, collectedAt: readyAt + random.between(40, 150) };
    },
  };
}
