// A 3-D view with everything needed to watch one trajectory: the stage, the body, the colour
// mode and its legend, what parts to draw, the playback bar and a draw-rate readout. The Preview
// and Datasets screens each own one. While playing it runs one requestAnimationFrame loop that
// moves the body in place; paused, it draws only on change.
import { PlaybackBar } from '../playback/playback-bar.ts';
import { PlaybackClock } from '../playback/playback-clock.ts';
import type { TrajectoryFrames } from '../playback/trajectory-frames.ts';
import { h, labelled, select } from '../ui/element.ts';
import type { BodyTopology } from './body-topology.ts';
import type { ColourMode } from './body-view.ts';
import { BodyView } from './body-view.ts';
import { renderColourLegend } from './colour-legend.ts';
import type { StageWorld } from './scene-view.ts';
import { SceneView } from './scene-view.ts';

const STRAIN_LIMITS = [0.01, 0.05, 0.2] as const;
/** Frames remembered per one-second measuring window (enough for a 240 Hz display). */
const RATE_WINDOW_CAPACITY = 256;

export class TrajectoryPlayer {
  readonly root: HTMLElement;
  readonly scene: SceneView;
  private readonly bar: PlaybackBar;
  private readonly legend: HTMLElement;
  private readonly colourMode: HTMLSelectElement;
  private readonly strainLimit: HTMLSelectElement;
  private readonly showNodes: HTMLInputElement;
  private readonly showSprings: HTMLInputElement;
  private readonly showFaces: HTMLInputElement;
  private readonly showTiming: HTMLInputElement;
  private readonly rateReadout: HTMLElement;
  private body: BodyView | null = null;
  private frames: TrajectoryFrames | null = null;
  private clock: PlaybackClock | null = null;
  private shownFrame = -1;
  private framed = false;
  private world: StageWorld = { ground: { enabled: false, heightM: 0 }, fluid: { enabled: false } };
  private looping = false;
  private lastTickMs = 0;
  private rateWindowStartMs = 0;
  private rateWindowFrames = 0;
  /** Update cost of each frame in the current window, ms; the median is reported, because one
   *  frame where the operating system ran something else says nothing about the page. */
  private readonly windowUpdateMs = new Float64Array(RATE_WINDOW_CAPACITY);
  private readonly windowSorted = new Float64Array(RATE_WINDOW_CAPACITY);
  private windowUpdates = 0;
  private rateWindowRenderMs = 0;
  private rateWindowRenders = 0;
  private readonly frameListeners: ((frame: number) => void)[] = [];
  /** A model's prediction of the loaded recording, drawn as the body while the recording is a ghost. */
  private comparison: { positionsM: Float32Array; ghost: BodyView; errorM: Float32Array; limitM: number } | null = null;
  private readonly errorOption: HTMLOptionElement;

  constructor() {
    const stageHost = h('div', { className: 'stage', attrs: { 'data-role': 'stage' } });
    this.scene = new SceneView(stageHost);
    this.rateReadout = h('div', { className: 'draw-rate', attrs: { 'data-role': 'draw-rate' }, text: 'paused' });
    // The timing readout is for whoever measures the drawing; off, it covers none of the view.
    this.rateReadout.hidden = true;
    stageHost.append(this.rateReadout);
    this.legend = h('div', { className: 'legend', attrs: { 'data-role': 'legend' } });
    this.colourMode = select([['material', 'Material'], ['actuator', 'Actuator level'], ['strain', 'Strain'], ['error', 'Prediction error']], 'material', { 'data-role': 'colour-mode' });
    this.errorOption = this.colourMode.querySelector('option[value="error"]')!;
    this.errorOption.disabled = true;
    this.strainLimit = select(STRAIN_LIMITS.map((v) => [String(v), `±${v * 100} %`] as const), '0.05', { 'data-role': 'strain-limit' });
    this.showNodes = checkbox(true, 'show-nodes');
    this.showSprings = checkbox(true, 'show-springs');
    this.showFaces = checkbox(true, 'show-faces');
    this.showTiming = checkbox(false, 'show-timing');
    this.showTiming.addEventListener('change', () => {
      this.rateReadout.hidden = !this.showTiming.checked;
    });
    for (const control of [this.colourMode, this.strainLimit]) control.addEventListener('change', () => this.recolour());
    for (const box of [this.showNodes, this.showSprings, this.showFaces]) box.addEventListener('change', () => this.applyVisibility());
    const options = h(
      'div',
      { className: 'view-options' },
      labelled('Colour by', this.colourMode),
      labelled('Strain scale', this.strainLimit),
      labelled('Nodes', this.showNodes),
      labelled('Springs', this.showSprings),
      labelled('Cell skin', this.showFaces),
      labelled('Frame timing', this.showTiming),
    );
    this.bar = new PlaybackBar({ changed: () => this.afterClockChange() });
    this.root = h('div', { className: 'player' }, h('div', { className: 'stage-row' }, stageHost, h('aside', { className: 'stage-side' }, options, this.legend)), this.bar.root);
    this.recolour();
  }

