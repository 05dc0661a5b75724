// Where the app's score jobs start: the .mjs bootstrap beside the worker in a checkout, and the
// bundled worker of the same file name beside main.mjs in the desktop build
// (electron/electron-bundles.ts), so the same URL finds either.

/** Score jobs (score-job-worker.ts); speaks electron/job-worker-protocol.ts. */
export const SCORE_JOB_WORKER_URL = new URL('./score-job-worker-entry.mjs', import.meta.url);
