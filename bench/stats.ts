// Summaries of timing samples. Percentiles by the nearest-rank method (the smallest sample with at
// least p % of the samples at or below it), so every figure is a time that was actually measured.

export interface Summary {
  n: number;
  p50: number;
  p95: number;
  p99: number;
  max: number;
}

export function percentile(sorted: ArrayLike<number>, p: number): number {
  if (sorted.length === 0) return NaN;
  const rank = Math.max(1, Math.ceil((p / 100) * sorted.length));
  return sorted[Math.min(sorted.length, rank) - 1];
}

export function summarize(samples: ArrayLike<number>): Summary {
  const sorted = Float64Array.from(samples).sort();
  return {
    n: sorted.length,
    p50: percentile(sorted, 50),
    p95: percentile(sorted, 95),
    p99: percentile(sorted, 99),
    max: sorted.length ? sorted[sorted.length - 1] : NaN,
  };
}

/** A growable list of numbers without boxing (hundreds of thousands of socket arrivals). */
export class Samples {
  private data = new Float64Array(1024);
  length = 0;
  push(x: number) {
    if (this.length === this.data.length) {
      const bigger = new Float64Array(this.data.length * 2);
      bigger.set(this.data);
      this.data = bigger;
    }
    this.data[this.length++] = x;
  }
  values(): Float64Array {
    return this.data.subarray(0, this.length);
  }
}
