// A deterministic SVG contact sheet of line drawings: rows of small panels, each drawing a set of
// straight segments (the springs of a body, projected onto a plane) at equal scale on both axes.
// The panels of one row share one scale, and panels of the same view in a row share their
// window, so a reader sees how far a body moved between them. Plain SVG 1.1, no scripts, fonts
// or external references; every coordinate goes through svgNumber. A panel's segments are one
// path of class "edges" ("M u v L u v" per segment), u to the right and v up in the plane.
import { escapeXml, svgClose, svgNumber, svgOpen } from './svg-text.ts';

export interface EdgePanel {
  title: string;
  /** Panels of a row with the same view share their window. */
  view: string;
  /** Segment s runs from (segments[4s], segments[4s+1]) to (segments[4s+2], segments[4s+3]), in metres. */
  segments: Float64Array;
  colour: string;
}

export interface EdgeSheetRow {
  label: string;
  panels: EdgePanel[];
}

export interface EdgeSheetSpec {
  title: string;
  note?: string;
  rows: EdgeSheetRow[];
}

const PANEL_PX = 200;
const PANEL_PAD_PX = 14;
const PANEL_TITLE_PX = 18;
const ROW_LABEL_PX = 20;
const HEADER_PX = 44;

interface Window {
  uMin: number;
  uMax: number;
  vMin: number;
  vMax: number;
}

function windowsOf(row: EdgeSheetRow): Map<string, Window> {
  const windows = new Map<string, Window>();
  for (const panel of row.panels) {
    let w = windows.get(panel.view);
    if (w === undefined) {
      w = { uMin: Infinity, uMax: -Infinity, vMin: Infinity, vMax: -Infinity };
      windows.set(panel.view, w);
    }
    const s = panel.segments;
    for (let i = 0; i + 1 < s.length; i += 2) {
      if (!Number.isFinite(s[i]) || !Number.isFinite(s[i + 1])) continue;
      w.uMin = Math.min(w.uMin, s[i]);
      w.uMax = Math.max(w.uMax, s[i]);
      w.vMin = Math.min(w.vMin, s[i + 1]);
      w.vMax = Math.max(w.vMax, s[i + 1]);
    }
  }
  return windows;
}

/** Pixels per metre of a row: the largest that fits every window of the row into a panel. */
function rowScale(windows: Map<string, Window>): number {
  const inner = PANEL_PX - 2 * PANEL_PAD_PX;
  let scale = Infinity;
  for (const w of windows.values()) {
    if (!(w.uMax >= w.uMin)) continue;
    const extent = Math.max(w.uMax - w.uMin, w.vMax - w.vMin);
    if (extent > 0) scale = Math.min(scale, inner / extent);
  }
  return Number.isFinite(scale) ? scale : 1;
}

/** The sheet as an SVG document. */
export function renderEdgeSheet(spec: EdgeSheetSpec): string {
  const columns = Math.max(1, ...spec.rows.map((r) => r.panels.length));
  const rowHeight = ROW_LABEL_PX + PANEL_TITLE_PX + PANEL_PX;
  const width = columns * PANEL_PX;
  const height = HEADER_PX + Math.max(1, spec.rows.length) * rowHeight;
  const out = svgOpen(width, height);
  out.push(`<text x="${svgNumber(width / 2)}" y="18" text-anchor="middle" font-size="13" font-weight="bold">${escapeXml(spec.title)}</text>`);
  if (spec.note) out.push(`<text x="${svgNumber(width / 2)}" y="34" text-anchor="middle" fill="#555555">${escapeXml(spec.note)}</text>`);
  spec.rows.forEach((row, r) => {
    const rowTop = HEADER_PX + r * rowHeight;
    const windows = windowsOf(row);
    const scale = rowScale(windows);
    out.push(`<g class="row">`);
    out.push(`<text class="row-label" x="6" y="${svgNumber(rowTop + 14)}" font-weight="bold">${escapeXml(`${row.label} (1 m = ${svgNumber(scale)} px)`)}</text>`);
    row.panels.forEach((panel, c) => {
      const left = c * PANEL_PX;
      const top = rowTop + ROW_LABEL_PX + PANEL_TITLE_PX;
      const w = windows.get(panel.view)!;
      const uCentre = (w.uMin + w.uMax) / 2;
      const vCentre = (w.vMin + w.vMax) / 2;
      const pu = (u: number) => left + PANEL_PX / 2 + (u - uCentre) * scale;
      const pv = (v: number) => top + PANEL_PX / 2 - (v - vCentre) * scale;
      out.push(`<g class="panel">`);
      out.push(`<text class="panel-title" x="${svgNumber(left + PANEL_PX / 2)}" y="${svgNumber(top - 5)}" text-anchor="middle">${escapeXml(panel.title)}</text>`);
      out.push(`<rect x="${svgNumber(left + 2)}" y="${svgNumber(top)}" width="${svgNumber(PANEL_PX - 4)}" height="${svgNumber(PANEL_PX - 4)}" fill="#fafafa" stroke="#cccccc"/>`);
      const s = panel.segments;
      let d = '';
      for (let i = 0; i + 3 < s.length; i += 4) {
        if (!Number.isFinite(s[i]) || !Number.isFinite(s[i + 1]) || !Number.isFinite(s[i + 2]) || !Number.isFinite(s[i + 3])) continue;
        d += `${d === '' ? '' : ' '}M${svgNumber(pu(s[i]))} ${svgNumber(pv(s[i + 1]))}L${svgNumber(pu(s[i + 2]))} ${svgNumber(pv(s[i + 3]))}`;
      }
      if (d !== '') out.push(`<path class="edges" d="${d}" fill="none" stroke="${panel.colour}" stroke-width="1.2" stroke-linecap="round"/>`);
      out.push('</g>');
    });
    out.push('</g>');
  });
  return svgClose(out);
}
