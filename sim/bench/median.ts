// Median of repeated benchmark measurements: the summary `pliant bench` reports when it runs a
// case several times, because a single run on a shared laptop is easily skewed by other work.

/** Median of a non-empty list (mean of the middle two for an even count). */
export function median(values: readonly number[]): number {
  if (values.length === 0) throw new RangeError('median of an empty list of measurements');
  const sorted = [...values].sort((a, b) => a - b);
  const mid = sorted.length >> 1;
  return sorted.length % 2 === 1 ? sorted[mid] : 0.5 * (sorted[mid - 1] + sorted[mid]);
}
