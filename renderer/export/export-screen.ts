// The Export screen: write the sweep on the Sweep screen as a dataset. Choose where, which file
// format and how many worker threads; follow the progress with the rate and the time left;
// cancel at an episode boundary so a later run with "resume" finishes the same folder; and at the
// end see the folder and the result of verifying every checksum. Before it starts, the screen
// shows the episodes per split and an estimate of the folder's size and the time it takes.
import type { AppInfo, ExportFormat, JobProgress } from '../../sim/bridge/bridge-contract.ts';
import { BRIDGE_LIMITS } from '../../sim/bridge/bridge-contract.ts';
import type { SweepDocument } from '../app/sweep-document.ts';
import type { PliantBridge } from '../bridge/pliant-bridge.ts';
import { byteSize } from '../ui/byte-size.ts';
import { button, h, labelled, select } from '../ui/element.ts';
import { insideFolder, newFolderNameProblem } from '../ui/new-folder-name.ts';
import { safetyCaution } from '../ui/safety-caution.ts';
import type { Screen } from '../ui/screen.ts';
import { StatusLine } from '../ui/status-line.ts';
import type { ExportEstimate } from './export-estimate.ts';
import { ESTIMATE_SAMPLE, ExportEstimator } from './export-estimate.ts';
import { JobProgressView } from './job-progress-view.ts';

/** Wait this long after the last change before estimating again, ms. */
const ESTIMATE_SETTLE_MS = 400;

export class ExportScreen implements Screen {
  readonly id = 'export';
  readonly title = 'Export';
  readonly root: HTMLElement;
  private readonly status = new StatusLine('export-status');
  private readonly scenarioLine: HTMLElement;
  private readonly folderLine: HTMLElement;
  private readonly nameInput: HTMLInputElement;
  private readonly format: HTMLSelectElement;
  private readonly workers: HTMLInputElement;
  private readonly resume: HTMLInputElement;
  private readonly startButton: HTMLButtonElement;
  private readonly cancelButton: HTMLButtonElement;
  private readonly job: JobProgressView;
  private readonly result: HTMLElement;
  private parentFolder: string | null = null;
  private jobId: string | null = null;
  private outDir: string | null = null;
  /** Largest worker count: the shell caps a job's threads at the core count (as the command line's default), within the bridge's limit. */
  private readonly maxWorkers: number;
  /** The scenario name the folder name was last filled from; a name the user typed is left alone. */
  private filledName: string | null = null;
  private readonly estimator = new ExportEstimator();
  private readonly estimateHost: HTMLElement;
  private estimateTimer: ReturnType<typeof setTimeout> | null = null;
  private estimatedFor = '';

