// The episode list of a dataset: one page of rows at a time from dataset.episodes, sortable by
// any column, filterable by split and by text, so a dataset of a million episodes lists as fast
// as one of ten. Rows show the split, the status (written, or rejected as unstable) and the
// sampled parameters.
import type { DatasetSplit, EpisodePage, EpisodeQuery, EpisodeRow } from '../../sim/bridge/bridge-contract.ts';
import { button, h, labelled, select } from '../ui/element.ts';
import { unitFromKey } from '../sweep/unit-from-key.ts';

export const EPISODE_PAGE_SIZE = 50;

export interface EpisodeTableEvents {
  fetch(query: EpisodeQuery): Promise<EpisodePage>;
  play(row: EpisodeRow): void;
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
    this.root = h('div', { className: 'episode-list' }, h('div', { className: 'toolbar' }, labelled('Split', this.split), labelled('Filter', this.filterText), this.prev, this.pageLabel, this.next), h('div', { className: 'table-scroll' }, this.table));
  }

  /** Shows a new dataset's episodes with these label columns; `splits` fill the split filter. */
  open(labelKeys: string[], splits: string[]): void {
    this.columns = labelKeys.filter((k) => k !== 'status');
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
    if (filter.split || filter.text) query.filter = filter;
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
      const unit = unitOfColumn(column);
      const caption = `${column}${unit ? `, ${unit}` : ''}${arrow}`;
      head.append(h('th', { attrs: { scope: 'col' } }, button(caption, () => this.sortBy(key), { className: 'sort-button', attrs: { 'data-sort': key } })));
    }
    head.append(h('th', { attrs: { scope: 'col' }, text: '' }));
    const rows = page.rows.map((row) => {
      const status = row.labels.status;
      const tr = h('tr', { attrs: { 'data-episode': row.episodeId } }, h('td', { text: row.episodeId }), h('td', {}, h('span', { className: `split-badge split-${row.split}`, text: row.split })), h('td', { className: `status-${String(status ?? 'unknown')}`, text: status === undefined ? '—' : String(status) }));
      for (const column of this.columns) tr.append(h('td', { className: 'num', text: formatCell(row.labels[column]) }));
      // A rejected episode (it became unstable) has no arrays to play.
      const play = button('Play', () => this.events.play(row), { className: 'play-row', attrs: { 'data-role': 'play-episode' } });
      play.disabled = status === 'rejected';
      tr.append(h('td', {}, play));
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

/** The unit a label column's key names ("/system/lengthM" or "system.lengthM" → "m"). */
function unitOfColumn(column: string): string | null {
  const words = column.split(/[/.:]/).filter((w) => w !== '' && !/^[0-9]+$/.test(w));
  return words.length > 0 ? unitFromKey(words[words.length - 1]) : null;
}

function formatCell(value: number | string | boolean | undefined): string {
  if (value === undefined) return '';
  if (typeof value === 'number') return Number.isInteger(value) ? String(value) : String(Number(value.toPrecision(5)));
  return String(value);
}
