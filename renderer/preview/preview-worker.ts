// The Preview screen's Web Worker: checks the sweep, draws the requested episodes with the
// sampler generate uses, and simulates the chosen one with the environment-free core, posting
// frames back in chunks of about a screen refresh's worth of work so playback can start at once.
// One run at a time; a newer request or a stop ends the current one at its next chunk.
import { ENERGY_TERM_COUNT } from '../../sim/core/energy.ts';
import { sampleEpisode } from '../../sim/scenario/sample-episode.ts';
import type { SampledEpisode } from '../../sim/scenario/sampled-episode.ts';
import { checkedScenario } from './checked-scenario.ts';
import { EpisodeStepper } from './episode-stepper.ts';
import { modelTopology, topologyBuffers } from './model-topology.ts';
import type { FromPreviewWorker, PreviewEpisodeSummary, ToPreviewWorker } from './preview-worker-protocol.ts';

/** The parts of a dedicated worker's global scope used here (the DOM lib types `self` as a Window). */
interface PreviewWorkerScope {
  postMessage(message: FromPreviewWorker, transfer?: Transferable[]): void;
  addEventListener(type: 'message', listener: (event: MessageEvent<ToPreviewWorker>) => void): void;
}

const scope = self as unknown as PreviewWorkerScope;

/** Wall-clock budget of one chunk, ms: short enough that a stop is noticed quickly. */
const CHUNK_BUDGET_MS = 40;

let activeRequest = -1;

scope.addEventListener('message', (event) => {
  const message = event.data;
  if (message.type === 'stop') {
    if (message.requestId === activeRequest) activeRequest = -1;
    return;
  }
  activeRequest = message.requestId;
  try {
    if (message.type === 'sample') sample(message.requestId, message.scenarioText, message.fileName, message.episodeIndices);
    else run(message.requestId, message.scenarioText, message.fileName, message.episodeIndex);
  } catch (error) {
    scope.postMessage({ type: 'refused', requestId: message.requestId, message: (error as Error).message });
  }
});

function sample(requestId: number, text: string, fileName: string, indices: number[]): void {
  const checked = checkedScenario(text, fileName);
  if (!checked.ok) {
    scope.postMessage({ type: 'refused', requestId, message: checked.message });
    return;
  }
  const episodes = indices.filter((i) => i < checked.scenario.episodes).map((i) => summarise(sampleEpisode(checked.scenario, i)));
  scope.postMessage({ type: 'sampled', requestId, episodes });
}

function run(requestId: number, text: string, fileName: string, index: number): void {
  const checked = checkedScenario(text, fileName);
  if (!checked.ok) {
    scope.postMessage({ type: 'refused', requestId, message: checked.message });
    return;
  }
  if (!(index >= 0 && index < checked.scenario.episodes)) {
    scope.postMessage({ type: 'refused', requestId, message: `episode ${index} is not in this sweep: it has episodes 0 to ${checked.scenario.episodes - 1}` });
    return;
  }
  const episode = sampleEpisode(checked.scenario, index);
  const stepper = new EpisodeStepper(episode.system.model, episode.world, episode.controls, episode.recording);
  const topology = modelTopology(episode.system);
  const world = episode.world;
  scope.postMessage(
    {
      type: 'started',
      requestId,
      episode: summarise(episode, stepper),
      topology,
      world: { ground: { enabled: world.ground.enabled, heightM: world.ground.heightM }, fluid: { enabled: world.fluid.enabled }, obstacles: world.obstacles },
      frameCount: stepper.frameCount,
    },
    topologyBuffers(topology),
  );
  const startedMs = performance.now();
  // Chunk size adapts so each chunk takes about the budget, whatever the system's size.
  let framesPerChunk = 1;
  const channels = episode.system.model.controlChannelCount;
  const n3 = episode.system.model.nodeCount * 3;
  const next = (): void => {
    if (activeRequest !== requestId) return;
    const first = stepper.framesDone;
    const count = Math.min(framesPerChunk, stepper.frameCount - first);
    const positionsM = new Float32Array(count * n3);
    const timeS = new Float64Array(count);
    const energiesJ = new Float64Array(count * ENERGY_TERM_COUNT);
    const chunkStartMs = performance.now();
    let written: number;
    try {
      written = stepper.advance(count, positionsM, timeS, energiesJ);
    } catch (error) {
      scope.postMessage({ type: 'failed', requestId, message: (error as Error).message, framesDone: stepper.framesDone });
      activeRequest = -1;
      return;
    }
    const tookMs = performance.now() - chunkStartMs;
    const intervals = Math.max(0, Math.min(first + written, stepper.steps) - first);
    const controls = episode.controls.slice(first * channels, (first + intervals) * channels);
    scope.postMessage({ type: 'frames', requestId, first, count: written, positionsM, timeS, energiesJ, controls }, [positionsM.buffer, timeS.buffer, energiesJ.buffer, controls.buffer]);
    if (stepper.framesDone >= stepper.frameCount) {
      scope.postMessage({ type: 'finished', requestId, wallS: (performance.now() - startedMs) / 1000 });
      activeRequest = -1;
      return;
    }
    framesPerChunk = Math.max(1, Math.min(500, Math.round((framesPerChunk * CHUNK_BUDGET_MS) / Math.max(1, tookMs))));
    setTimeout(next, 0);
  };
  next();
}

function summarise(episode: SampledEpisode, stepper?: EpisodeStepper): PreviewEpisodeSummary {
  const model = episode.system.model;
  const probe = stepper ?? new EpisodeStepper(model, episode.world, episode.controls, episode.recording);
  const labels: Record<string, string> = {};
  for (const [pointer, value] of Object.entries(episode.labels)) labels[pointer] = typeof value === 'number' ? formatLabel(value) : JSON.stringify(value);
  return {
    index: episode.index,
    split: episode.split,
    kind: episode.system.kind,
    nodeCount: model.nodeCount,
    springCount: model.springCount,
    cellCount: model.cellCount,
    recordedSteps: episode.recording.recordedSteps,
    recordIntervalS: episode.recording.recordIntervalS,
    substeps: probe.substeps,
    dtS: probe.dtS,
    criticalDtS: probe.criticalDtS,
    labels,
    channels: episode.system.controlChannels.map((c) => ({ name: c.name, unit: c.unit, description: c.description })),
  };
}

function formatLabel(value: number): string {
  return Number.isInteger(value) ? String(value) : String(Number(value.toPrecision(6)));
}
