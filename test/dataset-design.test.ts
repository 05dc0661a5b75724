// A dataset whose episodes a design places (Latin hypercube and Sobol over the Korrin Bay
// tether) must come out byte for byte the same from one run, from two worker threads and from
// three array-job shards merged, as test/dataset-reproducibility.test.ts demands of independent
// draws (the Latin hypercube one with exact, stratified split counts too); and its card must report the design with a discrepancy that SciPy's
// scipy.stats.qmc.discrepancy(method="CD") (under /usr/bin/python3) confirms for the same points.
import { mkdtempSync, readdirSync, readFileSync, rmSync, statSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join, resolve } from 'node:path';

import { afterAll, beforeAll, describe, expect, it } from 'vitest';

import { runCli } from '../sim/cli/main.ts';
import { checkScenarioText } from '../sim/scenario/check-scenario.ts';
import { scenarioDesignPlan } from '../sim/scenario/design/scenario-design.ts';
import { withOverrides } from '../sim/scenario/scenario-overrides.ts';
import type { Scenario } from '../sim/scenario/scenario-types.ts';
import { referencePythonAvailability, runReferencePython } from './support/reference-python.ts';

const ROOT = resolve(import.meta.dirname, '..');
const work = mkdtempSync(join(tmpdir(), 'pliant-design-'));
const EPISODES = 9;
const scenarios: Record<string, Scenario> = {};

async function cli(args: string[], env: Record<string, string> = {}): Promise<{ code: number; stdout: string; stderr: string }> {
  let stdout = '';
  let stderr = '';
  const code = await runCli(args, { stdout: (t) => void (stdout += t), stderr: (t) => void (stderr += t), isTerminal: false, env, cwd: work });
  return { code, stdout, stderr };
}

function filesBelow(dir: string): string[] {
  return readdirSync(dir, { recursive: true, encoding: 'utf8' })
    .filter((p) => statSync(join(dir, p)).isFile() && p !== 'manifest.json')
    .map((p) => p.split('\\').join('/'))
    .sort();
}

function expectSameFiles(dir: string, reference: string): void {
  const files = filesBelow(reference);
  expect(filesBelow(dir)).toEqual(files);
  for (const path of files) expect(readFileSync(join(dir, path)).equals(readFileSync(join(reference, path))), path).toBe(true);
  const { run: _a, ...want } = JSON.parse(readFileSync(join(reference, 'manifest.json'), 'utf8')) as Record<string, unknown>;
  const { run: _b, ...got } = JSON.parse(readFileSync(join(dir, 'manifest.json'), 'utf8')) as Record<string, unknown>;
  expect(got).toEqual(want);
}

beforeAll(async () => {
  const text = readFileSync(join(ROOT, 'scenarios/korrin-tether.json'), 'utf8');
  const checked = checkScenarioText(text, 'korrin-tether.json');
  if (!checked.ok) throw new Error(JSON.stringify(checked.problems));
  for (const kind of ['latin-hypercube', 'sobol'] as const) {
    const base = withOverrides(checked.scenario, { episodes: EPISODES, format: 'npz' });
    // The Latin hypercube run also plans its splits: exact counts, stratified by length.
    const splits = kind === 'latin-hypercube' ? { ...base.splits, counts: { validation: 2, test: 2 }, stratify: { parameters: ['/system/lengthM'], bins: 2 } } : base.splits;
    const scenario = { ...base, design: { kind }, splits };
    scenarios[kind] = scenario;
    writeFileSync(join(work, `${kind}.json`), JSON.stringify(scenario, null, 2));
    const made = await cli(['generate', join(work, `${kind}.json`), '--out', join(work, `${kind}-one`), '--workers', '1']);
    expect(made.stderr).toBe('');
    expect(made.code).toBe(0);
  }
});

afterAll(() => rmSync(work, { recursive: true, force: true }));

describe('a designed dataset is shard- and worker-safe', () => {
  for (const kind of ['latin-hypercube', 'sobol'] as const) {
    it(`${kind}: three shards merged and two workers equal one run, byte for byte`, async () => {
      const shards = [0, 1, 2].map((i) => join(work, `${kind}-shard-${i}`));
      for (let i = 0; i < 3; i++) {
        const made = await cli(['generate', join(work, `${kind}.json`), '--out', shards[i], '--shard', `${i}/3`, '--workers', '1']);
        expect(made.stderr).toBe('');
        expect(made.code).toBe(0);
      }
      const merged = join(work, `${kind}-merged`);
      const result = await cli(['merge', shards[2], shards[0], shards[1], '--out', merged]);
      expect(result.stderr).toBe('');
      expectSameFiles(merged, join(work, `${kind}-one`));
      const two = join(work, `${kind}-two`);
      expect((await cli(['generate', join(work, `${kind}.json`), '--out', two, '--workers', '2'])).code).toBe(0);
      expectSameFiles(two, join(work, `${kind}-one`));
    });
  }

  it('the design changes the labels: a Latin hypercube of 9 episodes has one length per ninth of its range; its planned splits have exactly 2 validation and 2 test episodes', () => {
    const manifest = JSON.parse(readFileSync(join(work, 'latin-hypercube-one', 'manifest.json'), 'utf8')) as { episodes: { labels: Record<string, number>; split: string }[] };
    const ninths = manifest.episodes.map((e) => Math.floor((e.labels['/system/lengthM'] - 1.5) * 9)).sort();
    expect(ninths).toEqual([0, 1, 2, 3, 4, 5, 6, 7, 8]);
    expect(manifest.episodes.filter((e) => e.split === 'validation').length).toBe(2);
    expect(manifest.episodes.filter((e) => e.split === 'test').length).toBe(2);
  });
});

describe.skipIf(!referencePythonAvailability().available)('the card reports the design', () => {
  it('with kind, dimension, points and the squared centred discrepancy SciPy finds for the same points', () => {
    const card = readFileSync(join(work, 'sobol-one', 'CARD.md'), 'utf8');
    expect(card).toContain('## Design');
    expect(card).toContain('Kind: **scrambled Sobol sequence**');
    const plan = scenarioDesignPlan(scenarios.sobol)!;
    expect(card).toContain(`Dimension ${plan.pointers.length}, ${EPISODES} points`);
    const points = Array.from({ length: EPISODES }, (_, i) => plan.coordinates(i));
    const want = runReferencePython<number>(
      `
import json, sys, numpy as np
from scipy.stats import qmc
print(json.dumps(float(qmc.discrepancy(np.array(json.load(sys.stdin)), method='CD'))))
`,
      points,
    );
    const shown = /CD² = ([0-9.e+-]+) over all 9 points/.exec(card);
    expect(shown).not.toBeNull();
    expect(Math.abs(Number(shown![1]) / want - 1)).toBeLessThan(5e-4);
    expect(card).not.toContain('## Design\n\nKind: **independent');
  });
});
