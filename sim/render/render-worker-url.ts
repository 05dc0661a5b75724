// Where the app's render jobs start: the .mjs bootstrap beside the worker in a checkout, and the
// bundled worker of the same file name beside main.mjs in the desktop build
// (electron/electron-bundles.ts), so the same URL finds either.

/** Render jobs (render-job-worker.ts); speaks electron/job-worker-protocol.ts. */
export const RENDER_JOB_WORKER_URL = new URL('./render-job-worker-entry.mjs', import.meta.url);
