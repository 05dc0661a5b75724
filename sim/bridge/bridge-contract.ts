// The one agreement between the renderer and the two shells that serve it (the Electron main
// process and the web-mode server): request names, argument and result shapes, the JSON Schemas
// every argument object is checked against, event names, and the transport constants.
//
// This file imports nothing on purpose: the renderer, the sandboxed preload script and the main
// process all compile it, and none of them may drag another's environment into the others. It
// lives in sim/bridge/, an environment-free room both sides import, so the page never imports
// the shells (electron/) and the shells never import the page.
//
// Binary arrays (`dataset.episodeArrays`) travel as base64 strings of little-endian, C-order
// bytes. Base64 is chosen over ArrayBuffers because the web-mode transport is JSON over HTTP,
// where an ArrayBuffer has no representation; one encoding keeps both bridges identical, and the
// 4/3 size cost is small next to the arrays a person inspects one episode at a time.

// ---------------------------------------------------------------------------------------------
// Limits. Generous for real use, small enough that a hostile caller cannot make the main process
// hold or scan megabytes of junk per request.

export const BRIDGE_LIMITS = {
  /** Longest accepted path, in characters (Linux PATH_MAX is 4096; common practice, no source). */
  pathChars: 4096,
  /** Longest accepted scenario text, in characters (1 MiB of JSON is far beyond any real scenario). */
  scenarioTextChars: 1_048_576,
  /** Longest accepted bare file name, in characters (NAME_MAX 255; common practice, no source). */
  fileNameChars: 255,
  /** Most parallel export workers a request may ask for. */
  maxWorkers: 64,
  /** Most episode rows one `dataset.episodes` page may return. */
  maxEpisodePage: 1000,
  /** Largest accepted request body in web mode, in bytes (scenario text plus JSON overhead). */
  webBodyBytes: 4 * 1024 * 1024,
  /** Smallest and largest side of a rendered episode picture, in pixels (as `pliant render --size`). */
  minPictureSidePx: 32,
  maxPictureSidePx: 4096,
  /** Fastest GIF playback a render may ask for, times real time. */
  maxPictureSpeed: 1000,
} as const;

// ---------------------------------------------------------------------------------------------
// Shared value types.

/**
 * What a chosen folder is for: a dataset to open, a folder to export into, a scenario's folder,
 * a model's predictions folder (read), a report folder (a score or calibration report to open,
 * or the folder a score job writes into), or the folder an episode's pictures are saved into.
 */
export type FolderPurpose = 'dataset' | 'export' | 'scenario' | 'predictions' | 'report' | 'pictures' | 'seed' | 'scenario-save';
export type ExportFormat = 'npz' | 'hdf5' | 'both';
/**
 * A split's name. Every scenario has 'train', 'validation' and 'test'; held-out rules add splits
 * of any name (e.g. 'held-out'). Names are letters, digits, '-' and '_' (they name .h5 files).
 */
export type DatasetSplit = string;
/** The splits every dataset has, in the order screens list them before any held-out split. */
export const STANDARD_SPLITS = ['train', 'validation', 'test'] as const;
export type JobKind = 'export' | 'reproduce' | 'score' | 'render';
/** What a render job writes: one looping GIF, or a new folder of frame-00000.png, frame-00001.png, …. */
export type PictureOutput = 'gif' | 'frames';
/** Seen from the side (x right, y up), from above (x right, z down) or both side by side. */
export type PictureView = 'side' | 'above' | 'both';
/** 'queued': accepted, waiting for a free place among the jobs that run at once (JobLimits). */
export type JobState = 'queued' | 'running' | 'done' | 'cancelled' | 'failed';

/** How much long work the shell runs at once; the export screen states them. */
export interface JobLimits {
  /** Jobs that run at the same time; later ones wait in a queue, in the order they were started. */
  runningJobs: number;
  /** Most jobs that may wait; a job started beyond this is refused with 'not-available'. */
  queuedJobs: number;
  /** An export asking for more worker threads gets this many (the machine's core count). */
  workerThreadsPerJob: number;
}
/** Element types an episode array may have; bytes are little-endian. */
export type ArrayDtype = 'float64' | 'float32' | 'int32' | 'uint32' | 'int16' | 'uint16' | 'int8' | 'uint8';

