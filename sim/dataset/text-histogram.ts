// Small histograms drawn with characters, for the dataset card: a reader sees at a glance how a
// sampled parameter is spread over the episodes without loading anything. Numbers are binned
// into equal-width bins; whole numbers with few distinct values and non-numeric values get one
// row per value.

const BAR = '█';

export interface HistogramOptions {
  /** Most rows for numeric values, default 8. */
  binCount?: number;
  /** Characters of the longest bar, default 24. */
  barWidth?: number;
}

function bar(count: number, largest: number, width: number): string {
  if (count === 0 || largest === 0) return '';
  return BAR.repeat(Math.max(1, Math.round((count / largest) * width)));
}

/** Formats a number compactly but without losing the digits that tell bins apart. */
export function formatLabelNumber(value: number): string {
  if (value === 0) return '0';
  const magnitude = Math.abs(value);
  if (magnitude >= 1e5 || magnitude < 1e-3) return value.toExponential(3);
  return Number(value.toPrecision(4)).toString();
}

function rows(labels: string[], counts: number[], width: number): string[] {
  const labelWidth = Math.max(...labels.map((l) => l.length));
  const largest = Math.max(...counts);
  const countWidth = String(largest).length;
  return labels.map((label, i) => `${label.padEnd(labelWidth)} │${bar(counts[i], largest, width).padEnd(width)}│ ${String(counts[i]).padStart(countWidth)}`);
}

/** Text rows of a histogram of numeric values; empty input gives no rows. */
export function numericHistogram(values: readonly number[], options: HistogramOptions = {}): string[] {
  if (values.length === 0) return [];
  const binCount = options.binCount ?? 8;
  const width = options.barWidth ?? 24;
  let min = Infinity;
  let max = -Infinity;
  for (const v of values) {
    if (v < min) min = v;
    if (v > max) max = v;
  }
  const distinct = [...new Set(values)].sort((a, b) => a - b);
  if (distinct.length <= binCount && distinct.every(Number.isInteger)) {
    return rows(distinct.map(String), distinct.map((d) => values.filter((v) => v === d).length), width);
  }
  if (min === max) return rows([formatLabelNumber(min)], [values.length], width);
  const counts = new Array<number>(binCount).fill(0);
  const span = max - min;
  for (const v of values) counts[Math.min(binCount - 1, Math.floor(((v - min) / span) * binCount))]++;
  const labels = counts.map((_, b) => {
    const low = min + (span * b) / binCount;
    const high = b === binCount - 1 ? max : min + (span * (b + 1)) / binCount;
    return `${formatLabelNumber(low)} – ${formatLabelNumber(high)}${b === binCount - 1 ? ']' : ')'}`;
  });
  return rows(labels.map((l) => `[${l}`), counts, width);
}

/** Text rows with one row per distinct value (compared by their JSON text), in first-seen order. */
export function categoricalHistogram(values: readonly unknown[], options: HistogramOptions = {}): string[] {
  if (values.length === 0) return [];
  const width = options.barWidth ?? 24;
  const order: string[] = [];
  const counts = new Map<string, number>();
  for (const v of values) {
    const key = typeof v === 'string' ? v : JSON.stringify(v);
    if (!counts.has(key)) order.push(key);
    counts.set(key, (counts.get(key) ?? 0) + 1);
  }
  return rows(order, order.map((k) => counts.get(k) ?? 0), width);
}
