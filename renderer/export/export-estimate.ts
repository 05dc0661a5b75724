// What an export will write, worked out before it starts: the episode count, the episodes per
// split, an estimate of the folder's size and of the time it takes. The sampler generate uses
// draws the first episodes (all of them for a sweep of up to ESTIMATE_SAMPLE episodes, so the
// split counts are then exact; beyond, they are scaled up and say so); the size counts the bytes
// of the main arrays of those episodes, uncompressed; the time is one simulated episode's wall
// time times the episodes, shared among the workers. It runs in a Web Worker of its own (the
// Preview screen's worker code), so the screen never stalls.
import { ENERGY_BASE_COUNT } from '../../sim/core/energy.ts';
import { NODE_FEATURE_NAMES } from '../../sim/systems/graph-labels.ts';
import type { FromPreviewWorker, PreviewEpisodeSummary, ToPreviewWorker } from '../preview/preview-worker-protocol.ts';

/** Episodes drawn to count the splits and size the arrays. */
export const ESTIMATE_SAMPLE = 100;

export interface ExportEstimate {
  episodes: number;
  /** Episodes per split, exact when `exact`, else scaled from the sample and rounded. */
  splitCounts: Record<string, number>;
  exact: boolean;
  /** Bytes of the main arrays of every episode, uncompressed (compression makes the files smaller). */
  arrayBytes: number;
  /** Wall time of the export with `workers` workers, s. */
  timeS: number;
  /** Wall time of simulating one episode here, s. */
  episodeWallS: number;
}

export interface EstimateRequest {
  text: string;
  fileName: string;
  episodes: number;
  workers: number;
  /** Bytes of a stored float: 4 for float32, 8 for float64. */
  floatBytes: number;
}

export class ExportEstimator {
  private worker: Worker | null = null;
  private requestId = 0;
  private pending: { resolve: (e: ExportEstimate | string) => void; request: EstimateRequest; sampled: PreviewEpisodeSummary[] | null; id: number } | null = null;

  /** Resolves with the estimate, or with the reason there is none; a newer request answers the older with null. */
  estimate(request: EstimateRequest): Promise<ExportEstimate | string | null> {
    const worker = this.start();
    this.pending?.resolve('superseded');
    const id = ++this.requestId;
    worker.postMessage({ type: 'stop', requestId: id - 1 } satisfies ToPreviewWorker);
    const count = Math.min(ESTIMATE_SAMPLE, request.episodes);
    return new Promise((resolve) => {
      this.pending = { resolve: (e) => resolve(e === 'superseded' ? null : e), request, sampled: null, id };
      worker.postMessage({ type: 'sample', requestId: id, scenarioText: request.text, fileName: request.fileName, episodeIndices: Array.from({ length: count }, (_, i) => i) } satisfies ToPreviewWorker);
    });
  }

  private start(): Worker {
    if (this.worker) return this.worker;
    const worker = new Worker(new URL('../preview/preview-worker.ts', import.meta.url), { type: 'module', name: 'pliant-export-estimate' });
    worker.addEventListener('message', (event: MessageEvent<FromPreviewWorker>) => this.receive(event.data));
    worker.addEventListener('error', (event) => this.finish(`the estimating worker stopped: ${event.message || 'no reason given'}`));
    this.worker = worker;
    return worker;
  }

  private receive(message: FromPreviewWorker): void {
    const pending = this.pending;
    if (!pending || message.requestId !== pending.id) return;
    if (message.type === 'refused') this.finish(message.message);
    else if (message.type === 'failed') this.finish(`episode 0 could not be simulated: ${message.message}`);
    else if (message.type === 'sampled') {
      pending.sampled = message.episodes;
      const id = ++this.requestId;
      pending.id = id;
      this.worker!.postMessage({ type: 'run', requestId: id, scenarioText: pending.request.text, fileName: pending.request.fileName, episodeIndex: 0 } satisfies ToPreviewWorker);
    } else if (message.type === 'finished' && pending.sampled) {
      this.finish(summarise(pending.request, pending.sampled, message.wallS));
    }
  }

  private finish(result: ExportEstimate | string): void {
    const pending = this.pending;
    this.pending = null;
    pending?.resolve(result);
  }
}

function summarise(request: EstimateRequest, sampled: PreviewEpisodeSummary[], episodeWallS: number): ExportEstimate {
  const exact = sampled.length >= request.episodes;
  const scale = sampled.length > 0 ? request.episodes / sampled.length : 0;
  const counted: Record<string, number> = {};
  for (const e of sampled) counted[e.split] = (counted[e.split] ?? 0) + 1;
  const splitCounts: Record<string, number> = {};
  for (const split of ['train', 'validation', 'test', ...Object.keys(counted)]) if (!(split in splitCounts)) splitCounts[split] = Math.round((counted[split] ?? 0) * scale);
  let sampleBytes = 0;
  for (const e of sampled) sampleBytes += episodeArrayBytes(e, request.floatBytes);
  const workers = Math.max(1, request.workers);
  return {
    episodes: request.episodes,
    splitCounts,
    exact,
    arrayBytes: Math.round(sampleBytes * scale),
    timeS: (episodeWallS * request.episodes) / Math.min(workers, request.episodes || 1),
    episodeWallS,
  };
}

/**
 * Bytes of an episode's main arrays as the catalogue lays them out
 * (sim/dataset/episode-array-catalogue.ts): positions and velocities (T+1)×N×3, time, controls
 * T×C, energies, node features, and per spring its two ends (int32), relation (uint8), rest
 * length, stiffness and damping. The optional force arrays and the hinge and cell tables are left
 * out, which makes this a lower estimate for scenarios that record forces.
 */
export function episodeArrayBytes(e: Pick<PreviewEpisodeSummary, 'recordedSteps' | 'nodeCount' | 'springCount' | 'channels'>, floatBytes: number): number {
  const frames = e.recordedSteps + 1;
  const floats = 2 * frames * e.nodeCount * 3 + frames + e.recordedSteps * e.channels.length + frames * ENERGY_BASE_COUNT + e.nodeCount * NODE_FEATURE_NAMES.length + 3 * e.springCount;
  return floats * floatBytes + e.springCount * (2 * 4 + 1);
}
