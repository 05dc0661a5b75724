// The contract between sampling and everything downstream: one episode of a sweep, fully
// determined by (scenario, master seed, episode index). The pipeline records it, the preview
// plays it, the manifest stores its labels.
import type { World } from '../core/world.ts';
import type { ObservationSettings } from '../episode/observe-trajectory.ts';
import type { RecordingSettings } from '../episode/record-episode.ts';
import type { BuiltSystem } from '../systems/built-system.ts';

/** A ground-truth label value: what the sampler drew for one parameter. */
export type LabelValue = number | string | boolean | null | LabelValue[] | { [key: string]: LabelValue };

export interface SampledEpisode {
  /** Index of the episode in the sweep, 0-based. */
  index: number;
  /** Master seed of the sweep, as a decimal string (up to 2^64 − 1). */
  masterSeed: string;
  /** Split the episode is assigned to (e.g. "train", "validation", "test", "held-out"). */
  split: string;
  /** The system to simulate, with its resolved physical parameters. */
  system: BuiltSystem;
  world: World;
  recording: RecordingSettings;
  /** Control sequence, recordedSteps × channelCount, in each channel's unit. */
  controls: Float64Array;
  /** What the scenario's sensor sees of this episode; null when the scenario has no observation block. */
  observation: ObservationSettings | null;
  /**
   * Every sampled value, keyed by the JSON pointer of its place in the scenario
   * (e.g. "/system/partCount", "/world/gravityMPerS2/1", "/controls/0/frequencyHz").
   */
  labels: Record<string, LabelValue>;
  /** Whether this episode is rerun at half the sub-step for a Richardson error estimate. */
  richardson: boolean;
}
