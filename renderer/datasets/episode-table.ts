// The episode list of a dataset: one page of rows at a time from dataset.episodes, sortable by
// any column, filterable by split, by text and by numeric ranges of any parameter, so a dataset of
// a million episodes lists as fast as one of ten. Rows show the split, the status (written, or
// rejected as unstable) and the sampled parameters; the id column and the actions (Play, Compare)
// stay in view however far the parameters scroll sideways.
import type { DatasetSplit, EpisodePage, EpisodeQuery, EpisodeRow } from '../../sim/bridge/bridge-contract.ts';
import { button, h, labelled, select } from '../ui/element.ts';
import { parameterLabel } from '../ui/parameter-label.ts';

export const EPISODE_PAGE_SIZE = 50;

export interface EpisodeTableEvents {
  fetch(query: EpisodeQuery): Promise<EpisodePage>;
  play(row: EpisodeRow): void;
  /** Plays the row beside the episode already playing. */
  compare(row: EpisodeRow): void;
  failed(error: unknown): void;
}

export class EpisodeTable {
  readonly root: HTMLElement;
  private readonly table: HTMLTableElement;
  private readonly pageLabel: HTMLElement;
  private readonly prev: HTMLButtonElement;
  private readonly next: HTMLButtonElement;
  private readonly split: HTMLSelectElement;
  private readonly filterText: HTMLInputElement;
  private readonly rangeKey: HTMLSelectElement;
  private readonly rangeMin: HTMLInputElement;
  private readonly rangeMax: HTMLInputElement;
  private readonly rangeList: HTMLElement;
  private readonly rangeProblem: HTMLElement;
  private ranges: { key: string; min?: number; max?: number }[] = [];
  private columns: string[] = [];
  private offset = 0;
  private total = 0;
  private sortKey: string | undefined;
  private descending = false;
  private filterTimer: ReturnType<typeof setTimeout> | null = null;
  private generation = 0;

  constructor(private readonly events: EpisodeTableEvents) {
    this.table = h('table', { className: 'episode-table', attrs: { 'data-role': 'episode-table' } });
    this.pageLabel = h('span', { className: 'page-label', attrs: { 'data-role': 'page-label' } });
    this.prev = button('◀ Previous', () => this.turn(-1), { attrs: { 'data-role': 'page-prev' } });
    this.next = button('Next ▶', () => this.turn(1), { attrs: { 'data-role': 'page-next' } });
    this.split = select([['', 'every split']], '', { 'data-role': 'filter-split' });
    this.split.addEventListener('change', () => this.reload());
    this.filterText = h('input', { attrs: { type: 'search', placeholder: 'episode id or label text', 'data-role': 'filter-text', 'aria-label': 'Filter episodes' } });
    this.filterText.addEventListener('input', () => {
      if (this.filterTimer !== null) clearTimeout(this.filterTimer);
      this.filterTimer = setTimeout(() => this.reload(), 300);
    });
    this.rangeKey = select([], '', { 'data-role': 'range-key' });
    this.rangeMin = h('input', { attrs: { type: 'number', step: 'any', 'data-role': 'range-min', class: 'number-input' } });
    this.rangeMax = h('input', { attrs: { type: 'number', step: 'any', 'data-role': 'range-max', class: 'number-input' } });
    this.rangeList = h('ul', { className: 'range-list', attrs: { 'data-role': 'range-list', 'aria-label': 'Ranges in force' } });
    this.rangeProblem = h('span', { className: 'field-problem', attrs: { 'data-role': 'range-problem', role: 'alert' } });
    const rangeRow = h(
      'div',
      { className: 'toolbar range-row' },
      labelled('Keep episodes whose', this.rangeKey),
      labelled('is from', this.rangeMin),
      labelled('to', this.rangeMax),
      button('Add range', () => this.addRange(), { attrs: { 'data-role': 'range-add' } }),
      this.rangeProblem,
      this.rangeList,
    );
    this.root = h('div', { className: 'episode-list' }, h('div', { className: 'toolbar' }, labelled('Split', this.split), labelled('Filter', this.filterText), this.prev, this.pageLabel, this.next), rangeRow, h('div', { className: 'table-scroll', attrs: { 'data-role': 'episode-scroll' } }, this.table));
  }

