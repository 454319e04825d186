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
