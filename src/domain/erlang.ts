// Queueing at the bar: M/M/c (Erlang C) waits and a staffing hint for the shift lead.
//
// Formulas (docs/check-values.md, "Queueing"), with offered load A = λ·h, c servers, h the MEAN
// make time (the model's service rate is 1/h; a median would understate a bar with a few slow drinks):
//   P_wait = [A^c/c! · c/(c−A)] / [Σ_{k<c} A^k/k! + A^c/c! · c/(c−A)]
//   W_q    = P_wait · h/(c − A)
//   SL(t)  = 1 − P_wait · e^(−(c−A)·t/h)
// Whether the queue settles (A < c) is decided on exact fractions of the counts and seconds the
// bar measured, never on a rounded double. P_wait is computed through the Erlang B recursion
// B(0) = 1, B(k) = A·B(k−1)/(k + A·B(k−1)), then C = c·B / (c − A·(1 − B)): every step stays in
// [0, 1], so there are no factorials to overflow. The model assumes Poisson arrivals and
// exponential make times: a rough guide for a bar, not a promise.
import { compare, floor, fraction, mul, sub, toNumber, type Fraction } from './fraction';
import { durationWords } from './format';

export interface ErlangInput {
  /** Drinks that came in over the window (λ = arrivals / windowSeconds). */
  arrivals: number;
  windowSeconds: number;
  /** h: the mean make time per drink in seconds; a number is taken at its exact value. */
  meanMakeSeconds: number | Fraction;
  /** c: baristas on bar (a whole number, 0 or more). */
  servers: number;
}

export interface ErlangResult {
  /** A = λ·h, in Erlangs: how many baristas the demand keeps busy. */
  offeredLoad: number;
  /** A/c, capped at 1 (a barista can't be busier than all the time); 0 with no servers and no load. */
  occupancy: number;
  /** False when A ≥ c (exactly): the queue grows without bound. */
  stable: boolean;
  /** Share of arrivals that wait at all (1 when unstable). */
  probabilityOfWaiting: number;
  /** Mean wait before a barista starts, in seconds (Infinity when unstable). */
  meanWaitSeconds: number;
  /** Share of arrivals that wait at most t seconds (0 when unstable; t ≥ 0). */
  serviceLevel(tSeconds: number): number;
}

function assertInput({ arrivals, windowSeconds, meanMakeSeconds, servers }: ErlangInput) {
  if (!(Number.isFinite(arrivals) && arrivals >= 0)) throw new RangeError(`arrivals must be a finite number ≥ 0, got ${arrivals}`);
  if (!(Number.isFinite(windowSeconds) && windowSeconds > 0)) throw new RangeError(`windowSeconds must be a finite number > 0, got ${windowSeconds}`);
  const h = typeof meanMakeSeconds === 'number' ? meanMakeSeconds : toNumber(meanMakeSeconds);
  if (!(Number.isFinite(h) && h > 0)) throw new RangeError(`meanMakeSeconds must be a finite number > 0, got ${h}`);
  if (!(Number.isInteger(servers) && servers >= 0)) throw new RangeError(`servers must be a whole number ≥ 0, got ${servers}`);
}

function checkT(tSeconds: number) {
  if (!(tSeconds >= 0)) throw new RangeError(`serviceLevel: t must be ≥ 0 seconds, got ${tSeconds}`);
}

/** Erlang B blocking probability by the standard recursion (stable for large c). */
function erlangB(load: number, servers: number): number {
  let b = 1;
  for (let k = 1; k <= servers; k++) b = (load * b) / (k + load * b);
  return b;
}

/** A = λ·h, exactly. */
export function offeredLoad({ arrivals, windowSeconds, meanMakeSeconds }: Omit<ErlangInput, 'servers'>): Fraction {
  return mul(fraction(arrivals, windowSeconds), fraction(meanMakeSeconds));
}

