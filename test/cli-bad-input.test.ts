// Bad input at the command line, end to end: each malformed scenario file makes `pliant validate`
// and `pliant generate` exit with 2, print a message that names the JSON pointer of the problem
// (and file:line:column), show no stack trace and create no output folder; bad flags do the same.
// The physical rules behind some cases: semi-implicit Euler is stable only for ω·dt < 2
// (Hairer, Lubich & Wanner, Geometric Numerical Integration, undamped case); Coulomb friction
// needs kinetic ≤ static (common practice, no source); a log-uniform distribution needs min > 0
// (its logarithm; common practice, no source). The scheduler variables are Slurm's
// SLURM_ARRAY_TASK_ID and Kubernetes' JOB_COMPLETION_INDEX (their manuals, from memory).
import { spawnSync } from 'node:child_process';
import { existsSync, mkdirSync, mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join, resolve } from 'node:path';

import { afterAll, describe, expect, it } from 'vitest';

import { runCli } from '../sim/cli/main.ts';

const ROOT = resolve(import.meta.dirname, '..');
const LAUNCHER = join(ROOT, 'sim/cli/pliant-launcher.mjs');
const work = mkdtempSync(join(tmpdir(), 'pliant-bad-input-'));
afterAll(() => rmSync(work, { recursive: true, force: true }));

type Json = any; // fixtures are edited freely before being written out

/** A valid tether check of the Korrin Bay test tank (invented demo values). */
function tether(): Json {
  return {
    formatVersion: 1,
    name: 'korrin-tether-check',
    system: { kind: 'chain', partCount: 6, lengthM: 1.5, totalMassKg: 0.3, axialStiffnessN: 2000, dampingRatio: 0.1, diameterM: 0.008, anchor: 'top-driven', drivenAxes: ['x'] },
    world: { gravityMPerS2: [0, -9.81, 0] },
    controls: { default: { kind: 'sinusoid', amplitude: 0.05, frequencyHz: 0.5 } },
    time: { recordIntervalS: 0.02, recordedSteps: 20 },
    episodes: 2,
    seed: 1,
  };
}

const skin = { name: 'skin', youngsModulusPa: 1e5, densityKgPerM3: 1000, dampingRatio: 0.1 };

