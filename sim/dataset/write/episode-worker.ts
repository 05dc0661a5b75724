// Worker-thread entry that computes episodes for the pool: it receives the scenario once, then
// episode indices, and answers each with the finished outcome (NPZ bytes transferred, not
// copied). It runs exactly the code the main thread would, so results never depend on it.
import { parentPort, workerData } from 'node:worker_threads';

import { reportOf } from '../../errors/error-report.ts';
import type { Scenario } from '../../scenario/scenario-types.ts';
import type { ExportDtype } from '../manifest/dataset-manifest.ts';
import { computeEpisodeOutcome } from './episode-outcome.ts';
import type { FromEpisodeWorker, ToEpisodeWorker } from './episode-worker-messages.ts';
import type { ReplayData } from './replay-inputs.ts';
import { ReplayTable } from './replay-inputs.ts';

interface EpisodeWorkerData {
  scenario: Scenario;
  dtype: ExportDtype;
  replay: Array<[string, ReplayData]>;
}

const { scenario, dtype, replay } = workerData as EpisodeWorkerData;
const table = ReplayTable.fromTransfer(replay);
const port = parentPort!;

port.on('message', (message: ToEpisodeWorker) => {
  if (message.type === 'stop') {
    port.close();
    return;
  }
  let reply: FromEpisodeWorker;
  const transfer: ArrayBuffer[] = [];
  try {
    const outcome = computeEpisodeOutcome(scenario, message.index, dtype, table);
    if (outcome.npz) transfer.push(outcome.npz.buffer as ArrayBuffer);
    reply = { type: 'outcome', index: message.index, outcome };
  } catch (error) {
    reply = { type: 'failed', index: message.index, error: reportOf(error) };
  }
  port.postMessage(reply, transfer);
});
