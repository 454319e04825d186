// Erlang C (the M/M/c queue) against docs/check-values.md, "Queueing", and the staffing sentence
// Pulse shows. Inputs are counts and seconds as the bar measures them: `arrivals` drinks in
// `windowSeconds`, and the mean make time per drink.
import { describe, it, expect } from 'vitest';
import fc from 'fast-check';
import { erlangC, staffingAdvice } from '@/domain/erlang';
import { fraction } from '@/domain/fraction';

/** Agreement to 4 significant digits: the value rounded to 4 significant digits is the published one. */
function expectSig4(actual: number, expected: number) {
  expect(Number(actual.toPrecision(4))).toBe(expected);
}

/**
 * The docs/check-values.md formula written out literally, in logs so it can be compared for large c:
 * P_wait = [A^c/c! · c/(c−A)] / [Σ_{k<c} A^k/k! + A^c/c! · c/(c−A)].
 * An independent second implementation (no Erlang B recursion).
 */
function literalPWait(a: number, c: number): number {
  const logTerm = (k: number) => {
    let logFact = 0;
    for (let i = 2; i <= k; i++) logFact += Math.log(i);
    return k * Math.log(a) - logFact;
  };
  const logs = Array.from({ length: c }, (_, k) => logTerm(k));
  const logTop = logTerm(c) + Math.log(c / (c - a));
  const peak = Math.max(logTop, ...logs);
  const top = Math.exp(logTop - peak);
  const sum = logs.reduce((s, l) => s + Math.exp(l - peak), 0);
  return top / (sum + top);
}

/** λ drinks a minute and a mean make time of h seconds, as counts over one minute. */
const perMinute = (arrivals: number, meanMakeSeconds: number, servers: number) => ({ arrivals, windowSeconds: 60, meanMakeSeconds, servers });

describe('erlangC: the worked example', () => {
  // docs/check-values.md, "Queueing": 360 arrivals per 30 min, h = 240 s. Inputs read on a stored
  // copy; outputs agreed by an independent implementation's tests.
  const input = { arrivals: 360, windowSeconds: 30 * 60, meanMakeSeconds: 240 };

  it('c = 55: A = 48, occupancy 0.8727, P_wait 0.2387, W_q 8.184 s, SL(15 s) 0.8459, SL(20 s) 0.8668', () => {
    const r = erlangC({ ...input, servers: 55 });
    expect(r.offeredLoad).toBe(48); // docs/check-values.md: A = 48, exactly (360/1800 s × 240 s)
    expect(r.stable).toBe(true);
    expectSig4(r.occupancy, 0.8727); // docs/check-values.md, worked example
    expectSig4(r.probabilityOfWaiting, 0.2387); // docs/check-values.md, worked example
    expectSig4(r.meanWaitSeconds, 8.184); // docs/check-values.md, worked example
    expectSig4(r.serviceLevel(15), 0.8459); // docs/check-values.md, worked example
    expectSig4(r.serviceLevel(20), 0.8668); // docs/check-values.md, worked example
  });

  it('c = 54: P_wait 0.3013, W_q 12.05 s', () => {
    const r = erlangC({ ...input, servers: 54 });
    expectSig4(r.probabilityOfWaiting, 0.3013); // docs/check-values.md, worked example
    expectSig4(r.meanWaitSeconds, 12.05); // docs/check-values.md, worked example
  });
});

