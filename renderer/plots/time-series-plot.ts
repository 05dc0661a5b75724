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

export interface PlotLayout {
  /** Chart height, px (150 by default; small multiples use less). */
  heightPx?: number;
  /** Narrowest the chart is drawn, px, however little room its box has. */
  minWidthPx?: number;
}

/** How a unit reads on a chart: the SI "1" of a dimensionless quantity reads "–". */
export function shownUnit(unit: string): string {
  return unit === '1' || unit === '' ? '–' : unit;
}

export class TimeSeriesPlot {
  readonly root: HTMLElement;
  private readonly resizeObserver: ResizeObserver;
  private readonly heightPx: number;
  private readonly minWidthPx: number;
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
    layout: PlotLayout = {},
  ) {
    this.heightPx = layout.heightPx ?? 150;
    this.minWidthPx = layout.minWidthPx ?? 240;
    this.chartHost = h('div', { className: 'plot-chart' });
    this.marker = h('div', { className: 'plot-marker', attrs: { 'aria-hidden': 'true' } });
    const caption = shownUnit(unit) === '–' ? `${title} (dimensionless)` : `${title}, ${unit}`;
    this.root = h('figure', { className: 'plot', attrs: { 'data-plot': title } }, h('figcaption', { text: caption }), this.chartHost);
    // The chart follows its box, so a narrower window never pushes it past the page's edge.
    let lastWidth = 0;
    this.resizeObserver = new ResizeObserver(() => {
      const width = this.width();
      if (this.plot && width !== lastWidth) {
        lastWidth = width;
        this.resize();
      }
    });
    this.resizeObserver.observe(this.chartHost);
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
    this.plot.setSize({ width: this.width(), height: this.heightPx });
  }

  dispose(): void {
    this.resizeObserver.disconnect();
    this.destroyChart();
  }

  private destroyChart(): void {
    this.plot?.destroy();
    this.plot = null;
    this.chartHost.replaceChildren();
  }

  private width(): number {
    return Math.max(this.minWidthPx, this.chartHost.clientWidth || 320);
  }

  private options(): uPlot.Options {
    const unit = shownUnit(this.unit);
    return {
      width: this.width(),
      height: this.heightPx,
      legend: { show: true, live: false },
      cursor: { drag: { x: false, y: false } },
      scales: { x: { time: false } },
      axes: [
        { label: this.xLabel, size: 36, labelSize: 14 },
        { label: unit, size: 56, labelSize: 14 },
      ],
      series: [{ label: this.xLabel }, ...this.series.map((s) => ({ label: unit === '–' ? s.label : `${s.label}, ${unit}`, stroke: s.colour, width: 1.5, spanGaps: this.showPoints, points: { show: this.showPoints, size: 6 } }))],
    };
  }
}

function sameSeries(a: PlotSeries[], b: PlotSeries[]): boolean {
  return a.length === b.length && a.every((s, i) => s.label === b[i].label && s.colour === b[i].colour);
}