export interface AppInfo {
  name: string;
  version: string;
  /** 'desktop' inside Electron, 'web' behind the local web-mode server. */
  mode: 'desktop' | 'web';
  /** 'native': `folder.choose` opens the system dialog. 'in-page': the UI browses with `folder.browse` and confirms with `folder.allow`. */
  folderChoice: 'native' | 'in-page';
  platform: string;
  /** Cores the jobs run on (os.availableParallelism()): the export's default and largest worker count, as on the command line. */
  cpuCount: number;
  /** Shown on the export screen and in every dataset card. */
  safetyNotice: string;
  jobLimits: JobLimits;
}

export interface ExampleScenario {
  /** File name inside the bundled scenarios folder, e.g. "korrin-tether.json". */
  fileName: string;
  /** Absolute path, readable with `scenario.read` (the bundled folder is read-only). */
  path: string;
}

export interface ScenarioText {
  path: string;
  text: string;
}

export interface WrittenFile {
  path: string;
  bytes: number;
}

export interface ScenarioProblem {
  /** RFC 6901 JSON pointer to the offending value; "" for the whole document. */
  pointer: string;
  /** What is wrong and how to fix it. */
  message: string;
  /** 1-based line of the offending value in the submitted text, when it could be placed. */
  line?: number;
  /** 1-based column (UTF-16 code units, as editors count) of the offending value, when it could be placed. */
  column?: number;
}

export interface ScenarioCheck {
  ok: boolean;
  problems: ScenarioProblem[];
}

export interface ChosenFolder {
  path: string;
  /** Web mode: the .json file in it the person picked in the chooser (a name, no folder), if they picked one. */
  file?: string;
}

export interface JsonFileListing {
  /** The folder listed (absolute, real). */
  path: string;
  /** Its regular files whose names end in ".json" (any case), sorted by name. */
  files: { name: string; path: string }[];
}

export interface FolderListing {
  /** The folder listed (absolute). */
  path: string;
  /** Its parent, or null at a file-system root. */
  parent: string | null;
  folders: { name: string; path: string }[];
  /** True when the folder held more subfolders than one listing returns. */
  truncated: boolean;
  /** Its .json files, sorted by name, when the request asked for them (a scenario is picked in one step). */
  jsonFiles?: { name: string; path: string }[];
}

export interface JobStarted {
  jobId: string;
}

export interface JobCancel {
  /** False when the job had already finished or was unknown. */
  cancelled: boolean;
}

export interface ArrayDescription {
  name: string;
  dtype: ArrayDtype;
  shape: number[];
  /** SI unit of the values ("m", "m/s", "N", "1" for dimensionless). */
  unit: string;
}

export interface ControlChannelDescription {
  index: number;
  name: string;
  /** 'handle-force', 'driven-offset' or 'actuator'. */
  kind: string;
  /** SI unit of the channel's values ("N", "m", "1" for a dimensionless actuator signal). */
  unit: string;
  description: string;
}

