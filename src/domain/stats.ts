// Small statistics for ticket times.

/** Quantile by Hyndman & Fan type 7 (linear between order statistics; R's and d3's default). */
export function quantile(values: number[], p: number): number {
  if (values.length === 0) return NaN;
  const sorted = [...values].sort((a, b) => a - b);
  const h = (sorted.length - 1) * p;
  const lo = Math.floor(h);
  const hi = Math.ceil(h);
  return sorted[lo] + (h - lo) * (sorted[hi] - sorted[lo]);
}

export const median = (values: number[]) => quantile(values, 0.5);
