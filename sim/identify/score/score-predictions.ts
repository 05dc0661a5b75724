// Scores a predictions folder against a dataset: checks that the folder covers exactly the
// recorded episodes of the chosen splits, then streams them one at a time (the episode's arrays
// and its prediction are dropped after scoring) into per-split running sums, and assembles the
// score document. Nothing is written here; see score-outputs.ts.
import { DatasetRequestError } from '../../dataset/formats/dataset-request-error.ts';
import { unitOfLabel } from '../../dataset/manifest/label-units.ts';
import { PLIANT_VERSION } from '../../scenario/pliant-version.ts';
import { SAFETY_CAUTION } from '../../scenario/safety-caution.ts';
import { readPredictionArrays } from '../predictions/prediction-arrays.ts';
import { PredictionsError } from '../predictions/predictions-error.ts';
import { predictionFilePath, readPredictionsFolder } from '../predictions/predictions-folder.ts';
import { episodeIdsByStatus, episodeRecordsOfSplits, openScoredDataset, recordedArrays } from './dataset-episodes.ts';
import { EpisodeScratch, scoreEpisode, type ScoreSettings } from './episode-score.ts';
import { generalisationGap, heldOutRulesBySplit, IN_DISTRIBUTION_SPLIT } from './generalisation-gap.ts';
import { defaultHorizons, type HorizonSpec,horizonSteps } from './horizons.ts';
import { LabelColumns, PARAMETER_BIN_COUNT, parameterBins } from './parameter-bins.ts';
import { SCORE_FORMAT_VERSION, type ScoreDocument } from './score-document.ts';
import { GroupAccumulator, type GroupSummary } from './split-summary.ts';

export interface ScoreRequest {
  datasetDir: string;
  predictionsDir: string;
  /** null: the splits used for evaluation, `test` and every held-out split. */
  splits: string[] | null;
  /** null: 10 and 50 steps (where shorter than the shortest episode) and the whole rollout. */
  horizons: HorizonSpec[] | null;
  vptThreshold: number;
  /**
   * Score the episodes that have a prediction file and list the others in the score, instead of
   * refusing the folder. For models that cannot predict every episode (a linear model fitted on
   * one node count, say); the report then says plainly what was left out.
   */
  allowMissing?: boolean;
  /** Called after each scored episode. */
  onEpisode?: (done: number, total: number) => void;
}

export const DEFAULT_VPT_THRESHOLD = 0.4;
const TRAINING_SPLITS = new Set(['train', 'validation']);

function listed(ids: readonly string[]): string {
  const shown = ids.slice(0, 5).join(', ');
  return ids.length > 5 ? `${shown} and ${ids.length - 5} more` : shown;
}

