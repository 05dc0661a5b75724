// Per-split (and overall) aggregates of episode scores. The error curve of a group is the mean
// over its episodes of each episode's RMSE(h) (and RMSE(h)/ℓ), step by step; steps beyond a
// shorter episode's end average over the episodes that have them. Scalar metrics get mean,
// median and 90th percentile over episodes. The curves are running sums, so memory grows with
// the episode length, not with the number of episodes; only the compact rows are kept.
import type { EpisodeScoreRow } from './episode-score.ts';
import type { HorizonSpec } from './horizons.ts';
import { type Statistics,statisticsOf } from './summary-statistics.ts';

export interface GroupSummary {
  episodes: number;
  /** Mean over episodes of RMSE(h), h = 0 … longest T, m. */
  meanRmseByStepM: number[];
  /** Mean over episodes of RMSE(h)/ℓ. */
  meanNormalisedErrorByStep: number[];
  /** Episodes contributing to each step. */
  episodesByStep: number[];
  /** The record interval when every episode of the group shares one, s; else null. */
  recordIntervalS: number | null;
  oneStepRmseM: Statistics | null;
  oneStepNormalisedError: Statistics | null;
  horizons: { horizon: string; rmseM: Statistics | null; normalisedError: Statistics | null }[];
  meanNormalisedError: Statistics | null;
  validPredictionTimeS: Statistics | null;
  /** Share of episodes whose error passed the threshold within the rollout. */
  validPredictionTimeReachedFraction: number | null;
  /** Over the episodes with predicted velocities. */
  energyDriftJ: Statistics | null;
  relativeEnergyDrift: Statistics | null;
  episodesWithVelocities: number;
}

export class GroupAccumulator {
  private rmseSum = new Float64Array(0);
  private normalisedSum = new Float64Array(0);
  private counts = new Float64Array(0);
  private interval: number | null | undefined = undefined;
  readonly rows: EpisodeScoreRow[] = [];

  add(row: EpisodeScoreRow, rmseM: Float64Array, normalised: Float64Array, recordIntervalS: number): void {
    const rows = row.recordedSteps + 1;
    if (this.rmseSum.length < rows) {
      const grow = (old: Float64Array) => {
        const next = new Float64Array(rows);
        next.set(old);
        return next;
      };
      this.rmseSum = grow(this.rmseSum);
      this.normalisedSum = grow(this.normalisedSum);
      this.counts = grow(this.counts);
    }
    for (let h = 0; h < rows; h++) {
      this.rmseSum[h] += rmseM[h];
      this.normalisedSum[h] += normalised[h];
      this.counts[h] += 1;
    }
    this.interval = this.interval === undefined || this.interval === recordIntervalS ? recordIntervalS : null;
    this.rows.push(row);
  }

  summary(horizons: readonly HorizonSpec[]): GroupSummary {
    const rows = this.rows;
    const steps = this.rmseSum.length;
    const meanRmse: number[] = [];
    const meanNormalised: number[] = [];
    const perStep: number[] = [];
    for (let h = 0; h < steps; h++) {
      meanRmse.push(this.rmseSum[h] / this.counts[h]);
      meanNormalised.push(this.normalisedSum[h] / this.counts[h]);
      perStep.push(this.counts[h]);
    }
    const withEnergy = rows.filter((r) => r.energyDriftJ !== null);
    const relative = withEnergy.filter((r) => r.relativeEnergyDrift !== null);
    return {
      episodes: rows.length,
      meanRmseByStepM: meanRmse,
      meanNormalisedErrorByStep: meanNormalised,
      episodesByStep: perStep,
      recordIntervalS: this.interval ?? null,
      oneStepRmseM: statisticsOf(rows.map((r) => r.oneStepRmseM)),
      oneStepNormalisedError: statisticsOf(rows.map((r) => r.oneStepRmseM / r.lengthScaleM)),
      horizons: horizons.map((spec, k) => ({
        horizon: spec.text,
        rmseM: statisticsOf(rows.map((r) => r.horizonRmseM[k])),
        normalisedError: statisticsOf(rows.map((r) => r.horizonRmseM[k] / r.lengthScaleM)),
      })),
      meanNormalisedError: statisticsOf(rows.map((r) => r.meanNormalisedError)),
      validPredictionTimeS: statisticsOf(rows.map((r) => r.validPredictionTimeS)),
      validPredictionTimeReachedFraction: rows.length === 0 ? null : rows.filter((r) => r.validPredictionTimeReached).length / rows.length,
      energyDriftJ: statisticsOf(withEnergy.map((r) => r.energyDriftJ!)),
      relativeEnergyDrift: statisticsOf(relative.map((r) => r.relativeEnergyDrift!)),
      episodesWithVelocities: withEnergy.length,
    };
  }
}
