// Where the app's worker threads start. Resolved next to this module: in a checkout that is the
// .mjs bootstraps beside it, which load TypeScript through tsx; in the desktop build
// (electron/electron-bundles.ts) this module is bundled into main.mjs and the workers are bundled
// under the same file names beside it, so the same URLs find them there.

/** Export and reproduce jobs (dataset-job-worker.ts); speaks electron/job-worker-protocol.ts. */
export const DATASET_JOB_WORKER_URL = new URL('./dataset-job-worker-entry.mjs', import.meta.url);

/** One verification of a dataset folder (dataset-verify-worker.ts). */
export const DATASET_VERIFY_WORKER_URL = new URL('./dataset-verify-worker-entry.mjs', import.meta.url);
