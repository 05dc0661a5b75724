// `pliant verify`, `reproduce` and `inspect` end to end. Verify must catch a flipped byte and a
// missing file (SHA-256, FIPS 180-4, through Node's crypto; the manifest's values are checked
// against Python's hashlib in dataset-export.test.ts); reproduce must report every file
// identical for an untouched dataset and name the file that differs after tampering; inspect
// must report what the manifest says. Replayed controls come from a .npy table written by
// Debian's NumPy (numpy.save), so the NPY reader is checked against the format's reference
// writer; the episode's controls must equal the table's columns rounded to float32 (IEEE 754
// round to nearest, as NumPy's astype does).
import { cpSync, existsSync, mkdirSync, mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join, resolve } from 'node:path';

import { afterAll, beforeAll, describe, expect, it } from 'vitest';

import { runCli } from '../sim/cli/main.ts';
import type { DatasetManifest } from '../sim/dataset/manifest/dataset-manifest.ts';
import { referencePythonAvailability, runReferencePython } from './support/reference-python.ts';

const ROOT = resolve(import.meta.dirname, '..');
const python = referencePythonAvailability();
const work = mkdtempSync(join(tmpdir(), 'pliant-verify-'));
const dataset = join(work, 'fin');

async function cli(args: string[]): Promise<{ code: number; stdout: string; stderr: string }> {
  let stdout = '';
  let stderr = '';
  const code = await runCli(args, { stdout: (t) => void (stdout += t), stderr: (t) => void (stderr += t), isTerminal: false, env: {}, cwd: work });
  return { code, stdout, stderr };
}

function manifestOf(dir: string): DatasetManifest {
  return JSON.parse(readFileSync(join(dir, 'manifest.json'), 'utf8')) as DatasetManifest;
}

function copyOf(name: string): string {
  const dir = join(work, name);
  cpSync(dataset, dir, { recursive: true });
  return dir;
}

function flipByte(path: string, offset: number): void {
  const bytes = readFileSync(path);
  bytes[offset] ^= 0x01;
  writeFileSync(path, bytes);
}

beforeAll(async () => {
  const made = await cli(['generate', join(ROOT, 'scenarios/korrin-fin.json'), '--out', dataset, '--episodes', '4', '--format', 'both', '--workers', '1']);
  expect(made.stderr).toBe('');
  expect(made.code).toBe(0);
});

afterAll(() => rmSync(work, { recursive: true, force: true }));

