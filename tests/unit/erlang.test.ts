import { describe, it, expect } from 'vitest';
import fc from 'fast-check';
import { erlangC, staffingAdvice } from '../../src/domain/erlang';

/** Agreement to 4 significant digits: the value rounded to 4 significant digits is the published one. */
function expectSig4(actual: number, expected: number) {
  expect(Number(actual.toPrecision(4))).toBe(expected);
}

/**
 * The check-values.md formula written out literally, in logs so it can be compared for large c:
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

describe('erlangC: the worked example', () => {
  // check-values.md, "Queueing": 360 arrivals per 30 min (λ = 12/min), h = 240 s (μ = 0.25/min).
  // Inputs confirmed on a stored copy; outputs agreed by an independent implementation's tests.
  const input = { arrivalsPerMinute: 360 / 30, servicePerMinutePerServer: 60 / 240 };

  it('c = 55: A = 48, occupancy 0.8727, P_wait 0.2387, W_q 8.184 s, SL(15 s) 0.8459, SL(20 s) 0.8668', () => {
    const r = erlangC({ ...input, servers: 55 });
    expect(r.offeredLoad).toBeCloseTo(48, 10);
    expect(r.stable).toBe(true);
    expectSig4(r.occupancy, 0.8727);
    expectSig4(r.probabilityOfWaiting, 0.2387);
    expectSig4(r.meanWaitSeconds, 8.184);
    expectSig4(r.serviceLevel(15), 0.8459);
    expectSig4(r.serviceLevel(20), 0.8668);
  });

  it('c = 54: P_wait 0.3013, W_q 12.05 s', () => {
    const r = erlangC({ ...input, servers: 54 });
    expectSig4(r.probabilityOfWaiting, 0.3013);
    expectSig4(r.meanWaitSeconds, 12.05);
  });
});

describe('erlangC: hand-checkable cases', () => {
  it('A = 1, c = 2 → P_wait 1/3; with μ = 1/min, W_q = 1/3 min = 20 s', () => {
    // check-values.md. By hand: A²/2!·2/(2−1) = 1; Σ_{k<2} = 1 + 1 = 2 → 1/(2 + 1) = 1/3;
    // W_q = (1/3)·60 s/(2 − 1) = 20 s.
    const r = erlangC({ arrivalsPerMinute: 1, servicePerMinutePerServer: 1, servers: 2 });
    expect(r.probabilityOfWaiting).toBeCloseTo(1 / 3, 12);
    expect(r.meanWaitSeconds).toBeCloseTo(20, 10);
    expect(r.occupancy).toBeCloseTo(0.5, 12);
    // Hand-worked: SL(0) = 1 − P_wait (those who don't wait at all); SL(60 s) = 1 − e^(−1)/3.
    expect(r.serviceLevel(0)).toBeCloseTo(2 / 3, 12);
    expect(r.serviceLevel(60)).toBeCloseTo(1 - Math.exp(-1) / 3, 12);
  });

  it('A = 2, c = 3 → P_wait 4/9', () => {
    // check-values.md. By hand: 2³/3!·3/(3−2) = 4; Σ_{k<3} = 1 + 2 + 2 = 5 → 4/9.
    const r = erlangC({ arrivalsPerMinute: 4, servicePerMinutePerServer: 2, servers: 3 });
    expect(r.offeredLoad).toBe(2);
    expect(r.probabilityOfWaiting).toBeCloseTo(4 / 9, 12);
    // h = 30 s: W_q = (4/9)·30/(3 − 2) = 13.33 s
    expect(r.meanWaitSeconds).toBeCloseTo(40 / 3, 10);
  });

  it('one server is M/M/1: P_wait = ρ, W_q = ρ·h/(1 − ρ)', () => {
    // Hand-worked: ρ = 0.5, h = 60 s → W_q = 60 s.
    const r = erlangC({ arrivalsPerMinute: 0.5, servicePerMinutePerServer: 1, servers: 1 });
    expect(r.probabilityOfWaiting).toBeCloseTo(0.5, 12);
    expect(r.meanWaitSeconds).toBeCloseTo(60, 10);
  });

  it('no arrivals: nobody waits', () => {
    const r = erlangC({ arrivalsPerMinute: 0, servicePerMinutePerServer: 1, servers: 2 });
    expect(r).toMatchObject({ offeredLoad: 0, occupancy: 0, stable: true, probabilityOfWaiting: 0, meanWaitSeconds: 0 });
    expect(r.serviceLevel(0)).toBe(1);
  });
});

describe('erlangC: unstable when λ ≥ cμ', () => {
  it('at exactly λ = cμ and above, the queue grows', () => {
    for (const arrivalsPerMinute of [2, 2.5, 10]) {
      const r = erlangC({ arrivalsPerMinute, servicePerMinutePerServer: 1, servers: 2 });
      expect(r.stable).toBe(false);
      expect(r.probabilityOfWaiting).toBe(1);
      expect(r.meanWaitSeconds).toBe(Infinity);
      expect(r.serviceLevel(120)).toBe(0);
      expect(r.occupancy).toBe(1);
      expect(r.offeredLoad).toBeCloseTo(arrivalsPerMinute, 12);
    }
  });

  it('no baristas with drinks coming in is unstable', () => {
    expect(erlangC({ arrivalsPerMinute: 1, servicePerMinutePerServer: 1, servers: 0 }).stable).toBe(false);
  });

  it('just under capacity is stable, with a long wait', () => {
    const r = erlangC({ arrivalsPerMinute: 1.99, servicePerMinutePerServer: 1, servers: 2 });
    expect(r.stable).toBe(true);
    expect(r.probabilityOfWaiting).toBeGreaterThan(0.99);
    expect(r.meanWaitSeconds).toBeGreaterThan(60 * 60);
  });
});

describe('erlangC: numerics and invariants', () => {
  it('stays finite for many servers where A^c/c! overflows a double', () => {
    // 150^150 and 150! both overflow; the recursion does not.
    for (const c of [100, 150, 300]) {
      const r = erlangC({ arrivalsPerMinute: 0.95 * c, servicePerMinutePerServer: 1, servers: c });
      expect(Number.isFinite(r.probabilityOfWaiting)).toBe(true);
      expect(r.probabilityOfWaiting).toBeGreaterThan(0);
      expect(r.probabilityOfWaiting).toBeLessThan(1);
      expect(Math.abs(r.probabilityOfWaiting - literalPWait(r.offeredLoad, c))).toBeLessThan(1e-9);
    }
  });

  it('agrees with the literal formula, and more staff never means longer waits', () => {
    const arb = fc.record({
      servers: fc.integer({ min: 1, max: 120 }),
      utilisation: fc.double({ min: 0.01, max: 0.99, noNaN: true }),
      mu: fc.double({ min: 0.1, max: 5, noNaN: true }),
    });
    fc.assert(
      fc.property(arb, ({ servers, utilisation, mu }) => {
        const arrivalsPerMinute = utilisation * servers * mu;
        const r = erlangC({ arrivalsPerMinute, servicePerMinutePerServer: mu, servers });
        expect(r.stable).toBe(true);
        expect(Math.abs(r.probabilityOfWaiting - literalPWait(r.offeredLoad, servers))).toBeLessThan(1e-9);
        expect(r.probabilityOfWaiting).toBeGreaterThanOrEqual(0);
        expect(r.probabilityOfWaiting).toBeLessThanOrEqual(1);
        const more = erlangC({ arrivalsPerMinute, servicePerMinutePerServer: mu, servers: servers + 1 });
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
    expect(() => erlangC({ arrivalsPerMinute: -1, servicePerMinutePerServer: 1, servers: 1 })).toThrow(RangeError);
    expect(() => erlangC({ arrivalsPerMinute: 1, servicePerMinutePerServer: 0, servers: 1 })).toThrow(RangeError);
    expect(() => erlangC({ arrivalsPerMinute: 1, servicePerMinutePerServer: 1, servers: 1.5 })).toThrow(RangeError);
    expect(() => erlangC({ arrivalsPerMinute: NaN, servicePerMinutePerServer: 1, servers: 1 })).toThrow(RangeError);
    const r = erlangC({ arrivalsPerMinute: 1, servicePerMinutePerServer: 1, servers: 2 });
    expect(() => r.serviceLevel(-1)).toThrow(RangeError);
  });
});

describe('staffingAdvice', () => {
  it('stable: says the wait now and with one more barista', () => {
    // A = 1, c = 2 (hand-checkable above): W_q 20 s = 0.3 min, P_wait 33 %;
    // over 60 s: P_wait·e^(−(2−1)·60/60) = e^(−1)/3 = 12 %.
    // c = 3 by hand: A³/3!·3/2 = 1/4; Σ = 1 + 1 + 1/2 = 2.5 → P_wait = 1/11;
    // W_q = (1/11)·60/2 = 2.7 s → "under 0.1 min"; over 60 s: e^(−2)/11 = 1 %.
    const advice = staffingAdvice({ arrivalsPerMinute: 1, servicePerMinutePerServer: 1, baristas: 2, targetSeconds: 60 });
    expect(advice.now.probabilityOfWaiting).toBeCloseTo(1 / 3, 12);
    expect(advice.withOneMore.probabilityOfWaiting).toBeCloseTo(1 / 11, 12);
    expect(advice.sentence).toBe(
      "With 2 on bar a drink waits about 0.3 min on average before it's started (33 % wait at all, 12 % longer than 1 min). " +
        'With 3 it would be under 0.1 min (1 % longer than 1 min).',
    );
  });

  it('unstable but one more would do: tells the lead to add a barista', () => {
    // 50 s a drink (μ = 1.2/min): A = 3.1/1.2 = 2.58 > c = 2; with 3 it is stable.
    const advice = staffingAdvice({ arrivalsPerMinute: 3.1, servicePerMinutePerServer: 1.2, baristas: 2, targetSeconds: 120 });
    expect(advice.now.stable).toBe(false);
    expect(advice.withOneMore.stable).toBe(true);
    expect(advice.sentence).toMatch(/^The queue is growing: 2 baristas can't keep up with 3\.1 drinks a minute — add a barista\./);
    expect(advice.sentence).toContain(`With 3 a drink would wait about ${(advice.withOneMore.meanWaitSeconds / 60).toFixed(1)} min`);
  });

  it('unstable even with one more: says how many it takes', () => {
    // A = 5.2: the first whole number above it is 6.
    const advice = staffingAdvice({ arrivalsPerMinute: 5.2, servicePerMinutePerServer: 1, baristas: 2, targetSeconds: 120 });
    expect(advice.withOneMore.stable).toBe(false);
    expect(advice.sentence).toBe("The queue is growing: 2 baristas can't keep up with 5.2 drinks a minute — it takes at least 6 on bar to keep up.");
    expect(erlangC({ arrivalsPerMinute: 5.2, servicePerMinutePerServer: 1, servers: 6 }).stable).toBe(true);
    expect(erlangC({ arrivalsPerMinute: 5.2, servicePerMinutePerServer: 1, servers: 5 }).stable).toBe(false);
  });

  it('one barista and no drinks read naturally', () => {
    expect(staffingAdvice({ arrivalsPerMinute: 1.5, servicePerMinutePerServer: 1, baristas: 1, targetSeconds: 90 }).sentence).toMatch(
      /^The queue is growing: 1 barista can't keep up with 1\.5 drinks a minute — add a barista\./,
    );
    expect(staffingAdvice({ arrivalsPerMinute: 0, servicePerMinutePerServer: 1, baristas: 1, targetSeconds: 90 }).sentence).toBe(
      'No drinks are coming in right now, so nobody waits.',
    );
  });
});
