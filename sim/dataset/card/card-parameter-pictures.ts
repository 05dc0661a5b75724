// The dataset card's pictures of the sampled parameters, drawn from the CardTally alone:
// per split, one histogram per sampled parameter (the bins of the card's text histograms,
// label-bins.ts, shared by every split, so splits compare bar for bar; every episode of the
// split counted, rejected ones too, as in the text histograms), with the held-out rules' ranges
// shaded; and scatter plots of the two or three parameters spread most widely over their range.
import type { HistogramBand, HistogramBin, HistogramPanel } from '../../plots/svg-histogram-panels.ts';
import { renderHistogramPanels } from '../../plots/svg-histogram-panels.ts';
import type { ScatterGroup } from '../../plots/svg-scatter-panels.ts';
import { renderScatterPanels } from '../../plots/svg-scatter-panels.ts';
import type { HeldOutRule } from '../../scenario/scenario-types.ts';
import { unitOfLabel } from '../manifest/label-units.ts';
import type { CardTally, LabelTally } from './card-tally.ts';
import { labelBins } from './label-bins.ts';
import { formatLabelNumber } from './text-histogram.ts';

/** Most distinct non-numeric values a picture draws one bar each for (as the card's text). */
const CATEGORY_BARS = 12;
/** Points per split in the scatter: the first this many episodes of the split, in index order. */
export const SCATTER_POINTS_PER_SPLIT = 500;
/** Parameters the scatter plots pair up. */
const SCATTER_PARAMETERS = 3;

function axisTitle(pointer: string, tally: CardTally): string {
  const unit = unitOfLabel(pointer, tally.channelUnits);
  return unit ? `${pointer} (${unit})` : pointer;
}

/** Labels the pictures draw: scalar, more than one distinct value, no list values. */
function drawnLabels(tally: CardTally): [string, LabelTally][] {
  return [...tally.labels].filter(([, label]) => label.compoundDigests.size === 0 && label.scalars.distinctCount() > 1);
}

function ruleBand(rule: HeldOutRule): HistogramBand {
  // Every condition of a rule must hold, so its range is the intersection of theirs.
  const low = Math.max(rule.above ?? -Infinity, rule.inside?.[0] ?? -Infinity);
  const high = Math.min(rule.below ?? Infinity, rule.inside?.[1] ?? Infinity);
  const words = [
    rule.above !== undefined ? `> ${formatLabelNumber(rule.above)}` : '',
    rule.below !== undefined ? `< ${formatLabelNumber(rule.below)}` : '',
    rule.inside !== undefined ? `${formatLabelNumber(rule.inside[0])} to ${formatLabelNumber(rule.inside[1])}` : '',
  ].filter(Boolean).join(', ');
  return { low, high, label: `${rule.split}: ${words}` };
}

/** Bin geometry and per-split counts of one label; null when it cannot be drawn as bars. */
function labelHistogram(label: LabelTally, splitCount: number): { bins: Omit<HistogramBin, 'count'>[]; counts: number[][]; numeric: boolean } | null {
  const values = label.scalars.values();
  const counts = Array.from({ length: splitCount }, () => [] as number[]);
  if (values.every((v): v is number => typeof v === 'number')) {
    const bins = labelBins(values)!;
    for (const c of counts) c.push(...new Array<number>(bins.lows.length).fill(0));
    values.forEach((v, i) => counts[label.scalarSplits.at(i)][bins.binOf(v)]++);
    // A bin per whole value is drawn one unit wide around it, so a range rule lines up with the values.
    const geometry = bins.lows.map((low, b) => bins.perValue
      ? { low: low - 0.5, high: low + 0.5, label: String(low) }
      : bins.lows.length === 1 ? { low: low - 0.5, high: low + 0.5, label: formatLabelNumber(low) } : { low, high: bins.highs[b] });
    return { bins: geometry, counts, numeric: true };
  }
  const order: string[] = [];
  const position = new Map<string, number>();
  const keys = values.map((v) => (typeof v === 'string' ? v : JSON.stringify(v)));
  for (const key of keys) {
    if (!position.has(key)) {
      position.set(key, order.length);
      order.push(key);
    }
  }
  if (order.length > CATEGORY_BARS) return null;
  for (const c of counts) c.push(...new Array<number>(order.length).fill(0));
  keys.forEach((key, i) => counts[label.scalarSplits.at(i)][position.get(key)!]++);
  return { bins: order.map((key, b) => ({ low: b, high: b + 1, label: key })), counts, numeric: false };
}