export interface DatasetSummary {
  path: string;
  title: string;
  scenarioName: string;
  /** Episodes the folder lists, rejected ones included (a shard folder lists only its own). */
  episodeCount: number;
  /** Listed episodes per split: the standard splits always, held-out splits when the scenario has them. */
  splitCounts: Record<DatasetSplit, number>;
  formats: ('npz' | 'hdf5')[];
  /** The seed file that regenerates this dataset, or null if it is missing. */
  seedFilePath: string | null;
  createdAtIso: string;
  toolVersion: string;
  /** The dataset card (Markdown), including its safety caution. */
  cardMarkdown: string;
  /**
   * Arrays every episode carries, with one episode's shape; an extent that differs between
   * episodes (nodes, springs) is -1, and `extentRanges` gives each axis's smallest and largest extent.
   */
  arrays: (ArrayDescription & { extentRanges: [number, number][] })[];
  /**
   * Label columns worth showing: the scalar labels (JSON pointers such as "/system/lengthM") whose
   * value differs between episodes. `dataset.episodes` also sorts by "episodeId", "split",
   * "status" and any other scalar label key.
   */
  labelKeys: string[];
  /** The control channels of the first episode, as the manifest records them (columns of `controls`). */
  controlChannels: ControlChannelDescription[];
  /** True when some episode records other channels; `dataset.episodeArrays` then carries each episode's own. */
  controlChannelsVary: boolean;
  /** Data files, seed file, card, copied inputs and manifest.json, in bytes. */
  sizeBytes: number;
}

export interface EpisodeRow {
  episodeId: string;
  split: DatasetSplit;
  /**
   * The episode's scalar sampled values keyed by JSON pointer, plus "status": "ok" or "rejected"
   * (a rejected episode has no arrays). List-valued labels are left out; the manifest has them.
   */
  labels: Record<string, number | string | boolean>;
}

export interface EpisodeFilter {
  split?: DatasetSplit;
  /** Case-insensitive substring matched against the episode id and string labels. */
  text?: string;
  /** Every range must hold: the numeric label `key` lies in [min, max] (an end left out is open); rows without a number there are left out. */
  ranges?: { key: string; min?: number; max?: number }[];
}

export interface EpisodeQuery {
  offset: number;
  limit: number;
  /** "episodeId" (the default), "split", "status" or a label key; values sort numbers first, then text, then booleans, missing last. */
  sortKey?: string;
  /** Reverses the whole order. */
  descending?: boolean;
  filter?: EpisodeFilter;
}

export interface EpisodePage {
  /** Rows matching the filter, before offset/limit. */
  total: number;
  offset: number;
  rows: EpisodeRow[];
}

export interface EncodedArray extends ArrayDescription {
  /** Little-endian, C-order element bytes, base64 (RFC 4648 section 4). */
  base64: string;
}

export interface EpisodeArrays {
  episodeId: string;
  arrays: EncodedArray[];
  /** This episode's control channels from the manifest, in the order of the `controls` columns. */
  controlChannels: ControlChannelDescription[];
}

/** The words of the one folder comparison (sim/dataset/read/dataset-comparison.ts), restated here. */
export type FileComparisonResult =
  | 'identical'
  | 'different'
  | 'missing in original'
  | 'missing in regenerated'
  | 'unreadable in original'
  | 'unreadable in regenerated'
  | 'only in regenerated';

export interface DatasetComparison {
  /**
   * Every file the original's manifest lists, then those only the regenerated manifest lists,
   * then manifest.json (compared without its `run` member, which differs between runs), then
   * files only the regenerated folder has ('only in regenerated').
   */
  comparisons: { file: string; result: FileComparisonResult }[];
}

export interface VerifyReport {
  ok: boolean;
  /** Files the manifest lists, every one of which was checked. */
  checkedFiles: number;
  /** `file` is relative to the dataset folder, as in `SeedSummary.expectedFiles`; "" for the folder as a whole. */
  problems: { file: string; message: string }[];
}

export interface SeedSummary {
  path: string;
  scenarioText: string;
  toolVersion: string;
  episodeCount: number;
  /** Files the regenerated dataset must reproduce byte for byte, with their SHA-256 (hex). */
  expectedFiles: { file: string; sha256: string }[];
}

/** Mean, median and 90th percentile over a group's episodes. */
export interface ScoreStatistics {
  mean: number;
  median: number;
  p90: number;
}