/** [case, edit of the valid scenario, the JSON pointer the message must name]. */
const CASES: Array<[string, (s: Json) => void, string]> = [
  ['format version', (s) => (s.formatVersion = 2), '/formatVersion'],
  ['name missing', (s) => delete s.name, '/'],
  ['name with a space and slash', (s) => (s.name = 'korrin tether/1'), '/name'],
  ['misspelt top-level key', (s) => (s.episdes = 3), '/episdes'],
  ['zero episodes', (s) => (s.episodes = 0), '/episodes'],
  ['fractional episodes', (s) => (s.episodes = 2.5), '/episodes'],
  ['negative seed', (s) => (s.seed = -1), '/seed'],
  ['seed above 2^64 − 1', (s) => (s.seed = '18446744073709551616'), '/seed'],
  ['unknown system kind', (s) => (s.system.kind = 'rope'), '/system/kind'],
  ['zero parts', (s) => (s.system.partCount = 0), '/system/partCount'],
  ['negative length', (s) => (s.system.lengthM = -1), '/system/lengthM'],
  ['mass as a word', (s) => (s.system.totalMassKg = 'heavy'), '/system/totalMassKg'],
  ['unknown anchor', (s) => (s.system.anchor = 'glued'), '/system/anchor'],
  ['unknown axis', (s) => (s.system.drivenAxes = ['w']), '/system/drivenAxes/0'],
  ['uniform min above max', (s) => (s.system.lengthM = { kind: 'uniform', min: 2, max: 1 }), '/system/lengthM/max'],
  ['log-uniform from zero', (s) => (s.system.axialStiffnessN = { kind: 'log-uniform', min: 0, max: 10 }), '/system/axialStiffnessN/min'],
  ['unknown distribution', (s) => (s.system.dampingRatio = { kind: 'gaussian', mean: 0.1 }), '/system/dampingRatio/kind'],
  ['integer range with a fraction', (s) => (s.system.partCount = { kind: 'integer', min: 2.5, max: 8 }), '/system/partCount/min'],
  ['gravity with two components', (s) => (s.world.gravityMPerS2 = [0, -9.81]), '/world/gravityMPerS2'],
  ['negative air drag', (s) => (s.world.airDragPerS = -0.1), '/world/airDragPerS'],
  ['kinetic friction above static', (s) => (s.world.ground = { heightM: -3, staticFriction: 0.3, kineticFriction: 0.6 }), '/world/ground/kineticFriction'],
  ['fluid without drag', (s) => (s.world.fluid = { densityKgPerM3: 1000 }), '/world/fluid'],
  ['unknown control kind', (s) => (s.controls.default = { kind: 'square-wave', amplitude: 1 }), '/controls/default/kind'],
  ['sinusoid without frequency', (s) => (s.controls.default = { kind: 'sinusoid', amplitude: 0.05 }), '/controls/default'],
  ['zero record interval', (s) => (s.time.recordIntervalS = 0), '/time/recordIntervalS'],
  ['recorded steps missing', (s) => delete s.time.recordedSteps, '/time'],
  ['sub-steps as a word', (s) => (s.time.substeps = 'many'), '/time/substeps'],
  ['one sub-step beyond the stability limit', (s) => { s.time.substeps = 1; s.system.axialStiffnessN = 5e6; }, '/time/substeps'],
  ['split fractions summing to 1.2', (s) => (s.splits = { fractions: { train: 0.8, validation: 0.3, test: 0.1 } }), '/splits/fractions'],
  ['held-out parameter not a pointer', (s) => (s.splits = { heldOut: [{ parameter: 'system/partCount', above: 3 }] }), '/splits/heldOut/0/parameter'],
  ['unknown export format', (s) => (s.export = { format: 'csv' }), '/export/format'],
  ['unknown export dtype', (s) => (s.export = { dtype: 'float16' }), '/export/dtype'],
  ['lattice without materials', (s) => (s.system = { kind: 'lattice', cellSizeM: 0.02, shape: { maps: [[[1, 1]]] }, materials: [] }), '/system/materials'],
  ['map naming a missing material', (s) => (s.system = { kind: 'lattice', cellSizeM: 0.02, shape: { maps: [[[1, 2]]] }, materials: [skin] }), '/system/shape/maps/0/0/1'],
  ['actuation strain above 0.5', (s) => (s.system = { kind: 'lattice', cellSizeM: 0.02, shape: { maps: [[[1, 1]]] }, materials: [{ ...skin, actuatorChannel: 0, actuationStrainMax: 0.9 }] }), '/system/materials/0/actuationStrainMax'],
  ['control for a channel the system lacks', (s) => (s.controls.channels = { 'top-offset-q': { kind: 'none' } }), '/controls/channels/top-offset-q'],
  ['replay file that does not exist', (s) => (s.controls.default = { kind: 'replay', file: 'no-such-table.npy', column: 0 }), '/controls/default/file'],
];

/** Files that are not even JSON objects; the message names the document root. */
const TEXT_CASES: Array<[string, string]> = [
  ['empty file', ''],
  ['trailing comma', '{"formatVersion": 1,}'],
  ['unclosed object', '{"formatVersion": 1, "name": "korrin"'],
  ['comment', '// tether\n{"formatVersion": 1}'],
  ['a JSON array', '[1, 2, 3]'],
];

interface Outcome {
  code: number;
  stdout: string;
  stderr: string;
}

