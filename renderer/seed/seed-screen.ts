// The Seed file screen: open a dataset's seed.json (the recipe that regenerates it bit for bit),
// preview any of its episodes, and regenerate it into a new folder, comparing it file by file with
// the original folder.
import type { DatasetComparison, FileComparisonResult, JobProgress, SeedSummary } from '../../sim/bridge/bridge-contract.ts';
import type { PliantBridge } from '../bridge/pliant-bridge.ts';
import { JobProgressView } from '../export/job-progress-view.ts';
import { button, h, labelled } from '../ui/element.ts';
import { insideFolder, newFolderNameProblem } from '../ui/new-folder-name.ts';
import type { Screen } from '../ui/screen.ts';
import { StatusLine } from '../ui/status-line.ts';

export interface SeedScreenEvents {
  /** Show episode `index` of the seed file's scenario on the Preview screen. */
  preview(text: string, fileName: string, source: string, index: number): void;
}

export class SeedScreen implements Screen {
  readonly id = 'seed';
  readonly title = 'Seed file';
  readonly root: HTMLElement;
  private readonly status = new StatusLine('seed-status');
  private readonly summaryHost: HTMLElement;
  private readonly indexInput: HTMLInputElement;
  private readonly outFolder: HTMLElement;
  private readonly outName: HTMLInputElement;
  private readonly regenerate: HTMLButtonElement;
  private readonly job: JobProgressView;
  private readonly files: HTMLElement;
  private seed: SeedSummary | null = null;
  private parentFolder: string | null = null;
  private outDir: string | null = null;

  constructor(private readonly bridge: PliantBridge, private readonly events: SeedScreenEvents) {
    this.summaryHost = h('dl', { className: 'facts', attrs: { 'data-role': 'seed-summary' } });
    this.indexInput = h('input', { attrs: { type: 'number', min: '0', step: '1', value: '0', 'data-role': 'seed-index', 'aria-label': 'Episode index' } });
    this.outFolder = h('span', { className: 'folder-line', text: 'no folder chosen', attrs: { 'data-role': 'seed-out-folder' } });
    this.outName = h('input', { attrs: { type: 'text', value: 'regenerated', spellcheck: 'false', 'aria-label': 'Folder name for the regenerated dataset', 'data-role': 'seed-out-name' } });
    this.regenerate = button('Regenerate', () => void this.begin(), { className: 'primary', attrs: { 'data-role': 'seed-regenerate' } });
    this.regenerate.disabled = true;
    this.job = new JobProgressView(bridge, 'seed', (p) => this.ended(p));
    this.files = h('div', { className: 'seed-files', attrs: { 'data-role': 'seed-files' } });
    this.root = h(
      'section',
      { className: 'screen seed-screen', attrs: { 'data-screen': 'seed' } },
      h('header', { className: 'screen-head' }, h('h2', { text: 'Seed file' }), h('p', { className: 'screen-note', text: 'A seed file regenerates its dataset byte for byte with the same Pliant version.' })),
      h('div', { className: 'toolbar' }, button('Open seed file…', () => void this.choose(), { attrs: { 'data-role': 'open-seed-file' } })),
      this.status.root,
      this.summaryHost,
      h('div', { className: 'toolbar' }, labelled('Episode', this.indexInput), button('Preview this episode', () => this.previewEpisode(), { attrs: { 'data-role': 'seed-preview' } })),
      h('div', { className: 'toolbar' }, h('span', { className: 'field-caption', text: 'Regenerate into' }), this.outFolder, button('Choose…', () => void this.chooseOut(), { attrs: { 'data-role': 'seed-choose-out' } }), labelled('named', this.outName), this.regenerate),
      this.job.bar,
      this.job.text,
      this.files,
    );
  }

  async open(seedPath: string): Promise<void> {
    try {
      this.seed = await this.bridge.invoke('seed.read', { path: seedPath });
    } catch (error) {
      this.status.error(`Could not read ${seedPath}`, error);
      return;
    }
    const s = this.seed;
    this.indexInput.max = String(Math.max(0, s.episodeCount - 1));
    this.summaryHost.replaceChildren(
      ...([
        ['seed file', s.path],
        ['written by', `Pliant ${s.toolVersion}`],
        ['episodes', s.episodeCount.toLocaleString('en')],
        ['files to reproduce', `${s.expectedFiles.length}`],
      ] as const).flatMap(([k, v]) => [h('dt', { text: k }), h('dd', { text: v })]),
    );
    this.renderFiles(null);
    this.regenerate.disabled = this.parentFolder === null;
    this.status.show('ok', `Opened ${s.path}.`);
  }

