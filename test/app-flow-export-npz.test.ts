// The app's whole dataset flow through the request handlers both shells use, with the real
// pipeline behind them: a cut-down Korrin Bay tether sweep is exported through export.begin and
// followed through job.progress to done; then dataset.summary, dataset.episodes and
// dataset.episodeArrays are compared with what Debian's Python finds in the folder (json for
// manifest.json, numpy.load for the NPZ files, sorted() for the episode order), dataset.verify
// passes and then fails after one flipped byte (hashlib's SHA-256, FIPS 180-4, as the reference
// digest), seed.read returns the seed file, reproduce.begin regenerates identical files, and
// folders the person did not pick are refused.
import { cpSync, mkdtempSync, readFileSync, realpathSync, rmSync, symlinkSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';

import { afterAll, beforeAll, describe, expect, it } from 'vitest';

import type { EpisodeRow, JobProgress } from '../sim/bridge/bridge-contract.ts';
import type { AppSession } from './support/app-flow-session.ts';
import { cutDownScenario, startDesktopSession } from './support/app-flow-session.ts';
import { referencePythonAvailability, runReferencePython } from './support/reference-python.ts';

const python = referencePythonAvailability();

const EPISODES = 5;
const RECORDED_STEPS = 30;

const ids = (rows: EpisodeRow[]): string[] => rows.map((r) => r.episodeId);

describe.runIf(python.available)('export, browse, verify and reproduce through the request handlers (NPZ)', () => {
  let root: string;
  let dataset: string;
  let session: AppSession;
  let exportEvents: JobProgress[];

  beforeAll(async () => {
    root = realpathSync(mkdtempSync(join(tmpdir(), 'pliant-app-flow-')));
    session = await startDesktopSession();
    await session.choose(root);
    dataset = join(root, 'tank-tether');
    const scenarioText = cutDownScenario('korrin-tether.json', EPISODES, RECORDED_STEPS);
    exportEvents = await session.runJob(() => session.call('export.begin', { scenarioText, outDir: dataset, format: 'npz', workers: 2, resume: false }));
  });

  afterAll(() => rmSync(root, { recursive: true, force: true }));

  it('export.begin runs in a worker and reports every episode through job.progress until done', () => {
    const last = exportEvents.at(-1)!;
    expect(last).toMatchObject({ kind: 'export', state: 'done', done: EPISODES, total: EPISODES, etaS: 0 });
    expect(last.message).toMatch(/complete/);
    expect(exportEvents.slice(0, -1).every((p) => p.state === 'running')).toBe(true);
    const counts = exportEvents.map((p) => p.done);
    expect(counts).toEqual([...counts].sort((a, b) => a - b));
  });

  it('dataset.summary says what manifest.json, CARD.md and the NPZ files say (Python json and numpy.load)', async () => {
    const summary = await session.call('dataset.summary', { path: dataset });
    const want = runReferencePython<{
      name: string; version: string; finished: string; count: number; splits: Record<string, number>; card: string;
      arrays: { name: string; dtype: string; shape: number[] }[]; varying: string[];
    }>(
      `import json, sys, os, numpy
d = json.load(sys.stdin)
m = json.load(open(os.path.join(d, "manifest.json")))
splits = {s: 0 for s in m["splits"]}
for e in m["episodes"]:
    splits[e["split"]] = splits.get(e["split"], 0) + 1
loaded = [numpy.load(os.path.join(d, "episodes", e["id"] + ".npz")) for e in m["episodes"] if e["status"] == "ok"]
arrays = []
for name in loaded[0].files:
    shapes = [z[name].shape for z in loaded]
    shape = [s if all(t[i] == s for t in shapes) else -1 for i, s in enumerate(shapes[0])]
    arrays.append({"name": name, "dtype": str(loaded[0][name].dtype), "shape": shape})
scalar = lambda v: isinstance(v, (int, float, str, bool))
keys = []
for e in m["episodes"]:
    for k, v in e["labels"].items():
        if scalar(v) and k not in keys:
            keys.append(k)
varying = [k for k in keys if len({json.dumps(e["labels"].get(k)) for e in m["episodes"]}) > 1]
print(json.dumps({"name": m["name"], "version": m["pliantVersion"], "finished": m["run"]["finishedAt"], "count": len(m["episodes"]),
    "splits": splits, "card": open(os.path.join(d, "CARD.md"), encoding="utf-8").read(), "arrays": arrays, "varying": varying}))`,
      dataset,
    );
    expect(summary).toMatchObject({
      path: dataset,
      title: 'tank-tether',
      scenarioName: want.name,
      episodeCount: want.count,
      splitCounts: want.splits,
      formats: ['npz'],
      seedFilePath: join(dataset, 'seed.json'),
      createdAtIso: want.finished,
      toolVersion: want.version,
      cardMarkdown: want.card,
      labelKeys: want.varying,
    });
    expect(summary.episodeCount).toBe(EPISODES);
    // Held-out rules make splits beyond the standard three (the tether scenario holds out long tethers).
    expect(Object.keys(summary.splitCounts)).toEqual(expect.arrayContaining(['train', 'validation', 'test', 'held-out']));
    expect(summary.arrays.map(({ name, dtype, shape }) => ({ name, dtype, shape }))).toEqual(want.arrays);
    expect(summary.arrays.find((a) => a.name === 'positions')?.unit).toBe('m');
    expect(summary.cardMarkdown).toMatch(/does not replace hardware testing/);
  });

  it('dataset.summary names the control channels with their units as manifest.json records them (Python json)', async () => {
    const summary = await session.call('dataset.summary', { path: dataset });
    const want = runReferencePython<{ first: unknown[]; vary: boolean }>(
      `import json, sys, os
m = json.load(open(os.path.join(json.load(sys.stdin), "manifest.json")))
first = m["episodes"][0]["controlChannels"]
print(json.dumps({"first": first, "vary": any(e["controlChannels"] != first for e in m["episodes"])}))`,
      dataset,
    );
    expect(summary.controlChannels).toEqual(want.first);
    expect(summary.controlChannelsVary).toBe(want.vary);
    // The tether's top end is driven in x and z (scenarios/korrin-tether.json, drivenAxes): two
    // offsets in metres.
    expect(summary.controlChannels.map((c) => c.unit)).toEqual(['m', 'm']);
    expect(summary.controlChannels.every((c) => c.kind === 'driven-offset' && c.name.length > 0)).toBe(true);
    for (const episode of ['ep-000000', 'ep-000003']) {
      const arrays = await session.call('dataset.episodeArrays', { path: dataset, episodeId: episode });
      const recorded = runReferencePython<unknown[]>(
        'import json, sys, os\nd, id = json.load(sys.stdin)\nm = json.load(open(os.path.join(d, "manifest.json")))\nprint(json.dumps([e for e in m["episodes"] if e["id"] == id][0]["controlChannels"]))',
        [dataset, episode],
      );
      expect(arrays.controlChannels, episode).toEqual(recorded);
      expect(arrays.arrays.find((a) => a.name === 'controls')?.shape[1], episode).toBe(recorded.length);
    }
  });

  it('dataset.summary gives the size in bytes: every listed file plus manifest.json, as os.path.getsize measures them', async () => {
    const summary = await session.call('dataset.summary', { path: dataset });
    const measured = runReferencePython<number>(
      `import json, sys, os
d = json.load(sys.stdin)
m = json.load(open(os.path.join(d, "manifest.json")))
print(sum(os.path.getsize(os.path.join(d, f["path"])) for f in m["documents"] + m["files"]) + os.path.getsize(os.path.join(d, "manifest.json")))`,
      dataset,
    );
    expect(summary.sizeBytes).toBe(measured);
    expect(summary.sizeBytes).toBeGreaterThan(0);
  });

  it('dataset.episodes pages, sorts and filters the manifest records as Python sorted() and filters do', async () => {
    const reference = (query: object) =>
      runReferencePython<{ total: number; ids: string[] }>(
        `import json, sys, os
q = json.load(sys.stdin)
m = json.load(open(os.path.join(q["dir"], "manifest.json")))
rows = m["episodes"]
if "split" in q:
    rows = [e for e in rows if e["split"] == q["split"]]
if "text" in q:
    t = q["text"].lower()
    rows = [e for e in rows if t in e["id"].lower() or t in e["status"] or any(isinstance(v, str) and t in v.lower() for v in e["labels"].values())]
key = q.get("key")
if key:
    rows = sorted(rows, key=lambda e: (e["labels"][key], e["index"]))
if q.get("descending"):
    rows = rows[::-1]
print(json.dumps({"total": len(rows), "ids": [e["id"] for e in rows[q["offset"]:q["offset"] + q["limit"]]]}))`,
        { dir: dataset, ...query },
      );
    const byLength = await session.call('dataset.episodes', { path: dataset, offset: 1, limit: 3, sortKey: '/system/lengthM', descending: true });
    const wantByLength = reference({ key: '/system/lengthM', descending: true, offset: 1, limit: 3 });
    expect({ total: byLength.total, ids: ids(byLength.rows) }).toEqual(wantByLength);
    expect(byLength.offset).toBe(1);

    const heldOut = await session.call('dataset.episodes', { path: dataset, offset: 0, limit: 50, filter: { split: 'held-out' } });
    expect({ total: heldOut.total, ids: ids(heldOut.rows) }).toEqual(reference({ split: 'held-out', offset: 0, limit: 50 }));
    expect(heldOut.rows.every((r) => r.split === 'held-out')).toBe(true);

    const byText = await session.call('dataset.episodes', { path: dataset, offset: 0, limit: 50, filter: { text: 'EP-00000' } });
    expect({ total: byText.total, ids: ids(byText.rows) }).toEqual(reference({ text: 'EP-00000', offset: 0, limit: 50 }));

    const pastTheEnd = await session.call('dataset.episodes', { path: dataset, offset: EPISODES + 3, limit: 10 });
    expect(pastTheEnd).toEqual({ total: EPISODES, offset: EPISODES + 3, rows: [] });
  });

  it('dataset.episodes rows carry the manifest labels and the status', async () => {
    const manifest = JSON.parse(readFileSync(join(dataset, 'manifest.json'), 'utf8'));
    const page = await session.call('dataset.episodes', { path: dataset, offset: 0, limit: EPISODES });
    expect(ids(page.rows)).toEqual(manifest.episodes.map((e: { id: string }) => e.id));
    const first = page.rows[0];
    expect(first.split).toBe(manifest.episodes[0].split);
    expect(first.labels.status).toBe('ok');
    expect(first.labels['/system/partCount']).toBe(manifest.episodes[0].labels['/system/partCount']);
    // List-valued labels (a band-limited signal's component frequencies) stay in the manifest only.
    expect(Object.values(first.labels).some((v) => Array.isArray(v))).toBe(false);
  });

  it('dataset.episodes refuses a column the dataset does not have, naming the ones it has', async () => {
    const error = await session.refusal('dataset.episodes', { path: dataset, offset: 0, limit: 5, sortKey: '/system/finCount' });
    expect(error.code).toBe('invalid-arguments');
    expect(error.message).toMatch(/no column "\/system\/finCount".*episodeId, split, status, \/system\/partCount/);
  });

  it('dataset.episodeArrays returns each episode\'s arrays byte for byte as numpy.load reads them', async () => {
    const want = runReferencePython<Record<string, { name: string; dtype: string; shape: number[]; base64: string }[]>>(
      `import json, sys, os, base64, numpy
d = json.load(sys.stdin)
m = json.load(open(os.path.join(d, "manifest.json")))
out = {}
for e in m["episodes"]:
    z = numpy.load(os.path.join(d, "episodes", e["id"] + ".npz"))
    out[e["id"]] = [{"name": n, "dtype": str(z[n].dtype), "shape": list(z[n].shape),
                     "base64": base64.b64encode(numpy.ascontiguousarray(z[n]).astype(z[n].dtype.newbyteorder("<")).tobytes()).decode()} for n in z.files]
print(json.dumps(out))`,
      dataset,
    );
    expect(Object.keys(want)).toHaveLength(EPISODES);
    for (const [episodeId, arrays] of Object.entries(want)) {
      const got = await session.call('dataset.episodeArrays', { path: dataset, episodeId });
      expect(got.episodeId).toBe(episodeId);
      expect(got.arrays.map(({ name, dtype, shape, base64 }) => ({ name, dtype, shape, base64 }))).toEqual(arrays);
    }
    const one = await session.call('dataset.episodeArrays', { path: dataset, episodeId: 'ep-000000' });
    expect(one.arrays.find((a) => a.name === 'velocities')?.unit).toBe('m/s');
    expect(one.arrays.find((a) => a.name === 'positions')?.shape).toEqual([RECORDED_STEPS + 1, expect.any(Number), 3]);
  });

  it('dataset.episodeArrays refuses an episode the dataset does not have', async () => {
    const error = await session.refusal('dataset.episodeArrays', { path: dataset, episodeId: 'ep-999999' });
    expect(error.code).toBe('not-found');
    expect(error.message).toMatch(/no episode "ep-999999"/);
  });

  it('dataset.verify passes; after one flipped byte it fails naming the file, and hashlib agrees the digest changed', async () => {
    const good = await session.call('dataset.verify', { path: dataset });
    const listed = runReferencePython<number>('import json, sys, os\nm = json.load(open(os.path.join(json.load(sys.stdin), "manifest.json")))\nprint(len(m["documents"]) + len(m["files"]))', dataset);
    expect(good).toEqual({ ok: true, checkedFiles: listed, problems: [] });

    const damaged = join(root, 'tank-tether-damaged');
    cpSync(dataset, damaged, { recursive: true });
    const victim = join(damaged, 'episodes', 'ep-000001.npz');
    const bytes = readFileSync(victim);
    bytes[Math.floor(bytes.length / 2)] ^= 0x01;
    writeFileSync(victim, bytes);
    const digests = runReferencePython<{ recorded: string; found: string }>(
      `import json, sys, os, hashlib
d = json.load(sys.stdin)
m = json.load(open(os.path.join(d, "manifest.json")))
rec = [f for f in m["files"] if f["path"] == "episodes/ep-000001.npz"][0]
print(json.dumps({"recorded": rec["sha256"], "found": hashlib.sha256(open(os.path.join(d, rec["path"]), "rb").read()).hexdigest()}))`,
      damaged,
    );
    expect(digests.found).not.toBe(digests.recorded);

    const bad = await session.call('dataset.verify', { path: damaged });
    expect(bad.ok).toBe(false);
    expect(bad.checkedFiles).toBe(listed);
    expect(bad.problems).toEqual([{ file: 'episodes/ep-000001.npz', message: expect.stringContaining(`has SHA-256 ${digests.found}, the manifest says ${digests.recorded}`) }]);
    // The damaged episode is not played as if it were good.
    const refused = await session.refusal('dataset.episodeArrays', { path: damaged, episodeId: 'ep-000001' });
    expect(refused.code).toBe('invalid-dataset');
    expect(refused.message).toMatch(/ep-000001\.npz.*does not match its SHA-256/);
  });

  it('seed.read returns the scenario, version, episode count and every file a regeneration must reproduce', async () => {
    const seed = await session.call('seed.read', { path: join(dataset, 'seed.json') });
    const want = runReferencePython<{ scenario: unknown; version: string; count: number; files: { file: string; sha256: string }[] }>(
      `import json, sys, os
d = json.load(sys.stdin)
s = json.load(open(os.path.join(d, "seed.json")))
m = json.load(open(os.path.join(d, "manifest.json")))
print(json.dumps({"scenario": s["scenario"], "version": s["pliantVersion"], "count": s["episodeCount"],
    "files": [{"file": f["path"], "sha256": f["sha256"]} for f in m["documents"] + m["files"]]}))`,
      dataset,
    );
    expect(seed.path).toBe(join(dataset, 'seed.json'));
    expect(JSON.parse(seed.scenarioText)).toEqual(want.scenario);
    expect(seed.toolVersion).toBe(want.version);
    expect(seed.episodeCount).toBe(EPISODES);
    expect(seed.episodeCount).toBe(want.count);
    expect(seed.expectedFiles).toEqual(want.files);
  });

  it('reproduce.begin regenerates the folder and reports every file identical; hashlib agrees file by file', async () => {
    const again = join(root, 'tank-tether-again');
    const events = await session.runJob(() => session.call('reproduce.begin', { seedPath: join(dataset, 'seed.json'), outDir: again }));
    expect(events.at(-1)).toMatchObject({ kind: 'reproduce', state: 'done', done: EPISODES, total: EPISODES });
    expect(events.at(-1)?.message).toMatch(/byte-identical/);
    const compared = runReferencePython<{ path: string; same: boolean }[]>(
      `import json, sys, os, hashlib
a, b = json.load(sys.stdin)
m = json.load(open(os.path.join(a, "manifest.json")))
h = lambda p: hashlib.sha256(open(p, "rb").read()).hexdigest()
print(json.dumps([{"path": f["path"], "same": h(os.path.join(a, f["path"])) == h(os.path.join(b, f["path"])) == f["sha256"]} for f in m["documents"] + m["files"]]))`,
      [dataset, again],
    );
    expect(compared.length).toBeGreaterThan(EPISODES);
    expect(compared.filter((c) => !c.same)).toEqual([]);
    expect((await session.call('dataset.verify', { path: again })).ok).toBe(true);

    // dataset.compare says the same, file by file, and finds a tampered, a lost and a stray file.
    const identical = await session.call('dataset.compare', { originalPath: dataset, regeneratedPath: again });
    expect(identical.comparisons.map((c) => c.file)).toEqual([...compared.map((c) => c.path), 'manifest.json']);
    expect(identical.comparisons.every((c) => c.result === 'identical')).toBe(true);

    const tampered = join(root, 'tank-tether-tampered');
    cpSync(again, tampered, { recursive: true });
    const victim = join(tampered, 'episodes', 'ep-000002.npz');
    const bytes = readFileSync(victim);
    bytes[bytes.length >> 1] ^= 0x80;
    writeFileSync(victim, bytes);
    const oneDifferent = await session.call('dataset.compare', { originalPath: dataset, regeneratedPath: tampered });
    expect(oneDifferent.comparisons.filter((c) => c.result !== 'identical')).toEqual([{ file: 'episodes/ep-000002.npz', result: 'different' }]);

    rmSync(join(tampered, 'CARD.md'));
    writeFileSync(join(tampered, 'episodes', 'notes.txt'), 'left here by hand\n');
    const got = await session.call('dataset.compare', { originalPath: dataset, regeneratedPath: tampered });
    // Reference: the same comparison in Python (hashlib SHA-256, FIPS 180-4; os.walk for extras).
    const want = runReferencePython<{ file: string; result: string }[]>(
      `import json, sys, os, hashlib
a, b = json.load(sys.stdin)
m = json.load(open(os.path.join(a, "manifest.json")))
h = lambda p: hashlib.sha256(open(p, "rb").read()).hexdigest()
out = []
for f in m["documents"] + m["files"]:
    there = os.path.join(b, f["path"])
    out.append({"file": f["path"], "result": "missing in regenerated" if not os.path.isfile(there) else "identical" if h(there) == h(os.path.join(a, f["path"])) else "different"})
strip = lambda p: {k: v for k, v in json.load(open(p)).items() if k != "run"}
out.append({"file": "manifest.json", "result": "identical" if strip(os.path.join(a, "manifest.json")) == strip(os.path.join(b, "manifest.json")) else "different"})
known = {o["file"] for o in out}
extra = sorted(os.path.relpath(os.path.join(r, n), b) for r, _, names in os.walk(b) for n in names)
out += [{"file": f, "result": "only in regenerated"} for f in extra if f not in known]
print(json.dumps(out))`,
      [dataset, tampered],
    );
    expect(got.comparisons).toEqual(want);
    expect(got.comparisons.filter((c) => c.result !== 'identical')).toEqual([
      { file: 'CARD.md', result: 'missing in regenerated' },
      { file: 'episodes/ep-000002.npz', result: 'different' },
      { file: 'episodes/notes.txt', result: 'only in regenerated' },
    ]);
  });

  it('refuses every dataset request for folders the person did not pick', async () => {
    const stranger = await startDesktopSession();
    const elsewhere = join(root, 'tank-tether');
    for (const [name, args] of [
      ['dataset.summary', { path: elsewhere }],
      ['dataset.episodes', { path: elsewhere, offset: 0, limit: 5 }],
      ['dataset.episodeArrays', { path: elsewhere, episodeId: 'ep-000000' }],
      ['dataset.verify', { path: elsewhere }],
      ['dataset.compare', { originalPath: elsewhere, regeneratedPath: elsewhere }],
      ['seed.read', { path: join(elsewhere, 'seed.json') }],
      ['reproduce.begin', { seedPath: join(elsewhere, 'seed.json'), outDir: join(root, 'never') }],
      ['export.begin', { scenarioText: '{}', outDir: join(root, 'never'), format: 'npz', workers: 1, resume: false }],
    ] as const) {
      const error = await stranger.refusal(name, args);
      expect(error.code, name).toBe('path-refused');
      expect(error.message, name).toMatch(/outside the folders chosen in this session/);
    }
    // A folder picked in the session does not open the way to what a symlink inside it points at.
    const picked = realpathSync(mkdtempSync(join(root, 'picked-')));
    await stranger.choose(picked);
    symlinkSync(dataset, join(picked, 'looks-like-mine'));
    expect((await stranger.refusal('dataset.summary', { path: join(picked, 'looks-like-mine') })).code).toBe('path-refused');
    // And a regeneration may read a seed file it was allowed to but still not write outside.
    const seedCopy = join(picked, 'seed.json');
    cpSync(join(dataset, 'seed.json'), seedCopy);
    expect((await stranger.refusal('reproduce.begin', { seedPath: seedCopy, outDir: join(root, 'never') })).code).toBe('path-refused');
  });
});