describe('erlangC: hand-checkable cases', () => {
  it('A = 1, c = 2 → P_wait 1/3; with μ = 1/min, W_q = 1/3 min = 20 s', () => {
    // docs/check-values.md, "Queueing" (hand-checkable). By hand: A²/2!·2/(2−1) = 1;
    // Σ_{k<2} = 1 + 1 = 2 → 1/(2 + 1) = 1/3; W_q = (1/3)·60 s/(2 − 1) = 20 s.
    const r = erlangC(perMinute(1, 60, 2));
    expect(r.probabilityOfWaiting).toBeCloseTo(1 / 3, 12);
    expect(r.meanWaitSeconds).toBeCloseTo(20, 10);
    expect(r.occupancy).toBeCloseTo(0.5, 12); // A/c = 1/2, by hand
    // docs/check-values.md, SL(t) = 1 − P_wait·e^(−(c−A)t/h): SL(0) = 2/3; SL(60 s) = 1 − e^(−1)/3.
    expect(r.serviceLevel(0)).toBeCloseTo(2 / 3, 12);
    expect(r.serviceLevel(60)).toBeCloseTo(1 - Math.exp(-1) / 3, 12);
  });

  it('A = 2, c = 3 → P_wait 4/9', () => {
    // docs/check-values.md (hand-checkable). By hand: 2³/3!·3/(3−2) = 4; Σ_{k<3} = 1 + 2 + 2 = 5 → 4/9.
    const r = erlangC(perMinute(4, 30, 3));
    expect(r.offeredLoad).toBe(2);
    expect(r.probabilityOfWaiting).toBeCloseTo(4 / 9, 12);
    // docs/check-values.md, W_q = P_wait·h/(c − A): h = 30 s → (4/9)·30/(3 − 2) = 13.33 s
    expect(r.meanWaitSeconds).toBeCloseTo(40 / 3, 10);
  });

  it('one server is M/M/1: P_wait = ρ, W_q = ρ·h/(1 − ρ)', () => {
    // docs/check-values.md formulas with c = 1, worked by hand: ρ = 0.5, h = 60 s → W_q = 60 s.
    const r = erlangC({ arrivals: 1, windowSeconds: 120, meanMakeSeconds: 60, servers: 1 });
    expect(r.probabilityOfWaiting).toBeCloseTo(0.5, 12);
    expect(r.meanWaitSeconds).toBeCloseTo(60, 10);
  });

  it('takes the mean make time as an exact fraction', () => {
    // hand-worked: 480 s over 5 drinks is 96 s; A = 1 drink a minute × 96 s = 1.6 (docs/check-values.md: A = λh)
    const r = erlangC({ arrivals: 1, windowSeconds: 60, meanMakeSeconds: fraction(480, 5), servers: 2 });
    expect(r.offeredLoad).toBeCloseTo(1.6, 12);
  });

  it('no arrivals: nobody waits', () => {
    // from the formulas (docs/check-values.md): A = 0 → P_wait = 0, W_q = 0
    const r = erlangC(perMinute(0, 60, 2));
    expect(r).toMatchObject({ offeredLoad: 0, occupancy: 0, stable: true, probabilityOfWaiting: 0, meanWaitSeconds: 0 });
    expect(r.serviceLevel(0)).toBe(1);
  });
});

describe('erlangC: unstable when A ≥ c, decided exactly', () => {
  it('at exactly A = c and above, the queue grows', () => {
    // docs/check-values.md, "Queueing": the queue settles only while A < c. By hand: 2, 2.5, 10 ≥ 2.
    for (const [arrivals, windowSeconds] of [
      [2, 60],
      [5, 120],
      [10, 60],
    ]) {
      const r = erlangC({ arrivals, windowSeconds, meanMakeSeconds: 60, servers: 2 });
      expect(r.stable).toBe(false);
      expect(r.probabilityOfWaiting).toBe(1);
      expect(r.meanWaitSeconds).toBe(Infinity);
      expect(r.serviceLevel(120)).toBe(0);
      expect(r.occupancy).toBe(1);
      expect(r.offeredLoad).toBeCloseTo((arrivals * 60) / windowSeconds, 12);
    }
  });

  it('72 drinks in 30 min at 75 s a drink is exactly 3 baristas’ work: 3 can’t keep up', () => {
    // hand-worked: A = λh = (72/1800 s)·75 s = 3 = c. In floating point 2.4/min ÷ 0.8/min is
    // 2.9999999999999996, which read as "stable" and gave a wait of 2814749767106559.5 min.
    const r = erlangC({ arrivals: 72, windowSeconds: 1800, meanMakeSeconds: 75, servers: 3 });
    expect(r.offeredLoad).toBe(3);
    expect(r.stable).toBe(false);
    expect(r.meanWaitSeconds).toBe(Infinity);
    // one drink fewer is A = 71·75/1800 = 2.958…: stable, with a long but finite wait
    const under = erlangC({ arrivals: 71, windowSeconds: 1800, meanMakeSeconds: 75, servers: 3 });
    expect(under.stable).toBe(true);
    expect(Number.isFinite(under.meanWaitSeconds)).toBe(true);
  });

  it('no baristas with drinks coming in is unstable', () => {
    // docs/check-values.md: A > 0 = c
    expect(erlangC(perMinute(1, 60, 0)).stable).toBe(false);
  });

  it('just under capacity is stable, with a long wait', () => {
    // hand-worked: 199 drinks in 100 min at 60 s = A 1.99 < 2; docs/check-values.md W_q = P·h/(c − A) ≫ 1 h
    const r = erlangC({ arrivals: 199, windowSeconds: 6000, meanMakeSeconds: 60, servers: 2 });
    expect(r.stable).toBe(true);
    expect(r.probabilityOfWaiting).toBeGreaterThan(0.99);
    expect(r.meanWaitSeconds).toBeGreaterThan(60 * 60);
  });
});

