// The Scores screen: how good is a model trained on our data? Pick a dataset and a model's
// predictions folder and score them (a job in a worker thread, writing the same report as
// `pliant score`), or open a report written before; read the per-split tables, the error
// against the prediction horizon, the generalisation gap of each held-out split and the error
// against each sampled parameter; play any episode with the prediction drawn over the
// recording, coloured by its error. Calibration reports open here too.
import type { DatasetSummary, JobProgress, ScoreDocumentView, ScoreEpisodeRow, ScoreReport } from '../../sim/bridge/bridge-contract.ts';
import { decodeArray } from '../bridge/decode-array.ts';
import type { PliantBridge } from '../bridge/pliant-bridge.ts';
import type { DatasetScene } from '../datasets/dataset-scene.ts';
import { datasetScene, episodeWorld } from '../datasets/dataset-scene.ts';
import { playableEpisode } from '../datasets/episode-playback.ts';
import { JobProgressView } from '../export/job-progress-view.ts';
import { TimeSeriesPlot } from '../plots/time-series-plot.ts';
import { button, h, labelled, select } from '../ui/element.ts';
import { safetyCaution } from '../ui/safety-caution.ts';
import type { Screen } from '../ui/screen.ts';
import { StatusLine } from '../ui/status-line.ts';
import { TrajectoryPlayer } from '../view/trajectory-player.ts';
import { CalibrationView } from './calibration-view.ts';
import { ScoreEpisodeList } from './score-episode-list.ts';
import { gapTable, splitTable } from './score-tables.ts';

/** Split colours for the plots: our own, one per split in the order score.json lists them. */
const SPLIT_COLOURS = ['#1f5f8b', '#c8553d', '#2e8b57', '#8e5ea2', '#b8860b', '#3a3a3a'];

export class ScoresScreen implements Screen {
  readonly id = 'scores';
  readonly title = 'Scores';
  readonly root: HTMLElement;
  readonly player = new TrajectoryPlayer();
  private readonly status = new StatusLine('scores-status');
  private readonly progress: JobProgressView;
  private readonly chosen: HTMLElement;
  private readonly scoreButton: HTMLButtonElement;
  private readonly report: HTMLElement;
  private readonly horizonPlot = new TimeSeriesPlot('Position RMSE against the prediction horizon', 'm', [], 'horizon, s');
  private readonly parameterPlot: TimeSeriesPlot;
  private readonly parameterChoice: HTMLSelectElement;
  private readonly episodes: ScoreEpisodeList;
  private readonly playing: HTMLElement;
  private readonly calibration: CalibrationView;
  private readonly allowMissing: HTMLInputElement;
  private datasetPath: string | null = null;
  private predictionsPath: string | null = null;
  private dataset: DatasetSummary | null = null;
  private scene: DatasetScene | null = null;
  private score: ScoreDocumentView | null = null;

  constructor(private readonly bridge: PliantBridge, safetyNotice: string) {
    this.progress = new JobProgressView(bridge, 'score', (p) => void this.jobEnded(p));
    this.chosen = h('dl', { className: 'facts', attrs: { 'data-role': 'score-inputs' } });
    this.scoreButton = button('Score into a folder…', () => void this.begin(), { attrs: { 'data-role': 'score-begin' } });
    this.scoreButton.disabled = true;
    this.allowMissing = h('input', { attrs: { type: 'checkbox', 'data-role': 'score-allow-missing' } });
    this.report = h('div', { className: 'score-report', attrs: { 'data-role': 'score-report' } });
    this.parameterChoice = select([], '', { 'data-role': 'score-parameter' });
    this.parameterChoice.addEventListener('change', () => this.showParameter());
    this.parameterPlot = new TimeSeriesPlot('Mean normalised error against a sampled parameter', '– (error/ℓ)', [], 'parameter (bin centre)', true);
    this.episodes = new ScoreEpisodeList((row) => void this.play(row));
    this.playing = h('p', { className: 'playing-line', attrs: { 'data-role': 'score-playing' } });
    this.calibration = new CalibrationView();
    this.root = h(
      'section',
      { className: 'screen scores-screen', attrs: { 'data-screen': 'scores' } },
      h('header', { className: 'screen-head' }, h('h2', { text: 'Scores' })),
      h('p', { className: 'screen-intro', text: "Score a model's predictions against a dataset's recorded episodes, or open a score or calibration report. A predictions folder holds one <episode id>.npz per episode with the predicted positions (LAYOUT.md, “Predictions folder”)." }),
      safetyCaution(safetyNotice),
      h(
        'div',
        { className: 'toolbar' },
        button('Dataset folder…', () => void this.chooseDataset(), { attrs: { 'data-role': 'score-dataset' } }),
        button('Predictions folder…', () => void this.choosePredictions(), { attrs: { 'data-role': 'score-predictions' } }),
        this.scoreButton,
        labelled('Score only the episodes that have a prediction', this.allowMissing),
        button('Open a score report…', () => void this.openReport(), { attrs: { 'data-role': 'score-open' } }),
        button('Open a calibration report…', () => void this.openCalibration(), { attrs: { 'data-role': 'calibration-open' } }),
      ),
      this.chosen,
      this.progress.bar,
      this.progress.text,
      this.status.root,
      this.report,
      this.calibration.root,
    );
    this.renderChosen();
  }

