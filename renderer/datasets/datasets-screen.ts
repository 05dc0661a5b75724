// The Datasets screen: open an exported dataset folder, read its card and summary, page through
// its episodes, play any episode back in the 3-D view from its own files, verify its checksums,
// open its seed file to preview or regenerate episodes, save the episode playing as a GIF or PNG
// frames, and play a second episode beside it to compare the two. Before a folder is open the
// screen says how to get one instead of showing an empty view.
import type { ControlChannelDescription, DatasetSummary, EpisodeRow } from '../../sim/bridge/bridge-contract.ts';
import type { PliantBridge } from '../bridge/pliant-bridge.ts';
import { TrajectoryPlots } from '../plots/trajectory-plots.ts';
import { byteSize } from '../ui/byte-size.ts';
import { button, h } from '../ui/element.ts';
import type { Screen } from '../ui/screen.ts';
import { StatusLine } from '../ui/status-line.ts';
import { TrajectoryPlayer } from '../view/trajectory-player.ts';
import type { DatasetScene } from './dataset-scene.ts';
import { datasetScene, episodeWorld } from './dataset-scene.ts';
import { EpisodePictureSaver } from './episode-picture-saver.ts';
import { playableEpisode } from './episode-playback.ts';
import { EpisodeTable } from './episode-table.ts';

export class DatasetsScreen implements Screen {
  readonly id = 'datasets';
  readonly title = 'Datasets';
  readonly root: HTMLElement;
  readonly player = new TrajectoryPlayer();
  /** The second episode of a comparison, played beside the first; made (with its WebGL context) on first use. */
  private comparePlayer: TrajectoryPlayer | null = null;
  private readonly compareHost: HTMLElement;
  private readonly plots = new TrajectoryPlots();
  private readonly emptyState: HTMLElement;
  private readonly openedParts: HTMLElement;
  private readonly playbackBody: HTMLElement;
  private readonly compareLine: HTMLElement;
  private readonly comparePane: HTMLElement;
  private readonly status = new StatusLine('datasets-status');
  private readonly summaryHost: HTMLElement;
  private readonly table: EpisodeTable;
  private readonly playing: HTMLElement;
  private readonly seedButton: HTMLButtonElement;
  private readonly verifyButton: HTMLButtonElement;
  private readonly verifyResult: HTMLElement;
  private readonly pictures: EpisodePictureSaver;
  private summary: DatasetSummary | null = null;
  private frameTimes: Float64Array | null = null;
  private scene: DatasetScene | null = null;

  constructor(private readonly bridge: PliantBridge, private readonly openSeed: (seedPath: string) => void) {
    this.summaryHost = h('div', { className: 'dataset-summary', attrs: { 'data-role': 'dataset-summary' } });
    this.table = new EpisodeTable({
      fetch: (query) => {
        if (!this.summary) return Promise.resolve({ total: 0, offset: 0, rows: [] });
        return this.bridge.invoke('dataset.episodes', { path: this.summary.path, ...query });
      },
      play: (row) => void this.play(row),
      compare: (row) => void this.compare(row),
      failed: (error) => this.status.error('Could not list the episodes', error),
    });
    this.playing = h('p', { className: 'playing-line', attrs: { 'data-role': 'playing-episode' } });
    this.seedButton = button('Open its seed file', () => this.summary?.seedFilePath && this.openSeed(this.summary.seedFilePath), { attrs: { 'data-role': 'open-seed' } });
    this.seedButton.disabled = true;
    this.verifyButton = button('Verify checksums', () => void this.verify(), { attrs: { 'data-role': 'dataset-verify' } });
    this.verifyButton.disabled = true;
    this.verifyResult = h('span', { className: 'verify-inline', attrs: { 'data-role': 'dataset-verify-result' } });
    this.pictures = new EpisodePictureSaver(bridge);
    this.player.onFrame((frame) => {
      if (this.frameTimes) this.plots.mark(this.frameTimes[frame]);
    });
    this.emptyState = h(
      'div',
      { className: 'empty-state', attrs: { 'data-role': 'datasets-empty' } },
      h('h3', { text: 'No dataset open yet' }),
      h(
        'ol',
        {},
        h('li', { text: 'Open a folder written by Export or by "pliant generate" with Open dataset folder… above.' }),
        h('li', { text: 'No dataset yet? Write one on the Export screen from the scenario on the Sweep screen.' }),
        h('li', { text: 'Once open, its episodes are listed here; Play shows one in 3-D with its charts, Compare plays a second beside it.' }),
      ),
    );
    this.compareLine = h('p', { className: 'playing-line', attrs: { 'data-role': 'compare-episode-line' } });
    this.compareHost = h('div', { className: 'compare-player' });
    this.comparePane = h('div', { className: 'compare-pane', attrs: { 'data-role': 'compare-pane' } }, h('div', { className: 'compare-head' }, this.compareLine, button('Close comparison', () => this.closeComparison(), { attrs: { 'data-role': 'compare-close' } })), this.compareHost);
    this.comparePane.hidden = true;
    this.playbackBody = h('div', { className: 'playback-body' }, h('div', { className: 'compare-grid' }, h('div', { className: 'compare-main' }, this.playing, this.player.root), this.comparePane), this.plots.root);
    this.playbackBody.hidden = true;
    this.openedParts = h('div', { className: 'dataset-opened' }, this.summaryHost, this.table.root, this.pictures.root, this.playbackBody);
    this.openedParts.hidden = true;
    this.root = h(
      'section',
      { className: 'screen datasets-screen', attrs: { 'data-screen': 'datasets' } },
      h('header', { className: 'screen-head' }, h('h2', { text: 'Datasets' })),
      h('div', { className: 'toolbar' }, button('Open dataset folder…', () => void this.choose(), { attrs: { 'data-role': 'open-dataset' } }), this.verifyButton, this.verifyResult, this.seedButton),
      this.status.root,
      this.emptyState,
      this.openedParts,
    );
  }

