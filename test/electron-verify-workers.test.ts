// Verifications run in worker threads (electron/verify-in-worker.ts): asking again for a folder
// already being checked shares that check instead of starting another thread, at most
// MAX_PARALLEL_VERIFICATIONS run at once, and a worker's error arrives as the contract's code.
// A fixture worker stands in for the real one (which app-flow-export-npz.test.ts runs) so the
// overlap can be measured: each check writes when it starts and ends.
import { mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { pathToFileURL } from 'node:url';

import { afterAll, beforeAll, describe, expect, it } from 'vitest';

import { createWorkerVerifier, MAX_PARALLEL_VERIFICATIONS } from '../electron/verify-in-worker.ts';

let dir: string;
let workerUrl: URL;
let journal: string;

beforeAll(() => {
  dir = mkdtempSync(join(tmpdir(), 'pliant-verifiers-'));
  journal = join(dir, 'journal.txt');
  writeFileSync(journal, '');
  const file = join(dir, 'fixture-verify-worker.mjs');
  writeFileSync(
    file,
    `import { appendFileSync } from 'node:fs';
import { parentPort, workerData } from 'node:worker_threads';
const { dir } = workerData;
appendFileSync(${JSON.stringify(journal)}, 'start ' + dir + '\\n');
setTimeout(() => {
  appendFileSync(${JSON.stringify(journal)}, 'end ' + dir + '\\n');
  if (dir.endsWith('not-a-dataset')) parentPort.postMessage({ type: 'failed', error: { kind: 'user', errorCode: 'dataset-request', message: dir + ' is not a readable Pliant dataset: manifest.json is missing' } });
  else parentPort.postMessage({ type: 'report', report: { ok: true, checkedFiles: dir.length, problems: [] } });
}, 500);
`,
  );
  workerUrl = pathToFileURL(file);
});

afterAll(() => rmSync(dir, { recursive: true, force: true }));

describe('verifications in worker threads', () => {
  it('shares a running check of the same folder and runs at most a few at once', async () => {
    const verify = createWorkerVerifier(workerUrl);
    const folders = ['/korrin-bay/tether', '/korrin-bay/fin', '/korrin-bay/eel', '/korrin-bay/tether-again'];
    const first = verify(folders[0]);
    const again = verify(folders[0]);
    expect(again).toBe(first);
    const reports = await Promise.all([first, again, ...folders.slice(1).map((f) => verify(f))]);
    expect(reports.map((r) => r.checkedFiles)).toEqual([folders[0].length, folders[0].length, ...folders.slice(1).map((f) => f.length)]);

    const lines = readFileSync(journal, 'utf8').trim().split('\n');
    expect(lines.filter((l) => l.startsWith('start'))).toHaveLength(folders.length);
    let open = 0;
    let most = 0;
    for (const line of lines) {
      open += line.startsWith('start') ? 1 : -1;
      most = Math.max(most, open);
    }
    expect(most).toBe(MAX_PARALLEL_VERIFICATIONS);
    // Once finished, the same folder is checked afresh (the files may have changed).
    await verify(folders[0]);
    expect(readFileSync(journal, 'utf8').trim().split('\n').filter((l) => l === `start ${folders[0]}`)).toHaveLength(2);
  });

  it('passes the worker\'s dataset error on with its contract code', async () => {
    const verify = createWorkerVerifier(workerUrl);
    await expect(verify('/korrin-bay/not-a-dataset')).rejects.toMatchObject({ code: 'invalid-dataset', message: '/korrin-bay/not-a-dataset is not a readable Pliant dataset: manifest.json is missing.' });
  });
});