  constructor(private readonly bridge: PliantBridge, private readonly sweep: SweepDocument, info: AppInfo, private readonly openDataset: (path: string) => void) {
    this.scenarioLine = h('p', { className: 'export-scenario', attrs: { 'data-role': 'export-scenario' } });
    this.folderLine = h('span', { className: 'folder-line', attrs: { 'data-role': 'export-folder' }, text: 'no folder chosen' });
    this.nameInput = h('input', { attrs: { type: 'text', spellcheck: 'false', 'aria-label': 'Dataset folder name', 'data-role': 'export-name' } });
    this.format = select([['npz', 'NPZ (zipped NPY arrays)'], ['hdf5', 'HDF5'], ['both', 'NPZ and HDF5']], 'npz', { 'data-role': 'export-format' });
    const limits = info.jobLimits;
    this.maxWorkers = Math.max(1, Math.min(BRIDGE_LIMITS.maxWorkers, limits.workerThreadsPerJob));
    this.workers = h('input', { attrs: { type: 'number', min: '1', max: String(this.maxWorkers), step: '1', value: String(this.maxWorkers), 'data-role': 'export-workers' } });
    this.workers.addEventListener('change', () => this.scheduleEstimate());
    this.estimateHost = h('div', { className: 'export-estimate', attrs: { 'data-role': 'export-estimate', 'aria-live': 'polite' } });
    this.resume = h('input', { attrs: { type: 'checkbox', 'data-role': 'export-resume' } });
    this.startButton = button('Start export', () => void this.start(), { className: 'primary', attrs: { 'data-role': 'export-start' } });
    this.cancelButton = button('Cancel', () => void this.cancel(), { attrs: { 'data-role': 'export-cancel' } });
    this.cancelButton.disabled = true;
    this.job = new JobProgressView(bridge, 'export', (p) => this.ended(p));
    this.result = h('div', { className: 'export-result', attrs: { 'data-role': 'export-result' } });
    this.root = h(
      'section',
      { className: 'screen export-screen', attrs: { 'data-screen': 'export' } },
      h('header', { className: 'screen-head' }, h('h2', { text: 'Export' })),
      safetyCaution(info.safetyNotice),
      this.scenarioLine,
      h(
        'div',
        { className: 'form-grid' },
        h('div', { className: 'field-inline' }, h('span', { className: 'field-caption', text: 'Into folder' }), this.folderLine, button('Choose…', () => void this.chooseFolder(), { attrs: { 'data-role': 'export-choose' } })),
        labelled('Dataset folder name', this.nameInput),
        labelled('Format', this.format),
        labelled('Worker threads', this.workers, `1 to ${this.maxWorkers}, the cores of the computer it runs on (as pliant generate's default)`),
        labelled('Resume a cancelled export in this folder', this.resume),
      ),
      h('p', {
        className: 'job-limits',
        attrs: { 'data-role': 'export-job-limits' },
        text: `At most ${limits.runningJobs} jobs (exports, regenerations, scores, pictures) run at once; later ones wait in a queue of up to ${limits.queuedJobs}, in the order they were started, and the progress line shows their place.`,
      }),
      this.estimateHost,
      h('div', { className: 'toolbar' }, this.startButton, this.cancelButton),
      this.status.root,
      this.job.bar,
      this.job.text,
      this.result,
    );
    sweep.subscribe(() => this.describeScenario());
  }

  shown(): void {
    this.describeScenario();
  }

  private describeScenario(): void {
    const state = this.sweep.current;
    const doc = state.document;
    if (!doc) {
      this.scenarioLine.textContent = 'Open a scenario on the Sweep screen first.';
      this.startButton.disabled = true;
      return;
    }
    const name = typeof doc.name === 'string' ? doc.name : 'sweep';
    const episodes = typeof doc.episodes === 'number' ? doc.episodes : '?';
    const problems = state.problems.length;
    this.scenarioLine.textContent = `Scenario ${state.fileName}: ${episodes} episodes${problems > 0 ? ` — ${problems} problem${problems === 1 ? '' : 's'} to fix on the Sweep screen first` : ''}.`;
    // The folder is named for the scenario on show, unless the user typed a name of their own.
    if (this.nameInput.value === '' || this.nameInput.value === this.filledName) {
      this.nameInput.value = name;
      this.filledName = name;
    }
    const format = (doc.export as { format?: unknown } | undefined)?.format;
    if (format === 'npz' || format === 'hdf5' || format === 'both') this.format.value = format;
    this.startButton.disabled = this.jobId !== null || !this.sweep.usable;
    this.scheduleEstimate();
  }

  private scheduleEstimate(): void {
    if (this.estimateTimer !== null) clearTimeout(this.estimateTimer);
    this.estimateTimer = setTimeout(() => {
      this.estimateTimer = null;
      void this.refreshEstimate();
    }, ESTIMATE_SETTLE_MS);
  }