/** One split's (or all scored episodes') metrics, as score.json holds them. */
export interface ScoreGroupSummary {
  episodes: number;
  /** Mean over episodes of the position RMSE at each horizon step h = 0, 1, …, m. */
  meanRmseByStepM: number[];
  /** The same, normalised by each episode's length scale. */
  meanNormalisedErrorByStep: number[];
  episodesByStep: number[];
  recordIntervalS: number | null;
  oneStepRmseM: ScoreStatistics | null;
  oneStepNormalisedError: ScoreStatistics | null;
  horizons: { horizon: string; rmseM: ScoreStatistics | null; normalisedError: ScoreStatistics | null }[];
  meanNormalisedError: ScoreStatistics | null;
  validPredictionTimeS: ScoreStatistics | null;
  validPredictionTimeReachedFraction: number | null;
  energyDriftJ: ScoreStatistics | null;
  relativeEnergyDrift: ScoreStatistics | null;
  episodesWithVelocities: number;
}

/** One scored episode. */
export interface ScoreEpisodeRow {
  id: string;
  split: DatasetSplit;
  recordedSteps: number;
  nodes: number;
  lengthScaleM: number;
  oneStepRmseM: number;
  /** In the order of `settings.horizons`. */
  horizonRmseM: number[];
  meanNormalisedError: number;
  validPredictionTimeS: number;
  validPredictionTimeReached: boolean;
  energyDriftJ: number | null;
  relativeEnergyDrift: number | null;
}

/** The parts of score.json (written by `pliant score` or a score job) the Scores screen shows. */
export interface ScoreDocumentView {
  scoreFormat: number;
  pliantVersion: string;
  caution: string;
  dataset: { name: string; masterSeed: string; episodeCount: number; manifestSha256: string; seedSha256: string | null };
  predictions: { model: string; description: string; episodeFiles: number; missing: { id: string; split: string }[] };
  settings: {
    splits: string[];
    horizons: { horizon: string; steps: number | null; seconds: number | null }[];
    validPredictionTimeThreshold: number;
  };
  episodes: ScoreEpisodeRow[];
  splits: Record<string, ScoreGroupSummary>;
  overall: ScoreGroupSummary;
  generalisationGap: {
    against: string;
    entries: { split: string; ruleText: string; metrics: { metric: string; heldOut: number; test: number; difference: number; ratio: number | null }[] }[];
    note: string;
  };
  parameters: {
    label: string;
    unit: string;
    min: number;
    max: number;
    edges: number[];
    splits: Record<string, { count: number[]; meanNormalisedError: (number | null)[]; validPredictionTimeS: (number | null)[] }>;
  }[];
}

export interface ScoreReport {
  /** The report folder. */
  path: string;
  score: ScoreDocumentView;
  /** REPORT.md beside score.json ("" when it is missing). */
  reportMarkdown: string;
}

/** One fitted parameter of a calibration report. */
export interface CalibrationParameterView {
  pointer: string;
  unit: string;
  /** null when the data could not identify it (see `identifiable`). */
  value: number | null;
  standardError: number | null;
  identifiable: boolean;
  /** Why it was not identifiable, or "". */
  note: string;
}

/** What `calibration.read` returns from a calibration report folder. */
export interface CalibrationReport {
  path: string;
  parameters: CalibrationParameterView[];
  /** Residual RMS over the measurement's time, m, for the residual plot. */
  residualTimeS: number[];
  residualRmsM: number[];
  reportMarkdown: string;
}

export interface JobProgress {
  jobId: string;
  kind: JobKind;
  /** Episodes finished so far (pictures drawn, for a render job). */
  done: number;
  /** Episodes in the whole job (pictures to draw, for a render job). */
  total: number;
  episodesPerS: number;
  /** Seconds left at the current rate; null before the rate is known. */
  etaS: number | null;
  state: JobState;
  /** While 'queued': 1 for the job that starts next, 2 for the one after it, and so on. */
  queuePosition?: number;
  /** Why a job failed or was cancelled, or what a finished job found, in words for the user. */
  message?: string;
}

// ---------------------------------------------------------------------------------------------
// Requests.

export type NoArgs = Record<string, never>;

