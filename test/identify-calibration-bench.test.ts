// The invented Korrin Bay tether bench measurement in scenarios/bench/: the committed files are
// exactly what their script makes (so they cannot drift from it), and `pliant calibrate` on them
// recovers the script's true values. Each identifiable value must lie within 3 of its reported
// standard errors of the truth: this is one fixed noise draw over four correlated parameters,
// so a 2σ test would fail by chance about one run in five even with correct errors (the 2σ rate
// itself is checked over many seeds in identify-calibration-coverage.test.ts). The fitted
// scenario then passes the scenario checks and `pliant generate` draws inside the fitted ranges.
import { mkdtempSync, readFileSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join, resolve } from 'node:path';

import { afterAll, describe, expect, it } from 'vitest';

import { BENCH_TRUE_VALUES, loadTetherScenario, makeKorrinTetherBench } from '../scenarios/bench/make-korrin-tether-bench.ts';
import { runCli } from '../sim/cli/main.ts';
import { checkScenarioText } from '../sim/scenario/check-scenario.ts';
import { SAFETY_CAUTION } from '../sim/scenario/safety-caution.ts';

const ROOT = resolve(import.meta.dirname, '..');
const work = mkdtempSync(join(tmpdir(), 'pliant-calibrate-bench-'));
afterAll(() => rmSync(work, { recursive: true, force: true }));

async function cli(args: string[]): Promise<{ code: number; stdout: string; stderr: string }> {
  let stdout = '';
  let stderr = '';
  const code = await runCli(args, { stdout: (t) => void (stdout += t), stderr: (t) => void (stderr += t), isTerminal: false, env: {}, cwd: ROOT });
  return { code, stdout, stderr };
}

describe('Korrin Bay tether bench measurement', () => {
  it('the committed descriptor and table are what make-korrin-tether-bench.ts writes', () => {
    const made = makeKorrinTetherBench(loadTetherScenario());
    expect(readFileSync(join(ROOT, 'scenarios/bench/korrin-tether-bench.json'), 'utf8')).toBe(made.descriptorText);
    expect(readFileSync(join(ROOT, 'scenarios/bench/korrin-tether-bench.csv'), 'utf8')).toBe(made.csvText);
    expect(JSON.parse(made.descriptorText).description).toMatch(/^INVENTED FOR THE DEMO/);
  });

  it('calibrating the tether scenario on it recovers the true values and writes a scenario to generate from', async () => {
    const fitted = join(work, 'korrin-tether-fitted.json');
    const run = await cli(['calibrate', 'scenarios/korrin-tether.json', 'scenarios/bench/korrin-tether-bench.json', '--out', fitted]);
    expect(run.stderr).toBe('');
    expect(run.code).toBe(0);
    expect(run.stdout).toContain(SAFETY_CAUTION);
    const report = join(work, 'korrin-tether-fitted-report');
    const calibration = JSON.parse(readFileSync(join(report, 'calibration.json'), 'utf8'));
    const parameters = calibration.parameters as Array<{ pointer: string; value: number | null; standardError: number | null; identifiable: boolean; fittedRange: { min: number; max: number } | null }>;
    expect(parameters.map((p) => p.pointer).sort()).toEqual(Object.keys(BENCH_TRUE_VALUES).sort());
    const identifiable = parameters.filter((p) => p.identifiable);
    expect(identifiable.length).toBeGreaterThanOrEqual(3);
    for (const p of identifiable) {
      const z = Math.abs((p.value as number) - BENCH_TRUE_VALUES[p.pointer]) / (p.standardError as number);
      expect(z, `${p.pointer}: fitted ${p.value} ± ${p.standardError}, true ${BENCH_TRUE_VALUES[p.pointer]}`).toBeLessThan(3);
      expect(p.fittedRange).not.toBeNull();
    }
    // Not identifiable: no number printed, and the fitted scenario keeps the written spec.
    const written = JSON.parse(readFileSync(join(ROOT, 'scenarios/korrin-tether.json'), 'utf8'));
    const out = JSON.parse(readFileSync(fitted, 'utf8'));
    const markdown = readFileSync(join(report, 'REPORT.md'), 'utf8');
    for (const p of parameters.filter((q) => !q.identifiable)) {
      expect(p.value).toBeNull();
      expect(p.standardError).toBeNull();
      expect(markdown).toMatch(new RegExp(`\`${p.pointer}\` \\|[^\\n]*not identifiable from this data`));
    }
    if (parameters.some((p) => p.pointer === '/system/dampingRatio' && !p.identifiable)) expect(out.system.dampingRatio).toEqual(written.system.dampingRatio);
    expect(markdown).toContain(SAFETY_CAUTION);
    expect(calibration.safetyCaution).toBe(SAFETY_CAUTION);
    expect(readFileSync(join(report, 'residual-over-time.svg'), 'utf8')).toMatch(/^<svg[^>]*xmlns="http:\/\/www.w3.org\/2000\/svg"/);
    expect(checkScenarioText(readFileSync(fitted, 'utf8'), fitted).ok).toBe(true);
    // Every other key is as written.
    expect(out.controls).toEqual(written.controls);
    expect(out.splits).toEqual(written.splits);

    const sweep = join(work, 'sweep');
    const generated = await cli(['generate', fitted, '--out', sweep, '--episodes', '3', '--workers', '1', '--progress', 'none']);
    expect(generated.stderr).toBe('');
    expect(generated.code).toBe(0);
    const manifest = JSON.parse(readFileSync(join(sweep, 'manifest.json'), 'utf8'));
    for (const episode of manifest.episodes) {
      for (const p of identifiable) {
        const drawn = episode.labels[p.pointer];
        expect(drawn).toBeGreaterThanOrEqual(p.fittedRange!.min);
        expect(drawn).toBeLessThanOrEqual(p.fittedRange!.max);
      }
    }
  }, 180_000);
});
