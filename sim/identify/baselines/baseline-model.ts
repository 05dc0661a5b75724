// The model file `pliant baseline fit` writes and `pliant baseline predict` reads: which
// baseline, fitted on which dataset (name, master seed) and which episodes, with its fitted
// numbers. Plain JSON so a person or another program can read the operator or the estimates.
import type { EpisodeIdentification } from './grey-box-identify.ts';
import type { LinearStateForm } from './linear-state.ts';

export const BASELINE_MODEL_FORMAT = 1;

export const BASELINE_MODEL_NAMES = ['persistence', 'constant-velocity', 'linear', 'grey-box'] as const;
export type BaselineModelName = (typeof BASELINE_MODEL_NAMES)[number];

export interface LinearGroup {
  nodeCount: number;
  channelCount: number;
  /** Ids of the episodes the group's operator was fitted on. */
  episodes: string[];
  snapshotCount: number;
  singularValues: number[];
  rank: number;
  rankTolerance: number;
  /** Spectral radius of the state-transition matrix; above 1 a rollout can grow without bound. */
  spectralRadius: number;
  oneStepRms: number;
  /** G = [A_0 … A_K  B  b], n rows × p columns, row-major. */
  operator: { rows: number; columns: number; data: number[] };
}

export interface LinearModelPart {
  delays: number;
  affine: boolean;
  stateForm: LinearStateForm;
  rankRule: string;
  groups: LinearGroup[];
}

export interface ParameterSummary {
  name: string;
  unit: string;
  episodes: number;
  medianRelativeError: number | null;
  maxRelativeError: number | null;
  /** Largest |estimate − truth| over the episodes, in the parameter's unit (the measure for true zeros). */
  maxAbsoluteError: number | null;
}

export interface GreyBoxModelPart {
  episodes: EpisodeIdentification[];
  summary: ParameterSummary[];
  /** Why estimates may be unreliable (coarse recording, missing force terms), one line each. */
  warnings: string[];
}

export interface BaselineModel {
  baselineModelFormat: number;
  model: BaselineModelName;
  pliantVersion: string;
  dataset: { name: string; masterSeed: string; episodeCount: number; exportDtype: string };
  fittedOn: { splits: string[]; episodes: string[] };
  safetyCaution: string;
  linear?: LinearModelPart;
  greyBox?: GreyBoxModelPart;
}
