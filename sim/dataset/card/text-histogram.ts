// Small histograms drawn with characters, for the dataset card: a reader sees at a glance how a
// sampled parameter is spread over the episodes without loading anything. Numbers are binned
// into equal-width bins (label-bins.ts); whole numbers with few distinct values and non-numeric values get one
// row per value.
import { labelBins } from './label-bins.ts';

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
  const bins = labelBins(values, binCount)!;
  const counts = new Array<number>(bins.lows.length).fill(0);
  for (const v of values) counts[bins.binOf(v)]++;
  if (bins.perValue) return rows(bins.lows.map(String), counts, width);
  if (bins.lows.length === 1) return rows([formatLabelNumber(bins.lows[0])], counts, width);
  const last = bins.lows.length - 1;
  const labels = bins.lows.map((low, b) => `${formatLabelNumber(low)} – ${formatLabelNumber(bins.highs[b])}${b === last ? ']' : ')'}`);
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
