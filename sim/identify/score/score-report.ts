// REPORT.md: the score for people — title, the safety caution, the settings, a table per split,
// the generalisation gap with the held-out rules, the error per parameter bin and links to the
// charts. Numbers are printed with four significant digits; score.json has them in full.
import type { ScoreDocument } from './score-document.ts';
import type { ScorePlot } from './score-plots.ts';
import type { GroupSummary } from './split-summary.ts';
import type { Statistics } from './summary-statistics.ts';

function num(value: number | null | undefined): string {
  if (value === null || value === undefined || !Number.isFinite(value)) return '—';
  if (value === 0) return '0';
  const a = Math.abs(value);
  return a >= 1e-3 && a < 1e5 ? String(Number(value.toPrecision(4))) : value.toExponential(3);
}

function stats(s: Statistics | null): string {
  return s === null ? '—' : `${num(s.mean)} (median ${num(s.median)}, p90 ${num(s.p90)})`;
}

function groupTable(name: string, g: GroupSummary): string[] {
  if (g.episodes === 0) return [`### ${name} (0 episodes)`, '', 'No episode of this split had a prediction, so there is nothing to summarise.', ''];
  const lines = [
    `### ${name} (${g.episodes} episode${g.episodes === 1 ? '' : 's'})`,
    '',
    '| metric | mean (median, 90th percentile) |',
    '| --- | --- |',
    `| one-step RMSE (m) | ${stats(g.oneStepRmseM)} |`,
    `| one-step RMSE / ℓ | ${stats(g.oneStepNormalisedError)} |`,
    ...g.horizons.flatMap((h) => [
      `| RMSE at horizon ${h.horizon} (m) | ${stats(h.rmseM)} |`,
      `| RMSE / ℓ at horizon ${h.horizon} | ${stats(h.normalisedError)} |`,
    ]),
    `| mean rollout RMSE / ℓ | ${stats(g.meanNormalisedError)} |`,
    `| valid prediction time (s) | ${stats(g.validPredictionTimeS)} |`,
    `| share of episodes passing the threshold | ${num(g.validPredictionTimeReachedFraction)} |`,
  ];
  if (g.episodesWithVelocities > 0) {
    lines.push(`| energy drift (J), ${g.episodesWithVelocities} episodes with velocities | ${stats(g.energyDriftJ)} |`);
    lines.push(`| energy drift / recorded energy range | ${stats(g.relativeEnergyDrift)} |`);
  } else {
    lines.push('| energy drift | — (no predicted velocities) |');
  }
  return [...lines, ''];
}

function missingSummary(score: ScoreDocument): string {
  const n = score.predictions.missing.length;
  return n === 0 ? '' : `; ${n} episode${n === 1 ? '' : 's'} of the scored splits had none and ${n === 1 ? 'is' : 'are'} not in these figures (listed below)`;
}

// Left-out episodes come first in the results so nobody reads a split's mean as covering it whole.
function missingSection(score: ScoreDocument): string[] {
  const bySplit = new Map<string, string[]>();
  for (const m of score.predictions.missing) bySplit.set(m.split, [...(bySplit.get(m.split) ?? []), m.id]);
  const lines = ['### Episodes without a prediction', '', '| split | not predicted | scored |', '| --- | --- | --- |'];
  for (const split of score.settings.splits) {
    const ids = bySplit.get(split);
    if (ids) lines.push(`| ${split} | ${ids.length}: ${ids.join(', ')} | ${score.splits[split].episodes} |`);
  }
  return [...lines, ''];
}

export function scoreReport(score: ScoreDocument, plots: readonly ScorePlot[]): string {
  const s = score.settings;
  const lines: string[] = [
    `# Score of ${score.predictions.model} on ${score.dataset.name}`,
    '',
    `> **Caution.** ${score.caution}`,
    '',
  ];
  if (score.predictions.description) lines.push(score.predictions.description, '');
  lines.push(
    '## Settings',
    '',
    `- Dataset: ${score.dataset.name}, master seed ${score.dataset.masterSeed}, ${score.dataset.episodeCount} episodes in the sweep; manifest.json SHA-256 \`${score.dataset.manifestSha256}\``,
    `- Predictions: ${score.predictions.episodeFiles} episode files from ${score.predictions.model}${missingSummary(score)}`,
    `- Splits scored: ${s.splits.join(', ')}`,
    `- Horizons: ${s.horizons.map((h) => (h.steps !== null ? `${h.steps} step${h.steps === 1 ? '' : 's'}` : `${h.seconds} s`)).join(', ')}`,
    `- Error: RMSE over nodes of the Euclidean position error, RMSE(h) = sqrt((1/N) Σ_i |p̂_i(h) − p_i(h)|²), in m; ℓ is the episode's RMS node distance from the centroid at t = 0`,
    `- Valid prediction time: the longest time over which RMSE/ℓ stays at or below ${s.validPredictionTimeThreshold}`,
    '- Split figures are means over the split\'s episodes (median and 90th percentile in brackets); "overall" pools every scored episode',
    '- Formulas and sources: SCORING.md in the Pliant source (sim/identify/score/SCORING.md)',
    '',
    '## Results',
    '',
  );
  if (score.predictions.missing.length > 0) lines.push(...missingSection(score));
  for (const split of s.splits) lines.push(...groupTable(split, score.splits[split]));
  if (s.splits.length > 1) lines.push(...groupTable('overall', score.overall));

  lines.push('## Generalisation gap', '');
  if (score.generalisationGap.entries.length === 0) {
    lines.push(`No gap to show: ${score.generalisationGap.note}.`, '');
  } else {
    for (const entry of score.generalisationGap.entries) {
      lines.push(`### ${entry.split} against ${score.generalisationGap.against}`, '', `Held out by: ${entry.ruleText}`, '',
        `| metric | ${entry.split} | ${score.generalisationGap.against} | difference | ratio |`, '| --- | --- | --- | --- | --- |');
      for (const m of entry.metrics) lines.push(`| ${m.metric} | ${num(m.heldOut)} | ${num(m.test)} | ${num(m.difference)} | ${num(m.ratio)} |`);
      lines.push('');
    }
  }

  lines.push('## Error against sampled parameters', '');
  if (score.parameters.length === 0) {
    lines.push('No sampled parameter varies over the scored episodes.', '');
  } else {
    lines.push(`Mean rollout RMSE / ℓ per equal-width bin of each parameter over its observed range (${s.parameterBins} bins), per split and for all scored episodes; episode count in brackets.`, '');
    const groups = s.splits.length > 1 ? [...s.splits, 'all'] : s.splits;
    for (const p of score.parameters) {
      const unit = p.unit && p.unit !== '1' ? ` (${p.unit})` : '';
      lines.push(`### ${p.label}${unit}`, '', `| bin | ${groups.join(' | ')} |`, `| --- |${groups.map(() => ' --- |').join('')}`);
      for (let b = 0; b < s.parameterBins; b++) {
        const cells = groups.map((g) => `${num(p.splits[g].meanNormalisedError[b])} (${p.splits[g].count[b]})`);
        lines.push(`| ${num(p.edges[b])} – ${num(p.edges[b + 1])} | ${cells.join(' | ')} |`);
      }
      const plot = plots.find((pl) => pl.title === `Error against ${p.label}`);
      if (plot) lines.push('', `![error against ${p.label}](${plot.path})`);
      lines.push('');
    }
  }

  lines.push('## Charts', '');
  for (const plot of plots) lines.push(`- [${plot.title}](${plot.path})`);
  lines.push('');
  return lines.join('\n');
}
