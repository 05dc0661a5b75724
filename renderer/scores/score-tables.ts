// The tables of the Scores screen, built from score.json as `pliant score` wrote it: one row per
// split (and all episodes) with the one-step error, the error at each horizon, the valid
// prediction time and the energy drift; and the generalisation gap of every held-out split
// against the in-distribution test split, with the rule that defines the split.
import type { ScoreDocumentView, ScoreGroupSummary, ScoreStatistics } from '../../sim/bridge/bridge-contract.ts';
import { h } from '../ui/element.ts';

/** Three significant digits, exponent form for very small or large values; "–" where none. */
export function shortNumber(value: number | null | undefined): string {
  if (value === null || value === undefined || !Number.isFinite(value)) return '–';
  if (value === 0) return '0';
  const magnitude = Math.abs(value);
  if (magnitude < 1e-3 || magnitude >= 1e5) return value.toExponential(2);
  return String(Number(value.toPrecision(3)));
}

function statistic(value: ScoreStatistics | null, unit = ''): string {
  if (!value) return '–';
  return `${shortNumber(value.mean)}${unit} (median ${shortNumber(value.median)})`;
}

function table(head: string[], rows: string[][], role: string): HTMLTableElement {
  return h(
    'table',
    { className: 'score-table', attrs: { 'data-role': role } },
    h('thead', {}, h('tr', {}, ...head.map((cell) => h('th', { text: cell, attrs: { scope: 'col' } })))),
    h('tbody', {}, ...rows.map((row) => h('tr', {}, ...row.map((cell, c) => (c === 0 ? h('th', { text: cell, attrs: { scope: 'row' } }) : h('td', { text: cell })))))),
  );
}

function groupRow(name: string, group: ScoreGroupSummary, horizonCount: number): string[] {
  const horizons = Array.from({ length: horizonCount }, (_, i) => statistic(group.horizons[i]?.rmseM ?? null));
  const reached = group.validPredictionTimeReachedFraction;
  return [
    name,
    String(group.episodes),
    statistic(group.oneStepRmseM),
    ...horizons,
    statistic(group.meanNormalisedError),
    `${statistic(group.validPredictionTimeS)}${reached === null ? '' : `, threshold passed in ${shortNumber(100 * reached)} %`}`,
    group.episodesWithVelocities > 0 ? statistic(group.relativeEnergyDrift) : 'no velocities',
  ];
}

/** Per split, then all scored episodes. Errors in m; normalised error and drift dimensionless. */
export function splitTable(score: ScoreDocumentView): HTMLTableElement {
  const horizons = score.settings.horizons.map((hz) => `RMSE at ${hz.horizon}, m`);
  const head = ['split', 'episodes', 'one-step RMSE, m', ...horizons, 'mean normalised error (–)', `valid prediction time, s (error/ℓ < ${score.settings.validPredictionTimeThreshold})`, 'relative energy drift (–)'];
  const rows = Object.entries(score.splits).map(([split, group]) => groupRow(split, group, horizons.length));
  rows.push(groupRow('all scored', score.overall, horizons.length));
  return table(head, rows, 'score-splits');
}

/** Each held-out split against the test split: the rule, then held-out, test, ratio per metric. */
export function gapTable(score: ScoreDocumentView): HTMLElement {
  const gap = score.generalisationGap;
  if (gap.entries.length === 0) return h('p', { className: 'score-note', attrs: { 'data-role': 'score-gap' }, text: gap.note || 'No held-out split was scored, so there is no generalisation gap to show.' });
  const rows: string[][] = [];
  for (const entry of gap.entries) {
    for (const metric of entry.metrics) {
      rows.push([entry.split, entry.ruleText, metric.metric, shortNumber(metric.heldOut), shortNumber(metric.test), metric.ratio === null ? '–' : `${shortNumber(metric.ratio)}×`]);
    }
  }
  return table(['held-out split', 'defined by', 'metric', 'held-out', gap.against, 'ratio'], rows, 'score-gap');
}
