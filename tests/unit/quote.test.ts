// The Counter's quoted wait: the drinks ahead plus this order's, at the recent median make time,
// shared among the baristas on bar.
import { describe, expect, it } from 'vitest';
import { DEFAULT_MAKE_SECONDS, quoteLabel, quoteWaitSeconds } from '../../src/domain/quote';

describe('quoteWaitSeconds', () => {
  it('divides the work ahead among the baristas', () => {
    // hand-worked: (4 ahead + 2 new) drinks × median(40, 50, 90) = 50 s ÷ 2 baristas = 150 s
    expect(quoteWaitSeconds({ drinksAhead: 4, drinksInOrder: 2, baristas: 2, recentMakeSeconds: [90, 40, 50] })).toBe(150);
  });
  it('falls back to a drink a minute with no history', () => {
    // common practice, rough: about one milk drink a minute per barista
    expect(DEFAULT_MAKE_SECONDS).toBe(60);
    expect(quoteWaitSeconds({ drinksAhead: 2, drinksInOrder: 1, baristas: 1, recentMakeSeconds: [] })).toBe(180);
  });
  it('agrees with Little’s law for a steady queue', () => {
    // Little's law L = λW (check-values.md: λ = 10/h, W = 0.5 h → L = 5). Read the other way for
    // the bar: L = 6 drinks in the system finished at λ = 2 baristas × 1 drink/min → W = 3 min.
    expect(quoteWaitSeconds({ drinksAhead: 5, drinksInOrder: 1, baristas: 2, recentMakeSeconds: [60] })).toBe(180);
  });
  it('quotes nothing for an order with no bar drinks, and treats 0 baristas as 1', () => {
    expect(quoteWaitSeconds({ drinksAhead: 9, drinksInOrder: 0, baristas: 2, recentMakeSeconds: [60] })).toBe(0);
    expect(quoteWaitSeconds({ drinksAhead: 0, drinksInOrder: 1, baristas: 0, recentMakeSeconds: [60] })).toBe(60);
  });
});

describe('quoteLabel', () => {
  it('rounds up to the minute, so the promise is kept more often than not', () => {
    expect(quoteLabel(0)).toBe('Ready now');
    expect(quoteLabel(61)).toBe('About 2 min');
    expect(quoteLabel(120)).toBe('About 2 min');
    expect(quoteLabel(10)).toBe('About 1 min');
  });
});
