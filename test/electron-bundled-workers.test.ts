// The desktop build (electron/electron-bundles.ts) carries the dataset pipeline's worker threads
// as plain JavaScript beside main.mjs, where the URLs in the bundled code look for them, because a
// packaged app has neither a TypeScript loader nor the sim/ folder. The bundled job worker, run
// in a worker thread from outside the checkout, exports a cut-down Korrin Bay tether sweep
// (through the bundled episode workers and HDF5 library) to the same bytes as `pliant generate`,
// compared with Debian Python's hashlib SHA-256; the bundled verify worker passes the result.
import { existsSync, mkdtempSync, readFileSync, realpathSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { pathToFileURL } from 'node:url';
import { Worker } from 'node:worker_threads';

import { afterAll, beforeAll, describe, expect, it } from 'vitest';

import { buildElectronBundles, WORKER_BUNDLES } from '../electron/electron-bundles.ts';
import { cutDownScenario, runPliant } from './support/app-flow-session.ts';
import { referencePythonAvailability, runReferencePython } from './support/reference-python.ts';

const python = referencePythonAvailability();

let root: string;
let bundle: string;

beforeAll(async () => {
  root = realpathSync(mkdtempSync(join(tmpdir(), 'pliant-bundle-')));
  bundle = join(root, 'dist-electron');
  await buildElectronBundles(bundle, 'silent');
});

afterAll(() => rmSync(root, { recursive: true, force: true }));

/** Every message a worker posts until it exits. */
function runWorker(file: string, workerData: unknown): Promise<{ exitCode: number; messages: unknown[] }> {
  return new Promise((resolve, reject) => {
    const messages: unknown[] = [];
    const worker = new Worker(pathToFileURL(join(bundle, file)), { workerData });
    worker.on('message', (m) => messages.push(m));
    worker.on('error', reject);
    worker.on('exit', (exitCode) => resolve({ exitCode, messages }));
  });
}

describe('bundled desktop build', () => {
  it('puts every worker beside main.mjs under the name the bundled code looks for', () => {
    const named = (file: string) => [...readFileSync(join(bundle, file), 'utf8').matchAll(/new URL\("\.\/([\w.-]+\.mjs)", import\.meta\.url\)/g)].map((m) => m[1]);
    expect(named('main.mjs').sort()).toEqual(['dataset-job-worker-entry.mjs', 'dataset-verify-worker-entry.mjs', 'render-job-worker-entry.mjs', 'score-job-worker-entry.mjs']);
    expect(named('dataset-job-worker-entry.mjs')).toEqual(['episode-worker-entry.mjs']);
    for (const file of Object.keys(WORKER_BUNDLES)) expect(existsSync(join(bundle, file)), file).toBe(true);
    // No TypeScript loader is left for a packaged app to lack.
    for (const file of ['main.mjs', ...Object.keys(WORKER_BUNDLES)]) expect(readFileSync(join(bundle, file), 'utf8')).not.toMatch(/tsx\/esm\/api/);
  });

  it.runIf(python.available)('exports with the bundled workers to the bytes pliant generate writes, and the bundled verify passes it', async () => {
    const scenarioText = cutDownScenario('korrin-tether.json', 3, 12);
    const exported = join(root, 'bundled-export');
    const job = await runWorker('dataset-job-worker-entry.mjs', { jobId: 'bundle-1', spec: { kind: 'export', scenarioText, outDir: exported, format: 'both', workers: 2, resume: false } });
    expect(job.exitCode).toBe(0);
    expect(job.messages.at(-1)).toEqual({ type: 'done', done: 3, total: 3 });

    const scenarioFile = join(root, 'tether.json');
    writeFileSync(scenarioFile, scenarioText);
    const reference = join(root, 'cli-export');
    const cli = runPliant(['generate', scenarioFile, '--out', reference, '--format', 'both', '--progress', 'none']);
    expect(cli.stderr).toBe('');
    const compared = runReferencePython<{ files: number; different: string[] }>(
      `import json, sys, os, hashlib
a, b = json.load(sys.stdin)
m = json.load(open(os.path.join(b, "manifest.json")))
h = lambda p: hashlib.sha256(open(p, "rb").read()).hexdigest()
paths = [f["path"] for f in m["documents"] + m["files"]]
print(json.dumps({"files": len(paths), "different": [p for p in paths if h(os.path.join(a, p)) != h(os.path.join(b, p))]}))`,
      [exported, reference],
    );
    expect(compared.files).toBeGreaterThan(3);
    expect(compared.different).toEqual([]);

    const verified = await runWorker('dataset-verify-worker-entry.mjs', { dir: exported });
    expect(verified.messages).toEqual([{ type: 'report', report: { ok: true, checkedFiles: compared.files, problems: [] } }]);
  });
});
