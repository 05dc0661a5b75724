// Web mode end to end over HTTP on 127.0.0.1 (port 0), with the same services and handlers the
// desktop app uses: the page's folder pick (folder.allow), an export followed through the
// Server-Sent Events stream (parsed by undici's EventSource, an implementation of the WHATWG HTML
// "Server-sent events" section) to done, the dataset read back (arrays compared with Debian
// NumPy's numpy.load), verified, its seed file read and regenerated; refusals carry the HTTP
// status that fits their code (RFC 9110: 403 Forbidden, 404 Not Found, 422 Unprocessable Content).
import { mkdirSync, mkdtempSync, realpathSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';

import { EventSource } from 'undici';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';

import { createDefaultServices } from '../electron/default-services.ts';
import { createRequestHandlers } from '../electron/request-handlers.ts';
import type { RunningWebServer } from '../electron/web-server.ts';
import { startWebServer } from '../electron/web-server.ts';
import type { BridgeEvent, JobProgress } from '../sim/bridge/bridge-contract.ts';
import { cutDownScenario, REPO_ROOT } from './support/app-flow-session.ts';
import { referencePythonAvailability, runReferencePython } from './support/reference-python.ts';

const python = referencePythonAvailability();
const EPISODES = 3;

describe.runIf(python.available)('web mode: the whole dataset flow over HTTP', () => {
  let root: string;
  let server: RunningWebServer;
  let events: EventSource;
  const progress: JobProgress[] = [];

  interface Reply {
    status: number;
    body: { ok: boolean; result?: any; error?: { code: string; message: string } };
  }

  async function post(name: string, args: unknown): Promise<Reply> {
    const response = await fetch(`http://127.0.0.1:${server.port}/api/request/${name}`, {
      method: 'POST',
      headers: { 'content-type': 'application/json', 'x-pliant-session': server.token },
      body: JSON.stringify(args),
    });
    return { status: response.status, body: (await response.json()) as Reply['body'] };
  }

  async function result(name: string, args: unknown): Promise<any> {
    const reply = await post(name, args);
    expect(reply.body.error, name).toBeUndefined();
    expect(reply.status).toBe(200);
    return reply.body.result;
  }

  /** Waits on the event stream for the job's last event. */
  async function jobOver(jobId: string): Promise<JobProgress[]> {
    for (let waitedMs = 0; waitedMs < 180_000; waitedMs += 50) {
      const mine = progress.filter((p) => p.jobId === jobId);
      if (mine.some((p) => p.state !== 'running' && p.state !== 'queued')) return mine;
      await new Promise((resolve) => setTimeout(resolve, 50));
    }
    throw new Error(`job ${jobId} did not finish; events: ${JSON.stringify(progress)}`);
  }

  beforeAll(async () => {
    root = realpathSync(mkdtempSync(join(tmpdir(), 'pliant-web-flow-')));
    mkdirSync(join(root, 'renderer'));
    writeFileSync(join(root, 'renderer', 'index.html'), '<!doctype html><title>Pliant</title>');
    mkdirSync(join(root, 'korrin-bay'));
    const services = await createDefaultServices({ mode: 'web', version: '0.1.0', bundledScenariosDir: join(REPO_ROOT, 'scenarios'), folderChooser: { mode: 'in-page', rootDir: root } });
    server = await startWebServer({ handlers: createRequestHandlers(services), rendererDir: join(root, 'renderer'), port: 0 });
    events = new EventSource(`http://127.0.0.1:${server.port}/api/events?session=${server.token}`);
    await new Promise<void>((resolve, reject) => {
      events.onopen = () => resolve();
      events.onerror = () => reject(new Error('the event stream was refused'));
    });
    events.addEventListener('job.progress', (event) => {
      // The event's name says what it is; its data is the payload (BridgeEvent['payload']).
      progress.push(JSON.parse(String((event as MessageEvent).data)) as BridgeEvent['payload']);
    });
  });

  afterAll(async () => {
    events?.close();
    await server?.close();
    rmSync(root, { recursive: true, force: true });
  });

  it('exports into the folder the page picked, streams progress to done, and reads the dataset back', async () => {
    expect(await result('folder.allow', { path: join(root, 'korrin-bay'), purpose: 'export' })).toEqual({ path: join(root, 'korrin-bay') });
    const dataset = join(root, 'korrin-bay', 'tank-tether');
    const { jobId } = await result('export.begin', { scenarioText: cutDownScenario('korrin-tether.json', EPISODES, 20), outDir: dataset, format: 'both', workers: 1, resume: false });
    const mine = await jobOver(jobId);
    expect(mine.at(-1)).toMatchObject({ kind: 'export', state: 'done', done: EPISODES, total: EPISODES });

    const summary = await result('dataset.summary', { path: dataset });
    expect(summary).toMatchObject({ path: dataset, episodeCount: EPISODES, formats: ['npz', 'hdf5'], seedFilePath: join(dataset, 'seed.json') });
    const page = await result('dataset.episodes', { path: dataset, offset: 0, limit: 2, sortKey: '/system/partCount' });
    expect(page.total).toBe(EPISODES);
    expect(page.rows).toHaveLength(2);

    const want = runReferencePython<{ name: string; dtype: string; shape: number[]; base64: string }[]>(
      `import json, sys, base64, numpy
z = numpy.load(json.load(sys.stdin))
print(json.dumps([{"name": n, "dtype": str(z[n].dtype), "shape": list(z[n].shape), "base64": base64.b64encode(z[n].astype(z[n].dtype.newbyteorder("<")).tobytes()).decode()} for n in z.files]))`,
      join(dataset, 'episodes', 'ep-000002.npz'),
    );
    const arrays = await result('dataset.episodeArrays', { path: dataset, episodeId: 'ep-000002' });
    expect(arrays.arrays.map(({ name, dtype, shape, base64 }: Record<string, unknown>) => ({ name, dtype, shape, base64 }))).toEqual(want);

    expect(await result('dataset.verify', { path: dataset })).toMatchObject({ ok: true, problems: [] });

    const seed = await result('seed.read', { path: join(dataset, 'seed.json') });
    expect(seed.episodeCount).toBe(EPISODES);
    expect(seed.expectedFiles.map((f: { file: string }) => f.file)).toEqual(expect.arrayContaining(['seed.json', 'CARD.md', 'episodes/ep-000000.npz', 'train.h5']));

    const again = await result('reproduce.begin', { seedPath: join(dataset, 'seed.json'), outDir: join(root, 'korrin-bay', 'tank-tether-again') });
    const regenerated = await jobOver(again.jobId);
    expect(regenerated.at(-1)).toMatchObject({ kind: 'reproduce', state: 'done', message: expect.stringMatching(/byte-identical/) });
    // Over HTTP too, the comparison lists every file the manifest lists (Python json) and manifest.json, all identical.
    const listed = runReferencePython<string[]>(
      'import json, sys, os\nm = json.load(open(os.path.join(json.load(sys.stdin), "manifest.json")))\nprint(json.dumps([f["path"] for f in m["documents"] + m["files"]]))',
      dataset,
    );
    const compared = await result('dataset.compare', { originalPath: dataset, regeneratedPath: join(root, 'korrin-bay', 'tank-tether-again') });
    expect(compared.comparisons).toEqual([...listed, 'manifest.json'].map((file) => ({ file, result: 'identical' })));
    // The page lists the picked folder's .json files; it holds only dataset folders.
    expect(await result('folder.listJson', { path: join(root, 'korrin-bay') })).toEqual({ path: join(root, 'korrin-bay'), files: [] });
    expect((await post('folder.listJson', { path: join(root, 'renderer') })).status).toBe(403);
  });

  it('answers refusals with the status that fits their code', async () => {
    const outside = await post('dataset.summary', { path: join(root, 'renderer') });
    expect(outside.status).toBe(403);
    expect(outside.body.error?.code).toBe('path-refused');

    const notADataset = join(root, 'korrin-bay', 'empty');
    mkdirSync(notADataset);
    const invalid = await post('dataset.summary', { path: notADataset });
    expect(invalid.status).toBe(422);
    expect(invalid.body.error).toMatchObject({ code: 'invalid-dataset', message: expect.stringMatching(/manifest\.json is missing/) });

    const missing = await post('dataset.episodeArrays', { path: join(root, 'korrin-bay', 'tank-tether'), episodeId: 'ep-000042' });
    expect(missing.status).toBe(404);
    expect(missing.body.error).toMatchObject({ code: 'not-found', message: expect.stringMatching(/no episode "ep-000042"/) });
    expect(missing.body.error?.message).not.toMatch(/\n\s+at\s/);
  });
});