describe('pliant verify', () => {
  it('passes an untouched dataset, checking every listed file', async () => {
    const m = manifestOf(dataset);
    const outcome = await cli(['verify', dataset]);
    expect(outcome.code).toBe(0);
    expect(outcome.stdout).toContain(`ok — ${m.files.length + m.documents.length} files match`);
  });

  it('catches one flipped byte in an episode file', async () => {
    const dir = copyOf('flipped');
    const target = manifestOf(dir).files.find((f) => f.kind === 'episode-npz')!;
    flipByte(join(dir, target.path), Math.floor(target.sizeBytes / 2));
    const outcome = await cli(['verify', dir]);
    expect(outcome.code).toBe(1);
    expect(outcome.stderr).toContain(`checksum mismatch: ${target.path}`);
    expect(outcome.stderr).toContain('1 problem');
  });

  it('catches a missing split file and a changed seed file', async () => {
    const dir = copyOf('missing');
    const h5 = manifestOf(dir).files.find((f) => f.kind === 'split-hdf5')!;
    rmSync(join(dir, h5.path));
    flipByte(join(dir, 'seed.json'), 10);
    const outcome = await cli(['verify', dir]);
    expect(outcome.code).toBe(1);
    expect(outcome.stderr).toContain(`missing file: ${h5.path}`);
    expect(outcome.stderr).toContain('checksum mismatch: seed.json');
  });

  it('catches an edited label (the episode records have a SHA-256 of their own) and a file the manifest does not list', async () => {
    const dir = copyOf('edited-label');
    const manifest = manifestOf(dir);
    expect(manifest.episodeRecordsSha256).toMatch(/^[0-9a-f]{64}$/);
    const record = manifest.episodes.find((e) => e.status === 'ok')!;
    const [pointer, value] = Object.entries(record.labels).find(([, v]) => typeof v === 'number')!;
    record.labels[pointer] = (value as number) * 1.01;
    writeFileSync(join(dir, 'manifest.json'), `${JSON.stringify(manifest, null, 2)}\n`);
    writeFileSync(join(dir, 'episodes', 'ep-999999.npz'), 'not listed');
    const outcome = await cli(['verify', dir]);
    expect(outcome.code).toBe(1);
    expect(outcome.stderr).toContain('2 problems');
    expect(outcome.stderr).toContain('manifest.json /episodeRecordsSha256: the episode records do not match the SHA-256 written beside them');
    expect(outcome.stderr).toContain('episodes/ep-999999.npz is in the folder but not in the manifest');
    // Writing the same records back in the same layout passes again: the digest is of the records.
    record.labels[pointer] = value;
    writeFileSync(join(dir, 'manifest.json'), `${JSON.stringify(manifest, null, 2)}\n`);
    rmSync(join(dir, 'episodes', 'ep-999999.npz'));
    const again = await cli(['verify', dir]);
    expect(again.stderr).toBe('');
    expect(again.stdout).toContain('and so do its episode records; no unlisted files');
  });

  it('refuses a manifest that breaks its schema, naming the member', async () => {
    const dir = copyOf('bad-manifest');
    const m = manifestOf(dir) as any;
    m.episodes[1].status = 'fine';
    writeFileSync(join(dir, 'manifest.json'), JSON.stringify(m));
    const outcome = await cli(['verify', dir]);
    expect(outcome.code).toBe(1);
    expect(outcome.stderr).toContain('manifest.json /episodes/1/status');
  });

  it('says what is wrong with a folder that is not a dataset', async () => {
    const outcome = await cli(['verify', join(work, 'nowhere')]);
    expect(outcome.code).toBe(2);
    expect(outcome.stderr).toContain('does not exist');
  });
});

describe('pliant reproduce', () => {
  it('regenerates an untouched dataset with every file identical', async () => {
    const m = manifestOf(dataset);
    const outcome = await cli(['reproduce', join(dataset, 'seed.json'), '--out', join(work, 'again'), '--workers', '2']);
    expect(outcome.stderr).toBe('');
    expect(outcome.code).toBe(0);
    const lines = outcome.stdout.trim().split('\n');
    const reported = lines.filter((l) => / {2}(identical|different|missing in (original|regenerated))$/.test(l));
    expect(reported.length).toBe(m.files.length + m.documents.length + 1);
    for (const line of reported) expect(line).toMatch(/identical$/);
    expect(lines.at(-1)).toBe(`all ${reported.length} files identical`);
  });

  it('names the one file that differs after tampering, and fails', async () => {
    const dir = copyOf('tampered');
    const target = manifestOf(dir).files.find((f) => f.kind === 'split-hdf5')!;
    flipByte(join(dir, target.path), target.sizeBytes - 100);
    const outcome = await cli(['reproduce', join(dir, 'seed.json'), '--out', join(work, 'again-tampered'), '--workers', '1']);
    expect(outcome.code).toBe(1);
    const lines = outcome.stdout.trim().split('\n');
    const different = lines.filter((l) => l.endsWith('different'));
    expect(different.map((l) => l.split(/\s+/)[0])).toEqual([target.path]);
    expect(lines.at(-1)).toMatch(/^1 of \d+ files differ$/);
  });
});