export interface RequestMap {
  'app.info': { args: NoArgs; result: AppInfo };
  'scenario.listExamples': { args: NoArgs; result: ExampleScenario[] };
  'scenario.read': { args: { path: string }; result: ScenarioText };
  'scenario.write': { args: { path: string; text: string }; result: WrittenFile };
  'scenario.check': { args: { text: string; fileName: string }; result: ScenarioCheck };
  'folder.choose': { args: { purpose: FolderPurpose }; result: ChosenFolder | null };
  'folder.browse': { args: { path: string; jsonFiles?: boolean }; result: FolderListing };
  'folder.allow': { args: { path: string; purpose: FolderPurpose }; result: ChosenFolder };
  'folder.listJson': { args: { path: string }; result: JsonFileListing };
  'export.begin': {
    args: { scenarioText: string; outDir: string; format: ExportFormat; workers: number; resume: boolean };
    result: JobStarted;
  };
  'export.cancel': { args: { jobId: string }; result: JobCancel };
  'dataset.summary': { args: { path: string }; result: DatasetSummary };
  'dataset.episodes': { args: { path: string } & EpisodeQuery; result: EpisodePage };
  'dataset.episodeArrays': { args: { path: string; episodeId: string }; result: EpisodeArrays };
  'dataset.verify': { args: { path: string }; result: VerifyReport };
  'dataset.compare': { args: { originalPath: string; regeneratedPath: string }; result: DatasetComparison };
  'seed.read': { args: { path: string }; result: SeedSummary };
  'reproduce.begin': { args: { seedPath: string; outDir: string }; result: JobStarted };
  'score.begin': { args: { datasetPath: string; predictionsPath: string; outDir: string; allowMissing?: boolean }; result: JobStarted };
  'score.read': { args: { path: string }; result: ScoreReport };
  'predictions.episodeArrays': { args: { path: string; episodeId: string }; result: EpisodeArrays };
  'calibration.read': { args: { path: string }; result: CalibrationReport };
  /**
   * Draws one recorded episode from its files, as `pliant render` does (same pictures, same
   * bytes), in a job whose progress counts pictures; cancel it with `export.cancel`. For 'gif'
   * `outPath` is a new .gif file, for 'frames' a new folder; either must lie in a folder chosen
   * for writing and must not exist yet. View, size and speed default to 'both', 640×320 and 1.
   */
  'render.begin': {
    args: { datasetPath: string; episodeId: string; output: PictureOutput; outPath: string; view?: PictureView; widthPx?: number; heightPx?: number; speed?: number };
    result: JobStarted;
  };
}

export type RequestName = keyof RequestMap;
export type RequestArgs<K extends RequestName> = RequestMap[K]['args'];
export type RequestResult<K extends RequestName> = RequestMap[K]['result'];

export const REQUEST_NAMES = [
  'app.info',
  'scenario.listExamples',
  'scenario.read',
  'scenario.write',
  'scenario.check',
  'folder.choose',
  'folder.browse',
  'folder.allow',
  'folder.listJson',
  'export.begin',
  'export.cancel',
  'dataset.summary',
  'dataset.episodes',
  'dataset.episodeArrays',
  'dataset.verify',
  'dataset.compare',
  'seed.read',
  'reproduce.begin',
  'score.begin',
  'score.read',
  'predictions.episodeArrays',
  'calibration.read',
  'render.begin',
] as const satisfies readonly RequestName[];

export function isRequestName(value: unknown): value is RequestName {
  return typeof value === 'string' && (REQUEST_NAMES as readonly string[]).includes(value);
}

// ---------------------------------------------------------------------------------------------
// Replies and errors.