/** The histogram document of each split that has episodes, keyed by split name, in `splits` order. */
export function parameterHistograms(tally: CardTally, heldOut: readonly HeldOutRule[], splits: readonly string[], colourOf: (split: string) => string): Map<string, string> {
  const histograms = drawnLabels(tally).flatMap(([pointer, label]) => {
    const h = labelHistogram(label, tally.splitNames.length);
    return h === null ? [] : [{ pointer, ...h }];
  });
  const documents = new Map<string, string>();
  if (histograms.length === 0) return documents;
  for (const split of splits) {
    const code = tally.splitNames.indexOf(split);
    if (code < 0) continue;
    const panels: HistogramPanel[] = histograms.map((h) => ({
      title: axisTitle(h.pointer, tally),
      bins: h.bins.map((b, i) => ({ ...b, count: h.counts[code][i] })),
      bands: h.numeric ? heldOut.filter((r) => r.parameter === h.pointer).map(ruleBand) : [],
    }));
    documents.set(split, renderHistogramPanels({
      title: `Sampled parameters, split "${split}" (${tally.splitEpisodes[code]} episodes)`,
      note: 'Bins as in CARD.md, the same for every split; shaded: held-out ranges.',
      panels,
      colour: colourOf(split),
    }));
  }
  return documents;
}

/**
 * Parameters for the scatter: numeric labels every episode has, ranked by the standard deviation
 * of their values over the width of their range (largest first; earlier labels win ties).
 */
export function scatterParameters(tally: CardTally): string[] {
  const ranked: { pointer: string; spread: number; order: number }[] = [];
  drawnLabels(tally).forEach(([pointer, label], order) => {
    if (label.scalars.size !== tally.episodes) return;
    const values = label.scalars.values();
    if (!values.every((v) => typeof v === 'number')) return;
    const numbers = values as number[];
    let min = Infinity;
    let max = -Infinity;
    let sum = 0;
    for (const v of numbers) {
      min = Math.min(min, v);
      max = Math.max(max, v);
      sum += v;
    }
    const mean = sum / numbers.length;
    let squares = 0;
    for (const v of numbers) squares += (v - mean) ** 2;
    ranked.push({ pointer, spread: Math.sqrt(squares / numbers.length) / (max - min), order });
  });
  ranked.sort((a, b) => b.spread - a.spread || a.order - b.order);
  return ranked.slice(0, SCATTER_PARAMETERS).map((r) => r.pointer);
}

/** The scatter document, or null when fewer than two parameters qualify. */
export function parameterScatter(tally: CardTally, splits: readonly string[], colourOf: (split: string) => string): string | null {
  const pointers = scatterParameters(tally);
  if (pointers.length < 2) return null;
  const columns = pointers.map((p) => tally.labels.get(p)!.scalars.values() as number[]);
  // Every chosen label is in every episode, so position i of each column is episode i.
  const splitsOfEpisodes = tally.labels.get(pointers[0])!.scalarSplits;
  const shown = splits.filter((s) => tally.splitNames.includes(s));
  const groups: ScatterGroup[] = [];
  const slot = new Map<string, number[][]>();
  for (const split of shown) slot.set(split, pointers.map(() => []));
  for (let i = 0; i < tally.episodes; i++) {
    const target = slot.get(tally.splitNames[splitsOfEpisodes.at(i)]);
    if (target === undefined || target[0].length >= SCATTER_POINTS_PER_SPLIT) continue;
    pointers.forEach((_, v) => target[v].push(columns[v][i]));
  }
  for (const split of shown) groups.push({ name: split, values: slot.get(split)!, colour: colourOf(split) });
  const pairs: [number, number][] = pointers.length === 2 ? [[0, 1]] : [[0, 1], [0, 2], [1, 2]];
  return renderScatterPanels({
    title: 'Most widely spread parameters, by split',
    note: `Largest standard deviation over range; first ${SCATTER_POINTS_PER_SPLIT} episodes of each split in index order.`,
    variables: pointers.map((p) => ({ label: axisTitle(p, tally) })),
    pairs,
    groups,
  });
}
