// The Counter's quoted wait: the drinks ahead plus this order's, at the bar's recent pace (the mean
// make time per drink, a batch's time shared among its drinks), shared among the baristas on bar.
import { describe, expect, it } from 'vitest';
import { barPace, busyPace, type TimedDrink } from '@/domain/make-times';
import { DEFAULT_MAKE_SECONDS, DEFAULT_WEIGHT_DRINKS, quoteLabel, quoteWaitSeconds } from '@/domain/quote';

/** A pace of `drinks` drinks in `seconds` of bar time in all. */
const pace = (drinks: number, seconds: number) => ({ drinks, totalMs: seconds * 1000 });

describe('quoteWaitSeconds', () => {
  it('divides the work ahead among the baristas', () => {
    // hand-worked: (4 ahead + 2 new) drinks × mean(40, 50, 90) = 60 s ÷ 2 baristas = 180 s
    expect(quoteWaitSeconds({ drinksAhead: 4, drinksInOrder: 2, baristas: 2, pace: pace(3, 180) })).toBe(180);
  });

  it('takes the mean make time, not the median', () => {
    // docs/check-values.md, "Queueing": the time to clear N drinks is N times the *mean* service
    // time (Little's law, L = λW). Hand-worked: times 30, 40, 50, 60, 300 s → mean 96 s (median 50 s);
    // steadied by 5 drinks of the 60 s default: (480 + 300) ÷ 10 = 78 s; 1 ahead + 1 new with 1 barista = 156 s
    // (the median, 50 s, would give (250 + 300) ÷ 10 × 2 = 110 s)
    expect(DEFAULT_WEIGHT_DRINKS).toBe(5);
    expect(quoteWaitSeconds({ drinksAhead: 1, drinksInOrder: 1, baristas: 1, pace: pace(5, 480) })).toBe(156);
  });

  it('falls back to a drink a minute with no history', () => {
    // common practice, rough: about one milk drink a minute per barista
    expect(DEFAULT_MAKE_SECONDS).toBe(60);
    // hand-worked: (2 + 1) × 60 s ÷ 1 = 180 s
    expect(quoteWaitSeconds({ drinksAhead: 2, drinksInOrder: 1, baristas: 1, pace: pace(0, 0) })).toBe(180);
  });

  it('agrees with Little’s law for a steady queue', () => {
    // Little's law L = λW (docs/check-values.md, "Queueing": λ = 10/h, W = 0.5 h → L = 5). Read the
    // other way for the bar: L = 6 drinks in the system finished at λ = 2 baristas × 1 drink/min → W = 3 min.
    expect(quoteWaitSeconds({ drinksAhead: 5, drinksInOrder: 1, baristas: 2, pace: pace(1, 60) })).toBe(180);
  });

  it('quotes nothing for an order with no bar drinks, and treats 0 baristas as 1', () => {
    // hand-worked: no bar drinks → no wait; 1 drink at 60 s with "0" baristas read as 1 → 60 s
    expect(quoteWaitSeconds({ drinksAhead: 9, drinksInOrder: 0, baristas: 2, pace: pace(1, 60) })).toBe(0);
    expect(quoteWaitSeconds({ drinksAhead: 0, drinksInOrder: 1, baristas: 0, pace: pace(1, 60) })).toBe(60);
  });

  it('a jug of three lattes made in 90 s is 30 s a drink (charging each the whole 90 s read 3 times slower)', () => {
    // hand-worked: the batch's 90 s shared by 3 → 90 s over 3 drinks; steadied by the default:
    // (90 + 5 × 60) ÷ (3 + 5) = 48.75 s; 6 ahead + 1 new = 7 drinks → 341 s with 1 barista
    // (charging each drink the whole 90 s: (270 + 300) ÷ 8 × 7 = 499 s)
    const batch: TimedDrink[] = [0, 1, 2].map(() => ({ startedMs: 0, doneMs: 90_000, bumpSeq: 1 }));
    expect(barPace(batch)).toEqual({ drinks: 3, totalMs: 90_000 });
    expect(quoteWaitSeconds({ drinksAhead: 6, drinksInOrder: 1, baristas: 1, pace: barPace(batch) })).toBe(341);
  });
});

/**
 * A deterministic rush on a bar that steams jugs: one drink arrives every `everyS` seconds for
 * `forS` seconds; a free barista takes up to `jug` of the oldest waiting drinks and bumps them
 * together after `batchS(n)` seconds. Time moves in whole seconds; at each second, finished
 * batches are bumped first, then arrivals are quoted (as the Counter does, from the drinks bumped
 * so far), then free baristas start. The numbers are invented; the checks are Little's law.
 */
