// Make time per drink when drinks are made together: a jug of three lattes started and bumped as
// one batch took the bar one stretch of time, shared among the three — not three times that
// stretch. All numbers here are worked by hand (no outside source is needed for the sharing
// itself; the mean is what Erlang C and Little's law take, docs/check-values.md, "Queueing").
import { describe, expect, it } from 'vitest';
import { barPace, perDrinkMakeSeconds, type TimedDrink } from '../../src/domain/make-times';

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
