// Worker-thread entry for the app's render jobs: takes the job from workerData, answers a
// 'cancel' message by stopping before the next picture, and relays runRenderJob's messages.
// Start it through render-job-worker-entry.mjs, which loads TypeScript first.
import { parentPort, workerData } from 'node:worker_threads';

import type { RenderJob } from './render-job.ts';
import { runRenderJob } from './render-job.ts';

const port = parentPort!;
const { spec } = workerData as { jobId: string; spec: RenderJob };
let cancelRequested = false;
port.on('message', (message: { type?: string }) => {
  if (message?.type === 'cancel') cancelRequested = true;
});

await runRenderJob(spec, (message) => port.postMessage(message), () => cancelRequested);
port.close();
