// Deterministic SVG scatter plots, one panel per pair of variables, points coloured by group
// with a legend, for the dataset card (parameters against each other, coloured by split).
// Plain SVG 1.1, no scripts, fonts or external references; every coordinate goes through
// svgNumber. Each point is a circle of class "point" whose fill names its group's colour.
import { chartColour } from './chart-colours.ts';
import { niceTicks, tickLabel } from './nice-ticks.ts';
import { escapeXml, svgClose, svgNumber, svgOpen } from './svg-text.ts';

export interface ScatterVariable {
  /** Axis label, with its unit. */
  label: string;
}

export interface ScatterGroup {
  name: string;
  /** values[v][i] is variable v of point i; every variable has the same number of points. */
  values: ArrayLike<number>[];
  /** Default: the palette's colour for the group's place in the list. */
  colour?: string;
}

export interface ScatterPanelsSpec {
  title: string;
  note?: string;
  variables: ScatterVariable[];
  /** Pairs of variable indices, [x, y], one panel each. */
  pairs: [number, number][];
  groups: ScatterGroup[];
}

const PANEL_PX = 300;
const MARGIN = { left: 56, right: 12, top: 12, bottom: 44 };
const HEADER_PX = 44;
const LEGEND_ROW_PX = 16;

function rangeOf(groups: ScatterGroup[], variable: number): [number, number] {
  let lo = Infinity;
  let hi = -Infinity;
  for (const g of groups) {
    const values = g.values[variable];
    for (let i = 0; i < values.length; i++) {
      const v = values[i];
      if (!Number.isFinite(v)) continue;
      if (v < lo) lo = v;
      if (v > hi) hi = v;
    }
  }
  return lo <= hi ? [lo, hi] : [0, 1];
}

/** The scatter panels as an SVG document, side by side, with the legend below. */
export function renderScatterPanels(spec: ScatterPanelsSpec): string {
  const width = Math.max(1, spec.pairs.length) * PANEL_PX;
  const height = HEADER_PX + PANEL_PX + spec.groups.length * LEGEND_ROW_PX + 8;
  const out = svgOpen(width, height);
  out.push(`<text x="${svgNumber(width / 2)}" y="18" text-anchor="middle" font-size="13" font-weight="bold">${escapeXml(spec.title)}</text>`);
  if (spec.note) out.push(`<text x="${svgNumber(width / 2)}" y="34" text-anchor="middle" fill="#555555">${escapeXml(spec.note)}</text>`);
  const ticks = spec.variables.map((_, v) => {
    const [lo, hi] = rangeOf(spec.groups, v);
    return niceTicks(lo, hi, 4);
  });
  const plotSize = PANEL_PX - MARGIN.left - MARGIN.right;
  const plotHeight = PANEL_PX - MARGIN.top - MARGIN.bottom;
  spec.pairs.forEach(([xv, yv], p) => {
    const left = p * PANEL_PX + MARGIN.left;
    const top = HEADER_PX + MARGIN.top;
    const xt = ticks[xv];
    const yt = ticks[yv];
    const px = (x: number) => left + ((x - xt.min) / (xt.max - xt.min)) * plotSize;
    const py = (y: number) => top + plotHeight * (1 - (y - yt.min) / (yt.max - yt.min));
    out.push(`<g class="panel">`);
    for (const t of yt.values) {
      const y = svgNumber(py(t));
      out.push(`<line x1="${svgNumber(left)}" y1="${y}" x2="${svgNumber(left + plotSize)}" y2="${y}" stroke="#ececec"/>`);
      out.push(`<text x="${svgNumber(left - 5)}" y="${y}" text-anchor="end" dominant-baseline="middle">${escapeXml(tickLabel(t))}</text>`);
    }
    for (const t of xt.values) {
      const x = svgNumber(px(t));
      out.push(`<line x1="${x}" y1="${svgNumber(top)}" x2="${x}" y2="${svgNumber(top + plotHeight)}" stroke="#ececec"/>`);
      out.push(`<text x="${x}" y="${svgNumber(top + plotHeight + 14)}" text-anchor="middle">${escapeXml(tickLabel(t))}</text>`);
    }
    out.push(`<rect x="${svgNumber(left)}" y="${svgNumber(top)}" width="${svgNumber(plotSize)}" height="${svgNumber(plotHeight)}" fill="none" stroke="#555555"/>`);
    out.push(`<text class="x-label" x="${svgNumber(left + plotSize / 2)}" y="${svgNumber(top + plotHeight + 32)}" text-anchor="middle">${escapeXml(spec.variables[xv].label)}</text>`);
    const yLabelX = svgNumber(p * PANEL_PX + 12);
    const yLabelY = svgNumber(top + plotHeight / 2);
    out.push(`<text class="y-label" x="${yLabelX}" y="${yLabelY}" text-anchor="middle" transform="rotate(-90 ${yLabelX} ${yLabelY})">${escapeXml(spec.variables[yv].label)}</text>`);
    spec.groups.forEach((group, g) => {
      const colour = group.colour ?? chartColour(g);
      const xs = group.values[xv];
      const ys = group.values[yv];
      for (let i = 0; i < xs.length; i++) {
        if (!Number.isFinite(xs[i]) || !Number.isFinite(ys[i])) continue;
        out.push(`<circle class="point" cx="${svgNumber(px(xs[i]))}" cy="${svgNumber(py(ys[i]))}" r="2.2" fill="${colour}" fill-opacity="0.75"/>`);
      }
    });
    out.push('</g>');
  });
  spec.groups.forEach((group, g) => {
    const y = HEADER_PX + PANEL_PX + g * LEGEND_ROW_PX + 4;
    out.push(`<circle class="legend-mark" cx="${MARGIN.left + 4}" cy="${y}" r="4" fill="${group.colour ?? chartColour(g)}"/>`);
    out.push(`<text class="legend" x="${MARGIN.left + 14}" y="${y}" dominant-baseline="middle">${escapeXml(`${group.name} (${group.values[0]?.length ?? 0} shown)`)}</text>`);
  });
  return svgClose(out);
}