  hidden(): void {
    this.player.pause();
  }

  private async chooseFolder(purpose: 'dataset' | 'predictions' | 'report'): Promise<string | null> {
    try {
      return (await this.bridge.invoke('folder.choose', { purpose }))?.path ?? null;
    } catch (error) {
      this.status.error('Could not choose a folder', error);
      return null;
    }
  }

  private async chooseDataset(): Promise<void> {
    const path = await this.chooseFolder('dataset');
    if (!path) return;
    try {
      this.dataset = await this.bridge.invoke('dataset.summary', { path });
    } catch (error) {
      this.status.error(`Could not open ${path} as a dataset`, error);
      return;
    }
    this.datasetPath = path;
    this.scene = null;
    if (this.dataset.seedFilePath) {
      try {
        this.scene = datasetScene((await this.bridge.invoke('seed.read', { path: this.dataset.seedFilePath })).scenarioText);
      } catch {
        // The seed file only adds the ground, the fluid and material names; play without them.
      }
    }
    this.renderChosen();
  }

  private async choosePredictions(): Promise<void> {
    const path = await this.chooseFolder('predictions');
    if (!path) return;
    this.predictionsPath = path;
    this.renderChosen();
  }

  private renderChosen(): void {
    const facts: [string, string][] = [
      ['dataset', this.dataset ? `${this.dataset.title} — ${this.datasetPath}` : 'not chosen'],
      ['predictions', this.predictionsPath ?? 'not chosen'],
    ];
    this.chosen.replaceChildren(...facts.flatMap(([k, v]) => [h('dt', { text: k }), h('dd', { text: v })]));
    this.scoreButton.disabled = !this.datasetPath || !this.predictionsPath || this.progress.following;
  }

  private async begin(): Promise<void> {
    if (!this.datasetPath || !this.predictionsPath) return;
    const outDir = await this.chooseFolder('report');
    if (!outDir) return;
    this.progress.reset('Starting the score…');
    this.scoreButton.disabled = true;
    try {
      const started = await this.bridge.invoke('score.begin', { datasetPath: this.datasetPath, predictionsPath: this.predictionsPath, outDir, allowMissing: this.allowMissing.checked });
      this.progress.follow(started.jobId);
      this.report.setAttribute('data-pending', outDir);
    } catch (error) {
      this.status.error('Could not start the score', error);
      this.renderChosen();
    }
  }

  private async jobEnded(p: JobProgress): Promise<void> {
    this.renderChosen();
    const outDir = this.report.getAttribute('data-pending');
    this.report.removeAttribute('data-pending');
    if (p.state !== 'done' || !outDir) {
      this.status.show('error', p.message ?? `The score job ended: ${p.state}.`);
      return;
    }
    await this.read(outDir);
  }

  private async openReport(): Promise<void> {
    const path = await this.chooseFolder('report');
    if (path) await this.read(path);
  }

  private async read(path: string): Promise<void> {
    this.status.show('busy', `Reading the score report in ${path}…`);
    let report: ScoreReport;
    try {
      report = await this.bridge.invoke('score.read', { path });
    } catch (error) {
      this.status.error(`Could not read a score report in ${path}`, error);
      return;
    }
    this.show(report);
    this.report.setAttribute('data-loaded', report.path);
    this.status.show('ok', `Scored ${report.score.episodes.length} episodes of ${report.score.dataset.name} predicted by ${report.score.predictions.model || 'an unnamed model'}.`);
  }

  private show(report: ScoreReport): void {
    const score = report.score;
    this.score = score;
    const facts: [string, string][] = [
      ['model', `${score.predictions.model || 'unnamed'}${score.predictions.description ? ` — ${score.predictions.description}` : ''}`],
      ['dataset', `${score.dataset.name} (seed ${score.dataset.masterSeed}, ${score.dataset.episodeCount} episodes)`],
      ['scored splits', score.settings.splits.join(', ')],
      ...(score.predictions.missing.length > 0
        ? [['not predicted', `${score.predictions.missing.length === 1 ? '1 episode has' : `${score.predictions.missing.length} episodes have`} no prediction file and ${score.predictions.missing.length === 1 ? 'is' : 'are'} left out: ${score.predictions.missing.map((m) => m.id).join(', ')}`] as [string, string]]
        : []),
      ['report folder', report.path],
    ];
    this.parameterChoice.replaceChildren(...score.parameters.map((p, i) => h('option', { text: `${p.label}${p.unit && p.unit !== '1' ? `, ${p.unit}` : ''}`, attrs: { value: String(i) } })));
    this.report.replaceChildren(
      h('dl', { className: 'facts' }, ...facts.flatMap(([k, v]) => [h('dt', { text: k }), h('dd', { text: v })])),
      h('h3', { text: 'Per split' }),
      splitTable(score),
      this.horizonPlot.root,
      h('h3', { text: 'Generalisation gap' }),
      gapTable(score),
      h('h3', { text: 'Where the model breaks' }),
      score.parameters.length > 0 ? labelled('Parameter', this.parameterChoice) : h('p', { className: 'score-note', text: 'No sampled parameter varies between the scored episodes.' }),
      score.parameters.length > 0 ? this.parameterPlot.root : h('span'),
      this.episodes.root,
      this.playing,
      this.player.root,
    );
    this.showHorizons(score);
    this.showParameter();
    this.episodes.show(score);
  }

