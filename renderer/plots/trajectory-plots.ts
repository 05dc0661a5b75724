// The three charts beside a 3-D view — a chosen node's coordinates, the energies, the control
// signals — kept in step with the trajectory as frames arrive and with the frame on show.
import type { TrajectoryFrames } from '../playback/trajectory-frames.ts';
import { h, labelled } from '../ui/element.ts';
import type { PlotSeries } from './time-series-plot.ts';
import { TimeSeriesPlot } from './time-series-plot.ts';
import { TrajectorySeries } from './trajectory-series.ts';

const AXIS_COLOURS = ['#b5462b', '#2f7f8c', '#6b4fa0'];
const ENERGY_SERIES: PlotSeries[] = [
  { label: 'kinetic', colour: '#b5462b' },
  { label: 'elastic', colour: '#2f7f8c' },
  { label: 'gravitational', colour: '#8c7a2f' },
  { label: 'bending', colour: '#6b4fa0' },
  { label: 'total', colour: '#222222' },
];
const CHANNEL_COLOURS = ['#2f7f8c', '#b5462b', '#6b4fa0', '#8c7a2f', '#3f6f3a', '#a0527a'];
/** More channels than this share no chart: each gets a small chart of its own. */
export const MAX_CHANNELS_IN_ONE_CHART = 4;
/** Height of one small chart, px. */
const SMALL_CHART_HEIGHT_PX = 90;
/** Redraw the charts at most this often while frames stream in, ms. */
const REDRAW_INTERVAL_MS = 250;

export interface ChannelInfo {
  name: string;
  unit: string;
}

export class TrajectoryPlots {
  readonly root: HTMLElement;
  private readonly nodeInput: HTMLInputElement;
  private readonly coordinates = new TimeSeriesPlot('Node position', 'm', AXIS_COLOURS.map((colour, i) => ({ label: 'xyz'[i], colour })));
  private readonly energies = new TimeSeriesPlot('Energy', 'J', ENERGY_SERIES);
  private controls = new TimeSeriesPlot('Controls', '', []);
  /** One small chart per channel, when there are too many channels for one chart to read. */
  private smallCharts: TimeSeriesPlot[] = [];
  private readonly controlsHost = h('div', { className: 'plot-host' });
  private series: TrajectorySeries | null = null;
  private channels: ChannelInfo[] = [];
  private lastRedrawMs = 0;
  private redrawTimer: ReturnType<typeof setTimeout> | null = null;

  constructor() {
    this.nodeInput = h('input', { attrs: { type: 'number', min: '0', step: '1', value: '0', 'data-role': 'plot-node', 'aria-label': 'Node to plot' } });
    this.nodeInput.addEventListener('change', () => {
      if (!this.series) return;
      this.series.selectNode(Number(this.nodeInput.value));
      this.nodeInput.value = String(this.series.selectedNode);
      this.redraw();
    });
    this.controlsHost.append(this.controls.root);
    this.root = h('div', { className: 'plots', attrs: { 'data-role': 'plots' } }, labelled('Plot node', this.nodeInput, `index, 0 to …`), this.coordinates.root, this.energies.root, this.controlsHost);
  }

  /** Starts plotting a new trajectory; the default node is the last one (a chain's free tip). */
  load(frames: TrajectoryFrames, channels: ChannelInfo[]): void {
    this.series = new TrajectorySeries(frames, frames.nodeCount - 1);
    this.channels = channels;
    this.nodeInput.max = String(frames.nodeCount - 1);
    this.nodeInput.value = String(frames.nodeCount - 1);
    const unitLabel = this.root.querySelector('.field-inline .unit');
    if (unitLabel) unitLabel.textContent = `index, 0 to ${frames.nodeCount - 1}`;
    const units = [...new Set(channels.map((c) => c.unit))];
    const unit = units.length === 1 ? units[0] : units.join(' or ');
    this.controls.dispose();
    for (const chart of this.smallCharts) chart.dispose();
    this.smallCharts = [];
    this.controls = new TimeSeriesPlot('Controls', unit || '1', channels.map((c, i) => ({ label: c.name, colour: CHANNEL_COLOURS[i % CHANNEL_COLOURS.length] })));
    if (channels.length === 0) {
      this.controlsHost.replaceChildren(h('figure', { className: 'plot' }, h('figcaption', { text: 'Controls' }), h('p', { className: 'field-help', text: 'This system has no control channels: nothing drives it but the world around it.' })));
    } else if (channels.length <= MAX_CHANNELS_IN_ONE_CHART) {
      this.controlsHost.replaceChildren(this.controls.root);
    } else {
      this.smallCharts = channels.map((c) => new TimeSeriesPlot(c.name, c.unit || '1', [{ label: c.name, colour: CHANNEL_COLOURS[0] }], 't, s', false, { heightPx: SMALL_CHART_HEIGHT_PX, minWidthPx: 160 }));
      const unitWords = units.map((u) => (u === '1' || u === '' ? 'dimensionless' : u)).join(' or ');
      this.controlsHost.replaceChildren(
        h(
          'section',
          { className: 'plot control-multiples', attrs: { 'data-role': 'control-multiples', 'aria-label': 'Control signals, one chart per channel' } },
          h('h4', { className: 'plot-group-title', text: `Controls: ${channels.length} channels, one chart each (${unitWords})` }),
          h('div', { className: 'small-multiples' }, ...this.smallCharts.map((chart) => chart.root)),
        ),
      );
    }
    this.framesArrived(true);
  }

  /** Extends the curves; redraws now when `force`, else at most every REDRAW_INTERVAL_MS. */
  framesArrived(force = false): void {
    if (!this.series) return;
    this.series.extend();
    const now = performance.now();
    if (force || now - this.lastRedrawMs >= REDRAW_INTERVAL_MS) {
      this.redraw();
    } else if (this.redrawTimer === null) {
      this.redrawTimer = setTimeout(() => {
        this.redrawTimer = null;
        this.redraw();
      }, REDRAW_INTERVAL_MS);
    }
  }

  mark(timeS: number): void {
    this.coordinates.mark(timeS);
    this.energies.mark(timeS);
    this.controls.mark(timeS);
    for (const chart of this.smallCharts) chart.mark(timeS);
  }

  private redraw(): void {
    const s = this.series;
    if (!s) return;
    this.lastRedrawMs = performance.now();
    const n = s.filled;
    const t = s.frames.timeS.subarray(0, n);
    this.coordinates.setData(t, [s.xM.subarray(0, n), s.yM.subarray(0, n), s.zM.subarray(0, n)]);
    this.energies.setData(t, [s.kineticJ.subarray(0, n), s.elasticJ.subarray(0, n), s.gravitationalJ.subarray(0, n), s.bendingJ.subarray(0, n), s.totalJ.subarray(0, n)]);
    if (this.smallCharts.length > 0) this.smallCharts.forEach((chart, c) => chart.setData(t, [s.controls[c].subarray(0, n)]));
    else if (this.channels.length > 0) this.controls.setData(t, s.controls.map((c) => c.subarray(0, n)));
  }
}
