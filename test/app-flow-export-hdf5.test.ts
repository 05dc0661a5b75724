// A dataset exported as HDF5 only (one .h5 file per split, no NPZ files) through the request
// handlers: the summary names the format, every episode's arrays come from its group in the
// split's file exactly as Debian's h5py reads them (dtype, shape and bytes), the manifest's
// units come along, and verification passes. The Korrin Bay soft fin (a voxel lattice, so the
// cell arrays are there too) is cut down to a few short episodes.
import { mkdtempSync, realpathSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';

import { afterAll, beforeAll, describe, expect, it } from 'vitest';

import type { AppSession } from './support/app-flow-session.ts';
import { cutDownScenario, startDesktopSession } from './support/app-flow-session.ts';
import { referencePythonAvailability, runReferencePython } from './support/reference-python.ts';

const python = referencePythonAvailability();
const EPISODES = 3;

describe.runIf(python.available)('an HDF5-only export read back through the request handlers', () => {
  let root: string;
  let dataset: string;
  let session: AppSession;

  beforeAll(async () => {
    root = realpathSync(mkdtempSync(join(tmpdir(), 'pliant-app-h5-')));
    session = await startDesktopSession();
    await session.choose(root);
    dataset = join(root, 'tank-fin');
    const events = await session.runJob(() =>
      session.call('export.begin', { scenarioText: cutDownScenario('korrin-fin.json', EPISODES, 20), outDir: dataset, format: 'hdf5', workers: 1, resume: false }));
    expect(events.at(-1)).toMatchObject({ state: 'done', done: EPISODES, total: EPISODES });
  });

  afterAll(() => rmSync(root, { recursive: true, force: true }));

  it('the summary lists HDF5 as the only format and the lattice arrays every episode carries', async () => {
    const summary = await session.call('dataset.summary', { path: dataset });
    expect(summary.formats).toEqual(['hdf5']);
    expect(summary.episodeCount).toBe(EPISODES);
    expect(summary.arrays.map((a) => a.name)).toEqual(expect.arrayContaining(['positions', 'cells', 'cell_material', 'cell_channel']));
  });

  it('each episode\'s arrays are its HDF5 group as h5py reads it, with the units the file carries', async () => {
    const want = runReferencePython<Record<string, { name: string; dtype: string; shape: number[]; unit: string; base64: string }[]>>(
      `import json, sys, os, base64, h5py, numpy
d = json.load(sys.stdin)
m = json.load(open(os.path.join(d, "manifest.json")))
out = {}
for e in m["episodes"]:
    if e["status"] != "ok":
        continue
    f = [x for x in m["files"] if x["path"] in e["files"]][0]
    names = [a["name"].split("/", 1)[1] for a in f["arrays"] if a["name"].startswith(e["id"] + "/")]
    with h5py.File(os.path.join(d, f["path"]), "r") as h:
        g = h[e["id"]]
        out[e["id"]] = [{"name": n, "dtype": str(g[n].dtype), "shape": list(g[n].shape), "unit": g[n].attrs["unit"].decode() if isinstance(g[n].attrs["unit"], bytes) else str(g[n].attrs["unit"]),
                         "base64": base64.b64encode(numpy.ascontiguousarray(g[n][()]).astype(g[n].dtype.newbyteorder("<")).tobytes()).decode()} for n in names]
print(json.dumps(out))`,
      dataset,
    );
    expect(Object.keys(want).length).toBeGreaterThan(0);
    for (const [episodeId, arrays] of Object.entries(want)) {
      const got = await session.call('dataset.episodeArrays', { path: dataset, episodeId });
      expect(got.arrays).toEqual(arrays);
    }
  });

  it('verification passes for every split file', async () => {
    const report = await session.call('dataset.verify', { path: dataset });
    expect(report.ok).toBe(true);
    expect(report.problems).toEqual([]);
  });
});
