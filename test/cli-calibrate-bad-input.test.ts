// Bad calibration inputs at the command line: each malformed measurement (wrong table shapes,
// missing marker columns, non-numbers, too few frames, uneven times, unknown pointers, channels
// or nodes, a descriptor that breaks its schema) makes `pliant calibrate` exit with 2, print a
// message that names the place (file:line, column name, JSON pointer) and the fix, show no stack
// trace and write no fitted scenario. A run whose first frame is not the scenario's start shape
// is fitted, but the command says so (our rule: the simulation starts from the laid-out shape). The CSV shape rule is RFC 4180's (every record has the
// header's field count); the rest are our format's rules (sim/identify/calibration/MEASUREMENT.md).
import { spawnSync } from 'node:child_process';
import { existsSync, mkdirSync, mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join, resolve } from 'node:path';

import { afterAll, describe, expect, it } from 'vitest';

import { runCli } from '../sim/cli/main.ts';
import { encodeNpyBytes } from '../sim/dataset/formats/npy.ts';
import { encodeNpz } from '../sim/dataset/formats/npz.ts';
import { checkScenarioValue } from '../sim/scenario/check-scenario.ts';
import { cleanPositions } from './support/synthetic-measurement.ts';

const ROOT = resolve(import.meta.dirname, '..');
const LAUNCHER = join(ROOT, 'sim/cli/pliant-launcher.mjs');
const work = mkdtempSync(join(tmpdir(), 'pliant-calibrate-bad-'));
afterAll(() => rmSync(work, { recursive: true, force: true }));

type Json = any; // fixtures are edited freely before being written out

/** An invented Korrin Bay tether check: 2 parts, top driven in x, stiffness to fit. */
const SCENARIO = {
  formatVersion: 1,
  name: 'korrin-tether-check',
  system: { kind: 'chain', partCount: 2, lengthM: 1, totalMassKg: 0.2, axialStiffnessN: { kind: 'log-uniform', min: 500, max: 2000 }, dampingRatio: 0.1, diameterM: 0.008, anchor: 'top-driven', drivenAxes: ['x'] },
  world: { gravityMPerS2: [0, -9.81, 0] },
  controls: { default: { kind: 'sinusoid', amplitude: 0.05, frequencyHz: 0.5 } },
  time: { recordIntervalS: 0.02, recordedSteps: 20 },
  episodes: 2,
  seed: 1,
};

function descriptor(): Json {
  return {
    measurementFormat: 1,
    description: 'invented test measurement',
    sampleRateHz: 50,
    table: 'bench.csv',
    markers: [
      { name: 'mid', node: 1 },
      { name: 'tip', node: 2 },
    ],
    drive: { 'top-offset-x': 'clamp_x_m' },
  };
}

const HEADER = 'time_s,mid_x_m,mid_y_m,mid_z_m,tip_x_m,tip_y_m,tip_z_m,clamp_x_m';

function csvRows(frames: number): string[] {
  const rows = [HEADER];
  for (let s = 0; s < frames; s++) rows.push([(s * 0.02).toFixed(2), 0, 2, 0, 0, 1.5, 0, (0.001 * s).toFixed(3)].join(','));
  return rows;
}

interface Case {
  name: string;
  descriptor?: (d: Json) => void;
  csv?: (rows: string[]) => void;
  files?: Record<string, Uint8Array>;
  args?: string[];
  /** Fragments the message must contain. */
  says: Array<string | RegExp>;
}

