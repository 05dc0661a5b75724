// Throughput and peak memory of `pliant score` on a korrin-tether dataset. The dataset (NPZ,
// float32) and a persistence prediction for every recorded episode (every row the initial
// state) are made first, untimed; then the score runs in a fresh child process
// (score-throughput-child.mjs) twice: over every split, and over the held-out split alone. The
// two peaks show whether memory follows the number of scored episodes (it should not, beyond the
// parsed manifest and a compact row per episode). Default 500 episodes;
// PLIANT_BENCH_SCORE_EPISODES=10000 for the full size (generating it takes minutes). MB are
// 10^6 bytes. Line:
//   {"case":"score-korrin-tether","episodes":…,"seconds":…,"episodes_per_s":…,"peak_rss_mb":…,
//    "held_out_episodes":…,"held_out_seconds":…,"held_out_peak_rss_mb":…}
import { spawnSync } from 'node:child_process';
import { mkdirSync, mkdtempSync, readFileSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { fileURLToPath } from 'node:url';

import { namedArray } from '../dataset/formats/named-array.ts';
import { readNpzFile, writeNpzFile } from '../dataset/formats/npz.ts';
import type { DatasetManifest } from '../dataset/manifest/dataset-manifest.ts';
import type { BenchmarkCase } from './benchmark-case.ts';
import { demoScenarioPath } from './demo-scenario.ts';
import { episodeCountFromEnvironment } from './sweep-memory.ts';

const CHILD = fileURLToPath(new URL('./score-throughput-child.mjs', import.meta.url));
export const SCORE_EPISODES_VARIABLE = 'PLIANT_BENCH_SCORE_EPISODES';
export const DEFAULT_SCORE_EPISODES = 500;

interface ChildReport {
  code: number;
  seconds: number;
  peakKib: number;
}

function writePersistence(dataset: string, manifest: DatasetManifest, out: string): void {
  mkdirSync(out, { recursive: true });
  for (const episode of manifest.episodes) {
    if (episode.status !== 'ok') continue;
    const arrays = readNpzFile(join(dataset, 'episodes', `${episode.id}.npz`));
    const held = ['positions', 'velocities'].map((name) => {
      const a = arrays.find((x) => x.name === name)!;
      const perRow = a.shape[1] * 3;
      const data = new Float32Array(a.shape[0] * perRow);
      for (let t = 0; t < a.shape[0]; t++) data.set((a.data as Float32Array).subarray(0, perRow), t * perRow);
      return namedArray(name, a.shape, data);
    });
    writeNpzFile(join(out, `${episode.id}.npz`), held, { compression: 'stored' });
  }
}

function scoreInChild(args: string[]): ChildReport {
  const run = spawnSync(process.execPath, [CHILD, ...args], { encoding: 'utf8', stdio: ['ignore', 'pipe', 'pipe'], maxBuffer: 1 << 20 });
  const lastLine = run.stdout?.trim().split('\n').at(-1) ?? '';
  let report: ChildReport | undefined;
  try {
    report = JSON.parse(lastLine) as ChildReport;
  } catch {
    report = undefined;
  }
  if (run.status !== 0 || report === undefined || report.code !== 0) {
    throw new Error(`the measured score failed (exit ${run.status ?? run.signal}): ${run.stderr?.trim() || lastLine || 'no output'}`);
  }
  return report;
}

const megabytes = (kib: number): number => Number(((kib * 1024) / 1e6).toFixed(1));

export const scoreThroughputCase: BenchmarkCase = {
  name: 'score-korrin-tether',
  async run() {
    const episodes = episodeCountFromEnvironment(process.env, SCORE_EPISODES_VARIABLE, DEFAULT_SCORE_EPISODES);
    const work = mkdtempSync(join(tmpdir(), 'pliant-bench-score-'));
    try {
      const dataset = join(work, 'tether');
      // Loaded here, not at the top: the command line's table of commands imports this case.
      const { defaultIo, runCli } = await import('../cli/main.ts');
      const io = { ...defaultIo(), stdout: () => {} };
      const code = await runCli(['generate', demoScenarioPath('korrin-tether'), '--out', dataset, '--episodes', String(episodes), '--workers', '2', '--progress', 'none'], io);
      if (code !== 0) throw new Error(`generating the benchmark dataset failed (exit ${code})`);
      const manifest = JSON.parse(readFileSync(join(dataset, 'manifest.json'), 'utf8')) as DatasetManifest;
      const predictions = join(work, 'persistence');
      writePersistence(dataset, manifest, predictions);
      const splits = Object.keys(manifest.splits).filter((s) => manifest.splits[s].ok > 0);
      const scored = splits.reduce((n, s) => n + manifest.splits[s].ok, 0);
      const all = scoreInChild([dataset, predictions, '--out', join(work, 'report-all'), '--split', splits.join(',')]);
      const heldOutEpisodes = manifest.splits['held-out']?.ok ?? 0;
      const heldOut = heldOutEpisodes > 0 ? scoreInChild([dataset, predictions, '--out', join(work, 'report-held-out'), '--split', 'held-out']) : null;
      return {
        episodes: scored,
        seconds: Number(all.seconds.toFixed(3)),
        episodes_per_s: Number((scored / all.seconds).toPrecision(4)),
        peak_rss_mb: megabytes(all.peakKib),
        held_out_episodes: heldOutEpisodes,
        ...(heldOut ? { held_out_seconds: Number(heldOut.seconds.toFixed(3)), held_out_peak_rss_mb: megabytes(heldOut.peakKib) } : {}),
      };
    } finally {
      rmSync(work, { recursive: true, force: true });
    }
  },
};