describe('erlangC: numerics and invariants', () => {
  it('stays finite for many servers where A^c/c! overflows a double', () => {
    // docs/check-values.md formula, checked against the literal sum above: 150^150 and 150! both
    // overflow; the recursion does not.
    for (const c of [100, 150, 300]) {
      const r = erlangC({ arrivals: 95 * c, windowSeconds: 6000, meanMakeSeconds: 60, servers: c });
      expect(Number.isFinite(r.probabilityOfWaiting)).toBe(true);
      expect(r.probabilityOfWaiting).toBeGreaterThan(0);
      expect(r.probabilityOfWaiting).toBeLessThan(1);
      expect(Math.abs(r.probabilityOfWaiting - literalPWait(r.offeredLoad, c))).toBeLessThan(1e-9);
    }
  });

  it('agrees with the literal formula, and more staff never means longer waits', () => {
    // docs/check-values.md formula (literalPWait); monotone in c and SL in t, from the same formulas
    const arb = fc.record({
      servers: fc.integer({ min: 1, max: 120 }),
      utilisation: fc.double({ min: 0.01, max: 0.99, noNaN: true }),
      mu: fc.double({ min: 0.1, max: 5, noNaN: true }),
    });
    fc.assert(
      fc.property(arb, ({ servers, utilisation, mu }) => {
        const input = perMinute(utilisation * servers * mu, 60 / mu, servers);
        const r = erlangC(input);
        expect(r.stable).toBe(true);
        expect(Math.abs(r.probabilityOfWaiting - literalPWait(r.offeredLoad, servers))).toBeLessThan(1e-9);
        expect(r.probabilityOfWaiting).toBeGreaterThanOrEqual(0);
        expect(r.probabilityOfWaiting).toBeLessThanOrEqual(1);
        const more = erlangC({ ...input, servers: servers + 1 });
        expect(more.probabilityOfWaiting).toBeLessThanOrEqual(r.probabilityOfWaiting + 1e-12);
        expect(more.meanWaitSeconds).toBeLessThanOrEqual(r.meanWaitSeconds + 1e-9);
        // SL rises with t from 1 − P_wait towards 1.
        expect(r.serviceLevel(0)).toBeCloseTo(1 - r.probabilityOfWaiting, 12);
        expect(r.serviceLevel(30)).toBeGreaterThanOrEqual(r.serviceLevel(10));
        expect(r.serviceLevel(1e9)).toBeCloseTo(1, 12);
      }),
      { numRuns: 300 },
    );
  });

  it('rejects impossible inputs', () => {
    // our own input rules: no negative counts, no empty window, a make time above 0, whole baristas
    expect(() => erlangC(perMinute(-1, 60, 1))).toThrow(RangeError);
    expect(() => erlangC({ arrivals: 1, windowSeconds: 0, meanMakeSeconds: 60, servers: 1 })).toThrow(RangeError);
    expect(() => erlangC(perMinute(1, 0, 1))).toThrow(RangeError);
    expect(() => erlangC(perMinute(1, 60, 1.5))).toThrow(RangeError);
    expect(() => erlangC(perMinute(NaN, 60, 1))).toThrow(RangeError);
    const r = erlangC(perMinute(1, 60, 2));
    expect(() => r.serviceLevel(-1)).toThrow(RangeError);
  });
});

