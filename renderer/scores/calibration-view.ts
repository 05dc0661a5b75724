// A calibration report in the app: the fitted parameters with their standard errors (and the
// ones the measurement could not identify, said in words instead of a number), the residual
// over the measurement's time, and the report text `pliant calibrate` wrote.
import type { CalibrationReport } from '../../sim/bridge/bridge-contract.ts';
import { TimeSeriesPlot } from '../plots/time-series-plot.ts';
import { h } from '../ui/element.ts';
import { shortNumber } from './score-tables.ts';

export class CalibrationView {
  readonly root: HTMLElement;
  private readonly residualPlot = new TimeSeriesPlot('Residual RMS over the measurement', 'm', [{ label: 'residual RMS', colour: '#c8553d' }]);

  constructor() {
    this.root = h('section', { className: 'calibration-report', attrs: { 'data-role': 'calibration-report', hidden: '' } });
  }

  show(report: CalibrationReport): void {
    const rows = report.parameters.map((p) =>
      h(
        'tr',
        { attrs: { 'data-pointer': p.pointer, 'data-identifiable': String(p.identifiable) } },
        h('th', { text: p.pointer, attrs: { scope: 'row' } }),
        h('td', { text: p.identifiable ? shortNumber(p.value) : 'not identifiable' }),
        h('td', { text: p.identifiable ? `± ${shortNumber(p.standardError)}` : '–' }),
        h('td', { text: p.unit && p.unit !== '1' ? p.unit : '– (dimensionless)' }),
        h('td', { text: p.note }),
      ),
    );
    this.root.hidden = false;
    this.root.setAttribute('data-loaded', report.path);
    this.root.replaceChildren(
      h('h3', { text: `Calibration report — ${report.path}` }),
      h(
        'table',
        { className: 'score-table', attrs: { 'data-role': 'calibration-parameters' } },
        h('thead', {}, h('tr', {}, ...['parameter', 'fitted value', 'standard error', 'unit', 'note'].map((t) => h('th', { text: t, attrs: { scope: 'col' } })))),
        h('tbody', {}, ...rows),
      ),
      this.residualPlot.root,
      h('details', { className: 'dataset-card' }, h('summary', { text: 'Report text' }), h('pre', { className: 'card-text', text: report.reportMarkdown })),
    );
    this.residualPlot.setData(report.residualTimeS, [report.residualRmsM]);
  }
}
