// Deterministic SVG line and point charts for the reports Pliant writes (score and calibration):
// plain SVG 1.1 text with no scripts, fonts or external references, coordinates rounded to
// 0.01 px so the same numbers always give the same bytes. Non-finite values leave gaps.
import { CHART_COLOURS } from './chart-colours.ts';
import type { AxisTicks } from './nice-ticks.ts';
import { decadeTicks, niceTicks, tickLabel } from './nice-ticks.ts';
import { escapeXml, svgNumber as fmt } from './svg-text.ts';

export type SeriesStyle = 'line' | 'points' | 'line+points';

export interface ChartSeries {
  name: string;
  x: ArrayLike<number>;
  y: ArrayLike<number>;
  style?: SeriesStyle;
}

export interface HorizontalGuide {
  y: number;
  label: string;
}

export interface LineChartSpec {
  title: string;
  xLabel: string;
  yLabel: string;
  series: ChartSeries[];
  yScale?: 'linear' | 'log';
  /** Dashed horizontal lines, e.g. a threshold. */
  guides?: HorizontalGuide[];
  widthPx?: number;
  heightPx?: number;
}

const MARGIN = { left: 72, right: 16, top: 36, bottom: 48 };
const LEGEND_ROW_PX = 16;

function finiteRange(values: Iterable<number>, positiveOnly: boolean): [number, number] {
  let lo = Infinity;
  let hi = -Infinity;
  for (const v of values) {
    if (!Number.isFinite(v) || (positiveOnly && v <= 0)) continue;
    if (v < lo) lo = v;
    if (v > hi) hi = v;
  }
  return lo <= hi ? [lo, hi] : [NaN, NaN];
}

function* allOf(series: ChartSeries[], key: 'x' | 'y'): Generator<number> {
  for (const s of series) for (let i = 0; i < s[key].length; i++) yield s[key][i];
}

/** The chart as an SVG document. */
export function renderLineChart(spec: LineChartSpec): string {
  const width = spec.widthPx ?? 640;
  const legendRows = spec.series.length;
  const plotHeight = (spec.heightPx ?? 360) - MARGIN.top - MARGIN.bottom;
  const height = MARGIN.top + plotHeight + MARGIN.bottom + legendRows * LEGEND_ROW_PX;
  const plotWidth = width - MARGIN.left - MARGIN.right;
  const log = spec.yScale === 'log';

  const [x0, x1] = finiteRange(allOf(spec.series, 'x'), false);
  const guideYs = (spec.guides ?? []).map((g) => g.y);
  const [y0, y1] = finiteRange([...allOf(spec.series, 'y'), ...guideYs], log);
  const xTicks = niceTicks(x0, x1);
  const yTicks: AxisTicks = log ? decadeTicks(y0, y1) : niceTicks(Math.min(0, y0), y1);

  const px = (x: number) => MARGIN.left + ((x - xTicks.min) / (xTicks.max - xTicks.min)) * plotWidth;
  const yUnit = (y: number) => log
    ? (Math.log10(y) - Math.log10(yTicks.min)) / (Math.log10(yTicks.max) - Math.log10(yTicks.min))
    : (y - yTicks.min) / (yTicks.max - yTicks.min);
  const py = (y: number) => MARGIN.top + plotHeight * (1 - yUnit(y));
  const drawable = (y: number) => Number.isFinite(y) && (!log || y > 0);

  const out: string[] = [];
  out.push(`<svg xmlns="http://www.w3.org/2000/svg" width="${width}" height="${height}" viewBox="0 0 ${width} ${height}" font-family="sans-serif" font-size="11">`);
  out.push(`<rect x="0" y="0" width="${width}" height="${height}" fill="#ffffff"/>`);
  out.push(`<text x="${fmt(width / 2)}" y="20" text-anchor="middle" font-size="13" font-weight="bold">${escapeXml(spec.title)}</text>`);
  for (const t of yTicks.values) {
    const y = fmt(py(t));
    out.push(`<line x1="${MARGIN.left}" y1="${y}" x2="${MARGIN.left + plotWidth}" y2="${y}" stroke="#e2e2e2"/>`);
    out.push(`<text x="${MARGIN.left - 6}" y="${y}" text-anchor="end" dominant-baseline="middle">${escapeXml(tickLabel(t))}</text>`);
  }
  for (const t of xTicks.values) {
    const x = fmt(px(t));
    out.push(`<line x1="${x}" y1="${MARGIN.top}" x2="${x}" y2="${MARGIN.top + plotHeight}" stroke="#efefef"/>`);
    out.push(`<text x="${x}" y="${MARGIN.top + plotHeight + 16}" text-anchor="middle">${escapeXml(tickLabel(t))}</text>`);
  }
  out.push(`<rect x="${MARGIN.left}" y="${MARGIN.top}" width="${plotWidth}" height="${plotHeight}" fill="none" stroke="#555555"/>`);
  out.push(`<text x="${fmt(MARGIN.left + plotWidth / 2)}" y="${MARGIN.top + plotHeight + 36}" text-anchor="middle">${escapeXml(spec.xLabel)}</text>`);
  out.push(`<text x="14" y="${fmt(MARGIN.top + plotHeight / 2)}" text-anchor="middle" transform="rotate(-90 14 ${fmt(MARGIN.top + plotHeight / 2)})">${escapeXml(spec.yLabel)}</text>`);

  for (const guide of spec.guides ?? []) {
    if (!drawable(guide.y)) continue;
    const y = fmt(py(guide.y));
    out.push(`<line x1="${MARGIN.left}" y1="${y}" x2="${MARGIN.left + plotWidth}" y2="${y}" stroke="#7a7a7a" stroke-dasharray="5 4"/>`);
    out.push(`<text x="${MARGIN.left + plotWidth - 4}" y="${fmt(py(guide.y) - 4)}" text-anchor="end" fill="#555555">${escapeXml(guide.label)}</text>`);
  }

  spec.series.forEach((series, index) => {
    const colour = CHART_COLOURS[index % CHART_COLOURS.length];
    const style = series.style ?? 'line';
    const n = Math.min(series.x.length, series.y.length);
    if (style !== 'points') {
      // A gap (non-finite value) ends one path piece and starts the next.
      let d = '';
      let pen = false;
      for (let i = 0; i < n; i++) {
        const x = series.x[i];
        const y = series.y[i];
        if (!Number.isFinite(x) || !drawable(y)) {
          pen = false;
          continue;
        }
        d += `${pen ? 'L' : 'M'}${fmt(px(x))} ${fmt(py(y))}`;
        pen = true;
      }
      if (d) out.push(`<path d="${d}" fill="none" stroke="${colour}" stroke-width="1.6"/>`);
    }
    if (style !== 'line') {
      for (let i = 0; i < n; i++) {
        if (!Number.isFinite(series.x[i]) || !drawable(series.y[i])) continue;
        out.push(`<circle cx="${fmt(px(series.x[i]))}" cy="${fmt(py(series.y[i]))}" r="2.6" fill="${colour}"/>`);
      }
    }
    const legendY = MARGIN.top + plotHeight + MARGIN.bottom + index * LEGEND_ROW_PX + 4;
    out.push(`<rect x="${MARGIN.left}" y="${legendY - 8}" width="14" height="4" fill="${colour}"/>`);
    out.push(`<text x="${MARGIN.left + 20}" y="${legendY - 4}" dominant-baseline="middle">${escapeXml(series.name)}</text>`);
  });
  out.push('</svg>');
  return `${out.join('\n')}\n`;
}
