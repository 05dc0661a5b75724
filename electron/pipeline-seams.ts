// The points where the dataset pipeline (sim/scenario, sim/dataset) plugs into the shells, and
// the pipeline's own parts that fill them. Both shells (main.ts, web-cli.ts) get these through
// createDefaultServices, so the desktop app and web mode answer every request with the same code;
// tests may replace single parts.
import type { JobKind } from '../sim/bridge/bridge-contract.ts';
import { DATASET_JOB_WORKER_URL, DATASET_VERIFY_WORKER_URL } from '../sim/dataset/jobs/app-worker-urls.ts';
import { SCORE_JOB_WORKER_URL } from '../sim/identify/score/score-worker-url.ts';
import { RENDER_JOB_WORKER_URL } from '../sim/render/render-worker-url.ts';
import type { DatasetReader, IdentificationReader, ScenarioChecker, SeedReader } from './request-services.ts';
import { createSimDatasetReader } from './sim-dataset-reader.ts';
import { SIM_IDENTIFICATION_READER } from './sim-identification-reader.ts';
import { SIM_SCENARIO_CHECKER } from './sim-scenario-checker.ts';
import { SIM_SEED_READER } from './sim-seed-reader.ts';

export interface PipelineServices {
  scenarioChecker: ScenarioChecker;
  datasetReader: DatasetReader;
  seedReader: SeedReader;
  identificationReader: IdentificationReader;
  /** Worker-thread entry per job kind; see job-worker-protocol.ts for what the worker receives and sends. */
  jobWorkerUrls: Partial<Record<JobKind, URL>>;
}

export function simPipelineServices(): PipelineServices {
  return {
    scenarioChecker: SIM_SCENARIO_CHECKER,
    datasetReader: createSimDatasetReader({ verifyWorkerUrl: DATASET_VERIFY_WORKER_URL }),
    seedReader: SIM_SEED_READER,
    identificationReader: SIM_IDENTIFICATION_READER,
    // One worker entry serves export and reproduce; it reads the kind from the job it is given.
    jobWorkerUrls: { export: DATASET_JOB_WORKER_URL, reproduce: DATASET_JOB_WORKER_URL, score: SCORE_JOB_WORKER_URL, render: RENDER_JOB_WORKER_URL },
  };
}
