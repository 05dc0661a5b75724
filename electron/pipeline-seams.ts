// The points where the dataset pipeline (sim/scenario, sim/dataset) plugs into the shells, and
// what stands in each while that part is not built: a service that refuses every call with
// 'not-available' and says so, rather than one that pretends to work.
import type { JobKind } from './bridge-contract.ts';
import { RequestError } from './request-error.ts';
import type { DatasetReader, ScenarioChecker, SeedReader } from './request-services.ts';

export interface PipelineServices {
  scenarioChecker: ScenarioChecker;
  datasetReader: DatasetReader;
  seedReader: SeedReader;
  /** Worker-thread entry per job kind; see job-worker-protocol.ts for what the worker receives and sends. */
  jobWorkerUrls: Partial<Record<JobKind, URL>>;
}

function notBuilt(what: string): RequestError {
  return new RequestError('not-available', `${what} is not part of this build of Pliant yet.`);
}

export const SCENARIO_CHECKER_NOT_BUILT: ScenarioChecker = {
  check: () => Promise.reject(notBuilt('Checking scenarios')),
};

export const DATASET_READER_NOT_BUILT: DatasetReader = {
  summary: () => Promise.reject(notBuilt('Reading datasets')),
  episodes: () => Promise.reject(notBuilt('Reading datasets')),
  episodeArrays: () => Promise.reject(notBuilt('Reading datasets')),
  verify: () => Promise.reject(notBuilt('Verifying datasets')),
};

export const SEED_READER_NOT_BUILT: SeedReader = {
  read: () => Promise.reject(notBuilt('Reading seed files')),
};
