// The bins a numeric label is counted in, one rule for the card's text histograms and its SVG
// histograms so the two always agree: whole numbers with at most `binCount` distinct values get
// one bin per value; otherwise `binCount` equal-width bins over [min, max], each holding
// [low, high) and the last also its upper end (numpy.histogram's rule with bins=binCount,
// range=(min, max)); a single value gets one bin.

export interface LabelBins {
  /** True when each bin is one whole value (then low === high === the value). */
  readonly perValue: boolean;
  readonly lows: readonly number[];
  readonly highs: readonly number[];
  /** The bin a value of the binned set falls in. */
  binOf(value: number): number;
}

/** Bins for `values`, or null when there are none. */
export function labelBins(values: readonly number[], binCount = 8): LabelBins | null {
  if (values.length === 0) return null;
  let min = Infinity;
  let max = -Infinity;
  for (const v of values) {
    if (v < min) min = v;
    if (v > max) max = v;
  }
  const distinct = [...new Set(values)].sort((a, b) => a - b);
  if (distinct.length <= binCount && distinct.every(Number.isInteger)) {
    const position = new Map(distinct.map((d, i) => [d, i]));
    return { perValue: true, lows: distinct, highs: distinct, binOf: (v) => position.get(v)! };
  }
  if (min === max) return { perValue: false, lows: [min], highs: [max], binOf: () => 0 };
  const span = max - min;
  const lows: number[] = [];
  const highs: number[] = [];
  for (let b = 0; b < binCount; b++) {
    lows.push(min + (span * b) / binCount);
    highs.push(b === binCount - 1 ? max : min + (span * (b + 1)) / binCount);
  }
  return { perValue: false, lows, highs, binOf: (v) => Math.min(binCount - 1, Math.floor(((v - min) / span) * binCount)) };
}
