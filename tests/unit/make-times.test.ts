// Make time per drink when drinks are made together: a jug of three lattes started and bumped as
// one batch took the bar one stretch of time, shared among the three — not three times that
// stretch. All numbers here are worked by hand (no outside source is needed for the sharing
// itself; the mean is what Erlang C and Little's law take, docs/check-values.md, "Queueing").
import { describe, expect, it } from 'vitest';
import { barPace, bumpShares, busyPace, perDrinkMakeSeconds, type BarDrink, type TimedDrink } from '@/domain/make-times';

const S = 1000;
const drink = (startedS: number, doneS: number, bumpSeq: number | null): TimedDrink => ({ startedMs: startedS * S, doneMs: doneS * S, bumpSeq });

describe('perDrinkMakeSeconds', () => {
  it('shares a batch’s time among its drinks', () => {
    // hand-worked: three lattes bumped together after 90 s → 30 s each; a single after 60 s → 60 s
    const drinks = [drink(0, 90, 1), drink(0, 90, 1), drink(0, 90, 1), drink(100, 160, 2)];
    expect(perDrinkMakeSeconds(drinks)).toEqual([30, 30, 30, 60]);
  });

  it('counts a batch from its first start to its bump, once', () => {
    // hand-worked: one drink started at 0, another at 40, both bumped at 100 (one command):
    // the bar spent 100 s on the pair → 50 s each (not 100 + 60 = 160 s of "make time")
    expect(perDrinkMakeSeconds([drink(0, 100, 7), drink(40, 100, 7)])).toEqual([50, 50]);
  });

  it('without a bump number, drinks sharing both start and done times are one batch', () => {
    // hand-worked: 2 drinks 0 → 80 s share 80 s; one 0 → 50 s alone
    expect(perDrinkMakeSeconds([drink(0, 80, null), drink(0, 80, null), drink(0, 50, null)])).toEqual([40, 40, 50]);
  });

  it('gives no time for a drink bumped without being started (start = bump)', () => {
    // hand-worked: a batch with no measured time says nothing about the pace
    expect(perDrinkMakeSeconds([drink(30, 30, 3), drink(0, 60, 4)])).toEqual([null, 60]);
  });
});

describe('barPace', () => {
  it('is the mean of the shared times, kept exact as total time over drinks', () => {
    // hand-worked: batches 90 s/3 drinks and 60 s/1 → 150 s over 4 drinks = 37.5 s a drink
    const pace = barPace([drink(0, 90, 1), drink(0, 90, 1), drink(0, 90, 1), drink(100, 160, 2)]);
    expect(pace).toEqual({ drinks: 4, totalMs: 150_000 });
  });

  it('leaves out drinks with no measured time', () => {
    expect(barPace([drink(30, 30, 3)])).toEqual({ drinks: 0, totalMs: 0 });
  });
});

describe('busyPace (Little’s law on the baristas)', () => {
  const bar = (firedS: number, doneS: number | null): BarDrink => ({ firedMs: firedS * S, doneMs: doneS === null ? null : doneS * S });

  it('a bar busy the whole time: barista-time over drinks bumped', () => {
    // Little's law (docs/check-values.md, "Queueing"): busy baristas = throughput × make time.
    // Hand-worked: 10 drinks fired at 0, 2 baristas, bumps at 60, 60, 120, 120, … 300, 300:
    // both busy 0 → 300 s = 600 barista-s over 10 drinks = 60 s a drink per barista
    const drinks = Array.from({ length: 10 }, (_, i) => bar(0, 60 * (Math.floor(i / 2) + 1)));
    expect(busyPace(drinks, 2, 0)).toEqual({ drinks: 10, totalMs: 600_000 });
  });

  it('a jug of 4 started 12 s before its bump is not 3 s a drink', () => {
    // hand-worked: 4 drinks fired at 0 and bumped together at 120 by 1 barista → 120 s over 4 = 30 s
    // (start → bump would read 12 s ÷ 4 = 3 s)
    expect(
      busyPace(
        [0, 0, 0, 0].map(() => bar(0, 120)),
        1,
        0,
      ),
    ).toEqual({ drinks: 4, totalMs: 120_000 });
  });

  it('counts a barista busy only while there is a drink for them', () => {
    // hand-worked: 2 baristas; one drink 0 → 90, another 200 → 260: busy 90 + 60 = 150 barista-s, 2 drinks
    expect(busyPace([bar(0, 90), bar(200, 260)], 2, 0)).toEqual({ drinks: 2, totalMs: 150_000 });
  });

  it('leaves out the time after the last bump, and a bar that has not bumped yet has no pace', () => {
    // hand-worked: 1 barista; bumps at 60 and 120, one drink still on the bar since 100: the span ends at 120
    expect(busyPace([bar(0, 60), bar(0, 120), bar(100, null)], 1, 0)).toEqual({ drinks: 2, totalMs: 120_000 });
    expect(busyPace([bar(0, null), bar(10, null)], 2, 0)).toEqual({ drinks: 0, totalMs: 0 });
  });

  it('looks back from `sinceMs` only', () => {
    // hand-worked: 1 barista, bumps every 60 s from 60 to 600 (10 drinks, all fired at 0); since 300:
    // 300 → 600 busy = 300 s over the 5 bumped after 300 → 60 s a drink
    const drinks = Array.from({ length: 10 }, (_, i) => bar(0, 60 * (i + 1)));
    expect(busyPace(drinks, 1, 300 * S)).toEqual({ drinks: 5, totalMs: 300_000 });
  });
});

describe('bumpShares (make time per barista)', () => {
  const bumped = (firedS: number, doneS: number, bumpSeq: number, bumper: string) => ({ firedMs: firedS * S, doneMs: doneS * S, bumpSeq, bumper });

  it('a batch runs from the barista’s previous bump, shared among its drinks', () => {
    // hand-worked: Ana bumps 1 drink at 60, then a jug of 4 at 180 (all fired at 0) → 60 s, then 120 ÷ 4 = 30 s each
    const drinks = [bumped(0, 60, 1, 'Ana'), ...[0, 0, 0, 0].map(() => bumped(0, 180, 2, 'Ana'))];
    expect(bumpShares(drinks)).toEqual([60, 30, 30, 30, 30]);
  });

  it('an idle barista’s batch runs from its firing; each barista keeps their own clock', () => {
    // hand-worked: Ana bumps at 60 (fired 0); a drink fired at 300 she bumps at 360 → 60 s (not 300);
    // Ben's drink fired at 0, bumped at 100 → 100 s (Ana's bumps are not his)
    expect(bumpShares([bumped(0, 60, 1, 'Ana'), bumped(300, 360, 2, 'Ana'), bumped(0, 100, 3, 'Ben')])).toEqual([60, 60, 100]);
  });
});
