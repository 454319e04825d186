// Queueing at the bar: M/M/c (Erlang C) waits and a staffing hint for the shift lead.
//
// Formulas (check-values.md, "Queueing"), with offered load A = λ/μ, c servers, h = 1/μ:
//   P_wait = [A^c/c! · c/(c−A)] / [Σ_{k<c} A^k/k! + A^c/c! · c/(c−A)]
//   W_q    = P_wait · h/(c − A)
//   SL(t)  = 1 − P_wait · e^(−(c−A)·t/h)
// P_wait is computed through the Erlang B recursion B(0) = 1, B(k) = A·B(k−1)/(k + A·B(k−1)),
// then C = c·B / (c − A·(1 − B)). Every step stays in [0, 1], so there are no factorials to
// overflow, even for hundreds of servers. The model assumes Poisson arrivals and exponential
// make times: a rough guide for a bar, not a promise.

export interface ErlangInput {
  /** λ: drinks (or customers) arriving per minute. */
  arrivalsPerMinute: number;
  /** μ: drinks one barista finishes per minute (1 / mean make time in minutes). */
  servicePerMinutePerServer: number;
  /** c: baristas on bar (a whole number, 0 or more). */
  servers: number;
}

export interface ErlangResult {
  /** A = λ/μ, in Erlangs: how many baristas the demand keeps busy. */
  offeredLoad: number;
  /** A/c, capped at 1 (a barista can't be busier than all the time); 0 with no servers and no load. */
  occupancy: number;
  /** False when A ≥ c: the queue grows without bound. */
  stable: boolean;
  /** Share of arrivals that wait at all (1 when unstable). */
  probabilityOfWaiting: number;
  /** Mean wait before a barista starts, in seconds (Infinity when unstable). */
  meanWaitSeconds: number;
  /** Share of arrivals that wait at most t seconds (0 when unstable; t ≥ 0). */
  serviceLevel(tSeconds: number): number;
}

function assertInput({ arrivalsPerMinute, servicePerMinutePerServer, servers }: ErlangInput) {
  if (!(Number.isFinite(arrivalsPerMinute) && arrivalsPerMinute >= 0)) {
    throw new RangeError(`arrivalsPerMinute must be a finite number ≥ 0, got ${arrivalsPerMinute}`);
  }
  if (!(Number.isFinite(servicePerMinutePerServer) && servicePerMinutePerServer > 0)) {
    throw new RangeError(`servicePerMinutePerServer must be a finite number > 0, got ${servicePerMinutePerServer}`);
  }
  if (!(Number.isInteger(servers) && servers >= 0)) {
    throw new RangeError(`servers must be a whole number ≥ 0, got ${servers}`);
  }
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

export function erlangC(input: ErlangInput): ErlangResult {
  assertInput(input);
  const { arrivalsPerMinute: lambda, servicePerMinutePerServer: mu, servers: c } = input;
  const a = lambda / mu;
  const hSeconds = 60 / mu;

  if (a === 0) {
    // No demand: nobody waits, whatever the staffing.
    return { offeredLoad: 0, occupancy: 0, stable: true, probabilityOfWaiting: 0, meanWaitSeconds: 0, serviceLevel: (t) => (checkT(t), 1) };
  }
  if (a >= c) {
    return {
      offeredLoad: a,
      occupancy: 1,
      stable: false,
      probabilityOfWaiting: 1,
      meanWaitSeconds: Infinity,
      serviceLevel: (t) => (checkT(t), 0),
    };
  }
  const b = erlangB(a, c);
  const pWait = (c * b) / (c - a * (1 - b));
  const meanWaitSeconds = (pWait * hSeconds) / (c - a);
  return {
    offeredLoad: a,
    occupancy: a / c,
    stable: true,
    probabilityOfWaiting: pWait,
    meanWaitSeconds,
    serviceLevel: (t) => {
      checkT(t);
      return 1 - pWait * Math.exp((-(c - a) * t) / hSeconds);
    },
  };
}

export interface StaffingInput {
  arrivalsPerMinute: number;
  servicePerMinutePerServer: number;
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

/** "about 1.4 min"; very short waits read "under 0.1 min". */
function about(seconds: number): string {
  return seconds < 3 ? 'under 0.1 min' : `about ${minutes(seconds)}`;
}

/** "1.4 min"; very short waits read "under 0.1 min". */
function minutes(seconds: number): string {
  if (seconds < 3) return 'under 0.1 min';
  return `${(seconds / 60).toFixed(1)} min`;
}

/** 180 → "3 min", 90 → "1.5 min", 45 → "45 s". */
function targetLabel(seconds: number): string {
  if (seconds < 60) return `${Math.round(seconds)} s`;
  const m = Math.round((seconds / 60) * 10) / 10;
  return `${Number.isInteger(m) ? m.toFixed(0) : m.toFixed(1)} min`;
}

const percent = (share: number) => `${Math.round(share * 100)} %`;
const onBar = (n: number) => `${n} on bar`;
const baristasWord = (n: number) => (n === 1 ? '1 barista' : `${n} baristas`);

export function staffingAdvice({ arrivalsPerMinute, servicePerMinutePerServer, baristas, targetSeconds }: StaffingInput): StaffingAdvice {
  if (!(Number.isFinite(targetSeconds) && targetSeconds >= 0)) {
    throw new RangeError(`targetSeconds must be a finite number ≥ 0, got ${targetSeconds}`);
  }
  const now = erlangC({ arrivalsPerMinute, servicePerMinutePerServer, servers: baristas });
  const withOneMore = erlangC({ arrivalsPerMinute, servicePerMinutePerServer, servers: baristas + 1 });
  const target = targetLabel(targetSeconds);
  let sentence: string;

  if (arrivalsPerMinute === 0) {
    sentence = 'No drinks are coming in right now, so nobody waits.';
  } else if (!now.stable) {
    const rate = arrivalsPerMinute.toFixed(1);
    const head = `The queue is growing: ${baristasWord(baristas)} can't keep up with ${rate} drinks a minute`;
    if (withOneMore.stable) {
      sentence = `${head} — add a barista. With ${baristas + 1} a drink would wait ${about(withOneMore.meanWaitSeconds)} on average.`;
    } else {
      // The fewest baristas that can keep up: the first whole number above the offered load.
      const needed = Math.floor(now.offeredLoad) + 1;
      sentence = `${head} — it takes at least ${onBar(needed)} to keep up.`;
    }
  } else {
    const overNow = 1 - now.serviceLevel(targetSeconds);
    const overMore = 1 - withOneMore.serviceLevel(targetSeconds);
    sentence =
      `With ${onBar(baristas)} a drink waits ${about(now.meanWaitSeconds)} on average before it's started ` +
      `(${percent(now.probabilityOfWaiting)} wait at all, ${percent(overNow)} longer than ${target}). ` +
      `With ${baristas + 1} it would be ${minutes(withOneMore.meanWaitSeconds)} (${percent(overMore)} longer than ${target}).`;
  }
  return { now, withOneMore, sentence };
}