async function cli(args: string[], env: Record<string, string> = {}): Promise<Outcome> {
  let stdout = '';
  let stderr = '';
  const code = await runCli(args, { stdout: (t) => void (stdout += t), stderr: (t) => void (stderr += t), isTerminal: false, env, cwd: work });
  return { code, stdout, stderr };
}

function writeCase(name: string, text: string): string {
  const path = join(work, `${name.replace(/[^a-z0-9]+/gi, '-')}.json`);
  writeFileSync(path, text);
  return path;
}

function expectRefusal(outcome: Outcome, pointer: string, file: string): void {
  expect(outcome.code).toBe(2);
  expect(outcome.stdout).toBe('');
  // formatProblems wording: file:line:column /pointer: message
  expect(outcome.stderr).toMatch(new RegExp(`^${escape(file)}:\\d+:\\d+ ${escape(pointer)}: \\S`, 'm'));
  expect(outcome.stderr).not.toMatch(/\n\s+at /);
  expect(outcome.stderr).not.toMatch(/Error:/);
}

function escape(text: string): string {
  return text.replace(/[.*+?^${}()|[\]\\/]/g, '\\$&');
}

describe('malformed scenario files at the command line', () => {
  it('has at least 30 cases', () => {
    expect(CASES.length + TEXT_CASES.length).toBeGreaterThanOrEqual(30);
  });

  for (const [name, edit, pointer] of CASES) {
    it(`${name}: validate and generate exit 2 naming ${pointer}, and create no folder`, async () => {
      const scenario = tether();
      edit(scenario);
      const file = writeCase(name, JSON.stringify(scenario, null, 2));
      expectRefusal(await cli(['validate', file]), pointer, file);
      const out = join(work, `out-${name.replace(/[^a-z0-9]+/gi, '-')}`);
      expectRefusal(await cli(['generate', file, '--out', out, '--workers', '1']), pointer, file);
      expect(existsSync(out)).toBe(false);
    });
  }

  for (const [name, text] of TEXT_CASES) {
    it(`${name}: validate and generate exit 2 at the document root, and create no folder`, async () => {
      const file = writeCase(name, text);
      expectRefusal(await cli(['validate', file]), '/', file);
      const out = join(work, `out-${name.replace(/[^a-z0-9]+/gi, '-')}`);
      expectRefusal(await cli(['generate', file, '--out', out]), '/', file);
      expect(existsSync(out)).toBe(false);
    });
  }

  it('the real process prints the same refusal and exits 2 without a stack trace', () => {
    const scenario = tether();
    scenario.system.partCount = 0;
    const text = JSON.stringify(scenario, null, 2);
    const file = writeCase('process-part-count', text);
    // Where the key is written, found by searching the text (1-based line and column).
    const lines = text.split('\n');
    const line = lines.findIndex((l) => l.includes('"partCount"')) + 1;
    const column = lines[line - 1].indexOf('"partCount"') + 1;
    const out = join(work, 'out-process');
    for (const args of [['validate', file], ['generate', file, '--out', out]]) {
      const run = spawnSync(process.execPath, [LAUNCHER, ...args], { cwd: work, encoding: 'utf8' });
      expect(run.status).toBe(2);
      expect(run.stderr).toBe(`${file}:${line}:${column} /system/partCount: must be ≥ 1 (got 0)\n`);
    }
    expect(existsSync(out)).toBe(false);
  });

  it('a valid scenario passes validate with exit 0', async () => {
    const file = writeCase('valid', JSON.stringify(tether(), null, 2));
    const outcome = await cli(['validate', file]);
    expect(outcome.stderr).toBe('');
    expect(outcome.code).toBe(0);
    expect(outcome.stdout).toContain('valid');
  });
});