  /** Shows a new trajectory; frames may still be arriving (see framesArrived). */
  load(topology: BodyTopology, frames: TrajectoryFrames, frameIntervalS: number, world: StageWorld): void {
    this.dropComparison();
    this.body = new BodyView(topology);
    this.frames = frames;
    this.world = world;
    this.clock = new PlaybackClock(frameIntervalS, frames.frameCount);
    this.shownFrame = -1;
    this.framed = false;
    this.scene.setBody(this.body);
    this.scene.setWorld(world);
    this.showFaces.disabled = !this.body.hasFaces;
    this.applyVisibility();
    this.recolour();
    this.bar.setClock(this.clock, frames.filled);
    this.framesArrived();
  }

  /**
   * Plays a model's prediction of the loaded recording: `predictedM` has the recording's layout
   * (frames × nodes × 3, m). The prediction is drawn as the body, coloured by each node's
   * distance from the recording (up to the largest in the episode), and the recording as a grey
   * outline under it.
   */
  compareWith(predictedM: Float32Array): void {
    if (!this.body || !this.frames) return;
    if (predictedM.length !== this.frames.positionsM.length) {
      throw new RangeError(`the prediction holds ${predictedM.length / 3} node positions but the recording ${this.frames.positionsM.length / 3}; they must have the same frames and nodes`);
    }
    this.dropComparison();
    const truth = this.frames.positionsM;
    let limitM = 0;
    for (let i = 0; i < truth.length; i += 3) {
      const d = Math.hypot(predictedM[i] - truth[i], predictedM[i + 1] - truth[i + 1], predictedM[i + 2] - truth[i + 2]);
      if (d > limitM) limitM = d;
    }
    const ghost = new BodyView(this.body.topology, { ghost: true });
    this.comparison = { positionsM: predictedM, ghost, errorM: new Float32Array(this.frames.nodeCount), limitM };
    this.scene.setOverlay(ghost);
    this.errorOption.disabled = false;
    this.colourMode.value = 'error';
    this.root.setAttribute('data-comparison', 'on');
    this.recolour();
    const frame = Math.max(0, this.shownFrame);
    this.shownFrame = -1;
    this.showFrame(frame);
  }

  /** The largest node error of the compared prediction, m; null without one. */
  get comparisonLimitM(): number | null {
    return this.comparison?.limitM ?? null;
  }

  private dropComparison(): void {
    if (!this.comparison) return;
    this.comparison = null;
    this.scene.setOverlay(null);
    this.errorOption.disabled = true;
    if (this.colourMode.value === 'error') this.colourMode.value = 'material';
    this.root.removeAttribute('data-comparison');
  }

  clear(): void {
    this.dropComparison();
    this.stopLoop();
    this.body = null;
    this.frames = null;
    this.clock = null;
    this.scene.setBody(null);
    this.bar.setClock(null, 0);
  }

  /** Call after frames were added to the loaded trajectory. */
  framesArrived(): void {
    if (!this.frames || !this.body) return;
    this.bar.setAvailable(this.frames.filled);
    if (this.frames.filled > 0 && !this.framed) {
      // Frame the camera on the first frame, with room for the motion to come.
      this.scene.frame(BodyView.frameBounds(this.frames.positionsM, 0, this.frames.nodeCount), this.world.ground.heightM);
      this.framed = true;
    }
    if (this.shownFrame < 0 && this.frames.filled > 0) this.showFrame(0);
  }

  get currentFrame(): number {
    return this.clock?.frame ?? 0;
  }

  play(): void {
    if (!this.clock || this.clock.playing) return;
    this.clock.toggle();
    this.afterClockChange();
  }

  /** Plays from the first frame. */
  restart(): void {
    if (!this.clock || !this.frames) return;
    this.clock.seek(0, this.frames.filled);
    if (!this.clock.playing) this.clock.toggle();
    this.afterClockChange();
  }

  pause(): void {
    if (!this.clock || !this.clock.playing) return;
    this.clock.toggle();
    this.afterClockChange();
  }

  /** Called with the shown frame whenever it changes. */
  onFrame(listener: (frame: number) => void): void {
    this.frameListeners.push(listener);
  }

  private afterClockChange(): void {
    if (!this.clock) return;
    this.bar.sync();
    if (this.clock.frame !== this.shownFrame) this.showFrame(this.clock.frame);
    if (this.clock.playing) this.startLoop();
    else this.stopLoop();
  }

  private startLoop(): void {
    if (this.looping) return;
    this.looping = true;
    this.lastTickMs = performance.now();
    this.startRateWindow(this.lastTickMs);
    requestAnimationFrame(this.tick);
  }

  private stopLoop(): void {
    this.looping = false;
    this.rateReadout.textContent = 'paused';
  }

