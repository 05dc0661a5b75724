// `pliant baseline fit` without the command line: opens the dataset, loads the fit split and
// fits the chosen baseline into a model document (persistence and constant velocity have
// nothing to fit; their file only records the dataset they were chosen for).
import { PLIANT_VERSION } from '../../scenario/pliant-version.ts';
import { SAFETY_CAUTION } from '../../scenario/safety-caution.ts';
import { BaselineInputError } from './baseline-input-error.ts';
import { BASELINE_MODEL_FORMAT, type BaselineModel, type BaselineModelName } from './baseline-model.ts';
import { episodesOfSplits, loadTrajectory, type OpenDataset } from './dataset-episodes.ts';
import { fitGreyBox } from './grey-box-baseline.ts';
import { fitLinearBaseline, type LinearOptions } from './linear-baseline.ts';

export interface FitRequest {
  model: BaselineModelName;
  splits: string[];
  linear: LinearOptions;
}

/** The members every model file has: which model, fitted on what, and the safety caution. */
export function baselineModelHead(dataset: OpenDataset, name: BaselineModelName, fittedOn: BaselineModel['fittedOn']): BaselineModel {
  const m = dataset.manifest;
  return {
    baselineModelFormat: BASELINE_MODEL_FORMAT,
    model: name,
    pliantVersion: PLIANT_VERSION,
    dataset: { name: m.name, masterSeed: m.masterSeed, episodeCount: m.episodeCount, exportDtype: m.export.dtype },
    fittedOn,
    safetyCaution: SAFETY_CAUTION,
  };
}

export async function fitBaseline(dataset: OpenDataset, request: FitRequest): Promise<BaselineModel> {
  const records = episodesOfSplits(dataset, request.splits);
  const needsData = request.model === 'linear' || request.model === 'grey-box';
  if (needsData && records.length === 0) {
    const counts = Object.entries(dataset.manifest.splits).map(([split, c]) => `${split} ${c.ok}`).join(', ');
    throw new BaselineInputError(`${dataset.dir} has no ok episodes in ${request.splits.join(', ')} to fit the ${request.model} baseline on (ok episodes per split: ${counts}); choose a split that has some with --split`);
  }
  const manifest = dataset.manifest;
  const model = baselineModelHead(dataset, request.model, { splits: request.splits, episodes: needsData ? records.map((r) => r.id) : [] });
  if (request.model === 'linear') {
    const trajectories = [];
    for (const record of records) trajectories.push(await loadTrajectory(dataset, record));
    model.linear = fitLinearBaseline(trajectories, request.linear);
  } else if (request.model === 'grey-box') {
    const episodes = [];
    for (const record of records) episodes.push({ trajectory: await loadTrajectory(dataset, record), record });
    model.greyBox = fitGreyBox(episodes, manifest.scenario, manifest.export.dtype);
  }
  return model;
}