describe('pliant reproduce with an edited seed file', () => {
  it.skipIf(!python.available)('says the seed file no longer matches the SHA-256 the manifest recorded (hashlib), not only that files differ', async () => {
    const dir = copyOf('edited-seed');
    const seedPath = join(dir, 'seed.json');
    const recorded = runReferencePython<string>('import hashlib, json, sys\nprint(json.dumps(hashlib.sha256(open(json.load(sys.stdin), "rb").read()).hexdigest()))', seedPath);
    // A valid edit that changes the recipe: one more recorded step per episode.
    const seed = JSON.parse(readFileSync(seedPath, 'utf8'));
    seed.scenario.time.recordedSteps += 1;
    writeFileSync(seedPath, `${JSON.stringify(seed, null, 2)}\n`);
    const now = runReferencePython<string>('import hashlib, json, sys\nprint(json.dumps(hashlib.sha256(open(json.load(sys.stdin), "rb").read()).hexdigest()))', seedPath);
    const outcome = await cli(['reproduce', seedPath, '--out', join(work, 'edited-seed-again'), '--workers', '1', '--progress', 'none']);
    expect(outcome.code).toBe(1);
    expect(outcome.stdout).toContain(`seed.json does not match the SHA-256 the dataset's manifest.json recorded for it (recorded ${recorded.slice(0, 12)}…, now ${now.slice(0, 12)}…)`);
    expect(outcome.stdout).toContain('restore the seed.json the run wrote');
    expect(outcome.stdout.trim().split('\n').at(-1)).toMatch(/files differ \(the seed file was edited: see above\)$/);
  });
});

describe('pliant inspect', () => {
  it('reports the split counts, parameter ranges, sizes and rejected episodes the manifest holds', async () => {
    const m = manifestOf(dataset);
    const outcome = await cli(['inspect', dataset]);
    expect(outcome.code).toBe(0);
    for (const [split, counts] of Object.entries(m.splits)) {
      expect(outcome.stdout).toMatch(new RegExp(`^\\s+${split}\\s+${counts.ok}\\s+${counts.rejected}$`, 'm'));
    }
    const sizes = m.episodes.map((e) => e.labels['/system/cellSizeM'] as number);
    const low = Number(Math.min(...sizes).toPrecision(4));
    const high = Number(Math.max(...sizes).toPrecision(4));
    expect(outcome.stdout).toMatch(new RegExp(`/system/cellSizeM\\s+m\\s+${low} to ${high}`));
    expect(outcome.stdout).toMatch(new RegExp(`episode NPZ\\s+${m.files.filter((f) => f.kind === 'episode-npz').length}\\s`));
    expect(outcome.stdout).toMatch(new RegExp(`split HDF5\\s+${m.files.filter((f) => f.kind === 'split-hdf5').length}\\s`));
    expect(outcome.stdout).toContain('Rejected episodes: none');
  });

  it.skipIf(!python.available)('--json gives the same facts as one JSON document, ranges as Python computes them from manifest.json', async () => {
    const outcome = await cli(['inspect', dataset, '--json']);
    expect(outcome.code, outcome.stderr).toBe(0);
    const inspected = JSON.parse(outcome.stdout) as { inspectFormat: number; state: string; splits: { split: string; ok: number; rejected: number }[]; parameters: { pointer: string; min: number | null; max: number | null; episodes: number }[] };
    expect(inspected.inspectFormat).toBe(1);
    expect(inspected.state).toBe('complete');
    // Reference: Python's json module and built-in min/max over the manifest's labels.
    const reference = runReferencePython<{ splits: Record<string, { ok: number; rejected: number }>; ranges: Record<string, [number, number, number]> }>(
      `
import json, sys
m = json.load(open(json.load(sys.stdin)["path"]))
ranges = {}
for e in m["episodes"]:
    for k, v in e["labels"].items():
        if isinstance(v, (int, float)) and not isinstance(v, bool):
            lo, hi, n = ranges.get(k, (v, v, 0))
            ranges[k] = (min(lo, v), max(hi, v), n + 1)
print(json.dumps({"splits": {k: {"ok": v["ok"], "rejected": v["rejected"]} for k, v in m["splits"].items()}, "ranges": ranges}))
`,
      { path: join(dataset, 'manifest.json') },
    );
    expect(Object.fromEntries(inspected.splits.map((s) => [s.split, { ok: s.ok, rejected: s.rejected }]))).toEqual(reference.splits);
    const numeric = inspected.parameters.filter((p) => p.min !== null);
    expect(numeric.length).toBeGreaterThan(3);
    for (const p of numeric) expect([p.min, p.max, p.episodes], p.pointer).toEqual(reference.ranges[p.pointer]);
  });
});

