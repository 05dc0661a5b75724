// Runs one episode of a sweep from its index alone — sample it, simulate it, label it — and
// returns either its arrays and manifest record, or a record saying why it was rejected. The
// same function runs in the main thread and in worker threads, so where an episode is computed
// can never change what is written.
import { likelyCause,SimulationBlowUpError } from '../../core/simulation-error.ts';
import type { StepKernel } from '../../core/step-kernel-choice.ts';
import { recordTrajectory, resolveSubsteps } from '../../episode/record-episode.ts';
import { richardsonEstimate, startStateOf } from '../../episode/richardson-estimate.ts';
import { PliantError } from '../../errors/pliant-error.ts';
import { observeEpisode } from '../../scenario/observe-episode.ts';
import { sampleEpisode } from '../../scenario/sample-episode.ts';
import type { Scenario } from '../../scenario/scenario-types.ts';
import { graphLabels } from '../../systems/graph-labels.ts';
import { columnMoments } from '../manifest/column-moments.ts';
import { episodeId } from '../manifest/dataset-files.ts';
import type { EpisodeRecord, EpisodeRejection, ExportDtype } from '../manifest/dataset-manifest.ts';
import { NORMALISED_ARRAYS } from '../manifest/dataset-manifest.ts';
import type { EpisodeArray } from './episode-arrays.ts';
import { episodeArrays } from './episode-arrays.ts';
import { numericsLabels } from './numerics-labels.ts';
import type { ReplayTable } from './replay-inputs.ts';

export interface EpisodeProduct {
  record: EpisodeRecord;
  /** The arrays to store, in catalogue order; null for a rejected episode. */
  arrays: EpisodeArray[] | null;
}

export const EPISODE_BUILD_ERROR_CODE = 'episode-build';

/** An episode that could not even be built: a scenario problem, not an unstable simulation. */
export class EpisodeBuildError extends PliantError {
  constructor(message: string) {
    super('user', EPISODE_BUILD_ERROR_CODE, message);
    this.name = 'EpisodeBuildError';
  }

  static of(episodeIndex: number, cause: unknown): EpisodeBuildError {
    return new EpisodeBuildError(`episode ${episodeIndex} could not be built from the scenario: ${cause instanceof Error ? cause.message : String(cause)}`);
  }
}

function rejectionOf(error: SimulationBlowUpError): EpisodeRejection {
  const d = error.details;
  return {
    kind: d.kind,
    step: d.step,
    node: d.node,
    spring: d.spring ?? null,
    value: Number.isFinite(d.value) ? d.value : null,
    dtS: d.dtS,
    criticalDtS: d.criticalDtS,
    message: error.message,
    likelyCause: likelyCause(d),
  };
}

/** Moments of the normalised arrays as written, one column per last-axis entry. */
function arrayMomentsOf(arrays: readonly EpisodeArray[]): EpisodeRecord['arrayMoments'] {
  const moments: NonNullable<EpisodeRecord['arrayMoments']> = {};
  for (const name of NORMALISED_ARRAYS) {
    const array = arrays.find((a) => a.name === name);
    if (array === undefined) continue;
    const found = columnMoments(array.data, array.shape[array.shape.length - 1] ?? 0);
    if (found !== null) moments[name] = found;
  }
  return moments;
}

export function produceEpisode(scenario: Scenario, index: number, dtype: ExportDtype, replay: ReplayTable, kernel?: StepKernel): EpisodeProduct {
  let sampled;
  try {
    sampled = sampleEpisode(scenario, index, { replay: (file) => replay.lookup(file), kernel });
  } catch (error) {
    throw EpisodeBuildError.of(index, error);
  }
  const model = sampled.system.model;
  // Graph labels describe the unactuated model, so take them before the run moves anything.
  const graph = graphLabels(model);
  const { substeps, dtS, criticalDtS } = resolveSubsteps(model, sampled.world, sampled.recording);
  const record: EpisodeRecord = {
    id: episodeId(index, scenario.episodes),
    index,
    split: sampled.split,
    seed: { masterSeed: sampled.masterSeed, episodeIndex: index },
    status: 'ok',
    rejection: null,
    systemKind: sampled.system.kind,
    labels: sampled.labels,
    simulation: {
      nodeCount: model.nodeCount,
      springCount: model.springCount,
      cellCount: model.cellCount,
      substeps,
      dtS,
      criticalDtS,
      recordIntervalS: sampled.recording.recordIntervalS,
      recordedSteps: sampled.recording.recordedSteps,
    },
    controlChannels: sampled.system.controlChannels,
    files: [],
  };
  try {
    const start = sampled.richardson ? startStateOf(model) : null;
    const trajectory = recordTrajectory(model, sampled.world, sampled.controls, sampled.recording, kernel);
    const arrays = episodeArrays(trajectory, graph, model.cellCornerCount, dtype, observeEpisode(sampled, trajectory));
    const richardson = start === null ? null : richardsonEstimate(model, start, sampled.world, sampled.controls, sampled.recording, trajectory);
    return { record: { ...record, labels: { ...record.labels, ...numericsLabels(trajectory, richardson) }, arrayMoments: arrayMomentsOf(arrays) }, arrays };
  } catch (error) {
    if (!(error instanceof SimulationBlowUpError)) throw EpisodeBuildError.of(index, error);
    return { record: { ...record, status: 'rejected', rejection: rejectionOf(error.inEpisode(index)) }, arrays: null };
  }
}
