// What the request handlers need from the world, as interfaces, so the same handlers run inside
// Electron, behind the web-mode server and in tests. The dataset pipeline plugs into the
// ScenarioChecker, DatasetReader, SeedReader and job-worker seams; the shells provide the rest.
import type {
  CalibrationReport,
  DatasetComparison,
  DatasetSummary,
  EpisodeArrays,
  EpisodePage,
  EpisodeQuery,
  FolderPurpose,
  JobLimits,
  JobProgress,
  JobStarted,
  ScenarioCheck,
  ScoreReport,
  SeedSummary,
  VerifyReport,
} from '../sim/bridge/bridge-contract.ts';
import type { AllowedFolders } from './allowed-folders.ts';
import type { JobSpec } from './job-worker-protocol.ts';

/** Checks scenario text against the scenario schema and physical limits. */
export interface ScenarioChecker {
  check(text: string, fileName: string): Promise<ScenarioCheck>;
}

/** Reads a written dataset. Every path it receives is real, absolute and already allowed. */
export interface DatasetReader {
  summary(datasetDir: string): Promise<DatasetSummary>;
  episodes(datasetDir: string, query: EpisodeQuery): Promise<EpisodePage>;
  episodeArrays(datasetDir: string, episodeId: string): Promise<EpisodeArrays>;
  /** Recomputes checksums against the manifest; may take a while on large datasets. */
  verify(datasetDir: string): Promise<VerifyReport>;
  /** Compares a regenerated folder with the original, file by file. */
  compare(originalDir: string, regeneratedDir: string): Promise<DatasetComparison>;
}

/** Reads the identification workbench's files. Every path is real, absolute and already allowed. */
export interface IdentificationReader {
  /** score.json (and REPORT.md) of a score report folder. */
  score(reportDir: string): Promise<ScoreReport>;
  /** One episode of a predictions folder: its `positions` (and `velocities` when given). */
  predictionArrays(predictionsDir: string, episodeId: string): Promise<EpisodeArrays>;
  /** calibration.json (and REPORT.md) of a calibration report folder. */
  calibration(reportDir: string): Promise<CalibrationReport>;
}

/** Reads a seed file (the recipe that regenerates a dataset bit for bit). */
export interface SeedReader {
  read(seedPath: string): Promise<SeedSummary>;
}

/** Runs long jobs off the main thread and reports their progress. */
export interface JobRunner {
  /** How many jobs run at once, wait, and how many worker threads an export gets (app.info states them). */
  readonly limits: JobLimits;
  begin(spec: JobSpec): JobStarted;
  /** False when the job is unknown or already over. */
  cancel(jobId: string): boolean;
  /** Returns a function that removes the listener. */
  onProgress(listener: (progress: JobProgress) => void): () => void;
}

/** File-system access for the handlers; paths are real and already checked. */
export interface FileAccess {
  /** Refuses files larger than maxBytes with 'too-large'. */
  readText(path: string, maxBytes: number): Promise<string>;
  /** Writes through a temporary file and a rename, so a crash never leaves half a file. Returns bytes written. */
  writeTextAtomic(path: string, text: string): Promise<number>;
  /** Names of subfolders, sorted; at most `max`. */
  listFolders(path: string, max: number): Promise<{ names: string[]; truncated: boolean }>;
  /** Names of regular files ending in `extension`, sorted. */
  listFiles(path: string, extension: string): Promise<string[]>;
  isFolder(path: string): Promise<boolean>;
  homeFolder(): string;
}

/**
 * 'native': the shell shows the system folder dialog. 'in-page': there is no dialog (web mode);
 * the page lists folders with folder.browse and confirms one with folder.allow, only inside
 * `rootDir` (the web-mode root folder, from the command line).
 */
export type FolderChooser =
  | { mode: 'native'; choose(purpose: FolderPurpose): Promise<string | null> }
  | { mode: 'in-page'; rootDir: string };

export interface RequestServices {
  app: { name: string; version: string; mode: 'desktop' | 'web'; platform: string };
  files: FileAccess;
  folders: AllowedFolders;
  folderChooser: FolderChooser;
  /** Real path of the bundled example scenarios (read-only). */
  bundledScenariosDir: string;
  scenarioChecker: ScenarioChecker;
  datasetReader: DatasetReader;
  seedReader: SeedReader;
  identificationReader: IdentificationReader;
  jobRunner: JobRunner;
  /** Receives unexpected errors with their stacks, for the developer's log; the caller only gets the message. */
  reportInternalError?: (requestName: string, error: unknown) => void;
}
