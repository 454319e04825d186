// Make time per drink. Drinks steamed in one jug are started and bumped together, so each one's
// own "done − started" is the whole jug's time: three lattes in 90 s would read as 3 × 90 s of work
// and make the bar look three times slower than it is. A batch's time is shared among its drinks.

export interface TimedDrink {
  startedMs: number;
  doneMs: number;
  /** Drinks bumped by one command share the number (order_items.bump_seq); null on old rows. */
  bumpSeq: number | null;
}

/** The bar's recent pace: `totalMs` of bar time made `drinks` drinks (mean = totalMs / drinks). */
export interface BarPace {
  drinks: number;
  totalMs: number;
}

interface Batch {
  fromMs: number;
  toMs: number;
  members: number[];
}

/** One batch per bump command (or, without a bump number, per shared start and done time). */
function batches(drinks: TimedDrink[]): Batch[] {
  const byKey = new Map<string, Batch>();
  drinks.forEach((d, i) => {
    const key = d.bumpSeq !== null ? `#${d.bumpSeq}` : `${d.startedMs}/${d.doneMs}`;
    const b = byKey.get(key);
    if (!b) byKey.set(key, { fromMs: d.startedMs, toMs: d.doneMs, members: [i] });
    else {
      // from the batch's first start to its bump: time two drinks overlapped counts once
      b.fromMs = Math.min(b.fromMs, d.startedMs);
      b.toMs = Math.max(b.toMs, d.doneMs);
      b.members.push(i);
    }
  });
  return [...byKey.values()];
}

/**
 * Each drink's share of its batch's time, in seconds, in the order given; null for a drink whose
 * batch has no measured time (bumped without being started: start = bump).
 */
export function perDrinkMakeSeconds(drinks: TimedDrink[]): (number | null)[] {
  const out = new Array<number | null>(drinks.length).fill(null);
  for (const b of batches(drinks)) {
    const span = b.toMs - b.fromMs;
    if (span > 0) for (const i of b.members) out[i] = span / 1000 / b.members.length;
  }
  return out;
}

/** The pace over the drinks given: the sum of their batches' times over the drinks timed. */
export function barPace(drinks: TimedDrink[]): BarPace {
  let totalMs = 0;
  let timed = 0;
  for (const b of batches(drinks)) {
    const span = b.toMs - b.fromMs;
    if (span > 0) {
      totalMs += span;
      timed += b.members.length;
    }
  }
  return { drinks: timed, totalMs };
}

/** A bar drink as the pace sees it: when it reached the bar (its ticket fired) and when it was bumped. */
export interface BarDrink {
  firedMs: number;
  /** null while it is still queued or being made. */
  doneMs: number | null;
}

/**
 * The bar's pace from what it got through, not from "start" taps: in a rush a barista taps start
 * on a jug moments before bumping it, and start → bump then reads a jug of 4 as 3 s a drink.
 * Little's law applied to the baristas (docs/check-values.md, "Queueing"): the mean number of busy
 * baristas equals throughput × make time, so the make time per drink is the barista-time the bar
 * was busy over the drinks it bumped in that time. A barista counts as busy while there are
 * drinks on the bar for them: min(drinks on the bar, baristas).
 *
 * The span runs from `sinceMs` (or the first drink given, if later) to the last bump in it: time
 * after the last bump is left out, so a bar that hasn't bumped yet reads as no pace (the default),
 * never as ever slower, and a burst of bumps after a long stretch is charged that stretch.
 */
/**
 * A drink left on the bar longer than this is forgotten (a ticket nobody bumped), not being made:
 * it keeps no barista busy after that. A real rush's drinks are bumped well within it, and while a
 * queue is long the baristas count busy anyway.
 */
export const FORGOTTEN_AFTER_MS = 20 * 60_000;

export function busyPace(drinks: BarDrink[], baristas: number, sinceMs: number): BarPace {
  const c = Math.max(1, baristas);
  if (drinks.length === 0) return { drinks: 0, totalMs: 0 };
  const from = Math.max(sinceMs, Math.min(...drinks.map((d) => d.firedMs)));
  const bumped = drinks.filter((d): d is BarDrink & { doneMs: number } => d.doneMs !== null && d.doneMs > from);
  if (bumped.length === 0) return { drinks: 0, totalMs: 0 };
  const to = Math.max(...bumped.map((d) => d.doneMs));
  // +1 where a drink reaches the bar, −1 where it leaves, inside [from, to]
  const steps: [number, number][] = [];
  for (const d of drinks) {
    const leaves = Math.min(d.doneMs ?? Infinity, d.firedMs + FORGOTTEN_AFTER_MS);
    if (d.firedMs >= to || leaves <= from) continue;
    steps.push([Math.max(d.firedMs, from), 1]);
    if (leaves < to) steps.push([leaves, -1]);
  }
  steps.sort((a, b) => a[0] - b[0]);
  let onBar = 0;
  let at = from;
  let busyMs = 0;
  for (const [t, step] of steps) {
    busyMs += Math.min(onBar, c) * (t - at);
    onBar += step;
    at = t;
  }
  busyMs += Math.min(onBar, c) * (to - at);
  return { drinks: bumped.length, totalMs: busyMs };
}

/** A bumped bar drink with who bumped it, for make times per barista and per category. */
export interface BumpedDrink {
  firedMs: number;
  doneMs: number;
  bumpSeq: number | null;
  bumper: string | null;
}

/**
 * Each drink's share of the time its barista spent on its batch, in seconds, in the order given
 * (null when no time can be put on it). A batch's time runs from when its barista could have
 * begun it — their previous bump, or the batch's first firing if that came later (they were
 * idle) — to its bump, shared among its drinks. Start taps are not used: a jug of 4 started 12 s
 * before its bump is not 3 s a drink. A barista's first bump in the data runs from its firing.
 */
export function bumpShares(drinks: BumpedDrink[]): (number | null)[] {
  const byBatch = new Map<string, { fromMs: number; doneMs: number; bumper: string; members: number[] }>();
  drinks.forEach((d, i) => {
    const bumper = d.bumper ?? '—';
    const key = d.bumpSeq !== null ? `#${d.bumpSeq}` : `${bumper}/${d.doneMs}`;
    const b = byBatch.get(key);
    if (!b) byBatch.set(key, { fromMs: d.firedMs, doneMs: d.doneMs, bumper, members: [i] });
    else {
      b.fromMs = Math.min(b.fromMs, d.firedMs);
      b.doneMs = Math.max(b.doneMs, d.doneMs);
      b.members.push(i);
    }
  });
  const out = new Array<number | null>(drinks.length).fill(null);
  const lastBump = new Map<string, number>();
  for (const b of [...byBatch.values()].sort((x, y) => x.doneMs - y.doneMs)) {
    const span = b.doneMs - Math.max(b.fromMs, lastBump.get(b.bumper) ?? -Infinity);
    lastBump.set(b.bumper, b.doneMs);
    if (span > 0) for (const i of b.members) out[i] = span / 1000 / b.members.length;
  }
  return out;
}
