// The Preview screen: draws the first episodes of the sweep (the very ones Export will write),
// lets one be picked, and simulates it live in a Web Worker while the 3-D view and the charts
// follow the frames as they arrive. Nothing is written to disk here.
import type { SweepDocument } from '../app/sweep-document.ts';
import { TrajectoryFrames } from '../playback/trajectory-frames.ts';
import { TrajectoryPlots } from '../plots/trajectory-plots.ts';
import { button, h, labelled } from '../ui/element.ts';
import type { Screen } from '../ui/screen.ts';
import { StatusLine } from '../ui/status-line.ts';
import { TrajectoryPlayer } from '../view/trajectory-player.ts';
import { parameterTable, renderEpisodeFacts } from './episode-facts.ts';
import type { FromPreviewWorker, PreviewEpisodeSummary, ToPreviewWorker } from './preview-worker-protocol.ts';

const DEFAULT_PREVIEW_COUNT = 4;
const MAX_PREVIEW_COUNT = 12;
/** Parameters a card lists; the rest are under This episode. */
const CARD_PARAMETER_ROWS = 4;

export class PreviewScreen implements Screen {
  readonly id = 'preview';
  readonly title = 'Preview';
  readonly root: HTMLElement;
  readonly player = new TrajectoryPlayer();
  private readonly plots = new TrajectoryPlots();
  private readonly status = new StatusLine('preview-status');
  private readonly countInput: HTMLInputElement;
  private readonly indexInput: HTMLInputElement;
  private readonly episodeList: HTMLElement;
  private readonly facts: HTMLElement;
  private readonly progress: HTMLElement;
  private worker: Worker | null = null;
  private requestId = 0;
  private frames: TrajectoryFrames | null = null;
  private episodes: PreviewEpisodeSummary[] = [];
  private sampledText = '';
  /** Where the scenario under preview came from, when not the Sweep screen (a seed file). */
  private override: { text: string; fileName: string; source: string } | null = null;

  constructor(private readonly sweep: SweepDocument) {
    this.countInput = h('input', { attrs: { type: 'number', min: '1', max: String(MAX_PREVIEW_COUNT), step: '1', value: String(DEFAULT_PREVIEW_COUNT), 'data-role': 'preview-count', 'aria-label': 'Episodes to draw' } });
    this.indexInput = h('input', { attrs: { type: 'number', min: '0', step: '1', value: '0', 'data-role': 'preview-index', 'aria-label': 'Episode index' } });
    this.episodeList = h('ol', { className: 'episode-cards', attrs: { 'data-role': 'preview-episodes' } });
    this.facts = h('div', { className: 'episode-facts', attrs: { 'data-role': 'episode-facts' } });
    this.progress = h('div', { className: 'sim-progress', attrs: { 'data-role': 'sim-progress' } });
    // A check that finishes while this screen shows brings the preview up to date.
    sweep.subscribe((change) => {
      if (change === 'checked' && this.visible && !this.override && this.sweep.current.text !== this.sampledText) this.drawEpisodes();
    });
    this.player.onFrame((frame) => {
      if (this.frames) this.plots.mark(this.frames.timeS[frame]);
    });
    this.root = h(
      'section',
      { className: 'screen preview-screen', attrs: { 'data-screen': 'preview' } },
      h('header', { className: 'screen-head' }, h('h2', { text: 'Preview' }), h('p', { className: 'screen-note', text: 'Episodes are drawn and simulated exactly as Export writes them; nothing is saved.' })),
      h(
        'div',
        { className: 'toolbar' },
        labelled('Draw the first', this.countInput, 'episodes'),
        button('Draw', () => this.drawEpisodes(), { attrs: { 'data-role': 'preview-draw' } }),
        labelled('or episode', this.indexInput),
        button('Simulate', () => this.runEpisode(Number(this.indexInput.value)), { attrs: { 'data-role': 'preview-run' } }),
      ),
      this.status.root,
      h('div', { className: 'preview-body' }, h('div', { className: 'preview-main' }, this.player.root, this.progress, this.plots.root), h('aside', { className: 'preview-side', attrs: { tabindex: '0', 'aria-label': 'Drawn episodes and this episode\'s parameters (scrolls with the arrow keys when focused)' } }, h('h3', { text: 'Drawn episodes' }), this.episodeList, h('h3', { text: 'This episode' }), this.facts)),
    );
  }

  shown(): void {
    this.visible = true;
    const source = this.source();
    if (source.text !== '' && source.text !== this.sampledText) this.drawEpisodes();
  }

  private visible = false;

  /** Previews a scenario that is not the one on the Sweep screen (the Seed file screen uses this). */
  previewScenario(text: string, fileName: string, source: string, episodeIndex: number): void {
    this.override = { text, fileName, source };
    this.sampledText = '';
    this.indexInput.value = String(episodeIndex);
    this.drawEpisodes(episodeIndex);
  }

  /** Back to previewing the Sweep screen's scenario. */
  useSweep(): void {
    this.override = null;
  }

  private source(): { text: string; fileName: string; source: string } {
    if (this.override) return this.override;
    const state = this.sweep.current;
    return { text: state.text, fileName: state.fileName, source: state.path ?? state.fileName };
  }