export type RequestErrorCode =
  | 'unknown-request'
  | 'invalid-arguments'
  | 'path-refused'
  | 'not-found'
  | 'already-exists'
  | 'permission-denied'
  | 'too-large'
  | 'not-available'
  | 'unsupported-in-mode'
  // The folder or file is there but is not a readable Pliant dataset or seed file (the message says why).
  | 'invalid-dataset'
  | 'refused-sender'
  // Transport refusals, sent before any handler runs (web mode; 'refused-sender' is Electron's).
  | 'refused-host'
  | 'refused-origin'
  | 'refused-token'
  | 'method-not-allowed'
  | 'unsupported-media-type'
  | 'bad-path'
  // Raised by the renderer's bridge itself when the shell cannot be reached or answers nonsense.
  | 'shell-unreachable'
  | 'io-error'
  | 'internal';

export interface RequestErrorInfo {
  code: RequestErrorCode;
  /** What went wrong, where, and how to fix it. Never a stack trace. */
  message: string;
}

export type RequestReply<K extends RequestName> =
  | { ok: true; result: RequestResult<K> }
  | { ok: false; error: RequestErrorInfo };

// ---------------------------------------------------------------------------------------------
// Events (main process or server to renderer).

export interface EventMap {
  'job.progress': JobProgress;
}

export type EventName = keyof EventMap;
export const EVENT_NAMES = ['job.progress'] as const satisfies readonly EventName[];

export type BridgeEvent = { [K in EventName]: { name: K; payload: EventMap[K] } }[EventName];

// ---------------------------------------------------------------------------------------------
// Transports.

/** The one renderer-to-main IPC channel; every request travels on it as (name, args). */
export const IPC_REQUEST_CHANNEL = 'pliant:request';
/** Main-to-renderer channel for events; the renderer never sends on it. */
export const IPC_EVENT_CHANNEL = 'pliant:event';
/** Name of the object the preload script exposes on `window`. */
export const PRELOAD_GLOBAL_NAME = 'pliantBridge';

/** Web mode: POST a JSON argument object to WEB_REQUEST_PREFIX + request name. */
export const WEB_REQUEST_PREFIX = '/api/request/';
/** Web mode: Server-Sent Events stream of BridgeEvent objects. */
export const WEB_EVENTS_PATH = '/api/events';
/** Web mode: header that carries the session token on every API request. */
export const WEB_TOKEN_HEADER = 'x-pliant-session';
/**
 * Web mode: the page URL carries the token in its fragment (#session=...), which browsers never
 * send to a server or put in a Referer. EventSource cannot set headers, so the events stream
 * alone takes it as the query parameter of the same name.
 */
export const WEB_TOKEN_PARAM = 'session';

/** What the preload script exposes as window.pliantBridge. */
export interface PreloadBridgeApi {
  invoke(name: string, args: unknown): Promise<RequestReply<RequestName>>;
  /** Returns a function that removes the listener. */
  onEvent(listener: (event: BridgeEvent) => void): () => void;
}

// ---------------------------------------------------------------------------------------------
// Argument schemas (JSON Schema draft 2020-12). Every object is closed (additionalProperties
// false) and every string is bounded, so validation itself stays cheap for hostile input.

export interface JsonSchema {
  $schema?: string;
  $id?: string;
  title?: string;
  description?: string;
  type?: 'object' | 'string' | 'integer' | 'number' | 'boolean' | 'array' | 'null';
  properties?: Record<string, JsonSchema>;
  required?: string[];
  additionalProperties?: boolean;
  minLength?: number;
  maxLength?: number;
  pattern?: string;
  enum?: readonly (string | number | boolean)[];
  minimum?: number;
  maximum?: number;
  items?: JsonSchema;
  maxItems?: number;
}

const SCHEMA_DIALECT = 'https://json-schema.org/draft/2020-12/schema';

const pathSchema = (description: string): JsonSchema => ({
  type: 'string',
  description: `${description} Absolute, inside a folder chosen in this session.`,
  minLength: 1,
  maxLength: BRIDGE_LIMITS.pathChars,
  // NUL ends a path in the C library, so "a\u0000b" would name a different file than it shows.
  pattern: '^[^\\u0000]*$',
});

const purposeSchema: JsonSchema = { type: 'string', enum: ['dataset', 'export', 'scenario', 'predictions', 'report', 'pictures', 'seed', 'scenario-save'] };

