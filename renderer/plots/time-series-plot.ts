// A small uPlot chart of quantities over episode time, sharing one unit, with a vertical line at
// the frame the 3-D view shows. Data is handed in as views on the trajectory's own arrays, so
// new frames cost a redraw and no copies. The line is an element moved over the chart rather
// than drawn into it, so following playback costs no chart redraw per frame.
import uPlot from 'uplot';
import { h } from '../ui/element.ts';

export interface PlotSeries {
  label: string;
  colour: string;
}

export class TimeSeriesPlot {
  readonly root: HTMLElement;
  private plot: uPlot | null = null;
  private markerTimeS = Number.NaN;
  private readonly chartHost: HTMLElement;
  private readonly marker: HTMLElement;

  constructor(
    readonly title: string,
    /** Unit of every series, shown on the y axis ("m", "J", "N", "1"). */
    readonly unit: string,
    private series: PlotSeries[],
    /** What x is; episode time by default, a prediction horizon or a parameter elsewhere. */
    private readonly xLabel = 't, s',
    /** Draw each value as a point too (binned values, where a line alone would hide lone bins). */
    private readonly showPoints = false,
  ) {
    this.chartHost = h('div', { className: 'plot-chart' });
    this.marker = h('div', { className: 'plot-marker', attrs: { 'aria-hidden': 'true' } });
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
      this.plot.over.append(this.marker);
    } else {
      this.plot.setData(data);
    }
    this.placeMarker();
  }

  /** Moves the marker to time t (s) of the shown frame. */
  mark(timeS: number): void {
    if (timeS === this.markerTimeS) return;
    this.markerTimeS = timeS;
    this.placeMarker();
  }

  private placeMarker(): void {
    if (!this.plot || !Number.isFinite(this.markerTimeS)) {
      this.marker.hidden = true;
      return;
    }
    const x = this.plot.valToPos(this.markerTimeS, 'x');
    this.marker.hidden = !(x >= 0);
    this.marker.style.transform = `translateX(${x.toFixed(1)}px)`;
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
        { label: this.xLabel, size: 36, labelSize: 14 },
        { label: unit, size: 56, labelSize: 14 },
      ],
      series: [{ label: this.xLabel }, ...this.series.map((s) => ({ label: `${s.label}, ${unit}`, stroke: s.colour, width: 1.5, spanGaps: this.showPoints, points: { show: this.showPoints, size: 6 } }))],
    };
  }
}

function sameSeries(a: PlotSeries[], b: PlotSeries[]): boolean {
  return a.length === b.length && a.every((s, i) => s.label === b[i].label && s.colour === b[i].colour);
}
