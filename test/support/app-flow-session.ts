// A session of the app without a window, for the app-flow suites: the handlers both shells use
// (createDefaultServices + createRequestHandlers), a folder dialog that "picks" whatever folder
// the test names, calls that return the result or throw the refusal, jobs followed through their
// job.progress events, and the Korrin Bay demo scenarios cut down so that an export takes
// seconds.
import { spawnSync } from 'node:child_process';
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { fileURLToPath } from 'node:url';

import { createDefaultServices } from '../../electron/default-services.ts';
import { createNativeFolderChooser } from '../../electron/folder-dialog.ts';
import type { RequestHandlers } from '../../electron/request-handlers.ts';
import { createRequestHandlers } from '../../electron/request-handlers.ts';
import type { JobProgress, RequestArgs, RequestErrorInfo, RequestName, RequestResult } from '../../sim/bridge/bridge-contract.ts';

export const REPO_ROOT = fileURLToPath(new URL('../..', import.meta.url));

/** A demo scenario with fewer, shorter episodes; everything else as shipped. */
export function cutDownScenario(fileName: string, episodes: number, recordedSteps: number): string {
  const scenario = JSON.parse(readFileSync(join(REPO_ROOT, 'scenarios', fileName), 'utf8'));
  scenario.episodes = episodes;
  scenario.time.recordedSteps = recordedSteps;
  return `${JSON.stringify(scenario, null, 2)}\n`;
}

export class Refused extends Error {
  constructor(readonly info: RequestErrorInfo) {
    super(`${info.code}: ${info.message}`);
  }
}

export interface AppSession {
  handlers: RequestHandlers;
  /** Picks `folder` in the (stand-in) system dialog, as the person would. */
  choose(folder: string): Promise<string>;
  call<K extends RequestName>(name: K, args: RequestArgs<K>): Promise<RequestResult<K>>;
  /** The refusal a request is answered with; fails the test if it succeeds. */
  refusal(name: RequestName, args: unknown): Promise<RequestErrorInfo>;
  /** Starts a job and resolves with every progress event of it, up to and including the last. */
  runJob(start: () => Promise<{ jobId: string }>, onEvent?: (p: JobProgress) => void): Promise<JobProgress[]>;
}

export async function startDesktopSession(): Promise<AppSession> {
  let nextPick: string | null = null;
  const services = await createDefaultServices({
    mode: 'desktop',
    version: '0.1.0',
    bundledScenariosDir: join(REPO_ROOT, 'scenarios'),
    folderChooser: createNativeFolderChooser(async () => ({ canceled: nextPick === null, filePaths: nextPick === null ? [] : [nextPick] })),
    reportInternalError: (name, error) => console.error(`[app-flow] ${name} failed:`, error),
  });
  const handlers = createRequestHandlers(services);
  const call = async <K extends RequestName>(name: K, args: RequestArgs<K>): Promise<RequestResult<K>> => {
    const reply = await handlers.handle(name, args);
    if (!reply.ok) throw new Refused(reply.error);
    return reply.result as RequestResult<K>;
  };
  return {
    handlers,
    async choose(folder) {
      nextPick = folder;
      const chosen = await call('folder.choose', { purpose: 'dataset' });
      nextPick = null;
      if (!chosen) throw new Error('the folder dialog stand-in was cancelled');
      return chosen.path;
    },
    call,
    async refusal(name, args) {
      const reply = await handlers.handle(name, args);
      if (reply.ok) throw new Error(`expected ${name} to be refused, got ${JSON.stringify(reply.result).slice(0, 200)}`);
      return reply.error;
    },
    runJob: (start, onEvent) => followJob(handlers, start, onEvent),
  };
}

/** Events may arrive before the start request answers with the job id, so all are kept until then. */
export function followJob(handlers: RequestHandlers, start: () => Promise<{ jobId: string }>, onEvent?: (p: JobProgress) => void): Promise<JobProgress[]> {
  return new Promise((resolve, reject) => {
    const seen: JobProgress[] = [];
    let jobId: string | null = null;
    let stop: () => void = () => {};
    const settleIfOver = (): void => {
      if (jobId === null) return;
      const mine = seen.filter((p) => p.jobId === jobId);
      if (mine.some((p) => p.state !== 'running' && p.state !== 'queued')) {
        stop();
        resolve(mine);
      }
    };
    stop = handlers.onEvent((event) => {
      seen.push(event.payload);
      if (jobId === null || event.payload.jobId === jobId) onEvent?.(event.payload);
      settleIfOver();
    });
    start().then((started) => {
      jobId = started.jobId;
      settleIfOver();
    }, (error: unknown) => {
      stop();
      reject(error);
    });
  });
}

/** Runs the `pliant` command line as a person would, in a child process. */
export function runPliant(args: string[]): { status: number | null; stdout: string; stderr: string } {
  const result = spawnSync(process.execPath, [join(REPO_ROOT, 'sim/cli/pliant-launcher.mjs'), ...args], { encoding: 'utf8', timeout: 300_000 });
  return { status: result.status, stdout: result.stdout, stderr: result.stderr };
}