export function erlangC(input: ErlangInput): ErlangResult {
  assertInput(input);
  const c = input.servers;
  const exact = offeredLoad(input);
  const a = toNumber(exact);
  const h = toNumber(fraction(input.meanMakeSeconds));

  if (exact.num === 0n) {
    // No demand: nobody waits, whatever the staffing.
    return { offeredLoad: 0, occupancy: 0, stable: true, probabilityOfWaiting: 0, meanWaitSeconds: 0, serviceLevel: (t) => (checkT(t), 1) };
  }
  if (compare(exact, fraction(c)) >= 0) {
    return { offeredLoad: a, occupancy: 1, stable: false, probabilityOfWaiting: 1, meanWaitSeconds: Infinity, serviceLevel: (t) => (checkT(t), 0) };
  }
  // c − A from the exact fraction: a hair under capacity stays a (long) finite wait, never 1/0.
  const slack = toNumber(sub(fraction(c), exact));
  const b = erlangB(a, c);
  const pWait = (c * b) / (c - a * (1 - b));
  return {
    offeredLoad: a,
    occupancy: a / c,
    stable: true,
    probabilityOfWaiting: pWait,
    meanWaitSeconds: (pWait * h) / slack,
    serviceLevel: (t) => {
      checkT(t);
      return 1 - pWait * Math.exp((-slack * t) / h);
    },
  };
}

export interface StaffingInput extends Omit<ErlangInput, 'servers'> {
  baristas: number;
  /** The wait the bar aims to keep under, in seconds. */
  targetSeconds: number;
}

export interface StaffingAdvice {
  now: ErlangResult;
  withOneMore: ErlangResult;
  /** Plain words for the shift lead. */
  sentence: string;
}

/** Past this, a mean wait is "over an hour": the bar is only just keeping up. */
const AT_THE_LIMIT_SECONDS = 60 * 60;

const about = (seconds: number) => (seconds < 0.5 ? 'under a second' : `about ${durationWords(seconds)}`);
const percent = (share: number) => `${Math.round(share * 100)} %`;
const onBar = (n: number) => `${n} on bar`;
const baristasWord = (n: number) => (n === 1 ? '1 barista' : `${n} baristas`);

export function staffingAdvice(input: StaffingInput): StaffingAdvice {
  const { arrivals, windowSeconds, meanMakeSeconds, baristas, targetSeconds } = input;
  if (!(Number.isFinite(targetSeconds) && targetSeconds >= 0)) {
    throw new RangeError(`targetSeconds must be a finite number ≥ 0, got ${targetSeconds}`);
  }
  const now = erlangC({ arrivals, windowSeconds, meanMakeSeconds, servers: baristas });
  const withOneMore = erlangC({ arrivals, windowSeconds, meanMakeSeconds, servers: baristas + 1 });
  const target = durationWords(targetSeconds);
  const h = toNumber(fraction(meanMakeSeconds));
  const window = `the last ${Math.round(windowSeconds / 60)} min`;
  const more = baristas + 1;
  let sentence: string;

  if (arrivals === 0) {
    sentence = `No drinks came in over ${window}, so nobody waits.`;
  } else if (!now.stable) {
    // what the baristas on bar can make in the window at this pace, against what came in
    const canMake = floor(fraction(baristas * windowSeconds, meanMakeSeconds));
    const make = baristas === 1 ? 'makes' : 'make';
    const head =
      `The bar can't keep up: ${arrivals} drinks came in over ${window}, and ${baristasWord(baristas)} at ${durationWords(h)} a drink ` +
      `${make} at most ${canMake} in that time, so the queue keeps growing.`;
    if (withOneMore.stable) {
      sentence = `${head} Add a barista: with ${more} a drink would wait ${about(withOneMore.meanWaitSeconds)} on average before it's started.`;
    } else {
      // the fewest baristas that can keep up: the first whole number above the offered load
      const needed = floor(offeredLoad(input)) + 1n;
      sentence = `${head} It takes at least ${onBar(Number(needed))} to keep up.`;
    }
  } else {
    const overMore = 1 - withOneMore.serviceLevel(targetSeconds);
    const tail = `With ${more} it would be ${about(withOneMore.meanWaitSeconds)} (${percent(overMore)} longer than ${target}).`;
    if (now.meanWaitSeconds >= AT_THE_LIMIT_SECONDS) {
      sentence = `With ${onBar(baristas)} the bar only just keeps up: a drink would wait over an hour on average before it's started. ${tail}`;
    } else {
      const overNow = 1 - now.serviceLevel(targetSeconds);
      sentence =
        `With ${onBar(baristas)} a drink waits ${about(now.meanWaitSeconds)} on average before it's started ` +
        `(${percent(now.probabilityOfWaiting)} wait at all, ${percent(overNow)} longer than ${target}). ${tail}`;
    }
  }
  return { now, withOneMore, sentence };
}
