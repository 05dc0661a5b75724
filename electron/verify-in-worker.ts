// Runs dataset verifications in worker threads and waits for their reports: hashing every file
// of a large dataset must not stall the Electron main process or the web server. The worker is
// sim/dataset/jobs/dataset-verify-worker.ts; it posts either the report or the error it met. A page
// asking again for a folder already being checked shares that check, and only a few run at once,
// so repeated clicks (or a hostile page) cannot start a thread per request.
import { Worker } from 'node:worker_threads';

import type { VerifyByFileReport } from '../sim/dataset/read/verify-by-file.ts';
import { type ErrorReport,ReportedError } from '../sim/errors/error-report.ts';
import { translateDatasetError } from './dataset-error-translation.ts';

type FromVerifyWorker = { type: 'report'; report: VerifyByFileReport } | { type: 'failed'; error: ErrorReport };

/** Verifications of different folders that may run at once; later ones wait their turn. */
export const MAX_PARALLEL_VERIFICATIONS = 2;

export type Verifier = (dir: string) => Promise<VerifyByFileReport>;

export function createWorkerVerifier(workerUrl: URL): Verifier {
  const inFlight = new Map<string, Promise<VerifyByFileReport>>();
  const waiting: (() => void)[] = [];
  let running = 0;

  const turn = async (): Promise<void> => {
    if (running < MAX_PARALLEL_VERIFICATIONS) {
      running += 1;
      return;
    }
    // The finishing verification hands its place over directly, so `running` stays counted.
    await new Promise<void>((resolve) => waiting.push(resolve));
  };
  const release = (): void => {
    const next = waiting.shift();
    if (next) next();
    else running -= 1;
  };

  return (dir) => {
    const shared = inFlight.get(dir);
    if (shared) return shared;
    const check = (async () => {
      await turn();
      try {
        return await verifyInWorker(workerUrl, dir);
      } finally {
        release();
        inFlight.delete(dir);
      }
    })();
    inFlight.set(dir, check);
    return check;
  };
}

function verifyInWorker(workerUrl: URL, dir: string): Promise<VerifyByFileReport> {
  return new Promise((resolve, reject) => {
    const worker = new Worker(workerUrl, { workerData: { dir } });
    let answered = false;
    worker.once('message', (message: FromVerifyWorker) => {
      answered = true;
      if (message.type === 'report') resolve(message.report);
      else {
        reject(translateDatasetError(new ReportedError(message.error)));
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
