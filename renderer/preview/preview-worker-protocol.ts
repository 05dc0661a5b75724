// Messages between the Preview screen and its Web Worker (preview-worker.ts). The worker draws
// episodes from the sweep exactly as `generate` does for the same indices, simulates the chosen
// one and streams its frames back in chunks; typed arrays travel as transferred buffers.
import type { BodyTopology } from '../view/body-topology.ts';
import type { StageWorld } from '../view/scene-view.ts';

export interface PreviewEpisodeSummary {
  index: number;
  split: string;
  kind: 'chain' | 'lattice';
  nodeCount: number;
  springCount: number;
  cellCount: number;
  recordedSteps: number;
  recordIntervalS: number;
  substeps: number;
  /** Sub-step length, s, and the stability limit it must stay under, s. */
  dtS: number;
  criticalDtS: number;
  /** Sampled values by JSON pointer, shown as text. */
  labels: Record<string, string>;
  channels: { name: string; unit: string; description: string }[];
}

export type ToPreviewWorker =
  | { type: 'sample'; requestId: number; scenarioText: string; fileName: string; episodeIndices: number[] }
  | { type: 'run'; requestId: number; scenarioText: string; fileName: string; episodeIndex: number }
  | { type: 'stop'; requestId: number };

export type FromPreviewWorker =
  | { type: 'sampled'; requestId: number; episodes: PreviewEpisodeSummary[] }
  | { type: 'refused'; requestId: number; message: string }
  | { type: 'started'; requestId: number; episode: PreviewEpisodeSummary; topology: BodyTopology; world: StageWorld; frameCount: number }
  | {
      type: 'frames';
      requestId: number;
      first: number;
      count: number;
      /** count × nodes × 3, m. */
      positionsM: Float32Array;
      timeS: Float64Array;
      /** count × 3, J. */
      energiesJ: Float64Array;
      /** The controls of intervals first … first + count − 1 (those that exist), channels each. */
      controls: Float64Array;
    }
  | { type: 'finished'; requestId: number; wallS: number }
  | { type: 'failed'; requestId: number; message: string; framesDone: number };