  private drawEpisodes(runIndex?: number): void {
    const source = this.source();
    if (source.text === '') {
      this.status.show('info', 'Open a scenario on the Sweep screen first.');
      return;
    }
    if (!this.override) {
      const state = this.sweep.current;
      if (state.checking) {
        this.status.show('busy', 'Waiting for the check of the sweep…');
        return;
      }
      if (!this.sweep.usable) {
        this.status.show('error', `The sweep has ${state.problems.length} problem${state.problems.length === 1 ? '' : 's'}; fix ${state.problems.length === 1 ? 'it' : 'them'} on the Sweep screen to preview it.`);
        return;
      }
    }
    const count = Math.min(MAX_PREVIEW_COUNT, Math.max(1, Math.round(Number(this.countInput.value) || DEFAULT_PREVIEW_COUNT)));
    const indices = Array.from({ length: count }, (_, i) => i);
    if (runIndex !== undefined && !indices.includes(runIndex)) indices.push(runIndex);
    this.sampledText = source.text;
    this.progress.removeAttribute('data-state');
    this.status.show('busy', `Drawing ${indices.length} episodes of ${source.source}…`);
    const id = this.send({ type: 'sample', requestId: ++this.requestId, scenarioText: source.text, fileName: source.fileName, episodeIndices: indices });
    this.pendingRun = { requestId: id, index: runIndex ?? 0 };
  }

  private pendingRun: { requestId: number; index: number } | null = null;

  private runEpisode(index: number): void {
    const source = this.source();
    if (source.text === '') return;
    if (!Number.isInteger(index) || index < 0) {
      this.status.show('error', `Episode index ${this.indexInput.value} is not a whole number ≥ 0. Type an episode number from 0 up.`);
      return;
    }
    this.indexInput.value = String(index);
    this.status.show('busy', `Simulating episode ${index}…`);
    this.progress.textContent = '';
    this.progress.removeAttribute('data-state');
    for (const card of this.episodeList.querySelectorAll('li')) card.classList.toggle('is-selected', card.getAttribute('data-index') === String(index));
    this.send({ type: 'run', requestId: ++this.requestId, scenarioText: source.text, fileName: source.fileName, episodeIndex: index });
  }

  private send(message: ToPreviewWorker): number {
    if (!this.worker) {
      this.worker = new Worker(new URL('./preview-worker.ts', import.meta.url), { type: 'module', name: 'pliant-preview' });
      this.worker.addEventListener('message', (event: MessageEvent<FromPreviewWorker>) => this.receive(event.data));
      this.worker.addEventListener('error', (event) => this.status.show('error', `The preview worker stopped: ${event.message || 'no reason given'}. Reload the page to start it again.`));
    }
    if (message.type !== 'stop') this.worker.postMessage({ type: 'stop', requestId: this.requestId - 1 } satisfies ToPreviewWorker);
    this.worker.postMessage(message);
    return message.requestId;
  }

  private receive(message: FromPreviewWorker): void {
    if (message.requestId !== this.requestId) return;
    switch (message.type) {
      case 'refused':
        this.status.show('error', `Cannot preview: ${message.message}`);
        return;
      case 'sampled':
        this.episodes = message.episodes;
        this.renderEpisodeCards();
        this.status.show('ok', `Drew ${message.episodes.length} episodes.`);
        if (this.pendingRun) {
          const index = this.pendingRun.index;
          this.pendingRun = null;
          this.runEpisode(index);
        }
        return;
      case 'started': {
        this.frames = new TrajectoryFrames(message.topology.nodeCount, message.episode.channels.length, message.frameCount);
        this.player.load(message.topology, this.frames, message.episode.recordIntervalS, message.world);
        this.plots.load(this.frames, message.episode.channels);
        renderEpisodeFacts(this.facts, message.episode);
        return;
      }
      case 'frames': {
        if (!this.frames) return;
        this.frames.receive(message.first, message.count, message.positionsM, message.timeS, message.energiesJ, message.controls);
        this.player.framesArrived();
        this.plots.framesArrived();
        this.progress.textContent = `Simulated ${this.frames.filled} of ${this.frames.frameCount} frames`;
        return;
      }
      case 'finished': {
        if (!this.frames) return;
        this.plots.framesArrived(true);
        const simulatedS = this.frames.timeS[this.frames.frameCount - 1];
        this.progress.textContent = `Simulated all ${this.frames.frameCount} frames (${simulatedS.toFixed(2)} s of episode time) in ${message.wallS.toFixed(2)} s.`;
        this.progress.setAttribute('data-state', 'finished');
        this.status.show('ok', 'Episode ready. Space plays and pauses, ← → step.');
        this.player.play();
        return;
      }
      case 'failed':
        this.progress.setAttribute('data-state', 'failed');
        this.status.show('error', `The episode could not be simulated past frame ${message.framesDone}: ${message.message}`);
        return;
    }
  }

  private renderEpisodeCards(): void {
    // The values that differ between the drawn episodes are what tells the cards apart.
    const varying = new Set<string>();
    const first = this.episodes[0]?.labels ?? {};
    for (const e of this.episodes) for (const [k, v] of Object.entries(e.labels)) if (first[k] !== v) varying.add(k);
    this.episodeList.replaceChildren(
      ...this.episodes.map((e) => {
        const card = h(
          'li',
          { attrs: { 'data-index': String(e.index) } },
          h('div', { className: 'episode-card-head' }, button(`Episode ${e.index}`, () => this.runEpisode(e.index), { className: 'episode-pick', attrs: { 'data-role': 'pick-episode' } }), h('span', { className: `split-badge split-${e.split}`, text: e.split })),
          h('div', { className: 'episode-card-facts', text: `${e.kind}, ${e.nodeCount} nodes, ${e.springCount} springs${e.cellCount ? `, ${e.cellCount} cells` : ''}` }),
          Object.keys(e.labels).length > 0 ? parameterTable(e.labels, 'card-parameters', CARD_PARAMETER_ROWS, varying) : null,
        );
        return card;
      }),
    );
  }

  hidden(): void {
    this.visible = false;
    // Playing on while hidden would spend the laptop's battery on nothing.
    this.player.pause();
  }
}