  private async refreshEstimate(): Promise<void> {
    const state = this.sweep.current;
    const doc = state.document;
    if (!doc || !this.sweep.usable || typeof doc.episodes !== 'number' || this.root.hidden) {
      if (!doc || !this.sweep.usable) {
        this.estimateHost.replaceChildren();
        this.estimateHost.removeAttribute('data-state');
        this.estimatedFor = '';
      }
      return;
    }
    const workers = Math.min(this.maxWorkers, Math.max(1, Math.round(Number(this.workers.value)) || 1));
    const floatBytes = (doc.export as { dtype?: unknown } | undefined)?.dtype === 'float64' ? 8 : 4;
    const key = `${workers}\u0000${state.text}`;
    if (key === this.estimatedFor) return;
    this.estimatedFor = key;
    this.estimateHost.setAttribute('data-state', 'busy');
    this.estimateHost.replaceChildren(h('p', { className: 'screen-note', text: 'Estimating the splits, the size and the time…' }));
    const estimate = await this.estimator.estimate({ text: state.text, fileName: state.fileName, episodes: doc.episodes, workers, floatBytes });
    if (estimate === null) return;
    if (typeof estimate === 'string') {
      this.estimateHost.setAttribute('data-state', 'failed');
      this.estimateHost.replaceChildren(h('p', { className: 'screen-note', text: `No estimate: ${estimate}` }));
      return;
    }
    this.renderEstimate(estimate, workers);
  }

  private renderEstimate(e: ExportEstimate, workers: number): void {
    const about = e.exact ? '' : 'about ';
    const splits = Object.entries(e.splitCounts).filter(([split, n]) => n > 0 || ['train', 'validation', 'test'].includes(split));
    const rows: [string, string, Record<string, string>][] = [
      ['episodes', e.episodes.toLocaleString('en'), { 'data-episodes': String(e.episodes) }],
      ['splits', `${about}${splits.map(([split, n]) => `${split} ${n.toLocaleString('en')}`).join(', ')}${e.exact ? '' : ` (scaled from the first ${ESTIMATE_SAMPLE} episodes)`}`, Object.fromEntries(splits.map(([split, n]) => [`data-split-${split}`, String(n)]))],
      ['size', `about ${byteSize(e.arrayBytes)} of arrays before compression (the files come out smaller)`, { 'data-bytes': String(e.arrayBytes) }],
      ['time', `${e.timeS < 1 ? '' : 'about '}${durationWords(e.timeS)} with ${workers} worker${workers === 1 ? '' : 's'} (one episode took ${e.episodeWallS.toFixed(2)} s here)`, { 'data-seconds': e.timeS.toFixed(3) }],
    ];
    this.estimateHost.setAttribute('data-state', 'ready');
    this.estimateHost.replaceChildren(
      h('h3', { text: 'This export will write' }),
      h('dl', { className: 'facts' }, ...rows.flatMap(([k, v, attrs]) => [h('dt', { text: k }), h('dd', { text: v, attrs: { 'data-role': `estimate-${k}`, ...attrs } })])),
    );
  }

  private async chooseFolder(): Promise<void> {
    try {
      const chosen = await this.bridge.invoke('folder.choose', { purpose: 'export' });
      if (!chosen) return;
      this.parentFolder = chosen.path;
      this.folderLine.textContent = chosen.path;
    } catch (error) {
      this.status.error('Could not choose a folder', error);
    }
  }

  private async start(): Promise<void> {
    if (!this.parentFolder) {
      this.status.show('error', 'Choose the folder to export into first (Choose…).');
      return;
    }
    const name = this.nameInput.value.trim();
    const nameProblem = newFolderNameProblem(name);
    if (nameProblem) {
      this.status.show('error', nameProblem);
      return;
    }
    const workers = Math.round(Number(this.workers.value));
    if (!(workers >= 1 && workers <= this.maxWorkers)) {
      this.status.show('error', `Worker threads must be a whole number from 1 to ${this.maxWorkers} (the cores of this computer), got ${this.workers.value}.`);
      return;
    }
    this.outDir = insideFolder(this.parentFolder, name);
    this.result.replaceChildren();
    this.job.reset('Starting…');
    this.root.setAttribute('data-export-state', 'running');
    try {
      const started = await this.bridge.invoke('export.begin', {
        scenarioText: this.sweep.current.text,
        outDir: this.outDir,
        format: this.format.value as ExportFormat,
        workers,
        resume: this.resume.checked,
      });
      this.jobId = started.jobId;
      this.job.follow(started.jobId);
      this.startButton.disabled = true;
      this.cancelButton.disabled = false;
      this.status.show('busy', `Exporting into ${this.outDir}…`);
    } catch (error) {
      this.root.setAttribute('data-export-state', 'refused');
      this.job.reset('');
      this.status.error('The export did not start', error);
    }
  }

