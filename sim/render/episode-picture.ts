// Draws recorded episode frames as wireframes: springs as lines, nodes as dots (pinned and
// driven nodes in their own colour), seen from the side (x right, y up) and/or from above (x
// right, z toward the bottom of the picture), with a bar along the bottom that shows how far
// the episode has played. One scale and one framing hold for every frame of the episode, fitted
// to the whole trajectory, so motion in the pictures is motion of the body and never of the
// camera. Orthographic projection; nothing here depends on a screen or a GPU.
import { IndexedFrame } from './indexed-frame.ts';

export type PictureView = 'side' | 'above' | 'both';

/** Palette indices; the colours are ours (light background, blue-grey springs, dark nodes, red fixed nodes). */
export const PICTURE_PALETTE: number[][] = [
  [255, 255, 255], // 0 background
  [226, 230, 234], // 1 panel frame and grid
  [92, 124, 160], // 2 springs
  [28, 36, 48], // 3 nodes
  [200, 62, 48], // 4 pinned or driven nodes
  [150, 160, 170], // 5 progress bar track
  [31, 95, 139], // 6 progress bar
];
const BACKGROUND = 0;
const FRAME = 1;
const SPRING = 2;
const NODE = 3;
const FIXED_NODE = 4;
const BAR_TRACK = 5;
const BAR = 6;
const BAR_HEIGHT_PX = 4;
const MARGIN_FRACTION = 0.06;

export interface EpisodeGeometry {
  nodeCount: number;
  /** (frames, nodeCount, 3), m, row-major as in the episode files. */
  positionsM: Float32Array | Float64Array;
  frameCount: number;
  /** (springs, 2) node indices. */
  edges: Int32Array;
  /** 1 for pinned or driven nodes. */
  fixedNode: Uint8Array;
}

interface PanelMapping {
  originPx: number;
  /** Horizontal and vertical world axes of the panel (0 x, 1 y, 2 z) and their signs on the picture. */
  uAxis: number;
  vAxis: number;
  vSign: number;
}

export class EpisodePicture {
  private readonly panels: PanelMapping[];
  private readonly panelWidthPx: number;
  private readonly scalePxPerM: number;
  private readonly centreM = new Float64Array(3);
  private readonly panelHeightPx: number;

  constructor(private readonly geometry: EpisodeGeometry, readonly widthPx: number, readonly heightPx: number, view: PictureView) {
    const count = view === 'both' ? 2 : 1;
    this.panelWidthPx = Math.floor(widthPx / count);
    this.panelHeightPx = heightPx - BAR_HEIGHT_PX - 2;
    const side: PanelMapping = { originPx: 0, uAxis: 0, vAxis: 1, vSign: -1 };
    const above: PanelMapping = { originPx: 0, uAxis: 0, vAxis: 2, vSign: 1 };
    this.panels = view === 'side' ? [side] : view === 'above' ? [above] : [side, { ...above, originPx: this.panelWidthPx }];

    const low = [Infinity, Infinity, Infinity];
    const high = [-Infinity, -Infinity, -Infinity];
    const p = geometry.positionsM;
    for (let i = 0; i < geometry.frameCount * geometry.nodeCount; i++) {
      for (let k = 0; k < 3; k++) {
        const v = p[3 * i + k];
        if (!Number.isFinite(v)) continue;
        if (v < low[k]) low[k] = v;
        if (v > high[k]) high[k] = v;
      }
    }
    let scale = Infinity;
    for (const panel of this.panels) {
      const uSpan = Math.max(high[panel.uAxis] - low[panel.uAxis], 1e-9);
      const vSpan = Math.max(high[panel.vAxis] - low[panel.vAxis], 1e-9);
      scale = Math.min(scale, (this.panelWidthPx * (1 - 2 * MARGIN_FRACTION)) / uSpan, (this.panelHeightPx * (1 - 2 * MARGIN_FRACTION)) / vSpan);
    }
    this.scalePxPerM = Number.isFinite(scale) ? scale : 1;
    for (let k = 0; k < 3; k++) this.centreM[k] = Number.isFinite(low[k]) ? (low[k] + high[k]) / 2 : 0;
  }

  /** Frame `frame` of the episode as a picture. */
  draw(frame: number): IndexedFrame {
    const g = this.geometry;
    const out = new IndexedFrame(this.widthPx, this.heightPx, BACKGROUND);
    const base = frame * g.nodeCount * 3;
    const p = g.positionsM;
    const nodeRadiusPx = Math.max(1, Math.min(3, Math.round(this.panelWidthPx / 160)));
    for (const panel of this.panels) {
      const uCentrePx = panel.originPx + this.panelWidthPx / 2;
      const vCentrePx = this.panelHeightPx / 2;
      const u = (node: number) => uCentrePx + (p[base + 3 * node + panel.uAxis] - this.centreM[panel.uAxis]) * this.scalePxPerM;
      const v = (node: number) => vCentrePx + panel.vSign * (p[base + 3 * node + panel.vAxis] - this.centreM[panel.vAxis]) * this.scalePxPerM;
      out.line(panel.originPx, 0, panel.originPx + this.panelWidthPx - 1, 0, FRAME);
      out.line(panel.originPx, this.panelHeightPx - 1, panel.originPx + this.panelWidthPx - 1, this.panelHeightPx - 1, FRAME);
      out.line(panel.originPx, 0, panel.originPx, this.panelHeightPx - 1, FRAME);
      out.line(panel.originPx + this.panelWidthPx - 1, 0, panel.originPx + this.panelWidthPx - 1, this.panelHeightPx - 1, FRAME);
      for (let e = 0; e < g.edges.length / 2; e++) {
        const a = g.edges[2 * e];
        const b = g.edges[2 * e + 1];
        const ua = u(a);
        const va = v(a);
        const ub = u(b);
        const vb = v(b);
        if (Number.isFinite(ua + va + ub + vb)) out.line(ua, va, ub, vb, SPRING);
      }
      for (let n = 0; n < g.nodeCount; n++) {
        const un = u(n);
        const vn = v(n);
        if (Number.isFinite(un + vn)) out.disc(un, vn, nodeRadiusPx, g.fixedNode[n] ? FIXED_NODE : NODE);
      }
    }
    const barTop = this.heightPx - BAR_HEIGHT_PX;
    out.fillRect(0, barTop, this.widthPx, BAR_HEIGHT_PX, BAR_TRACK);
    const played = g.frameCount > 1 ? frame / (g.frameCount - 1) : 1;
    out.fillRect(0, barTop, Math.round(played * this.widthPx), BAR_HEIGHT_PX, BAR);
    return out;
  }
}
