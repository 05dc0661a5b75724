// The renderer's web bridge end to end against the real web-mode server on port 0: requests by
// Node's fetch, events through undici's EventSource (an implementation of the WHATWG HTML
// "Server-sent events" section, so the stream format is checked by a parser that is not ours),
// and a job run in a real worker thread.
import { mkdirSync, mkdtempSync, realpathSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { pathToFileURL } from 'node:url';

import { EventSource } from 'undici';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';

import { createDefaultServices } from '../electron/default-services.ts';
import { defaultJobLimits } from '../electron/job-limits.ts';
import { createRequestHandlers } from '../electron/request-handlers.ts';
import type { RunningWebServer } from '../electron/web-server.ts';
import { startWebServer } from '../electron/web-server.ts';
import { BridgeRequestError } from '../renderer/bridge/bridge-request-error.ts';
import type { EventSourceLike, InPageFolderPicker, WebBridgeOptions } from '../renderer/bridge/web-bridge.ts';
import { createWebBridge, readSessionToken } from '../renderer/bridge/web-bridge.ts';
import type { BridgeEvent, JobProgress } from '../sim/bridge/bridge-contract.ts';

let root: string;
let server: RunningWebServer;
let origin: string;
const opened: Promise<void>[] = [];

function eventSource(url: string): EventSourceLike {
  const source = new EventSource(url);
  opened.push(new Promise((resolve, reject) => {
    source.onopen = () => resolve();
    source.onerror = () => reject(new Error('event stream refused'));
  }));
  return {
    addEventListener: (type, listener) => source.addEventListener(type, (event) => listener({ data: String((event as MessageEvent).data) })),
    close: () => source.close(),
  };
}

function bridge(overrides: Partial<WebBridgeOptions> = {}) {
  return createWebBridge({ origin, token: server.token, fetch: (url, init) => fetch(url, init), createEventSource: eventSource, ...overrides });
}

/** The page's own chooser as a person would use it: list the start folder, open "korrin-bay". */
const pickKorrinBay: InPageFolderPicker = async (_purpose, browse) => {
  const start = await browse(root, false);
  const folder = start.folders.find((f) => f.name === 'korrin-bay');
  return folder ? { path: folder.path } : null;
};

beforeAll(async () => {
  root = realpathSync(mkdtempSync(join(tmpdir(), 'pliant-wbridge-')));
  mkdirSync(join(root, 'renderer'));
  mkdirSync(join(root, 'korrin-bay'));
  writeFileSync(join(root, 'renderer', 'index.html'), '<!doctype html>');
  const worker = join(root, 'count-worker.mjs');
  writeFileSync(
    worker,
    `import { parentPort } from 'node:worker_threads';
for (let done = 1; done <= 3; done += 1) parentPort.postMessage({ type: 'progress', done, total: 3 });
parentPort.postMessage({ type: 'done', done: 3, total: 3 });
`,
  );
  const services = await createDefaultServices({
    mode: 'web',
    version: '0.1.0',
    bundledScenariosDir: join(root, 'none'),
    folderChooser: { mode: 'in-page', rootDir: root },
    pipeline: { jobWorkerUrls: { export: pathToFileURL(worker) } },
  });
  server = await startWebServer({ handlers: createRequestHandlers(services), rendererDir: join(root, 'renderer') });
  origin = `http://127.0.0.1:${server.port}`;
});

afterAll(async () => {
  await server.close();
  rmSync(root, { recursive: true, force: true });
});

describe('session token from the page address', () => {
  it('reads #session=<64 hex digits> and nothing else', () => {
    const token = 'ab'.repeat(32);
    expect(readSessionToken(`#session=${token}`)).toBe(token);
    expect(readSessionToken(`#view=export&session=${token}`)).toBe(token);
    expect(readSessionToken('#session=abc')).toBeNull();
    expect(readSessionToken(`#session=${token.toUpperCase()}`)).toBeNull();
    expect(readSessionToken('')).toBeNull();
  });
});

describe('web bridge against the web-mode server', () => {
  it('answers requests with their results', async () => {
    const info = await bridge().invoke('app.info', {});
    expect(info).toMatchObject({ name: 'Pliant', mode: 'web', folderChoice: 'in-page' });
    // The page states the limits the shell's job runner applies.
    expect(info.jobLimits).toEqual(defaultJobLimits());
  });

  it('resolves folder.choose through the page\'s own chooser and grants that folder', async () => {
    const web = bridge({ pickFolderInPage: pickKorrinBay });
    expect(await web.invoke('folder.choose', { purpose: 'scenario' })).toEqual({ path: join(root, 'korrin-bay') });
    const path = join(root, 'korrin-bay', 'soft-fin.json');
    expect(await web.invoke('scenario.write', { path, text: '{"fin":"korrin-bay"}' })).toEqual({ path, bytes: 20 });
    expect(await bridge({ pickFolderInPage: async () => null }).invoke('folder.choose', { purpose: 'dataset' })).toBeNull();
    await expect(bridge().invoke('folder.choose', { purpose: 'dataset' })).rejects.toMatchObject({ code: 'not-available' });
  });

  it('rejects with the server\'s error code and message', async () => {
    const failure = await bridge().invoke('scenario.read', { path: join(root, 'outside.json') }).catch((e: unknown) => e);
    expect(failure).toBeInstanceOf(BridgeRequestError);
    expect(failure).toMatchObject({ code: 'path-refused' });
    await expect(bridge({ token: '0'.repeat(64) }).invoke('app.info', {})).rejects.toMatchObject({ code: 'refused-token' });
  });

  it('streams job.progress events of a worker-thread export until it is done', async () => {
    const web = bridge({ pickFolderInPage: pickKorrinBay });
    const outDir = (await web.invoke('folder.choose', { purpose: 'export' }))!.path;
    const events: BridgeEvent[] = [];
    const finished = new Promise<void>((resolve) => {
      const stop = web.onEvent((event) => {
        events.push(event);
        if (event.payload.state !== 'running' && event.payload.state !== 'queued') {
          stop();
          resolve();
        }
      });
    });
    await opened.at(-1);
    const { jobId } = await web.invoke('export.begin', { scenarioText: '{"name":"korrin-bay-tether"}', outDir: join(outDir, 'run-1'), format: 'npz', workers: 1, resume: false });
    await finished;
    const progress = events.map((e) => e.payload as JobProgress);
    expect(events.every((e) => e.name === 'job.progress')).toBe(true);
    expect(progress.every((p) => p.jobId === jobId && p.kind === 'export')).toBe(true);
    expect(progress.map((p) => [p.state, p.done, p.total])).toEqual([
      ['running', 0, 0],
      ['running', 1, 3],
      ['running', 2, 3],
      ['running', 3, 3],
      ['done', 3, 3],
    ]);
    expect(progress.at(-1)?.etaS).toBe(0);
  });

  it('reports a stopped server as shell-unreachable', async () => {
    const services = await createDefaultServices({ mode: 'web', version: '0.1.0', bundledScenariosDir: join(root, 'none'), folderChooser: { mode: 'in-page', rootDir: root } });
    const shortLived = await startWebServer({ handlers: createRequestHandlers(services), rendererDir: join(root, 'renderer') });
    const web = createWebBridge({ origin: `http://127.0.0.1:${shortLived.port}`, token: shortLived.token, fetch: (url, init) => fetch(url, init), createEventSource: eventSource });
    await shortLived.close();
    await expect(web.invoke('app.info', {})).rejects.toMatchObject({ code: 'shell-unreachable' });
  });
});