  hidden(): void {
    this.player.pause();
    this.comparePlayer?.pause();
  }

  async open(path: string): Promise<void> {
    this.status.show('busy', `Reading ${path}…`);
    try {
      this.summary = await this.bridge.invoke('dataset.summary', { path });
    } catch (error) {
      this.status.error(`Could not open ${path} as a dataset`, error);
      return;
    }
    this.renderSummary(this.summary);
    this.emptyState.hidden = true;
    this.openedParts.hidden = false;
    this.playbackBody.hidden = true;
    this.closeComparison();
    this.player.clear();
    this.pictures.forget();
    this.scene = null;
    if (this.summary.seedFilePath) {
      try {
        this.scene = datasetScene((await this.bridge.invoke('seed.read', { path: this.summary.seedFilePath })).scenarioText);
      } catch {
        // The seed file only adds the ground, the fluid and material names; play without them.
      }
    }
    this.seedButton.disabled = this.summary.seedFilePath === null;
    this.verifyButton.disabled = false;
    this.verifyResult.textContent = '';
    this.table.open(this.summary.labelKeys, Object.keys(this.summary.splitCounts));
    this.status.show('ok', `Opened ${this.summary.path}.`);
  }

  private async choose(): Promise<void> {
    try {
      const chosen = await this.bridge.invoke('folder.choose', { purpose: 'dataset' });
      if (chosen) await this.open(chosen.path);
    } catch (error) {
      this.status.error('Could not choose a folder', error);
    }
  }

  private async verify(): Promise<void> {
    if (!this.summary) return;
    this.verifyResult.textContent = 'Verifying…';
    try {
      const report = await this.bridge.invoke('dataset.verify', { path: this.summary.path });
      this.verifyResult.textContent = report.ok ? `All ${report.checkedFiles} files match their checksums.` : `${report.problems.length} problem(s): ${report.problems.map((p) => `${p.file}: ${p.message}`).join('; ')}`;
      this.verifyResult.setAttribute('data-ok', String(report.ok));
    } catch (error) {
      this.verifyResult.textContent = '';
      this.status.error('Could not verify', error);
    }
  }

  private async play(row: EpisodeRow): Promise<void> {
    if (!this.summary) return;
    this.status.show('busy', `Loading episode ${row.episodeId}…`);
    try {
      const arrays = await this.bridge.invoke('dataset.episodeArrays', { path: this.summary.path, episodeId: row.episodeId });
      const episode = playableEpisode(arrays);
      this.frameTimes = episode.frames.timeS;
      if (this.scene && this.scene.materialNames.length >= episode.topology.materialNames.length) episode.topology.materialNames = this.scene.materialNames;
      this.player.load(episode.topology, episode.frames, episode.frameIntervalS, episodeWorld(this.scene, row.labels));
      this.plots.load(episode.frames, plottedChannels(episode.channelCount, arrays.controlChannels, this.summary.controlChannels));
      this.playing.textContent = `Playing episode ${row.episodeId} (${row.split}) from its files: ${episode.topology.nodeCount} nodes, ${episode.frames.frameCount} frames every ${Number(episode.frameIntervalS.toPrecision(6))} s.`;
      this.playing.setAttribute('data-episode', row.episodeId);
      this.pictures.episodeLoaded(this.summary.path, row.episodeId);
      this.playbackBody.hidden = false;
      this.status.show('ok', 'Space plays and pauses, ← → step.');
      this.player.play();
    } catch (error) {
      this.status.error(`Could not play episode ${row.episodeId}`, error);
    }
  }

