// Worker-thread entry for the app's dataset jobs: takes the job from workerData, answers a
// 'cancel' message by stopping at the next episode boundary, and relays runDatasetJob's messages.
// Start it through dataset-job-worker-entry.mjs, which loads TypeScript first.
import { parentPort, workerData } from 'node:worker_threads';

import { PLIANT_VERSION } from '../../scenario/pliant-version.ts';
import type { DatasetJob } from './dataset-job.ts';
import { runDatasetJob } from './dataset-job.ts';

const port = parentPort!;
const { spec } = workerData as { jobId: string; spec: DatasetJob };
let cancelRequested = false;
port.on('message', (message: { type?: string }) => {
  if (message?.type === 'cancel') cancelRequested = true;
});

await runDatasetJob(spec, (message) => port.postMessage(message), () => cancelRequested, PLIANT_VERSION);
port.close();
