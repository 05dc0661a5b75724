// Scores one episode: its recorded arrays against its prediction. Fills the per-step error
// curves (reused buffers, so scoring allocates nothing per step) and returns the compact row
// score.json keeps for the episode. Formulas and sources: SCORING.md.
import { DatasetRequestError } from '../../dataset/formats/dataset-request-error.ts';
import type { NamedArray } from '../../dataset/formats/named-array.ts';
import type { EpisodeRecord } from '../../dataset/manifest/dataset-manifest.ts';
import type { FloatData, PredictionArrays } from '../predictions/prediction-arrays.ts';
import { type HorizonSpec,horizonSteps } from './horizons.ts';
import { initialRmsRadiusM } from './length-scale.ts';
import { type EnergyModel,totalEnergyPerStep } from './trajectory-energy.ts';
import { positionRmsePerStep } from './trajectory-error.ts';
import { validPredictionTime } from './valid-prediction-time.ts';

export interface EpisodeScoreRow {
  id: string;
  split: string;
  recordedSteps: number;
  nodes: number;
  lengthScaleM: number;
  /** RMSE at h = 1, m. */
  oneStepRmseM: number;
  /** RMSE at each requested horizon, m, in the order of the settings. */
  horizonRmseM: number[];
  /** Mean over h = 1 … T of RMSE(h)/ℓ. */
  meanNormalisedError: number;
  validPredictionTimeS: number;
  validPredictionTimeReached: boolean;
  /** (Ê(T) − Ê(0)) − (E(T) − E(0)), J; null without predicted velocities. */
  energyDriftJ: number | null;
  /** energyDriftJ / (max_h E(h) − min_h E(h)); null without velocities or when E is constant. */
  relativeEnergyDrift: number | null;
}

/** Buffers one scorer reuses from episode to episode; they grow to the longest episode. */
export class EpisodeScratch {
  rmseM = new Float64Array(0);
  normalised = new Float64Array(0);
  recordedEnergyJ = new Float64Array(0);
  predictedEnergyJ = new Float64Array(0);
  freeMassKg = new Float64Array(0);

  ensure(rows: number, nodes: number): void {
    if (this.rmseM.length < rows) {
      this.rmseM = new Float64Array(rows);
      this.normalised = new Float64Array(rows);
      this.recordedEnergyJ = new Float64Array(rows);
      this.predictedEnergyJ = new Float64Array(rows);
    }
    if (this.freeMassKg.length < nodes) this.freeMassKg = new Float64Array(nodes);
  }
}

export interface ScoreSettings {
  horizons: HorizonSpec[];
  vptThreshold: number;
}

function arrayOf(arrays: readonly NamedArray[], name: string, episodeId: string): NamedArray {
  const found = arrays.find((a) => a.name === name);
  if (!found) throw new DatasetRequestError(`episode ${episodeId} has no "${name}" array; score needs the arrays listed in sim/dataset/LAYOUT.md — regenerate the dataset with this Pliant`);
  return found;
}

const NO_INDICES = new Int32Array(0);
const NO_VALUES = new Float64Array(0);

function optionalArray(arrays: readonly NamedArray[], name: string): NamedArray | undefined {
  return arrays.find((a) => a.name === name);
}

function gravityOf(episode: EpisodeRecord): [number, number, number] {
  const g = [0, 1, 2].map((k) => episode.labels[`/world/gravityMPerS2/${k}`]);
  if (!g.every((v) => typeof v === 'number')) {
    throw new DatasetRequestError(`episode ${episode.id}: the manifest's labels lack /world/gravityMPerS2/0…2, which the energy check needs; regenerate the dataset with this Pliant`);
  }
  return g as [number, number, number];
}