describe('bad flags at the command line', () => {
  const valid = (): string => writeCase('flags-valid', JSON.stringify(tether(), null, 2));
  const FLAG_CASES: Array<[string, string[], Record<string, string>, RegExp]> = [
    ['no --out', [], {}, /--out DIR is required/],
    ['zero episodes', ['--episodes', '0'], {}, /--episodes 0 is out of range/],
    ['a word for episodes', ['--episodes', 'many'], {}, /--episodes "many" is not a whole number/],
    ['a negative seed', ['--seed', '-1'], {}, /--seed "-1" is not a whole number from 0/],
    ['a seed above 2^64 − 1', ['--seed', '18446744073709551616'], {}, /--seed "18446744073709551616" is not a whole number from 0 to 18446744073709551615/],
    ['zero workers', ['--workers', '0'], {}, /--workers 0 is out of range/],
    ['an unknown format', ['--format', 'xml'], {}, /--format "xml" is not one of npz, hdf5, both/],
    ['an unknown progress style', ['--progress', 'fancy'], {}, /--progress "fancy" is not one of bar, json, none/],
    ['shard index not below the count', ['--shard', '3/3'], {}, /shard index 3 is not below the shard count 3/],
    ['a malformed shard', ['--shard', 'half'], {}, /--shard "half" is not of the form I\/N/],
    ['--shard auto with no scheduler', ['--shard', 'auto'], {}, /found neither SLURM_ARRAY_TASK_ID .* nor JOB_COMPLETION_INDEX/],
    ['--shard auto on Kubernetes without a count', ['--shard', 'auto'], { JOB_COMPLETION_INDEX: '1' }, /give --shard-count N or set PLIANT_SHARD_COUNT/],
    ['--shard auto on Slurm beyond the count', ['--shard', 'auto'], { SLURM_ARRAY_TASK_ID: '4', SLURM_ARRAY_TASK_COUNT: '4' }, /shard index 4 is not below the shard count 4/],
    ['--resume with --force', ['--resume', '--force'], {}, /give --resume or --force, not both/],
    ['an unknown option, with the nearest one offered', ['--wokers', '2'], {}, /unknown option "--wokers" \(did you mean "--workers"\?\); see `pliant generate --help`/],
    ['an unknown option nothing is near', ['--frobnicate'], {}, /unknown option "--frobnicate"; see/],
  ];
  for (const [name, flags, env, message] of FLAG_CASES) {
    it(`${name}: exit 2 with a message and no folder`, async () => {
      const out = join(work, `flag-out-${name.replace(/[^a-z0-9]+/gi, '-')}`);
      const args = ['generate', valid(), ...(name === 'no --out' ? [] : ['--out', out]), ...flags];
      const outcome = await cli(args, env);
      expect(outcome.code).toBe(2);
      expect(outcome.stderr).toMatch(message);
      expect(outcome.stderr).toMatch(/^pliant generate: /);
      expect(outcome.stderr).not.toMatch(/\n\s+at /);
      expect(existsSync(out)).toBe(false);
    });
  }

  it('refuses a non-empty folder that is not a Pliant dataset, even with --force, and leaves it alone', async () => {
    const out = join(work, 'someone-elses');
    mkdirSync(out);
    writeFileSync(join(out, 'notes.txt'), 'tank log');
    for (const extra of [[], ['--force'], ['--resume']]) {
      const outcome = await cli(['generate', valid(), '--out', out, ...extra]);
      expect(outcome.code).toBe(2);
      expect(outcome.stderr).toMatch(/not empty|did not write|not a Pliant dataset/);
    }
    expect(existsSync(join(out, 'notes.txt'))).toBe(true);
    expect(existsSync(join(out, 'seed.json'))).toBe(false);
  });

  it('an output path below a regular file is refused with a message naming it', async () => {
    const file = join(work, 'a-file');
    writeFileSync(file, 'x');
    const outcome = await cli(['generate', valid(), '--out', join(file, 'dataset')]);
    expect(outcome.code).toBe(1);
    expect(outcome.stderr).toContain(file);
    expect(outcome.stderr).toMatch(/is a file, not a folder|not a folder/);
    expect(outcome.stderr).not.toMatch(/\n\s+at /);
  });
});
