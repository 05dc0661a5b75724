// A small uPlot chart of quantities over episode time, sharing one unit, with a vertical line at
// the frame the 3-D view shows. Data is handed in as views on the trajectory's own arrays, so
// new frames cost a redraw and no copies.
import uPlot from 'uplot';
import { h } from '../ui/element.ts';

export interface PlotSeries {
  label: string;
  colour: string;
}

const MARKER_COLOUR = '#8a3b12';

export class TimeSeriesPlot {
  readonly root: HTMLElement;
  private plot: uPlot | null = null;
  private markerTimeS = Number.NaN;
  private readonly chartHost: HTMLElement;

  constructor(
    readonly title: string,
    /** Unit of every series, shown on the y axis ("m", "J", "N", "1"). */
    readonly unit: string,
    private series: PlotSeries[],
  ) {
    this.chartHost = h('div', { className: 'plot-chart' });
    this.root = h('figure', { className: 'plot', attrs: { 'data-plot': title } }, h('figcaption', { text: `${title}, ${unit}` }), this.chartHost);
  }

  /** Replaces the data: x in s, one array per series; all of equal length. */
  setData(timeS: ArrayLike<number>, values: ArrayLike<number>[], series?: PlotSeries[]): void {
    if (series && !sameSeries(series, this.series)) {
      this.series = series;
      this.destroyChart();
    }
    const data = [timeS, ...values] as unknown as uPlot.AlignedData;
    if (!this.plot) {
      this.plot = new uPlot(this.options(), data, this.chartHost);
      return;
    }
    this.plot.setData(data);
  }

  /** Moves the marker to time t (s) of the shown frame. */
  mark(timeS: number): void {
    if (timeS === this.markerTimeS) return;
    this.markerTimeS = timeS;
    this.plot?.redraw(false, false);
  }

  resize(): void {
    if (!this.plot) return;
    this.plot.setSize({ width: this.width(), height: 150 });
  }

  dispose(): void {
    this.destroyChart();
  }

  private destroyChart(): void {
    this.plot?.destroy();
    this.plot = null;
    this.chartHost.replaceChildren();
  }

  private width(): number {
    return Math.max(240, this.chartHost.clientWidth || 320);
  }

  private options(): uPlot.Options {
    const unit = this.unit;
    return {
      width: this.width(),
      height: 150,
      legend: { show: true, live: false },
      cursor: { drag: { x: false, y: false } },
      scales: { x: { time: false } },
      axes: [
        { label: 't, s', size: 36, labelSize: 14 },
        { label: unit, size: 56, labelSize: 14 },
      ],
      series: [{ label: 't, s' }, ...this.series.map((s) => ({ label: `${s.label}, ${unit}`, stroke: s.colour, width: 1.5, points: { show: false } }))],
      hooks: { draw: [(u: uPlot) => this.drawMarker(u)] },
    };
  }

  private drawMarker(u: uPlot): void {
    if (!Number.isFinite(this.markerTimeS)) return;
    const x = u.valToPos(this.markerTimeS, 'x', true);
    const ctx = u.ctx;
    ctx.save();
    ctx.strokeStyle = MARKER_COLOUR;
    ctx.lineWidth = 1.5 * (window.devicePixelRatio || 1);
    ctx.beginPath();
    ctx.moveTo(x, u.bbox.top);
    ctx.lineTo(x, u.bbox.top + u.bbox.height);
    ctx.stroke();
    ctx.restore();
  }
}

function sameSeries(a: PlotSeries[], b: PlotSeries[]): boolean {
  return a.length === b.length && a.every((s, i) => s.label === b[i].label && s.colour === b[i].colour);
}
