// `pliant baseline predict` without the command line: rolls the model out open-loop on every ok
// episode of the chosen splits and writes the predictions folder. Every episode is checked to
// have a fitted operator before anything is written; a rollout that leaves the finite numbers
// stops the run naming the episode.
import type { EpisodeRecord } from '../../dataset/manifest/dataset-manifest.ts';
import { preparePredictionsFolder, writePredictedEpisode, writePredictionsDescription } from '../predictions/predictions-folder-writer.ts';
import { BaselineInputError } from './baseline-input-error.ts';
import type { BaselineModel, LinearGroup } from './baseline-model.ts';
import { constantVelocityRollout } from './constant-velocity-rollout.ts';
import { episodesOfSplits, loadTrajectory, type OpenDataset } from './dataset-episodes.ts';
import { groupKey, groupKeyOfRecord, layoutOf } from './linear-baseline.ts';
import { linearRollout } from './linear-rollout.ts';
import { persistenceRollout } from './persistence-rollout.ts';
import { rolloutStartOf } from './rollout-start.ts';

export interface PredictRequest {
  splits: string[];
  outDir: string;
  /** Predict the episodes that have a fitted group and list the rest, instead of refusing. */
  skipUnfitted: boolean;
}

export interface PredictOutcome {
  written: string[];
  skipped: string[];
}

export async function predictBaseline(model: BaselineModel, dataset: OpenDataset, request: PredictRequest): Promise<PredictOutcome> {
  if (model.model === 'grey-box') {
    throw new BaselineInputError('a grey-box model file holds estimated parameters, not a predictor; predict with --model persistence or constant-velocity, or a file fitted with --model linear');
  }
  const records = episodesOfSplits(dataset, request.splits);
  if (records.length === 0) throw new BaselineInputError(`${dataset.dir} has no ok episodes in ${request.splits.join(', ')}; choose other splits with --split`);
  const groups = new Map<string, LinearGroup>((model.linear?.groups ?? []).map((g) => [groupKey(g.nodeCount, g.channelCount), g]));
  let predicted: EpisodeRecord[] = records;
  const skipped: string[] = [];
  if (model.model === 'linear') {
    const unfitted = records.filter((r) => !groups.has(groupKeyOfRecord(r)));
    if (unfitted.length > 0 && !request.skipUnfitted) {
      const sizes = [...new Set(unfitted.map(groupKeyOfRecord))].join('; ');
      throw new BaselineInputError(`the linear model has no operator for ${sizes} — no episode of that size was in ${model.fittedOn.splits.join(', ')} — so it cannot predict ${unfitted.map((r) => r.id).join(', ')}. Fit on a split that has such episodes, predict other splits with --split, or add --skip-unfitted to predict the rest`);
    }
    skipped.push(...unfitted.map((r) => r.id));
    predicted = records.filter((r) => groups.has(groupKeyOfRecord(r)));
    if (predicted.length === 0) throw new BaselineInputError(`the linear model has an operator for none of the episodes of ${request.splits.join(', ')}; nothing to predict`);
  }
  preparePredictionsFolder(request.outDir);
  const written: string[] = [];
  for (const record of predicted) {
    const trajectory = await loadTrajectory(dataset, record);
    const start = rolloutStartOf(trajectory);
    const size = (start.steps + 1) * start.nodeCount * 3;
    const out = { positionM: new Float64Array(size), velocityMPerS: new Float64Array(size) };
    if (model.model === 'persistence') persistenceRollout(start, out);
    else if (model.model === 'constant-velocity') constantVelocityRollout(start, out);
    else {
      const group = groups.get(groupKeyOfRecord(record))!;
      linearRollout(layoutOf(model.linear!, group.nodeCount, group.channelCount), Float64Array.from(group.operator.data), start, out);
    }
    const firstBad = out.positionM.findIndex((x) => !Number.isFinite(x));
    const badVelocity = out.velocityMPerS.findIndex((x) => !Number.isFinite(x));
    if (firstBad >= 0 || badVelocity >= 0) {
      const row = Math.floor(Math.max(firstBad, badVelocity) / (3 * start.nodeCount));
      throw new BaselineInputError(`the ${model.model} model's rollout of ${record.id} leaves the finite numbers by record row ${row}: the fitted operator is unstable there. Refit with --rank stable (the default), a smaller --rank or more training episodes; ${request.outDir} is left unfinished, without predictions.json`);
    }
    writePredictedEpisode(request.outDir, record.id, start.steps, start.nodeCount, out.positionM, out.velocityMPerS);
    written.push(record.id);
  }
  writePredictionsDescription(request.outDir, model.model, describe(model, request, skipped));
  return { written, skipped };
}

function describe(model: BaselineModel, request: PredictRequest, skipped: string[]): string {
  const what = model.model === 'persistence'
    ? 'persistence floor: every node stays at its initial position with its initial velocity'
    : model.model === 'constant-velocity'
      ? 'constant-velocity floor: every node keeps its initial velocity'
      : `linear model with inputs (DMDc), ${model.linear!.delays} delays, ${model.linear!.stateForm} state, ${model.linear!.affine ? 'affine' : 'no constant'} term, rank ${model.linear!.rankRule}, fitted on ${model.fittedOn.splits.join(', ')} of ${model.dataset.name} (seed ${model.dataset.masterSeed})`;
  const notes = skipped.length ? `; not predicted (no operator of their size): ${skipped.join(', ')}` : '';
  return `Pliant baseline, open-loop rollout from the recorded initial state and controls of ${request.splits.join(', ')}: ${what}${notes}.`;
}