  private async cancel(): Promise<void> {
    if (!this.jobId) return;
    this.cancelButton.disabled = true;
    this.status.show('busy', 'Cancelling at the next episode boundary…');
    try {
      await this.bridge.invoke('export.cancel', { jobId: this.jobId });
    } catch (error) {
      this.status.error('Could not cancel', error);
    }
  }

  private ended(p: JobProgress): void {
    this.jobId = null;
    this.cancelButton.disabled = true;
    this.startButton.disabled = !this.sweep.usable;
    this.root.setAttribute('data-export-state', p.state);
    if (p.state === 'done') {
      this.resume.checked = false;
      void this.finished(p.message);
    } else if (p.state === 'cancelled') {
      this.resume.checked = true;
      this.status.show('info', `Cancelled after ${p.done} of ${p.total} episodes. The folder keeps every finished episode; press Start export with "Resume" ticked to finish it.`);
    } else {
      this.status.show('error', `The export failed: ${p.message ?? 'no reason given'}`);
    }
  }

  /** `found` is what the job itself reports about the finished dataset, if anything. */
  private async finished(found: string | undefined): Promise<void> {
    const outDir = this.outDir;
    if (!outDir) return;
    this.status.show('busy', 'Export finished; verifying every checksum…');
    try {
      const report = await this.bridge.invoke('dataset.verify', { path: outDir });
      const sizeBytes = (await this.bridge.invoke('dataset.summary', { path: outDir })).sizeBytes;
      const verdict = report.ok
        ? h('p', { className: 'verify-ok', attrs: { 'data-role': 'verify-result', 'data-ok': 'true' }, text: `Verified: all ${report.checkedFiles} files match their recorded SHA-256 checksums.` })
        : h('div', { className: 'verify-bad', attrs: { 'data-role': 'verify-result', 'data-ok': 'false' } }, h('p', { text: `Verification found ${report.problems.length} problem${report.problems.length === 1 ? '' : 's'} in ${report.checkedFiles} files:` }), h('ul', {}, ...report.problems.map((pr) => h('li', { text: `${pr.file}: ${pr.message}` }))));
      this.result.replaceChildren(
        h('p', { attrs: { 'data-role': 'export-out-dir' }, text: `Dataset written to ${outDir}.` }),
        h('p', { attrs: { 'data-role': 'export-size', 'data-bytes': String(sizeBytes) }, text: `Size: ${byteSize(sizeBytes)}, counting every data file, the seed file, the card and manifest.json.` }),
        ...(found ? [h('p', { attrs: { 'data-role': 'export-found' }, text: found })] : []),
        verdict,
        button('Open in Datasets', () => this.openDataset(outDir), { attrs: { 'data-role': 'export-open-dataset' } }),
      );
      this.status.show(report.ok ? 'ok' : 'error', report.ok ? 'Export finished and verified.' : 'Export finished, but verification found problems (listed below).');
    } catch (error) {
      this.status.error('Export finished, but it could not be verified', error);
    }
  }
}

/** "40 s", "3.5 min", "2.1 h". */
function durationWords(s: number): string {
  if (s < 1) return 'under a second';
  if (s < 90) return `${Math.round(s)} s`;
  if (s < 5400) return `${Number((s / 60).toPrecision(2))} min`;
  return `${Number((s / 3600).toPrecision(2))} h`;
}
