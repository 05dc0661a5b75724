// The score's SVG charts: the mean normalised error against the horizon, one line per split,
// with the valid-prediction-time threshold as a guide; and per varying parameter the mean
// normalised rollout error per bin, one series per split. File names are derived from the split
// and label names only, so the same score gives the same files.
import { type ChartSeries,renderLineChart } from '../../plots/svg-line-chart.ts';
import type { ScoreDocument } from './score-document.ts';

export interface ScorePlot {
  /** Relative to the report folder, '/' separated. */
  path: string;
  title: string;
  svg: string;
}

export const ERROR_VS_HORIZON_PLOT = 'plots/error-vs-horizon.svg';

/** "/system/partCount" → "plots/error-vs-system-partCount.svg" */
export function parameterPlotPath(label: string): string {
  const stem = label.replace(/^\//, '').replace(/~1/g, '-').replace(/~0/g, '-').replace(/[^A-Za-z0-9_.-]+/g, '-').replace(/-+/g, '-');
  return `plots/error-vs-${stem || 'label'}.svg`;
}

function anyPositive(series: ChartSeries[]): boolean {
  return series.some((s) => Array.from(s.y).some((v) => Number.isFinite(v) && v > 0));
}

export function scorePlots(score: ScoreDocument): ScorePlot[] {
  const plots: ScorePlot[] = [];
  const horizonSeries: ChartSeries[] = [];
  let allInSeconds = true;
  for (const split of score.settings.splits) {
    const s = score.splits[split];
    if (s.recordIntervalS === null) allInSeconds = false;
  }
  for (const split of score.settings.splits) {
    const s = score.splits[split];
    const steps = s.meanNormalisedErrorByStep.length;
    const x: number[] = [];
    const y: number[] = [];
    // Step 0 is the given initial state, where every prediction is exact by contract.
    for (let h = 1; h < steps; h++) {
      x.push(allInSeconds ? h * s.recordIntervalS! : h);
      y.push(s.meanNormalisedErrorByStep[h]);
    }
    horizonSeries.push({ name: `${split} (${s.episodes} episodes)`, x, y, style: 'line' });
  }
  const threshold = score.settings.validPredictionTimeThreshold;
  plots.push({
    path: ERROR_VS_HORIZON_PLOT,
    title: 'Error against horizon',
    svg: renderLineChart({
      title: `${score.predictions.model}: position error against horizon`,
      xLabel: allInSeconds ? 'horizon (s)' : 'horizon (steps)',
      yLabel: 'mean RMSE / length scale',
      series: horizonSeries,
      yScale: anyPositive(horizonSeries) ? 'log' : 'linear',
      guides: [{ y: threshold, label: `valid-time threshold ${threshold}` }],
    }),
  });
  for (const parameter of score.parameters) {
    const centres = parameter.edges.slice(0, -1).map((e, k) => (e + parameter.edges[k + 1]) / 2);
    const series: ChartSeries[] = score.settings.splits.map((split) => ({
      name: split,
      x: centres,
      y: parameter.splits[split].meanNormalisedError.map((v) => (v === null ? NaN : v)),
      style: 'line+points',
    }));
    const unit = parameter.unit && parameter.unit !== '1' ? ` (${parameter.unit})` : '';
    plots.push({
      path: parameterPlotPath(parameter.label),
      title: `Error against ${parameter.label}`,
      svg: renderLineChart({
        title: `${score.predictions.model}: error against ${parameter.label}`,
        xLabel: `${parameter.label}${unit}, bin centre`,
        yLabel: 'mean rollout RMSE / length scale',
        series,
        yScale: anyPositive(series) ? 'log' : 'linear',
      }),
    });
  }
  return plots;
}