  private showHorizons(score: ScoreDocumentView): void {
    const splits = Object.entries(score.splits);
    const longest = Math.max(0, ...splits.map(([, g]) => g.meanRmseByStepM.length));
    const interval = splits.every(([, g]) => g.recordIntervalS !== null && g.recordIntervalS === splits[0][1].recordIntervalS) && splits.length > 0 ? splits[0][1].recordIntervalS! : 1;
    const x = Array.from({ length: longest }, (_, hStep) => hStep * interval);
    // uPlot draws null as a gap: a split with shorter episodes simply ends.
    const values = splits.map(([, g]) => Array.from({ length: longest }, (_, hStep) => (hStep < g.meanRmseByStepM.length ? g.meanRmseByStepM[hStep] : null)) as unknown as number[]);
    this.horizonPlot.setData(x, values, splits.map(([split], i) => ({ label: split, colour: SPLIT_COLOURS[i % SPLIT_COLOURS.length] })));
  }

  private showParameter(): void {
    const score = this.score;
    if (!score || score.parameters.length === 0) return;
    const parameter = score.parameters[Number(this.parameterChoice.value) || 0];
    const centres = parameter.edges.slice(0, -1).map((edge, i) => 0.5 * (edge + parameter.edges[i + 1]));
    const splits = Object.entries(parameter.splits);
    this.parameterPlot.setData(
      centres,
      splits.map(([, bins]) => bins.meanNormalisedError as unknown as number[]),
      splits.map(([split], i) => ({ label: split, colour: SPLIT_COLOURS[i % SPLIT_COLOURS.length] })),
    );
    this.parameterPlot.root.querySelector('figcaption')!.textContent = `Mean normalised error against ${parameter.label}${parameter.unit && parameter.unit !== '1' ? `, ${parameter.unit}` : ''} (bin centres)`;
  }

  private async play(row: ScoreEpisodeRow): Promise<void> {
    if (!this.datasetPath || !this.predictionsPath) {
      this.status.show('error', `To play ${row.id} with its prediction, choose the dataset folder and the predictions folder this report was made from.`);
      return;
    }
    this.status.show('busy', `Loading episode ${row.id} and its prediction…`);
    try {
      const [recorded, predicted, page] = await Promise.all([
        this.bridge.invoke('dataset.episodeArrays', { path: this.datasetPath, episodeId: row.id }),
        this.bridge.invoke('predictions.episodeArrays', { path: this.predictionsPath, episodeId: row.id }),
        this.bridge.invoke('dataset.episodes', { path: this.datasetPath, offset: 0, limit: 10, filter: { text: row.id } }),
      ]);
      const episode = playableEpisode(recorded);
      if (this.scene && this.scene.materialNames.length >= episode.topology.materialNames.length) episode.topology.materialNames = this.scene.materialNames;
      const labels = page.rows.find((r) => r.episodeId === row.id)?.labels ?? {};
      this.player.load(episode.topology, episode.frames, episode.frameIntervalS, episodeWorld(this.scene, labels));
      const positions = predicted.arrays.find((a) => a.name === 'positions');
      if (!positions) throw new Error(`The predictions folder's ${row.id}.npz has no positions.`);
      const decoded = decodeArray(positions);
      this.player.compareWith(decoded instanceof Float32Array ? decoded : Float32Array.from(decoded));
      this.playing.textContent = `Playing ${row.id} (${row.split}): the prediction coloured by its distance from the recording (grey outline); largest error ${Number((this.player.comparisonLimitM ?? 0).toPrecision(3))} m.`;
      this.playing.setAttribute('data-episode', row.id);
      this.status.show('ok', 'Space plays and pauses, ← → step.');
      this.player.play();
    } catch (error) {
      this.status.error(`Could not play ${row.id} with its prediction`, error);
    }
  }

  private async openCalibration(): Promise<void> {
    const path = await this.chooseFolder('report');
    if (!path) return;
    this.status.show('busy', `Reading the calibration report in ${path}…`);
    try {
      this.calibration.show(await this.bridge.invoke('calibration.read', { path }));
      this.status.show('ok', `Opened the calibration report in ${path}.`);
    } catch (error) {
      this.status.error(`Could not read a calibration report in ${path}`, error);
    }
  }
}
