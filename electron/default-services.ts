// Builds the RequestServices both shells use (main.ts for Electron, web-cli.ts for web mode): real
// file access, the session's allowed folders, worker-thread jobs and the dataset pipeline's
// checker, readers and job workers (pipeline-seams.ts). The shells differ only in the options
// below; `pipeline` lets tests replace single parts.
import { realpath } from 'node:fs/promises';
import { resolve } from 'node:path';

import { AllowedFolders } from './allowed-folders.ts';
import { createNodeFileAccess } from './node-file-access.ts';
import type { PipelineServices } from './pipeline-seams.ts';
import { simPipelineServices } from './pipeline-seams.ts';
import type { FolderChooser, RequestServices } from './request-services.ts';
import { createWorkerJobRunner } from './worker-job-runner.ts';

export interface DefaultServicesOptions {
  mode: 'desktop' | 'web';
  version: string;
  /** The bundled example scenarios; read-only to requests. */
  bundledScenariosDir: string;
  folderChooser: FolderChooser;
  /** Replaces parts of the dataset pipeline (tests only); by default every part is the real one. */
  pipeline?: Partial<PipelineServices>;
  reportInternalError?: (requestName: string, error: unknown) => void;
}

export async function createDefaultServices(options: DefaultServicesOptions): Promise<RequestServices> {
  const bundled = await realpath(options.bundledScenariosDir).catch(() => resolve(options.bundledScenariosDir));
  const pipeline: PipelineServices = { ...simPipelineServices(), ...options.pipeline };
  // A root that does not exist is refused here rather than confining to nothing in silence.
  const confinedTo = options.folderChooser.mode === 'in-page' ? await realpath(options.folderChooser.rootDir) : null;
  const services: RequestServices = {
    app: { name: 'Pliant', version: options.version, mode: options.mode, platform: process.platform },
    files: createNodeFileAccess(),
    folders: new AllowedFolders([bundled], confinedTo),
    folderChooser: options.folderChooser,
    bundledScenariosDir: bundled,
    scenarioChecker: pipeline.scenarioChecker,
    datasetReader: pipeline.datasetReader,
    seedReader: pipeline.seedReader,
    identificationReader: pipeline.identificationReader,
    jobRunner: createWorkerJobRunner({ workerUrls: pipeline.jobWorkerUrls }),
  };
  if (options.reportInternalError) services.reportInternalError = options.reportInternalError;
  return services;
}