  /** Plays `row` beside the episode playing (or as the first, when none is). */
  private async compare(row: EpisodeRow): Promise<void> {
    if (!this.summary) return;
    if (!this.playing.hasAttribute('data-episode')) {
      await this.play(row);
      return;
    }
    this.status.show('busy', `Loading episode ${row.episodeId} to compare…`);
    try {
      const arrays = await this.bridge.invoke('dataset.episodeArrays', { path: this.summary.path, episodeId: row.episodeId });
      const episode = playableEpisode(arrays);
      if (this.scene && this.scene.materialNames.length >= episode.topology.materialNames.length) episode.topology.materialNames = this.scene.materialNames;
      if (!this.comparePlayer) {
        this.comparePlayer = new TrajectoryPlayer();
        this.compareHost.append(this.comparePlayer.root);
      }
      this.comparePane.hidden = false;
      this.playbackBody.classList.add('is-comparing');
      this.comparePlayer.load(episode.topology, episode.frames, episode.frameIntervalS, episodeWorld(this.scene, row.labels));
      this.compareLine.textContent = `Beside it: episode ${row.episodeId} (${row.split}), ${episode.topology.nodeCount} nodes, ${episode.frames.frameCount} frames.`;
      this.compareLine.setAttribute('data-episode', row.episodeId);
      this.status.show('ok', `Comparing episode ${this.playing.getAttribute('data-episode')} (left) with ${row.episodeId} (right); both play from the start.`);
      // Both from the first frame, so the two motions line up in time.
      this.player.restart();
      this.comparePlayer.restart();
    } catch (error) {
      this.status.error(`Could not play episode ${row.episodeId}`, error);
    }
  }

  private closeComparison(): void {
    this.comparePlayer?.clear();
    this.comparePane.hidden = true;
    this.playbackBody.classList.remove('is-comparing');
    this.compareLine.textContent = '';
    this.compareLine.removeAttribute('data-episode');
  }

  private renderSummary(s: DatasetSummary): void {
    const facts: [string, string][] = [
      ['dataset', s.title],
      ['folder', s.path],
      ['scenario', s.scenarioName],
      ['episodes', `${s.episodeCount.toLocaleString('en')} (${Object.entries(s.splitCounts).map(([split, n]) => `${split} ${n}`).join(', ')})`],
      ['files', s.formats.join(' and ').toUpperCase()],
      ['written', `${s.createdAtIso} by Pliant ${s.toolVersion}`],
      ['seed file', s.seedFilePath ?? 'missing: this dataset cannot be regenerated'],
      ['arrays', s.arrays.map((a) => `${a.name} [${shapeText(a.shape, a.extentRanges)}] ${a.unit}`).join('; ')],
      ['controls', s.controlChannels.length === 0 ? 'none: nothing drives this system' : `${s.controlChannels.map((c) => `${c.name}, ${c.unit}`).join('; ')}${s.controlChannelsVary ? ' (in the first episode; others differ)' : ''}`],
      ['size', byteSize(s.sizeBytes)],
    ];
    const card = h('details', { className: 'dataset-card' }, h('summary', { text: 'Dataset card' }), h('pre', { className: 'card-text', text: s.cardMarkdown }));
    this.summaryHost.replaceChildren(h('dl', { className: 'facts' }, ...facts.flatMap(([k, v]) => [h('dt', { text: k }), h('dd', { text: v })])), card);
  }
}

/** "201×9–25×3": each axis's extent, or its range over the episodes where it varies. */
export function shapeText(shape: readonly number[], ranges: readonly (readonly [number, number])[] | undefined): string {
  return shape.map((extent, axis) => {
    const range = ranges?.[axis];
    if (range && range[0] !== range[1]) return `${range[0]}–${range[1]}`;
    return extent < 0 ? 'varies' : String(extent);
  }).join('×');
}

/**
 * The `controls` columns named as the manifest records them: the episode's own channels, else the
 * dataset's when they cover every column. A column neither names is shown by index, and says so.
 */
function plottedChannels(columns: number, episode: readonly ControlChannelDescription[], dataset: readonly ControlChannelDescription[]): { name: string; unit: string }[] {
  const named = episode.length === columns ? episode : dataset.length === columns ? dataset : [];
  return Array.from({ length: columns }, (_, c) => (named[c] ? { name: named[c].name, unit: named[c].unit } : { name: `column ${c}`, unit: 'unit not recorded' }));
}
