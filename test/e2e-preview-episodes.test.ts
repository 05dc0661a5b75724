// The Preview screen's promise, checked without a browser: the episodes its Web Worker draws and
// simulates are the episodes `pliant generate` writes. The worker's code path (the defaults it
// fills without ajv, sampleEpisode, the chunked EpisodeStepper) runs here in Node for the first
// episodes of the tether demo; `pliant generate` writes the same episodes to NPZ files; Debian's
// NumPy (/usr/bin/python3) reads the files back. Positions must agree to the last bit of float32.
import { spawnSync } from 'node:child_process';
import { mkdtempSync, readdirSync, readFileSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';

import { afterAll, beforeAll, describe, expect, it } from 'vitest';

import { checkedScenario } from '../renderer/preview/checked-scenario.ts';
import { EpisodeStepper } from '../renderer/preview/episode-stepper.ts';
import { ENERGY_TERM_COUNT } from '../sim/core/energy.ts';
import { checkScenarioText } from '../sim/scenario/check-scenario.ts';
import { sampleEpisode } from '../sim/scenario/sample-episode.ts';
import { REPO_ROOT, SCENARIOS_DIR } from './support/e2e-web-app.ts';
import { referencePythonAvailability, runReferencePython } from './support/reference-python.ts';

const python = referencePythonAvailability();
const DEMOS = readdirSync(SCENARIOS_DIR).filter((name) => name.endsWith('.json')).sort();

describe('the preview worker reads a checked scenario as the checker does', () => {
  // The checker fills defaults with ajv's useDefaults; the worker cannot run ajv under the page's
  // Content-Security-Policy and fills them by walking the schema instead.
  for (const demo of DEMOS) {
    it(`${demo}: same defaults as checkScenarioText`, () => {
      const text = readFileSync(join(SCENARIOS_DIR, demo), 'utf8');
      const reference = checkScenarioText(text, demo);
      expect(reference.ok).toBe(true);
      const ours = checkedScenario(text, demo);
      expect(ours.ok).toBe(true);
      if (reference.ok && ours.ok) expect(ours.scenario).toEqual(reference.scenario);
    });
  }
});

describe.runIf(python.available)('previewed episodes are the generated episodes (files read by NumPy)', () => {
  const demo = 'korrin-tether.json';
  const episodes = 2;
  let folder: string;

  beforeAll(() => {
    folder = mkdtempSync(join(tmpdir(), 'pliant-e2e-generate-'));
    const cli = spawnSync(
      process.execPath,
      [join(REPO_ROOT, 'sim/cli/pliant-launcher.mjs'), 'generate', join(SCENARIOS_DIR, demo), '--out', join(folder, 'out'), '--episodes', String(episodes), '--workers', '1', '--format', 'npz', '--progress', 'none'],
      { encoding: 'utf8', timeout: 240_000 },
    );
    if (cli.status !== 0) throw new Error(`pliant generate failed (${cli.status}): ${cli.stderr}`);
  });

  afterAll(() => rmSync(folder, { recursive: true, force: true }));

  for (let index = 0; index < episodes; index++) {
    it(`episode ${index}: every float32 position equals the NPZ file's`, () => {
      const checked = checkedScenario(readFileSync(join(SCENARIOS_DIR, demo), 'utf8'), demo);
      if (!checked.ok) throw new Error(checked.message);
      const episode = sampleEpisode(checked.scenario, index);
      const stepper = new EpisodeStepper(episode.system.model, episode.world, episode.controls, episode.recording);
      const n3 = episode.system.model.nodeCount * 3;
      const positions = new Float32Array(stepper.frameCount * n3);
      const time = new Float64Array(stepper.frameCount);
      const energies = new Float64Array(stepper.frameCount * ENERGY_TERM_COUNT);
      // Odd chunk sizes, as the worker's adaptive chunks would be.
      let done = 0;
      for (let chunk = 1; done < stepper.frameCount; chunk = (chunk * 3) % 17 + 1) {
        const part = new Float32Array(chunk * n3);
        const written = stepper.advance(chunk, part, time.subarray(done), energies.subarray(ENERGY_TERM_COUNT * done));
        positions.set(part.subarray(0, written * n3), done * n3);
        done += written;
      }
      const file = join(folder, 'out', 'episodes', `ep-${String(index).padStart(6, '0')}.npz`);
      const reference = runReferencePython<{ shape: number[]; dtype: string; values: number[] }>(
        'import json, sys, numpy\n' +
          'path = json.load(sys.stdin)\n' +
          'a = numpy.load(path)["positions"]\n' +
          'print(json.dumps({"shape": list(a.shape), "dtype": str(a.dtype), "values": a.astype(numpy.float64).ravel().tolist()}))',
        file,
      );
      expect(reference.dtype).toBe('float32');
      expect(reference.shape).toEqual([stepper.frameCount, episode.system.model.nodeCount, 3]);
      expect(Array.from(positions)).toEqual(reference.values);
    });
  }
});
