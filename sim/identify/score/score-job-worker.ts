// Worker-thread entry for the app's score jobs: takes the job from workerData, answers a
// 'cancel' message by stopping after the episode being scored, and relays runScoreJob's
// messages. Start it through score-job-worker-entry.mjs, which loads TypeScript first.
import { parentPort, workerData } from 'node:worker_threads';

import type { ScoreJob } from './score-job.ts';
import { runScoreJob } from './score-job.ts';

const port = parentPort!;
const { spec } = workerData as { jobId: string; spec: ScoreJob };
let cancelRequested = false;
port.on('message', (message: { type?: string }) => {
  if (message?.type === 'cancel') cancelRequested = true;
});

await runScoreJob(spec, (message) => port.postMessage(message), () => cancelRequested);
port.close();
