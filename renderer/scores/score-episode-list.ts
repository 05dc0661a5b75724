// The scored episodes of a score report, worst first (largest mean normalised error), with the
// split, the one-step error and the valid prediction time, and a Play button that shows the
// prediction over the recording in the 3-D view. Long lists show the worst rows only, and say so.
import type { ScoreDocumentView, ScoreEpisodeRow } from '../../sim/bridge/bridge-contract.ts';
import { button, h, labelled, select } from '../ui/element.ts';
import { shortNumber } from './score-tables.ts';

const SHOWN_ROWS = 200;

export class ScoreEpisodeList {
  readonly root: HTMLElement;
  private readonly splitFilter: HTMLSelectElement;
  private readonly body: HTMLElement;
  private readonly note: HTMLElement;
  private rows: ScoreEpisodeRow[] = [];

  constructor(private readonly play: (row: ScoreEpisodeRow) => void) {
    this.splitFilter = select([['', 'every scored split']], '', { 'data-role': 'score-episode-split' });
    this.splitFilter.addEventListener('change', () => this.render());
    this.body = h('tbody');
    this.note = h('p', { className: 'score-note', attrs: { 'data-role': 'score-episode-note' } });
    this.root = h(
      'section',
      { className: 'score-episodes' },
      h('h3', { text: 'Episodes, worst first' }),
      labelled('Split', this.splitFilter),
      h(
        'table',
        { className: 'score-table', attrs: { 'data-role': 'score-episodes' } },
        h('thead', {}, h('tr', {}, ...['episode', 'split', 'mean normalised error (–)', 'one-step RMSE, m', 'valid prediction time, s', ''].map((t) => h('th', { text: t, attrs: { scope: 'col' } })))),
        this.body,
      ),
      this.note,
    );
  }

  show(score: ScoreDocumentView): void {
    this.rows = [...score.episodes].sort((a, b) => b.meanNormalisedError - a.meanNormalisedError || (a.id < b.id ? -1 : 1));
    this.splitFilter.replaceChildren(h('option', { text: 'every scored split', attrs: { value: '' } }), ...Object.keys(score.splits).map((split) => h('option', { text: split, attrs: { value: split } })));
    this.render();
  }

  private render(): void {
    const split = this.splitFilter.value;
    const matching = split === '' ? this.rows : this.rows.filter((r) => r.split === split);
    const shown = matching.slice(0, SHOWN_ROWS);
    this.body.replaceChildren(
      ...shown.map((row) =>
        h(
          'tr',
          { attrs: { 'data-episode': row.id } },
          h('th', { text: row.id, attrs: { scope: 'row' } }),
          h('td', { text: row.split }),
          h('td', { text: shortNumber(row.meanNormalisedError) }),
          h('td', { text: shortNumber(row.oneStepRmseM) }),
          h('td', { text: `${shortNumber(row.validPredictionTimeS)}${row.validPredictionTimeReached ? '' : ' (never passed)'}` }),
          h('td', {}, button('Play', () => this.play(row), { attrs: { 'data-role': 'score-play', 'aria-label': `Play episode ${row.id} with its prediction` } })),
        ),
      ),
    );
    this.note.textContent = matching.length > shown.length ? `Showing the ${shown.length} worst of ${matching.length} episodes; score.json lists every one.` : `${matching.length} episode${matching.length === 1 ? '' : 's'}.`;
  }
}