  /** Adds the range typed in the range row (an empty end is open) and lists the matching episodes. */
  private addRange(): void {
    const key = this.rangeKey.value;
    const min = this.rangeMin.value.trim() === '' ? undefined : Number(this.rangeMin.value);
    const max = this.rangeMax.value.trim() === '' ? undefined : Number(this.rangeMax.value);
    const label = parameterLabel(key);
    if (!key) return;
    if ((min !== undefined && !Number.isFinite(min)) || (max !== undefined && !Number.isFinite(max))) {
      this.rangeProblem.textContent = `Type numbers for the range of ${label.name}, or leave an end empty.`;
      return;
    }
    if (min === undefined && max === undefined) {
      this.rangeProblem.textContent = `Type a lowest or a highest ${label.name} (or both).`;
      return;
    }
    if (min !== undefined && max !== undefined && min > max) {
      this.rangeProblem.textContent = `The range of ${label.name} runs from ${min} to ${max}: the first must not be larger. Swap them.`;
      return;
    }
    this.rangeProblem.textContent = '';
    this.ranges = [...this.ranges.filter((r) => r.key !== key), { key, ...(min !== undefined ? { min } : {}), ...(max !== undefined ? { max } : {}) }];
    this.rangeMin.value = '';
    this.rangeMax.value = '';
    this.renderRanges();
    this.reload();
  }

  private renderRanges(): void {
    this.rangeList.replaceChildren(
      ...this.ranges.map((r) => {
        const label = parameterLabel(r.key);
        const unit = label.unit === '–' ? '' : ` ${label.unit}`;
        const text = `${label.name} ${r.min !== undefined ? `≥ ${r.min}${unit}` : ''}${r.min !== undefined && r.max !== undefined ? ' and ' : ''}${r.max !== undefined ? `≤ ${r.max}${unit}` : ''}`;
        return h('li', { attrs: { 'data-key': r.key } }, h('span', { text }), button('✕', () => this.removeRange(r.key), { className: 'range-remove', attrs: { 'aria-label': `Remove the range of ${label.name}`, 'data-role': 'range-remove' } }));
      }),
    );
  }

  private removeRange(key: string): void {
    this.ranges = this.ranges.filter((r) => r.key !== key);
    this.renderRanges();
    this.reload();
  }

  /** Shows a new dataset's episodes with these label columns; `splits` fill the split filter. */
  open(labelKeys: string[], splits: string[]): void {
    this.columns = labelKeys.filter((k) => k !== 'status');
    this.rangeKey.replaceChildren(...this.columns.map((key) => h('option', { text: columnCaption(key), attrs: { value: key } })));
    this.ranges = [];
    this.renderRanges();
    this.rangeProblem.textContent = '';
    this.split.replaceChildren(...[['', 'every split'], ...splits.map((s) => [s, s])].map(([value, label]) => h('option', { text: label, attrs: { value } })));
    this.sortKey = undefined;
    this.descending = false;
    this.split.value = '';
    this.filterText.value = '';
    this.reload();
  }

  reload(): void {
    this.offset = 0;
    void this.load();
  }

  private turn(direction: number): void {
    const next = this.offset + direction * EPISODE_PAGE_SIZE;
    if (next < 0 || next >= this.total) return;
    this.offset = next;
    void this.load();
  }