  private readonly tick = (nowMs: number): void => {
    if (!this.looping || !this.clock || !this.frames) return;
    const elapsedS = Math.min(0.25, Math.max(0, (nowMs - this.lastTickMs) / 1000));
    this.lastTickMs = nowMs;
    const updateStartMs = performance.now();
    if (this.clock.advance(elapsedS, this.frames.filled)) {
      this.showFrame(this.clock.frame);
      this.bar.sync();
    }
    if (this.windowUpdates < RATE_WINDOW_CAPACITY) this.windowUpdateMs[this.windowUpdates++] = performance.now() - updateStartMs;
    this.rateWindowFrames++;
    if (nowMs - this.rateWindowStartMs >= 1000) this.reportRate(nowMs);
    if (!this.clock.playing) {
      this.stopLoop();
      this.bar.sync();
      return;
    }
    requestAnimationFrame(this.tick);
  };

  private startRateWindow(nowMs: number): void {
    this.rateWindowStartMs = nowMs;
    this.rateWindowFrames = 0;
    this.windowUpdates = 0;
    this.rateWindowRenderMs = this.scene.renderMsTotal;
    this.rateWindowRenders = this.scene.renderCount;
  }

  /**
   * Shows how many frames per second reach the screen and what each costs this page: moving the
   * body's buffers in place, and issuing the draw. Where the rate falls short while both costs
   * stay small, the graphics driver is the limit, not Pliant.
   */
  private reportRate(nowMs: number): void {
    const rate = (1000 * this.rateWindowFrames) / (nowMs - this.rateWindowStartMs);
    const count = this.windowUpdates;
    const sorted = this.windowSorted.subarray(0, count);
    sorted.set(this.windowUpdateMs.subarray(0, count));
    sorted.sort();
    const updateMs = count > 0 ? sorted[count >> 1] : 0;
    const renders = this.scene.renderCount - this.rateWindowRenders;
    const drawMs = (this.scene.renderMsTotal - this.rateWindowRenderMs) / Math.max(1, renders);
    this.rateReadout.textContent = `drawing ${rate.toFixed(0)} frames/s · per frame: update ${updateMs.toFixed(2)} ms (median) + draw ${drawMs.toFixed(2)} ms`;
    this.rateReadout.setAttribute('data-rate', rate.toFixed(1));
    this.rateReadout.setAttribute('data-update-ms', updateMs.toFixed(3));
    this.rateReadout.setAttribute('data-draw-ms', drawMs.toFixed(3));
    this.startRateWindow(nowMs);
  }

  private showFrame(frame: number): void {
    const body = this.body;
    const frames = this.frames;
    if (!body || !frames || frame >= frames.filled) return;
    const offset = frames.positionOffset(frame);
    const comparison = this.comparison;
    const shownPositions = comparison ? comparison.positionsM : frames.positionsM;
    body.showPositions(shownPositions, offset);
    comparison?.ghost.showPositions(frames.positionsM, offset);
    const mode = this.colourMode.value as ColourMode;
    if (mode === 'error' && comparison) {
      this.measureError(comparison, offset);
      body.showNodeMagnitudes(comparison.errorM, comparison.limitM);
    } else if (mode !== 'material' || this.shownFrame < 0) {
      // Material colours do not change over time; recolour only when the frame matters.
      body.showColours(mode, shownPositions, offset, frames.controls, frames.controlOffset(frame), Number(this.strainLimit.value));
    }
    this.shownFrame = frame;
    this.root.setAttribute('data-frame', String(frame));
    this.scene.requestRender();
    for (const listener of this.frameListeners) listener(frame);
  }

  private measureError(comparison: NonNullable<TrajectoryPlayer['comparison']>, offset: number): void {
    const truth = this.frames!.positionsM;
    const predicted = comparison.positionsM;
    const error = comparison.errorM;
    for (let i = 0; i < error.length; i++) {
      const p = offset + 3 * i;
      const dx = predicted[p] - truth[p];
      const dy = predicted[p + 1] - truth[p + 1];
      const dz = predicted[p + 2] - truth[p + 2];
      error[i] = Math.sqrt(dx * dx + dy * dy + dz * dz);
    }
  }

  private recolour(): void {
    const mode = this.colourMode.value as ColourMode;
    this.strainLimit.disabled = mode !== 'strain';
    renderColourLegend(this.legend, mode, this.body?.topology.materialNames ?? [], Number(this.strainLimit.value), this.comparison?.limitM ?? 0, this.body?.materialCount ?? 0);
    if (this.body && this.frames && this.shownFrame >= 0) {
      const offset = this.frames.positionOffset(this.shownFrame);
      const comparison = this.comparison;
      if (mode === 'error' && comparison) {
        this.measureError(comparison, offset);
        this.body.showNodeMagnitudes(comparison.errorM, comparison.limitM);
      } else {
        this.body.showColours(mode, comparison ? comparison.positionsM : this.frames.positionsM, offset, this.frames.controls, this.frames.controlOffset(this.shownFrame), Number(this.strainLimit.value));
      }
      this.scene.requestRender();
    }
  }

  private applyVisibility(): void {
    this.body?.setVisibility({ nodes: this.showNodes.checked, springs: this.showSprings.checked, faces: this.showFaces.checked });
    this.scene.requestRender();
  }
}

function checkbox(checked: boolean, role: string): HTMLInputElement {
  const box = document.createElement('input');
  box.type = 'checkbox';
  box.checked = checked;
  box.setAttribute('data-role', role);
  return box;
}
