// Error against each sampled parameter: for every numeric label that varies over the scored
// episodes, 8 equal-width bins over its observed range [min, max] (the last bin includes max,
// as numpy.histogram's do), and per bin and split the number of episodes, their mean of the
// rollout's mean normalised error and their mean valid prediction time. Labels that do not
// vary (or are not numbers everywhere) are left out: there is nothing to bin.
import type { EpisodeScoreRow } from './episode-score.ts';

export const PARAMETER_BIN_COUNT = 8;

export interface ParameterBinsBySplit {
  count: number[];
  meanNormalisedError: (number | null)[];
  validPredictionTimeS: (number | null)[];
}

export interface ParameterBins {
  label: string;
  unit: string;
  min: number;
  max: number;
  /** PARAMETER_BIN_COUNT + 1 edges. */
  edges: number[];
  /** Per scored split, in split order, and "all". */
  splits: Record<string, ParameterBinsBySplit>;
}

/** Collects each label's value per scored episode, in scoring order. */
export class LabelColumns {
  private readonly columns = new Map<string, number[]>();
  private readonly broken = new Set<string>();
  private count = 0;

  add(labels: Record<string, unknown>): void {
    for (const [key, value] of Object.entries(labels)) {
      if (this.broken.has(key)) continue;
      if (typeof value !== 'number' || !Number.isFinite(value)) {
        this.broken.add(key);
        this.columns.delete(key);
        continue;
      }
      let column = this.columns.get(key);
      if (!column) {
        if (this.count > 0) {
          // A label missing from earlier episodes cannot be binned across all of them.
          this.broken.add(key);
          continue;
        }
        column = [];
        this.columns.set(key, column);
      }
      column.push(value);
    }
    this.count += 1;
    for (const [key, column] of this.columns) {
      if (column.length !== this.count) {
        this.columns.delete(key);
        this.broken.add(key);
      }
    }
  }

  /** Labels present as numbers in every episode and not constant. */
  varying(): [string, number[]][] {
    return [...this.columns].filter(([, c]) => c.some((v) => v !== c[0]));
  }
}

function binIndex(value: number, min: number, max: number): number {
  return Math.min(PARAMETER_BIN_COUNT - 1, Math.floor(((value - min) / (max - min)) * PARAMETER_BIN_COUNT));
}

export function parameterBins(label: string, unit: string, values: readonly number[], rows: readonly EpisodeScoreRow[], splitOrder: readonly string[]): ParameterBins {
  let min = Infinity;
  let max = -Infinity;
  for (const v of values) {
    if (v < min) min = v;
    if (v > max) max = v;
  }
  const edges = Array.from({ length: PARAMETER_BIN_COUNT + 1 }, (_, k) => (k === PARAMETER_BIN_COUNT ? max : min + ((max - min) * k) / PARAMETER_BIN_COUNT));
  const groups = [...splitOrder, 'all'];
  const sums = new Map(groups.map((g) => [g, { count: new Array<number>(PARAMETER_BIN_COUNT).fill(0), error: new Array<number>(PARAMETER_BIN_COUNT).fill(0), vpt: new Array<number>(PARAMETER_BIN_COUNT).fill(0) }]));
  rows.forEach((row, i) => {
    const b = binIndex(values[i], min, max);
    for (const group of [row.split, 'all']) {
      const s = sums.get(group)!;
      s.count[b] += 1;
      s.error[b] += row.meanNormalisedError;
      s.vpt[b] += row.validPredictionTimeS;
    }
  });
  const splits: Record<string, ParameterBinsBySplit> = {};
  for (const group of groups) {
    const s = sums.get(group)!;
    splits[group] = {
      count: s.count,
      meanNormalisedError: s.count.map((n, b) => (n === 0 ? null : s.error[b] / n)),
      validPredictionTimeS: s.count.map((n, b) => (n === 0 ? null : s.vpt[b] / n)),
    };
  }
  return { label, unit, min, max, edges, splits };
}