const CASES: Case[] = [
  { name: 'row with a missing value', csv: (r) => (r[4] = r[4].split(',').slice(0, -1).join(',')), says: ['bench.csv:5:', 'has 7 values, the header 8 columns'] },
  { name: 'marker columns missing', descriptor: (d) => d.markers.push({ name: 'q9', node: 2 }), says: ['bench.csv:1:', 'no column "q9_x_m"'] },
  { name: 'misspelt column', csv: (r) => (r[0] = r[0].replace('tip_y_m', 'tip_yy_m')), says: ['bench.csv:1: the header has no column "tip_y_m"', 'did you mean "tip_yy_m"?'] },
  { name: 'NaN in a coordinate', csv: (r) => (r[6] = r[6].replace(',1.5,', ',NaN,')), says: ['bench.csv:7 column tip_y_m', '"NaN" is not a finite number'] },
  { name: 'empty cell', csv: (r) => (r[3] = r[3].replace(',2,', ',,')), says: ['bench.csv:4 column mid_y_m', 'is not a finite number'] },
  { name: 'one frame only', csv: (r) => r.splice(2), says: ['1 frame', 'shorter than one record interval'] },
  { name: 'header only', csv: (r) => r.splice(1), says: ['0 frames', 'shorter than one record interval'] },
  { name: 'uneven frame times', csv: (r) => (r[5] = r[5].replace(/^0\.08/, '0.09')), says: ['bench.csv:6 column time_s', 'evenly spaced'] },
  { name: 'unknown --fit pointer', args: ['--fit', '/system/axialStifnessN'], says: ['--fit: "/system/axialStifnessN" is not a numeric parameter', 'did you mean "/system/axialStiffnessN"'] },
  { name: '--fit without a slash', args: ['--fit', 'system/lengthM'], says: ['each starting with "/"'] },
  { name: 'unknown known-parameter pointer', descriptor: (d) => (d.knownParameters = { '/system/lenghtM': 1 }), says: ['/knownParameters: "/system/lenghtM"', 'did you mean "/system/lengthM"'] },
  { name: 'marker on a node the system lacks', descriptor: (d) => (d.markers[1].node = 7), says: ['/markers/1/node', 'has 3 nodes (0 to 2)'] },
  { name: 'drive of an unknown channel', descriptor: (d) => (d.drive = { 'top-offset-x': 'clamp_x_m', 'top-ofset-z': 'clamp_x_m' }), says: ['/drive/top-ofset-z', 'no control channel "top-ofset-z"'] },
  { name: 'channel without a drive', descriptor: (d) => delete d.drive, csv: (r) => r.forEach((row, i) => (r[i] = row.split(',').slice(0, -1).join(','))), says: ['/drive: control channel "top-offset-x"', 'has no recorded signal'] },
  { name: 'misspelt descriptor key', descriptor: (d) => (d.sampleRateHZ = 50), says: [/bench-descriptor\.json:\d+:\d+ \/sampleRateHZ: is not a member/] },
  { name: 'sample rate missing', descriptor: (d) => delete d.sampleRateHz, says: [/bench-descriptor\.json:\d+:\d+ \/: must have required property 'sampleRateHz'/] },
  { name: 'negative sample rate', descriptor: (d) => (d.sampleRateHz = -50), says: [/\/sampleRateHz: must be > 0/] },
  { name: 'table of another kind', descriptor: (d) => (d.table = 'bench.xlsx'), says: [/\/table: must match pattern/] },
  { name: 'table missing', descriptor: (d) => (d.table = 'nowhere.csv'), says: ['cannot read the measurement table nowhere.csv: it does not exist'] },
  { name: 'NPY of the wrong shape', descriptor: (d) => { d.table = 'bench.npy'; delete d.drive; }, files: { 'bench.npy': encodeNpyBytes({ name: 'positions_m', dtype: 'float64', shape: [10, 2, 2], data: new Float64Array(40) }) }, says: ['bench.npy positions_m: the array has shape (10, 2, 2); it must be (frames, 2, 3)'] },
  { name: 'NPZ without positions', descriptor: (d) => (d.table = 'bench.npz'), files: { 'bench.npz': encodeNpz([{ name: 'drive', dtype: 'float64', shape: [10, 1], data: new Float64Array(10) }]) }, says: ['no member "positions_m"'] },
  { name: 'NPZ drive named by column name', descriptor: (d) => (d.table = 'bench.npz'), files: { 'bench.npz': encodeNpz([{ name: 'positions_m', dtype: 'float64', shape: [10, 2, 3], data: new Float64Array(60) }, { name: 'drive', dtype: 'float64', shape: [10, 1], data: new Float64Array(10) }]) }, says: ['/drive/top-offset-x: an NPZ drive is named by column index'] },
  { name: 'NaN in an NPZ table', descriptor: (d) => { d.table = 'bench.npz'; d.drive = { 'top-offset-x': 0 }; }, files: { 'bench.npz': encodeNpz([{ name: 'positions_m', dtype: 'float64', shape: [10, 2, 3], data: Float64Array.from({ length: 60 }, (_, i) => (i === 22 ? NaN : 0)) }, { name: 'drive', dtype: 'float64', shape: [10, 1], data: new Float64Array(10) }]) }, says: ['frame 3, marker "tip", y', 'must be a finite number'] },
  { name: 'missing --out', args: ['--no-out'], says: ['--out FITTED.json is required'] },
  { name: 'bad --range-se', args: ['--range-se', 'two'], says: ['--range-se "two" must be a number above 0'] },
];

async function cli(args: string[]): Promise<{ code: number; stdout: string; stderr: string }> {
  let stdout = '';
  let stderr = '';
  const code = await runCli(args, { stdout: (t) => void (stdout += t), stderr: (t) => void (stderr += t), isTerminal: false, env: {}, cwd: work });
  return { code, stdout, stderr };
}