  private async load(): Promise<void> {
    const generation = ++this.generation;
    const query: EpisodeQuery = { offset: this.offset, limit: EPISODE_PAGE_SIZE };
    if (this.sortKey) {
      query.sortKey = this.sortKey;
      query.descending = this.descending;
    }
    const filter: EpisodeQuery['filter'] = {};
    if (this.split.value) filter.split = this.split.value as DatasetSplit;
    if (this.filterText.value.trim()) filter.text = this.filterText.value.trim();
    if (this.ranges.length > 0) filter.ranges = this.ranges.map((r) => ({ ...r }));
    if (filter.split || filter.text || filter.ranges) query.filter = filter;
    let page: EpisodePage;
    try {
      page = await this.events.fetch(query);
    } catch (error) {
      this.events.failed(error);
      return;
    }
    if (generation !== this.generation) return;
    this.total = page.total;
    this.render(page);
  }

  private render(page: EpisodePage): void {
    const head = h('tr', {});
    for (const column of ['episode', 'split', 'status', ...this.columns]) {
      const key = column === 'episode' ? 'episodeId' : column;
      const arrow = this.sortKey === key ? (this.descending ? ' ▼' : ' ▲') : '';
      const caption = `${column === 'episode' || column === 'split' || column === 'status' ? column : columnCaption(column)}${arrow}`;
      const sortState = this.sortKey === key ? (this.descending ? 'descending' : 'ascending') : 'none';
      head.append(h('th', { className: column === 'episode' ? 'sticky-start' : '', attrs: { scope: 'col', 'aria-sort': sortState, ...(column.startsWith('/') ? { title: column } : {}) } }, button(caption, () => this.sortBy(key), { className: 'sort-button', attrs: { 'data-sort': key } })));
    }
    head.append(h('th', { className: 'sticky-end', attrs: { scope: 'col' }, text: 'actions' }));
    const rows = page.rows.map((row) => {
      const status = row.labels.status;
      const tr = h('tr', { attrs: { 'data-episode': row.episodeId } }, h('th', { className: 'sticky-start', attrs: { scope: 'row' }, text: row.episodeId }), h('td', {}, h('span', { className: `split-badge split-${row.split}`, text: row.split })), h('td', { className: `status-${String(status ?? 'unknown')}`, text: status === undefined ? '—' : String(status) }));
      for (const column of this.columns) tr.append(h('td', { className: 'num', text: formatCell(row.labels[column]) }));
      // A rejected episode (it became unstable) has no arrays to play.
      const play = button('Play', () => this.events.play(row), { className: 'play-row', attrs: { 'data-role': 'play-episode', 'aria-label': `Play episode ${row.episodeId}` } });
      const compare = button('Compare', () => this.events.compare(row), { className: 'compare-row', attrs: { 'data-role': 'compare-episode', 'aria-label': `Play episode ${row.episodeId} beside the one playing` } });
      play.disabled = status === 'rejected';
      compare.disabled = status === 'rejected';
      tr.append(h('td', { className: 'sticky-end actions' }, play, compare));
      return tr;
    });
    this.table.replaceChildren(h('thead', {}, head), h('tbody', {}, ...rows));
    const first = page.total === 0 ? 0 : page.offset + 1;
    const last = page.offset + page.rows.length;
    this.pageLabel.textContent = `episodes ${first}–${last} of ${page.total.toLocaleString('en')}`;
    this.prev.disabled = page.offset === 0;
    this.next.disabled = last >= page.total;
  }

  private sortBy(key: string): void {
    if (this.sortKey === key) this.descending = !this.descending;
    else {
      this.sortKey = key;
      this.descending = false;
    }
    this.reload();
  }
}

/** A label column's heading: the parameter in words with its unit ("length, m"; "damping ratio, –"). */
function columnCaption(column: string): string {
  const label = parameterLabel(column);
  return `${label.name}, ${label.unit}`;
}

function formatCell(value: number | string | boolean | undefined): string {
  if (value === undefined) return '';
  if (typeof value === 'number') return Number.isInteger(value) ? String(value) : String(Number(value.toPrecision(5)));
  return String(value);
}
