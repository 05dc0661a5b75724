// The manifest's shape: everything a reader needs to trust and use a dataset folder without
// running Pliant — the resolved scenario, one record per episode with its sampled labels and
// status, and for every file its SHA-256, size and arrays. Everything outside `run` is a pure
// function of the seed file, so two runs of the same seed write the same manifest apart from
// `run`.
import type { BlowUpKind } from '../../core/simulation-error.ts';
import type { CompressionLevels, ExportCompression } from '../../scenario/export-compression.ts';
import type { LabelValue } from '../../scenario/sampled-episode.ts';
import type { ControlChannelInfo } from '../../systems/control-channel.ts';
import type { ColumnMoments } from './column-moments.ts';
import type { CatalogueDtype } from './episode-array-catalogue.ts';

export const MANIFEST_FORMAT_VERSION = 1;

export type ExportFormat = 'npz' | 'hdf5' | 'both';
export type ExportDtype = 'float32' | 'float64';
export type StoredDtype = 'float32' | 'float64' | Exclude<CatalogueDtype, 'float'>;

/** The name, stored dtype and shape of one array in an episode's file. */
export interface ArrayLayout {
  name: string;
  dtype: StoredDtype;
  shape: number[];
}

export interface ArrayRecord {
  /** Name inside the file: the NPZ member without ".npy", or the HDF5 dataset path. */
  name: string;
  dtype: StoredDtype;
  shape: number[];
  unit: string;
  meaning: string;
}

export interface FileRecord {
  /** Path relative to the dataset folder, with '/' separators. */
  path: string;
  sha256: string;
  sizeBytes: number;
}

export interface DataFileRecord extends FileRecord {
  kind: 'episode-npz' | 'split-hdf5';
  split: string;
  /** Ids of the episodes the file holds, ascending. */
  episodes: string[];
  arrays: ArrayRecord[];
}

export interface InputFileRecord extends FileRecord {
  kind: 'input';
  /** The file name as the scenario writes it. */
  scenarioPath: string;
}

export interface EpisodeRejection {
  kind: BlowUpKind;
  /** Recorded step at which the run stopped (0 = the initial state). */
  step: number;
  node: number;
  spring: number | null;
  /** Offending value: stretch ratio, speed in m/s, or null for non-finite values. */
  value: number | null;
  dtS: number;
  criticalDtS: number;
  message: string;
  likelyCause: string;
}

export interface EpisodeSimulation {
  nodeCount: number;
  springCount: number;
  cellCount: number;
  substeps: number;
  dtS: number;
  criticalDtS: number;
  recordIntervalS: number;
  recordedSteps: number;
}

/** The arrays a split's normalisation statistics cover; the last axis is the column. */
export const NORMALISED_ARRAYS = ['positions', 'velocities', 'controls'] as const;
export type NormalisedArrayName = (typeof NORMALISED_ARRAYS)[number];

/** One array's statistics over a split, per column, population standard deviation. */
export interface ColumnStatistics {
  count: number;
  mean: number[];
  std: number[];
  min: number[];
  max: number[];
}

export interface EpisodeRecord {
  id: string;
  index: number;
  split: string;
  /** The episode is regenerated from (masterSeed, index) alone. */
  seed: { masterSeed: string; episodeIndex: number };
  status: 'ok' | 'rejected';
  rejection: EpisodeRejection | null;
  systemKind: 'chain' | 'lattice';
  /** Every sampled value, keyed by the JSON pointer of its place in the scenario. */
  labels: Record<string, LabelValue>;
  simulation: EpisodeSimulation;
  controlChannels: ControlChannelInfo[];
  /**
   * Per-column moments of the recorded arrays the normalisation statistics cover, as written
   * (recorded episodes only; absent in manifests written before them).
   */
  arrayMoments?: Partial<Record<NormalisedArrayName, ColumnMoments>>;
  /** Paths of the data files that hold this episode (none when rejected). */
  files: string[];
}

export interface ShardRecord {
  index: number;
  count: number;
}

export interface DatasetManifest {
  manifestFormat: number;
  pliantVersion: string;
  name: string;
  description: string;
  masterSeed: string;
  episodeCount: number;
  /** Set when this folder holds one shard of an array job; null for a whole dataset. */
  shard: ShardRecord | null;
  /**
   * `compression` and the levels it stands for (sim/scenario/export-compression.ts); absent in
   * manifests written before the choice existed, whose files used the levels of "small".
   */
  export: { format: ExportFormat; dtype: ExportDtype; compression?: ExportCompression; levels?: CompressionLevels };
  /** Episodes per split, ok and rejected. */
  splits: Record<string, { ok: number; rejected: number }>;
  /**
   * Per split, the statistics of each normalised array over its recorded episodes (an array
   * whose column count differs between episodes is left out); absent in older manifests.
   */
  normalisation?: Record<string, Partial<Record<NormalisedArrayName, ColumnStatistics>>>;
  scenario: unknown;
  episodes: EpisodeRecord[];
  /** SHA-256 over the episode records (episode-records-digest.ts); absent in older manifests. */
  episodeRecordsSha256?: string;
  files: DataFileRecord[];
  /** seed.json, CARD.md and copied inputs, with their checksums. */
  documents: (FileRecord | InputFileRecord)[];
  /** When, where and how this copy was made. No checksum covers it; it differs between runs. */
  run: Record<string, unknown>;
}

/** The members of the manifest that come before its per-episode and per-file lists. */
export type ManifestHead = Omit<DatasetManifest, 'episodes' | 'files' | 'documents' | 'run'>;