function prepare(c: Case): { dir: string; args: string[]; out: string } {
  const dir = join(work, c.name.replace(/[^a-z0-9]+/gi, '-'));
  mkdirSync(dir, { recursive: true });
  writeFileSync(join(dir, 'scenario.json'), JSON.stringify(SCENARIO, null, 2));
  const d = descriptor();
  c.descriptor?.(d);
  writeFileSync(join(dir, 'bench-descriptor.json'), JSON.stringify(d, null, 2));
  const rows = csvRows(10);
  c.csv?.(rows);
  writeFileSync(join(dir, 'bench.csv'), `${rows.join('\n')}\n`);
  for (const [name, bytes] of Object.entries(c.files ?? {})) writeFileSync(join(dir, name), bytes);
  const out = join(dir, 'fitted.json');
  const extra = c.args ?? [];
  const withOut = extra[0] === '--no-out' ? [] : ['--out', out, ...extra];
  return { dir, args: ['calibrate', join(dir, 'scenario.json'), join(dir, 'bench-descriptor.json'), ...withOut], out };
}

describe('pliant calibrate refuses bad inputs with exit 2 and a message', () => {
  it.each(CASES.map((c) => [c.name, c] as const))('%s', async (_name, c) => {
    const { args, out } = prepare(c);
    const outcome = await cli(args);
    expect(outcome.code, outcome.stderr).toBe(2);
    expect(outcome.stdout).toBe('');
    for (const fragment of c.says) {
      if (typeof fragment === 'string') expect(outcome.stderr).toContain(fragment);
      else expect(outcome.stderr).toMatch(fragment);
    }
    expect(outcome.stderr).not.toMatch(/\n\s+at /);
    expect(outcome.stderr).not.toMatch(/Error:/);
    expect(existsSync(out)).toBe(false);
  });

  it('an integer parameter left to fit asks for the bench value', async () => {
    const c: Case = { name: 'part count distributed', says: [] };
    const { dir, args } = prepare(c);
    writeFileSync(join(dir, 'scenario.json'), JSON.stringify({ ...SCENARIO, system: { ...SCENARIO.system, partCount: { kind: 'integer', min: 2, max: 4 } } }));
    const outcome = await cli(args);
    expect(outcome.code).toBe(2);
    expect(outcome.stderr).toContain('/system/partCount is drawn as a whole number');
    expect(outcome.stderr).toContain('"knownParameters": { "/system/partCount": … }');
  });

  it('a bench run that did not start from the laid-out shape is fitted but warned about', async () => {
    const checked = checkScenarioValue(SCENARIO);
    if (!checked.ok) throw new Error(JSON.stringify(checked.problems));
    const frames = 40;
    const drive = Float64Array.from({ length: frames }, (_, s) => 0.05 * Math.sin(0.2 * (s + 1)));
    const clean = cleanPositions({
      scenario: checked.scenario,
      markers: descriptor().markers,
      frameCount: frames,
      sampleRateHz: 50,
      trueValues: { '/system/axialStiffnessN': 1000 },
      noiseStdM: 0,
      seed: 1,
      drive: [{ channel: 'top-offset-x', values: drive }],
    });
    const c: Case = { name: 'start elsewhere', says: [] };
    const { dir, args } = prepare(c);
    const rows = [HEADER];
    for (let s = 0; s < frames; s++) {
      const p = Array.from(clean.slice(6 * s, 6 * s + 6), (x, k) => x + (s === 0 && k === 1 ? 0.05 : 0) + 1e-4 * Math.sin(7 * s + k));
      rows.push([(s * 0.02).toFixed(2), ...p.map((x) => x.toFixed(7)), drive[s].toFixed(7)].join(','));
    }
    writeFileSync(join(dir, 'bench.csv'), `${rows.join('\n')}\n`);
    const outcome = await cli(args);
    expect(outcome.code, outcome.stderr).toBe(0);
    expect(outcome.stdout).toMatch(/warning: frame 0 differs from the simulated start by 2\.\d+e-2 m RMS/);
  }, 60_000);

  it('the installed launcher prints the same message and no stack trace', () => {
    const { args } = prepare(CASES.find((c) => c.name === 'NaN in a coordinate')!);
    const run = spawnSync(process.execPath, [LAUNCHER, ...args], { encoding: 'utf8', cwd: work });
    expect(run.status).toBe(2);
    expect(run.stderr).toContain('bench.csv:7 column tip_y_m');
    expect(run.stderr).not.toMatch(/\n\s+at /);
  }, 60_000);
});