export async function scorePredictions(request: ScoreRequest): Promise<ScoreDocument> {
  const dataset = await openScoredDataset(request.datasetDir);
  const folder = readPredictionsFolder(request.predictionsDir);
  const known = dataset.splitNames;

  let splits: string[];
  if (request.splits === null) {
    splits = known.filter((s) => !TRAINING_SPLITS.has(s) && dataset.manifest.splits[s].ok > 0);
    if (splits.length === 0) throw new DatasetRequestError(`${request.datasetDir} has no recorded episodes in a test or held-out split; name the splits to score with --split (the dataset has ${known.join(', ')})`);
  } else {
    for (const s of request.splits) {
      if (!known.includes(s)) throw new DatasetRequestError(`--split: the dataset has no split "${s}"; its splits are ${known.join(', ')}`);
    }
    splits = known.filter((s) => request.splits!.includes(s));
  }
  const chosen = new Set(splits);

  // Coverage first, from the manifest and the file names alone: every problem is found before a
  // single array is decoded.
  const { ok, rejected } = await episodeIdsByStatus(dataset);
  const extra = folder.episodeIds.filter((id) => !ok.has(id));
  if (extra.length > 0) {
    const rejectedToo = extra.filter((id) => rejected.has(id));
    const why = rejectedToo.length > 0 ? ` (${listed(rejectedToo)} ${rejectedToo.length === 1 ? 'was' : 'were'} rejected during generation and have no recorded trajectory)` : '';
    throw new PredictionsError(`${request.predictionsDir}: ${extra.length} prediction file${extra.length === 1 ? ' is' : 's are'} for episodes the dataset did not record: ${listed(extra)}${why}; remove them or check that the predictions belong to ${dataset.manifest.name}`);
  }
  const have = new Set(folder.episodeIds);
  const missing: { id: string; split: string }[] = [];
  let total = 0;
  let shortestSteps = Infinity;
  for await (const episode of episodeRecordsOfSplits(dataset, chosen)) {
    total += 1;
    shortestSteps = Math.min(shortestSteps, episode.simulation.recordedSteps);
    if (!have.has(episode.id)) missing.push({ id: episode.id, split: episode.split });
  }
  if (total === 0) throw new DatasetRequestError(`the splits ${splits.join(', ')} of ${request.datasetDir} hold no recorded episode; choose others with --split (the dataset has ${known.filter((s) => dataset.manifest.splits[s].ok > 0).join(', ')})`);
  if (missing.length > 0 && !request.allowMissing) {
    throw new PredictionsError(`${request.predictionsDir}: ${missing.length} of the ${total} episodes of ${splits.join(', ')} have no prediction file: ${listed(missing.map((m) => m.id))}; write <episode id>.npz for each, score fewer splits with --split, or score only the episodes present with --allow-missing`);
  }
  if (missing.length === total) {
    throw new PredictionsError(`${request.predictionsDir}: none of the ${total} episodes of ${splits.join(', ')} has a prediction file; check that the predictions belong to ${dataset.manifest.name} and these splits`);
  }
  const missingIds = new Set(missing.map((m) => m.id));
  const scoredTotal = total - missing.length;

  const horizons = request.horizons ?? defaultHorizons(shortestSteps);
  const settings: ScoreSettings = { horizons, vptThreshold: request.vptThreshold };
  const scratch = new EpisodeScratch();
  const groups = new Map(splits.map((s) => [s, new GroupAccumulator()]));
  const overall = new GroupAccumulator();
  const labels = new LabelColumns();
  const channelUnits = new Map<string, string>();
  let done = 0;
  for await (const episode of episodeRecordsOfSplits(dataset, chosen)) {
    if (missingIds.has(episode.id)) continue;
    // Check every horizon against this episode before any arrays are read.
    for (const spec of horizons) horizonSteps(spec, episode.simulation.recordIntervalS, episode.simulation.recordedSteps, episode.id);
    const recorded = await recordedArrays(dataset, episode);
    const shape = recorded.find((a) => a.name === 'positions')!.shape;
    const predicted = readPredictionArrays(predictionFilePath(folder, episode.id), { episodeId: episode.id, rows: shape[0], nodes: shape[1] });
    const row = scoreEpisode(episode, recorded, predicted, settings, scratch);
    groups.get(episode.split)!.add(row, scratch.rmseM, scratch.normalised, episode.simulation.recordIntervalS);
    overall.add(row, scratch.rmseM, scratch.normalised, episode.simulation.recordIntervalS);
    labels.add(episode.labels);
    for (const channel of episode.controlChannels) channelUnits.set(channel.name, channel.unit);
    done += 1;
    request.onEpisode?.(done, scoredTotal);
  }

  const summaries = new Map<string, GroupSummary>([...groups].map(([s, g]) => [s, g.summary(horizons)]));
  const rules = heldOutRulesBySplit(dataset.manifest.scenario);
  const gap = generalisationGap(rules, summaries);
  const unpredicted = (split: string): boolean => missing.some((m) => m.split === split) && summaries.get(split)?.episodes === 0;
  const gapNote = gap.length > 0 ? ''
    : chosen.has(IN_DISTRIBUTION_SPLIT) && unpredicted(IN_DISTRIBUTION_SPLIT)
      ? 'the predictions hold no episode of the test split, so there is nothing to compare held-out splits with'
      : !chosen.has(IN_DISTRIBUTION_SPLIT) || (summaries.get(IN_DISTRIBUTION_SPLIT)?.episodes ?? 0) === 0
        ? 'the test split was not scored, so there is nothing to compare held-out splits with'
        : rules.size === 0 ? 'the scenario has no held-out rules'
          : [...rules.keys()].some((s) => chosen.has(s) && unpredicted(s))
            ? 'the predictions hold no episode of the held-out splits, so the gap cannot be measured'
            : 'no held-out split was scored';
  const rows = overall.rows;
  return {
    scoreFormat: SCORE_FORMAT_VERSION,
    pliantVersion: PLIANT_VERSION,
    caution: SAFETY_CAUTION,
    dataset: {
      name: dataset.manifest.name,
      masterSeed: dataset.manifest.masterSeed,
      episodeCount: dataset.manifest.episodeCount,
      manifestSha256: dataset.manifestSha256,
      seedSha256: dataset.seedSha256,
    },
    predictions: { model: folder.model, description: folder.description, episodeFiles: folder.episodeIds.length, missing },
    settings: {
      splits,
      horizons: horizons.map((h) => ({ horizon: h.text, steps: h.steps, seconds: h.seconds })),
      validPredictionTimeThreshold: request.vptThreshold,
      error: 'rmse-per-node-euclidean',
      lengthScale: 'rms-radius-at-t0',
      energy: 'kinetic+elastic+gravitational+bending',
      parameterBins: PARAMETER_BIN_COUNT,
    },
    episodes: rows,
    splits: Object.fromEntries(summaries),
    overall: overall.summary(horizons),
    generalisationGap: { against: IN_DISTRIBUTION_SPLIT, entries: gap, note: gapNote },
    parameters: labels.varying().map(([label, values]) => parameterBins(label, unitOfLabel(label, channelUnits), values, rows, splits)),
  };
}
