// Cancelling an export in the app stops it at an episode boundary and leaves a folder that the
// command line's `pliant generate --resume` finishes to the very bytes of an export that was
// never interrupted (LAYOUT.md, "Interrupted runs and --resume"). Bytes are compared by
// Debian Python's hashlib SHA-256 (FIPS 180-4) and the manifests by Python's json, `run` aside.
import { existsSync, mkdtempSync, realpathSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';

import { afterAll, beforeAll, describe, expect, it } from 'vitest';

import type { JobProgress } from '../sim/bridge/bridge-contract.ts';
import type { AppSession } from './support/app-flow-session.ts';
import { cutDownScenario, runPliant, startDesktopSession } from './support/app-flow-session.ts';
import { referencePythonAvailability, runReferencePython } from './support/reference-python.ts';

const python = referencePythonAvailability();
// Enough episodes that the cancel, sent as soon as the first one is counted, lands mid-run.
const EPISODES = 16;

describe.runIf(python.available)('export.cancel, then pliant generate --resume', () => {
  let root: string;
  let session: AppSession;
  let scenarioText: string;
  let cancelledEvents: JobProgress[];
  const interrupted = (): string => join(root, 'tether-interrupted');
  const straight = (): string => join(root, 'tether-straight');

  beforeAll(async () => {
    root = realpathSync(mkdtempSync(join(tmpdir(), 'pliant-app-cancel-')));
    session = await startDesktopSession();
    await session.choose(root);
    scenarioText = cutDownScenario('korrin-tether.json', EPISODES, 150);
    let cancelSent = false;
    cancelledEvents = await session.runJob(
      () => session.call('export.begin', { scenarioText, outDir: interrupted(), format: 'npz', workers: 1, resume: false }),
      (p) => {
        if (!cancelSent && p.state === 'running' && p.done >= 1) {
          cancelSent = true;
          void session.call('export.cancel', { jobId: p.jobId }).then((answer) => expect(answer).toEqual({ cancelled: true }));
        }
      },
    );
  });

  afterAll(() => rmSync(root, { recursive: true, force: true }));

  it('stops at an episode boundary part way and says how to continue', async () => {
    const last = cancelledEvents.at(-1)!;
    expect(last.state).toBe('cancelled');
    expect(last.done).toBeGreaterThanOrEqual(1);
    expect(last.done).toBeLessThan(EPISODES);
    expect(last.message).toMatch(/resume/);
    expect(existsSync(join(interrupted(), '.pliant-work'))).toBe(true);
    expect(existsSync(join(interrupted(), 'manifest.json'))).toBe(false);
    // A cancelled job is over: cancelling it again changes nothing.
    expect(await session.call('export.cancel', { jobId: last.jobId })).toEqual({ cancelled: false });
  });

  it('the unfinished folder is not opened as a dataset, and Verify says the run has not finished', async () => {
    const error = await session.refusal('dataset.summary', { path: interrupted() });
    expect(error.code).toBe('invalid-dataset');
    // In the app's words (issue 10, defect 12): the Export screen's tick box, not a flag the app does not have.
    expect(error.message).toMatch(/has not finished; finish it on the Export screen with "Resume a cancelled export in this folder" ticked/);
    expect(error.message).toMatch(/press "Verify checksums" on the Datasets screen for every problem/);
    const report = await session.call('dataset.verify', { path: interrupted() });
    expect(report.ok).toBe(false);
    expect(report.problems[0]).toMatchObject({ file: 'manifest.json', message: expect.stringMatching(/finish it on the Export screen with "Resume a cancelled export in this folder" ticked/) });
    for (const text of [error.message, ...report.problems.map((p) => p.message)]) expect(text).not.toMatch(/--[a-z]|pliant [a-z]|\u27e6/);
  });

  it('pliant generate --resume completes it to the bytes of an uninterrupted export', async () => {
    const scenarioFile = join(root, 'tether.json');
    writeFileSync(scenarioFile, scenarioText);
    const resumed = runPliant(['generate', scenarioFile, '--out', interrupted(), '--resume', '--progress', 'none']);
    expect(resumed.stderr).toBe('');
    expect(resumed.status).toBe(0);

    const events = await session.runJob(() => session.call('export.begin', { scenarioText, outDir: straight(), format: 'npz', workers: 2, resume: false }));
    expect(events.at(-1)).toMatchObject({ state: 'done', done: EPISODES });

    const compared = runReferencePython<{ files: number; different: string[]; manifestsAgree: boolean; resumed: boolean[] }>(
      `import json, sys, os, hashlib
a, b = json.load(sys.stdin)
ma = json.load(open(os.path.join(a, "manifest.json")))
mb = json.load(open(os.path.join(b, "manifest.json")))
h = lambda p: hashlib.sha256(open(p, "rb").read()).hexdigest()
listed = [f["path"] for f in mb["documents"] + mb["files"]]
different = [p for p in listed if h(os.path.join(a, p)) != h(os.path.join(b, p))]
strip = lambda m: {k: v for k, v in m.items() if k != "run"}
print(json.dumps({"files": len(listed), "different": different, "manifestsAgree": strip(ma) == strip(mb),
    "resumed": [ma["run"]["resumed"], mb["run"]["resumed"]]}))`,
      [interrupted(), straight()],
    );
    expect(compared.files).toBeGreaterThan(EPISODES);
    expect(compared.different).toEqual([]);
    expect(compared.manifestsAgree).toBe(true);
    expect(compared.resumed).toEqual([true, false]);
    expect(existsSync(join(interrupted(), '.pliant-work'))).toBe(false);
    expect((await session.call('dataset.verify', { path: interrupted() })).ok).toBe(true);
  });
});