  private async choose(): Promise<void> {
    try {
      const chosen = await this.bridge.invoke('folder.choose', { purpose: 'seed' });
      if (chosen) await this.open(insideFolder(chosen.path, 'seed.json'));
    } catch (error) {
      this.status.error('Could not choose a folder', error);
    }
  }

  private async chooseOut(): Promise<void> {
    try {
      const chosen = await this.bridge.invoke('folder.choose', { purpose: 'export' });
      if (!chosen) return;
      this.parentFolder = chosen.path;
      this.outFolder.textContent = chosen.path;
      this.regenerate.disabled = this.seed === null;
    } catch (error) {
      this.status.error('Could not choose a folder', error);
    }
  }

  private previewEpisode(): void {
    if (!this.seed) return;
    const index = Math.round(Number(this.indexInput.value));
    if (!(index >= 0 && index < this.seed.episodeCount)) {
      this.status.show('error', `Episode ${this.indexInput.value} is not in this dataset: choose 0 to ${this.seed.episodeCount - 1}.`);
      return;
    }
    this.events.preview(this.seed.scenarioText, 'seed.json', this.seed.path, index);
  }

  private async begin(): Promise<void> {
    if (!this.seed || !this.parentFolder) return;
    const name = this.outName.value.trim();
    const nameProblem = newFolderNameProblem(name);
    if (nameProblem) {
      this.status.show('error', nameProblem);
      return;
    }
    this.outDir = insideFolder(this.parentFolder, name);
    this.job.reset('Starting…');
    try {
      this.job.follow((await this.bridge.invoke('reproduce.begin', { seedPath: this.seed.path, outDir: this.outDir })).jobId);
      this.regenerate.disabled = true;
      this.status.show('busy', `Regenerating into ${this.outDir}…`);
    } catch (error) {
      this.status.error('Regeneration did not start', error);
    }
  }

  private ended(p: JobProgress): void {
    this.regenerate.disabled = false;
    this.root.setAttribute('data-seed-state', p.state);
    if (p.state === 'done') void this.compare(p);
    else this.status.show(p.state === 'failed' ? 'error' : 'info', `Regeneration ${p.state}: ${p.message ?? 'no reason given'}`);
  }

  /** Every file of the regenerated folder compared with the original folder beside the seed file. */
  private async compare(p: JobProgress): Promise<void> {
    if (!this.outDir || !this.seed) return;
    try {
      const { comparisons } = await this.bridge.invoke('dataset.compare', { originalPath: parentFolder(this.seed.path), regeneratedPath: this.outDir });
      this.renderFiles(comparisons);
      const same = comparisons.filter((c) => c.result === 'identical').length;
      const allSame = same === comparisons.length;
      this.status.show(allSame ? 'ok' : 'error', `${p.message ?? 'Regenerated.'} Compared with the original folder: ${same} of ${comparisons.length} files identical${allSame ? '' : '; the table shows which differ'}.`);
    } catch (error) {
      this.status.error('Regenerated, but the result could not be compared with the original', error);
    }
  }

  private renderFiles(comparisons: DatasetComparison['comparisons'] | null): void {
    if (!this.seed) return;
    const recorded = new Map(this.seed.expectedFiles.map((f) => [f.file, f.sha256]));
    const listed = comparisons ?? this.seed.expectedFiles.map((f) => ({ file: f.file, result: null }));
    const rows = listed.map(({ file, result }) => {
      const sha256 = recorded.get(file);
      return h(
        'tr',
        { attrs: { 'data-file': file, 'data-result': result ?? 'pending' } },
        h('td', { text: file }),
        h('td', { className: 'hash', text: sha256 ? `${sha256.slice(0, 16)}…` : '—' }),
        h('td', { text: result === null ? 'not regenerated yet' : RESULT_WORDS[result] }),
      );
    });
    this.files.replaceChildren(h('table', { className: 'file-table' }, h('thead', {}, h('tr', {}, h('th', { text: 'file' }), h('th', { text: 'SHA-256 (recorded)' }), h('th', { text: 'compared with the original' }))), h('tbody', {}, ...rows)));
  }
}

const RESULT_WORDS: Record<FileComparisonResult, string> = {
  identical: 'identical, byte for byte',
  different: 'different from the original',
  'missing in original': 'missing from the original folder',
  'missing in regenerated': 'missing from the regenerated folder',
  'unreadable in original': 'cannot be read in the original folder',
  'unreadable in regenerated': 'cannot be read in the regenerated folder',
  'only in regenerated': 'only in the regenerated folder',
};

/** The folder a file path lies in, with either separator (the renderer has no path module). */
function parentFolder(path: string): string {
  const cut = Math.max(path.lastIndexOf('/'), path.lastIndexOf('\\'));
  return cut <= 0 ? path.slice(0, cut + 1) : path.slice(0, cut);
}
