// Small statistics for ticket times.

/**
 * The percentile definition the product uses, for the UI and docs to show beside any
 * median or 90th percentile (docs/check-values.md, "Percentiles": say which definition is used).
 */
export const PERCENTILE_METHOD = 'Hyndman & Fan type 7 (linear interpolation, as R and d3 use by default)';

/**
 * Quantile by Hyndman & Fan type 7 (linear between order statistics; R's and d3's default):
 * h = (n − 1)·p, Q(p) = x[⌊h⌋] + (h − ⌊h⌋)·(x[⌈h⌉] − x[⌊h⌋]) on the sorted values.
 * Empty input gives NaN; p must be in [0, 1].
 */
export function quantile(values: number[], p: number): number {
  if (!(p >= 0 && p <= 1)) throw new RangeError(`quantile: p must be between 0 and 1, got ${p}`);
  return quantileOfSorted(sortedCopy(values), p);
}

/** Ascending copy; a typed array's numeric sort is the (a, b) => a − b order, several times faster. */
function sortedCopy(values: number[]): Float64Array {
  return Float64Array.from(values).sort();
}

function quantileOfSorted(sorted: Float64Array, p: number): number {
  if (sorted.length === 0) return NaN;
  const h = (sorted.length - 1) * p;
  const lo = Math.floor(h);
  const hi = Math.ceil(h);
  // On an order statistic, return it as it is (no arithmetic on it).
  if (lo === hi) return sorted[lo];
  return sorted[lo] + (h - lo) * (sorted[hi] - sorted[lo]);
}

export const median = (values: number[]) => quantile(values, 0.5);

/** Arithmetic mean; NaN for empty input. */
export function mean(values: number[]): number {
  if (values.length === 0) return NaN;
  let sum = 0;
  for (const v of values) sum += v;
  return sum / values.length;
}

export interface WaitSummary {
  count: number;
  meanSeconds: number | null;
  medianSeconds: number | null;
  /** 90th percentile, type 7 (see PERCENTILE_METHOD). */
  p90Seconds: number | null;
  maxSeconds: number | null;
  /** Share of waits strictly longer than the target, 0..1 (null when there are none). */
  overTargetShare: number | null;
}

/** Summary of wait (or ticket) times in seconds against a target. Empty input: count 0, the rest null. */
export function summarizeWaits(seconds: number[], targetSeconds: number): WaitSummary {
  if (seconds.length === 0) {
    return { count: 0, meanSeconds: null, medianSeconds: null, p90Seconds: null, maxSeconds: null, overTargetShare: null };
  }
  let max = -Infinity;
  let over = 0;
  for (const s of seconds) {
    if (s > max) max = s;
    if (s > targetSeconds) over++;
  }
  const sorted = sortedCopy(seconds); // once, for both percentiles
  return {
    count: seconds.length,
    meanSeconds: mean(seconds),
    medianSeconds: quantileOfSorted(sorted, 0.5),
    p90Seconds: quantileOfSorted(sorted, 0.9),
    maxSeconds: max,
    overTargetShare: over / seconds.length,
  };
}
