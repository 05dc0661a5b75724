// The pipeline benchmark cases of `pliant bench`: each prints JSON lines with exactly the keys
// documented in its file (sim/bench/pipeline-episodes.ts, pipeline-export.ts, sweep-memory.ts),
// rates are the quotient of the amounts and times on the same line (arithmetic, common practice,
// no source), and the export cases count real data files: the NPZ files they write load in
// Debian's NumPy and the HDF5 file in h5py with the episodes' arrays, for every compression
// choice; the file bytes they report are the sizes Python's os.path.getsize reads and the array
// bytes the sum of NumPy's ndarray.nbytes. No time is asserted: benchmarks measure.
import { spawnSync } from 'node:child_process';
import { mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';

import { afterAll, describe, expect, it } from 'vitest';

import { PIPELINE_EPISODES } from '../sim/bench/pipeline-episodes.ts';
import { arrayBytes, EXPORT_EPISODES, exportHdf5, exportNpz, tetherEpisodes } from '../sim/bench/pipeline-export.ts';
import { MEMORY_EPISODES_VARIABLE } from '../sim/bench/sweep-memory.ts';
import { EXPORT_COMPRESSIONS } from '../sim/scenario/export-compression.ts';
import { referencePythonAvailability, runReferencePython } from './support/reference-python.ts';

const python = referencePythonAvailability();
const work = mkdtempSync(join(tmpdir(), 'pliant-bench-lines-'));
afterAll(() => rmSync(work, { recursive: true, force: true }));

function bench(cases: string[], env: Record<string, string> = {}): { status: number | null; stderr: string; lines: Record<string, unknown>[] } {
  const run = spawnSync(process.execPath, ['sim/cli/pliant-launcher.mjs', 'bench', ...cases.flatMap((c) => ['--case', c])], {
    cwd: join(import.meta.dirname, '..'),
    encoding: 'utf8',
    env: { ...process.env, ...env },
    timeout: 300_000,
  });
  const lines = run.stdout.split('\n').filter((line) => line !== '').map((line) => JSON.parse(line) as Record<string, unknown>);
  return { status: run.status, stderr: run.stderr, lines };
}

/** `value` equals `amount / seconds` to the precision the line rounds to. */
function expectRate(value: unknown, amount: number, seconds: number): void {
  expect(typeof value).toBe('number');
  expect(Math.abs((value as number) - amount / seconds) / (amount / seconds)).toBeLessThan(2e-3);
}

describe('pipeline benchmark lines', () => {
  it('export-npz and export-hdf5: one line per compression choice with the rates and ratio of the amounts on it', () => {
    const run = bench(['export-npz', 'export-hdf5']);
    expect(run.stderr).toBe('');
    expect(run.status).toBe(0);
    expect(run.lines.map((l) => [l.case, l.compression])).toEqual([
      ...EXPORT_COMPRESSIONS.map((c) => ['export-npz', c]),
      ...EXPORT_COMPRESSIONS.map((c) => ['export-hdf5', c]),
    ]);
    const keys = ['array_megabytes', 'case', 'compression', 'episodes', 'mb_per_s', 'megabytes', 'ratio', 'seconds'];
    for (const line of run.lines) {
      expect(Object.keys(line).sort()).toEqual(line.case === 'export-npz' ? [...keys, 'encode_mb_per_s', 'encode_seconds'].sort() : keys);
      expect(line.episodes).toBeGreaterThan(0);
      expect(line.episodes).toBeLessThanOrEqual(EXPORT_EPISODES);
      expectRate(line.mb_per_s, line.array_megabytes as number, line.seconds as number);
      expectRate(line.ratio, line.array_megabytes as number, line.megabytes as number);
      if (line.case === 'export-npz') {
        expectRate(line.encode_mb_per_s, line.array_megabytes as number, line.encode_seconds as number);
        // Encoding is part of writing the file.
        expect(line.encode_seconds as number).toBeLessThanOrEqual(line.seconds as number);
      }
    }
  }, 300_000);

  it.runIf(python.available)('the export cases count the bytes of files NumPy and h5py read back with the episodes\' arrays, and the array bytes NumPy counts', async () => {
    const episodes = tetherEpisodes(4);
    const expected = episodes.map((e) => ({ id: e.id, arrays: Object.fromEntries(e.arrays.map((a) => [a.name, [...a.shape]])) }));
    for (const compression of EXPORT_COMPRESSIONS) {
      const npz = exportNpz(episodes, join(work, compression, 'npz'), compression);
      const hdf5 = await exportHdf5(episodes, join(work, compression, 'hdf5'), compression);
      const read = runReferencePython<{ npzBytes: number; h5Bytes: number; arrayBytes: number; npz: unknown; h5: unknown }>(
        `import json, os, sys
import numpy as np, h5py
spec = json.load(sys.stdin)
npz, total, array_bytes = [], 0, 0
for e in spec["episodes"]:
    path = os.path.join(spec["npz"], "episodes", e["id"] + ".npz")
    total += os.path.getsize(path)
    with np.load(path) as z:
        npz.append({"id": e["id"], "arrays": {k: list(z[k].shape) for k in z.files}})
        array_bytes += sum(z[k].nbytes for k in z.files)
with h5py.File(spec["h5"], "r") as f:
    h5 = [{"id": k, "arrays": {n: list(f[k][n].shape) for n in f[k].keys()}} for k in sorted(f.keys())]
print(json.dumps({"npzBytes": total, "h5Bytes": os.path.getsize(spec["h5"]), "arrayBytes": array_bytes, "npz": npz, "h5": h5}))`,
        { episodes: expected, npz: join(work, compression, 'npz'), h5: join(work, compression, 'hdf5', 'train.h5') },
      );
      expect(read.npzBytes).toBe(npz.bytes);
      expect(read.h5Bytes).toBe(hdf5.bytes);
      expect(read.arrayBytes).toBe(arrayBytes(episodes));
      expect(read.npz).toEqual(expected);
      expect(read.h5).toEqual(expected);
    }
  }, 120_000);

  it('episodes-korrin-eel: a line at 1 and at 2 workers, the second with the speed-up of the two rates', () => {
    const run = bench(['episodes-korrin-eel']);
    expect(run.stderr).toBe('');
    expect(run.status).toBe(0);
    expect(run.lines).toHaveLength(2);
    const [one, two] = run.lines;
    expect(Object.keys(one).sort()).toEqual(['case', 'episodes', 'episodes_per_s', 'finish_s', 'first_episode_s', 'seconds', 'workers']);
    expect(Object.keys(two).sort()).toEqual(['case', 'episodes', 'episodes_per_s', 'finish_s', 'first_episode_s', 'seconds', 'speedup', 'workers']);
    expect([one.case, one.workers, two.case, two.workers]).toEqual(['episodes-korrin-eel', 1, 'episodes-korrin-eel', 2]);
    for (const line of run.lines) {
      expect(line.episodes).toBe(PIPELINE_EPISODES['korrin-eel']);
      expectRate(line.episodes_per_s, line.episodes as number, line.seconds as number);
      // The first episode is written after the start and the finishing step ends the run.
      expect(line.first_episode_s).toBeGreaterThan(0);
      expect((line.first_episode_s as number) + (line.finish_s as number)).toBeLessThanOrEqual(line.seconds as number);
    }
    expectRate(two.speedup, (one.seconds as number), (two.seconds as number));
  }, 300_000);

  it(`memory-korrin-tether: one line for the episode count ${MEMORY_EPISODES_VARIABLE} gives, with the peak resident memory`, () => {
    const run = bench(['memory-korrin-tether'], { [MEMORY_EPISODES_VARIABLE]: '40' });
    expect(run.stderr).toBe('');
    expect(run.status).toBe(0);
    expect(run.lines).toHaveLength(1);
    const line = run.lines[0];
    const keys = ['case', 'episodes', 'episodes_per_s', 'peak_rss_mb', 'seconds', 'workers'];
    // The sweep-only figure exists where the kernel can reset the high-water mark (Linux).
    expect(Object.keys(line).sort()).toEqual(process.platform === 'linux' ? [...keys, 'sweep_peak_rss_mb'].sort() : keys);
    expect([line.case, line.episodes, line.workers]).toEqual(['memory-korrin-tether', 40, 2]);
    expectRate(line.episodes_per_s, 40, line.seconds as number);
    // A process that loaded Node.js, the TypeScript loader and the scenario checks holds tens of MB at the least.
    expect(line.peak_rss_mb).toBeGreaterThan(40);
  }, 300_000);

  it(`refuses a ${MEMORY_EPISODES_VARIABLE} that is not a whole number, saying what to give, without a stack trace`, () => {
    const run = bench(['memory-korrin-tether'], { [MEMORY_EPISODES_VARIABLE]: 'ten thousand' });
    expect(run.status).toBe(2);
    expect(run.lines).toEqual([]);
    expect(run.stderr).toContain(`${MEMORY_EPISODES_VARIABLE}="ten thousand" is not a whole number`);
    expect(run.stderr).toContain('e.g. 10000');
    expect(run.stderr).not.toMatch(/\n\s+at /);
  }, 60_000);
});
