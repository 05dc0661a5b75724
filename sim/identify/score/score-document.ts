// The shape of score.json: everything a score run found, machine-readable, checked against
// SCORE_SCHEMA (score-schema.ts) before it is written. Numbers that cannot be computed (a ratio
// against 0, a drift without velocities) are null, never NaN.
import type { HeldOutRule } from '../../scenario/scenario-types.ts';
import type { EpisodeScoreRow } from './episode-score.ts';
import type { GapMetric } from './generalisation-gap.ts';
import type { ParameterBins } from './parameter-bins.ts';
import type { GroupSummary } from './split-summary.ts';

export const SCORE_FORMAT_VERSION = 1;

export interface ScoreDocument {
  scoreFormat: number;
  pliantVersion: string;
  caution: string;
  dataset: {
    name: string;
    masterSeed: string;
    episodeCount: number;
    manifestSha256: string;
    seedSha256: string | null;
  };
  predictions: {
    model: string;
    description: string;
    episodeFiles: number;
    /** Episodes of the scored splits with no prediction file (only with allowMissing), in index order. */
    missing: { id: string; split: string }[];
  };
  settings: {
    splits: string[];
    horizons: { horizon: string; steps: number | null; seconds: number | null }[];
    validPredictionTimeThreshold: number;
    error: 'rmse-per-node-euclidean';
    lengthScale: 'rms-radius-at-t0';
    energy: 'kinetic+elastic+gravitational+bending';
    parameterBins: number;
  };
  /** One row per scored episode, in index order. */
  episodes: EpisodeScoreRow[];
  splits: Record<string, GroupSummary>;
  overall: GroupSummary;
  generalisationGap: {
    against: string;
    entries: { split: string; rules: HeldOutRule[]; ruleText: string; metrics: GapMetric[] }[];
    /** Why there are no entries, or "". */
    note: string;
  };
  parameters: ParameterBins[];
}