function simulateRush(o: { baristas: number; everyS: number; forS: number; jug: number; batchS: (n: number) => number }) {
  interface Drink extends TimedDrink {
    firedMs: number;
    arrivedS: number;
    ahead: number;
    quoteS: number;
  }
  const drinks: Drink[] = [];
  const waiting: Drink[] = [];
  const busyUntil = new Array<number>(o.baristas).fill(0);
  const making: { drinks: Drink[]; doneS: number }[] = [];
  const bumped: Drink[] = [];
  let seq = 0;
  let inSystemSeconds = 0; // ∫ N(t) dt, N constant within each second
  for (let t = 0; t < o.forS || waiting.length || making.length; t++) {
    for (const b of making.filter((m) => m.doneS === t)) {
      seq++;
      for (const d of b.drinks) Object.assign(d, { doneMs: t * 1000, bumpSeq: seq });
      bumped.push(...b.drinks);
    }
    making.splice(0, making.length, ...making.filter((m) => m.doneS > t));
    if (t < o.forS && t % o.everyS === 0) {
      const ahead = waiting.length + making.reduce((s, m) => s + m.drinks.length, 0);
      const known = drinks.map((x) => ({ firedMs: x.firedMs, doneMs: Number.isNaN(x.doneMs) ? null : x.doneMs }));
      const quoteS = quoteWaitSeconds({ drinksAhead: ahead, drinksInOrder: 1, baristas: o.baristas, pace: busyPace(known, o.baristas, t * 1000 - 1_800_000) });
      const d: Drink = { firedMs: t * 1000, arrivedS: t, ahead, quoteS, startedMs: NaN, doneMs: NaN, bumpSeq: null };
      drinks.push(d);
      waiting.push(d);
    }
    for (let b = 0; b < o.baristas && waiting.length; b++) {
      if (busyUntil[b] > t) continue;
      const jug = waiting.splice(0, o.jug);
      for (const d of jug) d.startedMs = t * 1000;
      busyUntil[b] = t + o.batchS(jug.length);
      making.push({ drinks: jug, doneS: busyUntil[b] });
    }
    inSystemSeconds += waiting.length + making.reduce((s, m) => s + m.drinks.length, 0);
  }
  return { drinks, inSystemSeconds };
}

describe('the quote on a simulated rush with jugs (Little’s law)', () => {
  // 2 baristas; a drink every 10 s for 20 min (6 a minute); jugs of up to 3, a jug taking
  // 30 s + 15 s a drink (45, 60, 75 s). Full jugs make 2 × 3 drinks per 75 s = 4.8 a minute, so the
  // queue grows through the rush and drains after it.
  const run = simulateRush({ baristas: 2, everyS: 10, forS: 20 * 60, jug: 3, batchS: (n) => 30 + 15 * n });
  const waitS = (d: (typeof run.drinks)[number]) => d.doneMs / 1000 - d.arrivedS;
  const mean = (xs: number[]) => xs.reduce((s, x) => s + x, 0) / xs.length;

  it('the simulation itself obeys L = λW', () => {
    // docs/check-values.md, "Queueing": Little's law. Over a run that starts and ends empty, the
    // time-average number of drinks in the bar equals the arrival rate times the mean time in it.
    const spanS = Math.max(...run.drinks.map((d) => d.doneMs / 1000));
    const L = run.inSystemSeconds / spanS;
    const lambda = run.drinks.length / spanS;
    expect(run.drinks.length).toBe(120);
    expect(L).toBeCloseTo(lambda * mean(run.drinks.map(waitS)), 9);
  });

  it('the pace per drink matches the simulated throughput in the rush', () => {
    // Little's law read as W = L/λ (docs/check-values.md, "Queueing"): N drinks clear in N ÷ throughput.
    // Throughput from the simulation: drinks bumped between minute 5 and minute 20, per second.
    const inRush = run.drinks.filter((d) => d.doneMs >= 300_000 && d.doneMs < 1_200_000);
    const throughput = inRush.length / 900;
    // the pace over the same drinks, as the Counter would read it from their start and bump times
    const p = barPace(inRush);
    const quotedSecondsPerDrink = p.totalMs / 1000 / p.drinks / 2;
    expect(Math.abs(quotedSecondsPerDrink * throughput - 1)).toBeLessThan(0.02);
    // charging each drink its whole jug's time would read the bar as 3 times slower
    const wholeJug = mean(run.drinks.map((d) => (d.doneMs - d.startedMs) / 1000)) / 2;
    expect(wholeJug * throughput).toBeGreaterThan(2.5);
  });

  it('quotes the waits the rush really had, on average: leaning long by at most a quarter', () => {
    // docs/check-values.md, "Queueing": by Little's law the mean wait is L/λ, and the quote is the
    // drinks in the system ahead of and including this one over the bar's throughput (busyPace).
    // Quotes taken after the first 5 minutes, once the Counter has a pace to go on (before that it
    // leans on a drink a minute, common practice). A drink being made counts whole: the quote leans long.
    const settled = run.drinks.filter((d) => d.arrivedS >= 300);
    const quoted = mean(settled.map((d) => d.quoteS));
    const actual = mean(settled.map(waitS));
    expect(quoted / actual - 1).toBeGreaterThanOrEqual(0);
    expect(quoted / actual - 1).toBeLessThan(0.25);
  });
});

describe('quoteLabel', () => {
  it('rounds up to the minute, so the promise is kept more often than not', () => {
    // common practice: a quoted wait is said in whole minutes, rounded up
    expect(quoteLabel(0)).toBe('Ready now');
    expect(quoteLabel(61)).toBe('About 2 min');
    expect(quoteLabel(120)).toBe('About 2 min');
    expect(quoteLabel(10)).toBe('About 1 min');
  });
});
