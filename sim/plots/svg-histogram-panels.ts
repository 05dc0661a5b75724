// Deterministic SVG histograms, several small panels to a page (one per parameter), for the
// dataset card: bars whose heights are proportional to their counts on an axis from 0, and
// shaded bands for value ranges the reader should notice (held-out ranges). Plain SVG 1.1, no
// scripts, fonts or external references; every coordinate goes through svgNumber.
import { niceTicks, tickLabel } from './nice-ticks.ts';
import { escapeXml, svgClose, svgNumber, svgOpen } from './svg-text.ts';

/** One bar: the values in [low, high) (the last bin of a panel also holds its upper end). */
export interface HistogramBin {
  low: number;
  high: number;
  count: number;
  /** Drawn under the bar instead of numeric ticks, for categories. */
  label?: string;
}

export interface HistogramBand {
  /** Either end may lie outside the bins' span (or be infinite); the band is clipped to it. */
  low: number;
  high: number;
  label: string;
}

export interface HistogramPanel {
  title: string;
  bins: HistogramBin[];
  bands?: HistogramBand[];
}

export interface HistogramPanelsSpec {
  title: string;
  /** A line under the title, e.g. how the bins were chosen. */
  note?: string;
  panels: HistogramPanel[];
  colour: string;
  columns?: number;
}

const PANEL_WIDTH_PX = 320;
const PANEL_HEIGHT_PX = 200;
const PANEL_MARGIN = { left: 48, right: 12, top: 28, bottom: 34 };
const HEADER_PX = 44;

function panelLines(panel: HistogramPanel, originX: number, originY: number, colour: string): string[] {
  const out: string[] = [];
  const plotWidth = PANEL_WIDTH_PX - PANEL_MARGIN.left - PANEL_MARGIN.right;
  const plotHeight = PANEL_HEIGHT_PX - PANEL_MARGIN.top - PANEL_MARGIN.bottom;
  const left = originX + PANEL_MARGIN.left;
  const top = originY + PANEL_MARGIN.top;
  const bottom = top + plotHeight;
  out.push(`<g class="panel">`);
  out.push(`<text class="panel-title" x="${svgNumber(originX + PANEL_WIDTH_PX / 2)}" y="${svgNumber(originY + 16)}" text-anchor="middle" font-weight="bold">${escapeXml(panel.title)}</text>`);
  const bins = panel.bins;
  if (bins.length === 0) {
    out.push(`<text x="${svgNumber(left + plotWidth / 2)}" y="${svgNumber(top + plotHeight / 2)}" text-anchor="middle">no values</text>`, '</g>');
    return out;
  }
  const lowest = bins[0].low;
  const highest = bins[bins.length - 1].high;
  const span = highest > lowest ? highest - lowest : 1;
  const px = (value: number) => left + ((value - lowest) / span) * plotWidth;
  let largestCount = 0;
  for (const bin of bins) largestCount = Math.max(largestCount, bin.count);
  const yTicks = niceTicks(0, Math.max(1, largestCount), 4);
  // Counts are whole: keep only whole ticks (a largest count of 1 would otherwise get 0.2 steps).
  const yValues = yTicks.values.filter(Number.isInteger);
  const py = (count: number) => bottom - (count / yTicks.max) * plotHeight;

  for (const band of panel.bands ?? []) {
    const from = Math.max(lowest, band.low);
    const to = Math.min(highest, band.high);
    if (!(to >= from)) continue;
    const x = px(from);
    const width = Math.max(1, px(to) - x);
    out.push(`<rect class="band" x="${svgNumber(x)}" y="${svgNumber(top)}" width="${svgNumber(width)}" height="${svgNumber(plotHeight)}" fill="#d9d9d9" fill-opacity="0.6"/>`);
    out.push(`<text class="band-label" x="${svgNumber(x + width / 2)}" y="${svgNumber(top + 11)}" text-anchor="middle" fill="#444444">${escapeXml(band.label)}</text>`);
  }
  for (const t of yValues) {
    const y = svgNumber(py(t));
    out.push(`<line x1="${svgNumber(left)}" y1="${y}" x2="${svgNumber(left + plotWidth)}" y2="${y}" stroke="#e8e8e8"/>`);
    out.push(`<text x="${svgNumber(left - 5)}" y="${y}" text-anchor="end" dominant-baseline="middle">${escapeXml(tickLabel(t))}</text>`);
  }
  for (const bin of bins) {
    const x = px(bin.low);
    const width = px(bin.high) - x;
    // A gap of one pixel between bars while they are wide enough to show it; a bar narrower than
    // 2 px (whole values far apart) is widened about its centre so it stays visible.
    const gap = width > 3 ? 1 : 0;
    const drawnWidth = Math.max(2, width - gap);
    const height = bottom - py(bin.count);
    out.push(`<rect class="bar" x="${svgNumber(x + width / 2 - drawnWidth / 2)}" y="${svgNumber(bottom - height)}" width="${svgNumber(drawnWidth)}" height="${svgNumber(height)}" fill="${colour}"/>`);
    if (bin.label !== undefined) {
      out.push(`<text x="${svgNumber(x + width / 2)}" y="${svgNumber(bottom + 14)}" text-anchor="middle">${escapeXml(bin.label)}</text>`);
    }
  }
  if (bins.every((b) => b.label === undefined)) {
    const xTicks = niceTicks(lowest, highest, 4);
    for (const t of xTicks.values) {
      if (t < lowest || t > highest) continue;
      const x = svgNumber(px(t));
      out.push(`<line x1="${x}" y1="${svgNumber(bottom)}" x2="${x}" y2="${svgNumber(bottom + 4)}" stroke="#555555"/>`);
      out.push(`<text x="${x}" y="${svgNumber(bottom + 16)}" text-anchor="middle">${escapeXml(tickLabel(t))}</text>`);
    }
  }
  out.push(`<rect x="${svgNumber(left)}" y="${svgNumber(top)}" width="${svgNumber(plotWidth)}" height="${svgNumber(plotHeight)}" fill="none" stroke="#555555"/>`);
  out.push(`<text x="${svgNumber(originX + 12)}" y="${svgNumber(top + plotHeight / 2)}" text-anchor="middle" transform="rotate(-90 ${svgNumber(originX + 12)} ${svgNumber(top + plotHeight / 2)})">episodes</text>`);
  out.push('</g>');
  return out;
}

/** The panels as an SVG document, `columns` to a row (default 2). */
export function renderHistogramPanels(spec: HistogramPanelsSpec): string {
  const columns = Math.max(1, Math.min(spec.columns ?? 2, Math.max(1, spec.panels.length)));
  const rows = Math.max(1, Math.ceil(spec.panels.length / columns));
  const width = columns * PANEL_WIDTH_PX;
  const height = HEADER_PX + rows * PANEL_HEIGHT_PX;
  const out = svgOpen(width, height);
  out.push(`<text x="${svgNumber(width / 2)}" y="18" text-anchor="middle" font-size="13" font-weight="bold">${escapeXml(spec.title)}</text>`);
  if (spec.note) out.push(`<text x="${svgNumber(width / 2)}" y="34" text-anchor="middle" fill="#555555">${escapeXml(spec.note)}</text>`);
  spec.panels.forEach((panel, i) => {
    out.push(...panelLines(panel, (i % columns) * PANEL_WIDTH_PX, HEADER_PX + Math.floor(i / columns) * PANEL_HEIGHT_PX, spec.colour));
  });
  return svgClose(out);
}