function closedObject(name: string, properties: Record<string, JsonSchema>, required: string[]): JsonSchema {
  return {
    $schema: SCHEMA_DIALECT,
    $id: `pliant:request/${name}`,
    title: `Arguments of ${name}`,
    type: 'object',
    properties,
    required,
    additionalProperties: false,
  };
}

export const REQUEST_ARGUMENT_SCHEMAS: { readonly [K in RequestName]: JsonSchema } = {
  'app.info': closedObject('app.info', {}, []),
  'scenario.listExamples': closedObject('scenario.listExamples', {}, []),
  'scenario.read': closedObject('scenario.read', { path: pathSchema('Scenario file to read.') }, ['path']),
  'scenario.write': closedObject(
    'scenario.write',
    {
      path: pathSchema('Scenario file to write; must end in .json.'),
      text: { type: 'string', maxLength: BRIDGE_LIMITS.scenarioTextChars },
    },
    ['path', 'text'],
  ),
  'scenario.check': closedObject(
    'scenario.check',
    {
      text: { type: 'string', maxLength: BRIDGE_LIMITS.scenarioTextChars },
      fileName: {
        type: 'string',
        description: 'Bare file name used in problem messages; no folders.',
        minLength: 1,
        maxLength: BRIDGE_LIMITS.fileNameChars,
        pattern: '^[^/\\\\\\u0000]+$',
      },
    },
    ['text', 'fileName'],
  ),
  'folder.choose': closedObject('folder.choose', { purpose: purposeSchema }, ['purpose']),
  'folder.browse': closedObject(
    'folder.browse',
    {
      path: {
        type: 'string',
        description: 'Absolute folder to list; "" lists the home folder.',
        maxLength: BRIDGE_LIMITS.pathChars,
        pattern: '^[^\\u0000]*$',
      },
      jsonFiles: { type: 'boolean', description: 'Also list the folder\'s .json files, so a scenario file is picked in the chooser itself.' },
    },
    ['path'],
  ),
  'folder.allow': closedObject(
    'folder.allow',
    { path: pathSchema('Folder the person picked in the in-page chooser.'), purpose: purposeSchema },
    ['path', 'purpose'],
  ),
  'folder.listJson': closedObject('folder.listJson', { path: pathSchema('Folder whose .json files to list.') }, ['path']),
  'export.begin': closedObject(
    'export.begin',
    {
      scenarioText: { type: 'string', minLength: 1, maxLength: BRIDGE_LIMITS.scenarioTextChars },
      outDir: pathSchema('Folder the dataset is written into.'),
      format: { type: 'string', enum: ['npz', 'hdf5', 'both'] },
      workers: { type: 'integer', minimum: 1, maximum: BRIDGE_LIMITS.maxWorkers },
      resume: { type: 'boolean' },
    },
    ['scenarioText', 'outDir', 'format', 'workers', 'resume'],
  ),
  'export.cancel': closedObject('export.cancel', { jobId: jobIdSchema() }, ['jobId']),
  'dataset.summary': closedObject('dataset.summary', { path: pathSchema('Dataset folder.') }, ['path']),
  'dataset.episodes': closedObject(
    'dataset.episodes',
    {
      path: pathSchema('Dataset folder.'),
      offset: { type: 'integer', minimum: 0, maximum: 1_000_000_000 },
      limit: { type: 'integer', minimum: 1, maximum: BRIDGE_LIMITS.maxEpisodePage },
      // Label keys are JSON pointers (RFC 6901), so '/' and '~' are allowed; see EpisodeQuery.
      sortKey: { type: 'string', minLength: 1, maxLength: 512, pattern: '^[A-Za-z0-9_.:/~-]+$' },
      descending: { type: 'boolean' },
      filter: {
        type: 'object',
        properties: {
          split: splitSchema(),
          text: { type: 'string', maxLength: 200 },
          ranges: {
            type: 'array',
            maxItems: 64,
            items: {
              type: 'object',
              properties: {
                key: { type: 'string', minLength: 1, maxLength: 512, pattern: '^[A-Za-z0-9_.:/~-]+$' },
                min: { type: 'number' },
                max: { type: 'number' },
              },
              required: ['key'],
              additionalProperties: false,
            },
          },
        },
        additionalProperties: false,
      },
    },
    ['path', 'offset', 'limit'],
  ),
  'dataset.episodeArrays': closedObject(
    'dataset.episodeArrays',
    {
      path: pathSchema('Dataset folder.'),
      episodeId: { type: 'string', minLength: 1, maxLength: 128, pattern: '^[A-Za-z0-9_.-]+$' },
    },
    ['path', 'episodeId'],
  ),
  'dataset.verify': closedObject('dataset.verify', { path: pathSchema('Dataset folder.') }, ['path']),
  'dataset.compare': closedObject(
    'dataset.compare',
    { originalPath: pathSchema('The original dataset folder.'), regeneratedPath: pathSchema('The folder regenerated from its seed file.') },
    ['originalPath', 'regeneratedPath'],
  ),
  'seed.read': closedObject('seed.read', { path: pathSchema('Seed file.') }, ['path']),
  'reproduce.begin': closedObject(
    'reproduce.begin',
    { seedPath: pathSchema('Seed file to regenerate from.'), outDir: pathSchema('Folder the regenerated dataset is written into.') },
    ['seedPath', 'outDir'],
  ),
  'score.begin': closedObject(
    'score.begin',
    {
      datasetPath: pathSchema('Dataset folder whose episodes the predictions are scored against.'),
      predictionsPath: pathSchema('Predictions folder: one <episode id>.npz per predicted episode.'),
      outDir: pathSchema('Folder the score report (score.json, REPORT.md, plots) is written into.'),
      allowMissing: { type: 'boolean' },
    },
    ['datasetPath', 'predictionsPath', 'outDir'],
  ),
  'score.read': closedObject('score.read', { path: pathSchema('Score report folder holding score.json.') }, ['path']),
  'predictions.episodeArrays': closedObject(
    'predictions.episodeArrays',
    {
      path: pathSchema('Predictions folder.'),
      episodeId: { type: 'string', minLength: 1, maxLength: 128, pattern: '^[A-Za-z0-9_.-]+$' },
    },
    ['path', 'episodeId'],
  ),
  'calibration.read': closedObject('calibration.read', { path: pathSchema('Calibration report folder holding calibration.json.') }, ['path']),
  'render.begin': closedObject(
    'render.begin',
    {
      datasetPath: pathSchema('Dataset folder holding the episode.'),
      episodeId: { type: 'string', minLength: 1, maxLength: 128, pattern: '^[A-Za-z0-9_.-]+$' },
      output: { type: 'string', enum: ['gif', 'frames'] },
      outPath: pathSchema('The new .gif file, or the new folder for the PNG pictures.'),
      view: { type: 'string', enum: ['side', 'above', 'both'] },
      widthPx: { type: 'integer', minimum: BRIDGE_LIMITS.minPictureSidePx, maximum: BRIDGE_LIMITS.maxPictureSidePx },
      heightPx: { type: 'integer', minimum: BRIDGE_LIMITS.minPictureSidePx, maximum: BRIDGE_LIMITS.maxPictureSidePx },
      speed: { type: 'number', minimum: 0.001, maximum: BRIDGE_LIMITS.maxPictureSpeed },
    },
    ['datasetPath', 'episodeId', 'output', 'outPath'],
  ),
};

function splitSchema(): JsonSchema {
  return { type: 'string', description: 'Split name, e.g. "train" or "held-out".', pattern: '^[A-Za-z0-9][A-Za-z0-9_-]{0,63}$' };
}

function jobIdSchema(): JsonSchema {
  return { type: 'string', minLength: 1, maxLength: 64, pattern: '^[A-Za-z0-9-]+$' };
}
