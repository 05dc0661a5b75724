// The transport-free request registry. Electron's IPC shell and the web-mode server both hand it
// (name, args) exactly as they arrived from the renderer; it checks the name, validates the
// arguments against the contract schema, runs the handler and always answers with a reply
// object. It never throws and never lets a stack trace out.
import type { BridgeEvent, RequestName, RequestReply } from '../sim/bridge/bridge-contract.ts';
import { isRequestName, REQUEST_NAMES } from '../sim/bridge/bridge-contract.ts';
import { appRequests } from './app-requests.ts';
import { datasetRequests } from './dataset-requests.ts';
import { folderRequests } from './folder-requests.ts';
import type { HandlerTable } from './handler-table.ts';
import { identificationRequests } from './identification-requests.ts';
import { jobRequests } from './job-requests.ts';
import { renderRequests } from './render-requests.ts';
import { createArgumentChecker } from './request-arguments.ts';
import { RequestError, toRequestErrorInfo } from './request-error.ts';
import type { RequestServices } from './request-services.ts';
import { scenarioRequests } from './scenario-requests.ts';

export interface RequestHandlers {
  /** Runs one request; `name` and `args` are untrusted and checked here. */
  handle(name: unknown, args: unknown): Promise<RequestReply<RequestName>>;
  /** Subscribes to events for the renderer; returns a function that unsubscribes. */
  onEvent(listener: (event: BridgeEvent) => void): () => void;
}

export function createRequestHandlers(services: RequestServices): RequestHandlers {
  const check = createArgumentChecker();
  const table: HandlerTable = {
    ...appRequests(services),
    ...scenarioRequests(services),
    ...folderRequests(services),
    ...jobRequests(services),
    ...datasetRequests(services),
    ...identificationRequests(services),
    ...renderRequests(services),
  };

  return {
    async handle(name, args) {
      if (!isRequestName(name)) {
        return { ok: false, error: unknownRequest(name) };
      }
      try {
        const checked = check(name, args);
        const run = table[name] as (a: typeof checked) => Promise<unknown>;
        const result = await run(checked);
        return { ok: true, result } as RequestReply<RequestName>;
      } catch (error) {
        if (!(error instanceof RequestError)) services.reportInternalError?.(name, error);
        return { ok: false, error: toRequestErrorInfo(error, name) };
      }
    },

    onEvent(listener) {
      return services.jobRunner.onProgress((payload) => listener({ name: 'job.progress', payload }));
    },
  };
}

function unknownRequest(name: unknown): { code: 'unknown-request'; message: string } {
  const said = typeof name === 'string' ? JSON.stringify(name.length > 60 ? `${name.slice(0, 60)}…` : name) : `a ${name === null ? 'null' : typeof name} value`;
  return {
    code: 'unknown-request',
    message: `Pliant has no request named ${said}. Known requests: ${REQUEST_NAMES.join(', ')}.`,
  };
}