describe.runIf(python.available)('replayed controls from a NumPy .npy table', () => {
  it('records the table\'s columns as controls, copies the table beside seed.json, and reproduces without the original', async () => {
    const scenarioDir = join(work, 'replay-scenario');
    mkdirSync(join(scenarioDir, 'drive'), { recursive: true });
    const table = join(scenarioDir, 'drive/rover-path.npy');
    runReferencePython(`
import json, sys
import numpy as np
t = np.arange(40) * 0.02
np.save(sys.stdin.read().strip('"'), np.stack([0.05 * np.sin(2 * np.pi * t), 0.03 * np.cos(np.pi * t)], axis=1))
print("null")
`, table);
    const scenario = {
      formatVersion: 1,
      name: 'korrin-tether-replay',
      description: 'Korrin Bay test tank: the tether top follows a recorded rover path.',
      system: { kind: 'chain', partCount: { kind: 'integer', min: 6, max: 9 }, lengthM: 1.5, totalMassKg: 0.3, axialStiffnessN: 3000, dampingRatio: 0.1, diameterM: 0.008, anchor: 'top-driven', drivenAxes: ['x', 'z'] },
      controls: { default: { kind: 'none' }, channels: { 'top-offset-x': { kind: 'replay', file: 'drive/rover-path.npy', column: 0 }, 'top-offset-z': { kind: 'replay', file: 'drive/rover-path.npy', column: 1 } } },
      time: { recordIntervalS: 0.02, recordedSteps: 40 },
      episodes: 3,
      seed: 3,
    };
    const scenarioPath = join(scenarioDir, 'replay.json');
    writeFileSync(scenarioPath, JSON.stringify(scenario, null, 2));
    const out = join(work, 'replayed');
    const made = await cli(['generate', scenarioPath, '--out', out, '--workers', '1']);
    expect(made.stderr).toBe('');
    expect(made.code).toBe(0);
    const m = manifestOf(out);
    const copy = m.documents.find((d) => 'kind' in d && d.kind === 'input')!;
    expect(copy.path).toBe('inputs/rover-path.npy');
    const check = runReferencePython<{ worst: number; copySha: string; originalSha: string }>(`
import hashlib, json, sys
import numpy as np
args = json.load(sys.stdin)
table = np.load(args["table"])
worst = 0.0
for e in args["episodes"]:
    controls = np.load(args["out"] + "/episodes/" + e + ".npz")["controls"]
    worst = max(worst, float(np.abs(controls - table.astype(np.float32)).max()))
print(json.dumps({"worst": worst, "copySha": hashlib.sha256(open(args["out"] + "/inputs/rover-path.npy", "rb").read()).hexdigest(), "originalSha": hashlib.sha256(open(args["table"], "rb").read()).hexdigest()}))
`, { table, out, episodes: m.episodes.map((e) => e.id) });
    expect(check.worst).toBe(0);
    expect(check.copySha).toBe(check.originalSha);
    expect(copy.sha256).toBe(check.originalSha);
    // seed.json alone (with its inputs/ copy) regenerates the dataset.
    rmSync(scenarioDir, { recursive: true });
    const again = await cli(['reproduce', join(out, 'seed.json'), '--out', join(work, 'replayed-again'), '--workers', '1']);
    expect(again.code).toBe(0);
    expect(again.stdout.trim().split('\n').at(-1)).toMatch(/^all \d+ files identical$/);
    // A changed copy is refused before anything is written.
    flipByte(join(out, 'inputs/rover-path.npy'), 200);
    const refused = await cli(['reproduce', join(out, 'seed.json'), '--out', join(work, 'replayed-refused')]);
    expect(refused.code).toBe(2);
    expect(refused.stderr).toContain('the copy was changed');
    expect(existsSync(join(work, 'replayed-refused'))).toBe(false);
  });
});
