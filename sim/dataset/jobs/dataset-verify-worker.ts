// Worker-thread entry for the app's Verify button: checks the folder named in workerData the way
// `pliant verify` does and posts the report once, or the error it met (its kind, stable code
// and message, sim/errors/error-report.ts, since an error's class does not cross threads). Reading and hashing every file of a
// large dataset takes seconds to minutes, which must not stall the Electron main process or the
// web server. Start it through dataset-verify-worker-entry.mjs, which loads TypeScript first.
import { parentPort, workerData } from 'node:worker_threads';

import { reportOf } from '../../errors/error-report.ts';
import { verifyDatasetByFile } from '../read/verify-by-file.ts';

const { dir } = workerData as { dir: string };
try {
  parentPort!.postMessage({ type: 'report', report: await verifyDatasetByFile(dir) });
} catch (error) {
  parentPort!.postMessage({ type: 'failed', error: reportOf(error) });
}
