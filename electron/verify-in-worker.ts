// Runs one dataset verification in its own worker thread and waits for its report: hashing every
// file of a large dataset must not stall the Electron main process or the web server. The worker
// is sim/dataset/dataset-verify-worker.ts; it posts either the report or the error it met.
import { Worker } from 'node:worker_threads';
import type { VerifyByFileReport } from '../sim/dataset/verify-by-file.ts';
import { asSentence, DATASET_ERROR_CODES } from './dataset-error-translation.ts';
import { RequestError } from './request-error.ts';

type FromVerifyWorker = { type: 'report'; report: VerifyByFileReport } | { type: 'failed'; name: string; message: string };

export function verifyInWorker(workerUrl: URL, dir: string): Promise<VerifyByFileReport> {
  return new Promise((resolve, reject) => {
    const worker = new Worker(workerUrl, { workerData: { dir } });
    let answered = false;
    worker.once('message', (message: FromVerifyWorker) => {
      answered = true;
      if (message.type === 'report') resolve(message.report);
      else {
        const code = DATASET_ERROR_CODES[message.name];
        reject(code ? new RequestError(code, asSentence(message.message)) : new Error(message.message));
      }
    });
    worker.once('error', (error) => {
      answered = true;
      reject(error);
    });
    worker.once('exit', (exitCode) => {
      if (!answered) reject(new Error(`the verification worker stopped before reporting (exit code ${exitCode})`));
    });
  });
}