export function scoreEpisode(episode: EpisodeRecord, recorded: readonly NamedArray[], predicted: PredictionArrays,
  settings: ScoreSettings, scratch: EpisodeScratch): EpisodeScoreRow {
  const positions = arrayOf(recorded, 'positions', episode.id);
  const rows = positions.shape[0];
  const nodes = positions.shape[1];
  const steps = rows - 1;
  scratch.ensure(rows, nodes);
  const recordedPositions = positions.data as FloatData;
  const timeS = arrayOf(recorded, 'time', episode.id).data as FloatData;

  const rmse = scratch.rmseM;
  positionRmsePerStep(predicted.positionsM, recordedPositions, rows, nodes, rmse);
  const lengthScaleM = initialRmsRadiusM(recordedPositions, nodes);
  const normalised = scratch.normalised;
  let normalisedSum = 0;
  for (let h = 0; h < rows; h++) {
    normalised[h] = rmse[h] / lengthScaleM;
    if (h > 0) normalisedSum += normalised[h];
  }
  const vpt = validPredictionTime(normalised, timeS, rows, settings.vptThreshold);
  const interval = episode.simulation.recordIntervalS;

  let energyDriftJ: number | null = null;
  let relativeEnergyDrift: number | null = null;
  if (predicted.velocitiesMPerS) {
    const features = arrayOf(recorded, 'node_features', episode.id).data as FloatData;
    const columns = arrayOf(recorded, 'node_features', episode.id).shape[1];
    const free = scratch.freeMassKg;
    for (let i = 0; i < nodes; i++) {
      const pinned = features[i * columns + 1] !== 0;
      const driven = features[i * columns + 2] !== 0;
      free[i] = pinned || driven ? 0 : features[i * columns];
    }
    const edges = arrayOf(recorded, 'edges', episode.id).data as Int32Array;
    const springs = edges.length / 2;
    // Edges are stored as (E, 2) pairs; split them once per episode for the energy loop.
    const edgeA = new Int32Array(springs);
    const edgeB = new Int32Array(springs);
    for (let s = 0; s < springs; s++) {
      edgeA[s] = edges[2 * s];
      edgeB[s] = edges[2 * s + 1];
    }
    const model: EnergyModel = {
      nodes,
      freeMassKg: free.subarray(0, nodes),
      edgeA,
      edgeB,
      restLengthM: arrayOf(recorded, 'edge_rest_length', episode.id).data as FloatData,
      stiffnessNPerM: arrayOf(recorded, 'edge_stiffness', episode.id).data as FloatData,
      gravityMPerS2: gravityOf(episode),
      // Datasets of lattices, or written before chains had bending rigidity, have none.
      hinges: (optionalArray(recorded, 'hinges')?.data as Int32Array | undefined) ?? NO_INDICES,
      hingeStiffnessNm: (optionalArray(recorded, 'hinge_stiffness')?.data as FloatData | undefined) ?? NO_VALUES,
      clamps: (optionalArray(recorded, 'clamps')?.data as Int32Array | undefined) ?? NO_INDICES,
      clampDirection: (optionalArray(recorded, 'clamp_direction')?.data as FloatData | undefined) ?? NO_VALUES,
      clampStiffnessNm: (optionalArray(recorded, 'clamp_stiffness')?.data as FloatData | undefined) ?? NO_VALUES,
    };
    const e = scratch.recordedEnergyJ;
    const eHat = scratch.predictedEnergyJ;
    totalEnergyPerStep(model, recordedPositions, arrayOf(recorded, 'velocities', episode.id).data as FloatData, rows, e);
    totalEnergyPerStep(model, predicted.positionsM, predicted.velocitiesMPerS, rows, eHat);
    let lo = Infinity;
    let hi = -Infinity;
    for (let h = 0; h < rows; h++) {
      if (e[h] < lo) lo = e[h];
      if (e[h] > hi) hi = e[h];
    }
    energyDriftJ = (eHat[steps] - eHat[0]) - (e[steps] - e[0]);
    relativeEnergyDrift = hi > lo ? energyDriftJ / (hi - lo) : null;
  }

  return {
    id: episode.id,
    split: episode.split,
    recordedSteps: steps,
    nodes,
    lengthScaleM,
    oneStepRmseM: rmse[1],
    horizonRmseM: settings.horizons.map((spec) => rmse[horizonSteps(spec, interval, steps, episode.id)]),
    meanNormalisedError: normalisedSum / steps,
    validPredictionTimeS: vpt.seconds,
    validPredictionTimeReached: vpt.reached,
    energyDriftJ,
    relativeEnergyDrift,
  };
}