describe('staffingAdvice', () => {
  const advise = (arrivals: number, meanMakeSeconds: number, baristas: number, targetSeconds: number) =>
    staffingAdvice({ arrivals, windowSeconds: 30 * 60, meanMakeSeconds, baristas, targetSeconds });

  it('stable: says the wait now and with one more barista', () => {
    // docs/check-values.md, "Queueing": A = 1, c = 2 → W_q 20 s, P_wait 33 %;
    // over 60 s: P_wait·e^(−(2−1)·60/60) = e^(−1)/3 = 12 %.
    // c = 3 by hand: A³/3!·3/2 = 1/4; Σ = 1 + 1 + 1/2 = 2.5 → P_wait = 1/11;
    // W_q = (1/11)·60/2 = 2.7 s → "about 3 s"; over 60 s: e^(−2)/11 = 1 %.
    const advice = advise(30, 60, 2, 60);
    expect(advice.now.probabilityOfWaiting).toBeCloseTo(1 / 3, 12);
    expect(advice.withOneMore.probabilityOfWaiting).toBeCloseTo(1 / 11, 12);
    expect(advice.sentence).toBe(
      "With 2 on bar a drink waits about 20 s on average before it's started (33 % wait at all, 12 % longer than 1:00). " +
        'With 3 it would be about 3 s (1 % longer than 1:00).',
    );
  });

  it('says a 90 s target as 1:30, not "2 min"', () => {
    // hand-worked: 90 s is one minute and thirty seconds
    expect(advise(30, 60, 2, 90).sentence).toContain('longer than 1:30');
  });

  it('at exactly the bar’s capacity: a plain sentence, no huge wait', () => {
    // hand-worked: 72 drinks in 30 min at 75 s = A 3 = c → can't keep up; 3 × 1800/75 = 72 at most.
    // With 4 (docs/check-values.md formulas, by hand): terms 1, 3, 4.5, 4.5; A⁴/4!·4/(4−3) = 13.5;
    // P_wait = 13.5/26.5 = 0.509; W_q = 0.509·75 s = 38.2 s.
    const advice = advise(72, 75, 3, 240);
    expect(advice.now.stable).toBe(false);
    expect(advice.sentence).toBe(
      "The bar can't keep up: 72 drinks came in over the last 30 min, and 3 baristas at 1:15 a drink make at most 72 in that time, " +
        "so the queue keeps growing. Add a barista: with 4 a drink would wait about 38 s on average before it's started.",
    );
  });

  it('unstable even with one more: says how many it takes', () => {
    // hand-worked: 156 drinks in 30 min at 60 s → A = 5.2: the first whole number above it is 6
    const advice = advise(156, 60, 2, 120);
    expect(advice.withOneMore.stable).toBe(false);
    expect(advice.sentence).toBe(
      "The bar can't keep up: 156 drinks came in over the last 30 min, and 2 baristas at 1:00 a drink make at most 60 in that time, " +
        'so the queue keeps growing. It takes at least 6 on bar to keep up.',
    );
  });

  it('at a whole offered load, it takes one more than the load', () => {
    // hand-worked: 120 drinks in 30 min at 60 s → A = 4 exactly; 4 only match it, so 5
    expect(advise(120, 60, 2, 120).sentence).toContain('It takes at least 5 on bar to keep up.');
  });

  it('only just keeping up: says the wait would pass an hour', () => {
    // hand-worked: 2999 drinks in 75 000 s at 75 s → A = 2.999 < 3; docs/check-values.md
    // W_q = P·h/(c − A) ≈ 0.999·75/0.001 s ≈ 20 h. With 4: P_wait 0.509, W_q = 0.509·75/1.001 ≈ 38 s.
    const advice = staffingAdvice({ arrivals: 2999, windowSeconds: 75_000, meanMakeSeconds: 75, baristas: 3, targetSeconds: 240 });
    expect(advice.now.stable).toBe(true);
    expect(advice.sentence).toMatch(
      /^With 3 on bar the bar only just keeps up: a drink would wait over an hour on average before it's started\. With 4 it would be about 38 s \(/,
    );
  });

  it('one barista and no drinks read naturally', () => {
    // hand-worked: 45 drinks in 30 min at 60 s → A = 1.5 > 1 barista; with 2 it is stable
    expect(advise(45, 60, 1, 90).sentence).toMatch(
      /^The bar can't keep up: 45 drinks came in over the last 30 min, and 1 barista at 1:00 a drink makes at most 30/,
    );
    expect(advise(0, 60, 1, 90).sentence).toBe('No drinks came in over the last 30 min, so nobody waits.');
  });
});
