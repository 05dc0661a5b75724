// Builds the RequestServices both shells use: real file access, the session's allowed folders,
// worker-thread jobs, and whatever parts of the dataset pipeline exist. Parts the pipeline has
// not provided yet refuse with 'not-available' (see pipeline-seams.ts).
import { realpath } from 'node:fs/promises';
import { resolve } from 'node:path';
import { AllowedFolders } from './allowed-folders.ts';
import { createNodeFileAccess } from './node-file-access.ts';
import { DATASET_READER_NOT_BUILT, SCENARIO_CHECKER_NOT_BUILT, SEED_READER_NOT_BUILT } from './pipeline-seams.ts';
import type { PipelineServices } from './pipeline-seams.ts';
import type { FolderChooser, RequestServices } from './request-services.ts';
import { createWorkerJobRunner } from './worker-job-runner.ts';

export interface DefaultServicesOptions {
  mode: 'desktop' | 'web';
  version: string;
  /** The bundled example scenarios; read-only to requests. */
  bundledScenariosDir: string;
  folderChooser: FolderChooser;
  pipeline?: Partial<PipelineServices>;
  reportInternalError?: (requestName: string, error: unknown) => void;
}

export async function createDefaultServices(options: DefaultServicesOptions): Promise<RequestServices> {
  const bundled = await realpath(options.bundledScenariosDir).catch(() => resolve(options.bundledScenariosDir));
  const pipeline = options.pipeline ?? {};
  const services: RequestServices = {
    app: { name: 'Pliant', version: options.version, mode: options.mode, platform: process.platform },
    files: createNodeFileAccess(),
    folders: new AllowedFolders([bundled]),
    folderChooser: options.folderChooser,
    bundledScenariosDir: bundled,
    scenarioChecker: pipeline.scenarioChecker ?? SCENARIO_CHECKER_NOT_BUILT,
    datasetReader: pipeline.datasetReader ?? DATASET_READER_NOT_BUILT,
    seedReader: pipeline.seedReader ?? SEED_READER_NOT_BUILT,
    jobRunner: createWorkerJobRunner({ workerUrls: pipeline.jobWorkerUrls ?? {} }),
  };
  if (options.reportInternalError) services.reportInternalError = options.reportInternalError;
  return services;
}
