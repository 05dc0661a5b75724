// Mean, median and 90th percentile of a list of per-episode values. Percentiles interpolate
// linearly between order statistics, q-th percentile at position q·(n−1) of the sorted values:
// definition 7 of Hyndman & Fan, The American Statistician 50 (1996) 361–365, which is also
// numpy.percentile's default ("linear").

export interface Statistics {
  mean: number;
  median: number;
  p90: number;
}

export function percentileOfSorted(sorted: readonly number[], q: number): number {
  const position = q * (sorted.length - 1);
  const below = Math.floor(position);
  const above = Math.min(below + 1, sorted.length - 1);
  return sorted[below] + (position - below) * (sorted[above] - sorted[below]);
}

/** null for an empty list. */
export function statisticsOf(values: readonly number[]): Statistics | null {
  if (values.length === 0) return null;
  let sum = 0;
  for (const v of values) sum += v;
  const sorted = [...values].sort((a, b) => a - b);
  return { mean: sum / values.length, median: percentileOfSorted(sorted, 0.5), p90: percentileOfSorted(sorted, 0.9) };
}
