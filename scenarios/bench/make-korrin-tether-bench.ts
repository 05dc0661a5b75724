// Makes the invented Korrin Bay bench measurement of the rover's tether that the calibration
// demo and its tests use: the tether scenario simulated with chosen "true" values, four markers
// sampled at 50 Hz for 2 s while the rover drags the top about, plus 1 mm of normal noise per
// coordinate. Invented for the demo; no real tether was measured. Run it to rewrite the files:
//   npx tsx scenarios/bench/make-korrin-tether-bench.ts
// A test checks the committed files are exactly what this script makes.
import { readFileSync, writeFileSync } from 'node:fs';
import { fileURLToPath } from 'node:url';

import { selectParameters } from '../../sim/identify/calibration/free-parameters.ts';
import { MarkerTrajectoryModel } from '../../sim/identify/calibration/marker-trajectory-model.ts';
import type { Measurement } from '../../sim/identify/calibration/measurement.ts';
import { RandomStream, StreamPurpose } from '../../sim/random/random-stream.ts';
import { checkScenarioText } from '../../sim/scenario/check-scenario.ts';
import type { Scenario } from '../../sim/scenario/scenario-types.ts';

export const BENCH_DESCRIPTOR_FILE = 'korrin-tether-bench.json';
export const BENCH_TABLE_FILE = 'korrin-tether-bench.csv';
export const BENCH_SAMPLE_RATE_HZ = 50;
export const BENCH_FRAME_COUNT = 101;
export const BENCH_NOISE_STD_M = 0.001;
const NOISE_SEED = 20261203;

/** What the bench "knows": the tether as built (12 parts) and weighed (0.25 kg). */
export const BENCH_KNOWN_PARAMETERS = { '/system/partCount': 12, '/system/totalMassKg': 0.25 };

/** The invented "true" values the measurement is made from (inside the scenario's ranges). */
export const BENCH_TRUE_VALUES: Record<string, number> = {
  '/system/lengthM': 2.1,
  '/system/axialStiffnessN': 6500,
  '/system/bendingStiffnessNm2': 0.006,
  '/system/dampingRatio': 0.11,
  '/world/gravityMPerS2/1': -9.81,
  '/world/fluid/normalDragNsPerM3': 1150,
};

const MARKERS = [
  { name: 'q3', node: 3 },
  { name: 'q6', node: 6 },
  { name: 'q9', node: 9 },
  { name: 'tip', node: 12 },
];

/** Offset of the rover's tether clamp from its start, m (starts at rest at 0). */
function clampOffsetM(timeS: number): [number, number] {
  const x = 0.12 * Math.sin(2 * Math.PI * 0.6 * timeS) + 0.04 * Math.sin(2 * Math.PI * 1.3 * timeS);
  const z = 0.08 * Math.sin(2 * Math.PI * 0.8 * timeS);
  return [x, z];
}

export function tetherScenarioPath(): string {
  return fileURLToPath(new URL('../korrin-tether.json', import.meta.url));
}

export function loadTetherScenario(): Scenario {
  const checked = checkScenarioText(readFileSync(tetherScenarioPath(), 'utf8'), 'korrin-tether.json');
  if (!checked.ok) throw new Error('scenarios/korrin-tether.json does not pass its checks; run pliant validate on it');
  return checked.scenario;
}

export interface BenchFiles {
  descriptorText: string;
  csvText: string;
}

export function makeKorrinTetherBench(scenario: Scenario): BenchFiles {
  const frames = BENCH_FRAME_COUNT;
  // The drive's row s is the offset reached at frame s + 1 (an episode's `controls` convention).
  const driveX = new Float64Array(frames);
  const driveZ = new Float64Array(frames);
  for (let s = 0; s < frames; s++) [driveX[s], driveZ[s]] = clampOffsetM((s + 1) / BENCH_SAMPLE_RATE_HZ);
  const skeleton: Measurement = {
    source: BENCH_DESCRIPTOR_FILE,
    description: '',
    sampleRateHz: BENCH_SAMPLE_RATE_HZ,
    markers: MARKERS,
    frameCount: frames,
    positionsM: new Float64Array(frames * MARKERS.length * 3),
    drive: [
      { channel: 'top-offset-x', values: driveX },
      { channel: 'top-offset-z', values: driveZ },
    ],
    knownParameters: BENCH_KNOWN_PARAMETERS,
  };
  const selection = selectParameters(scenario, BENCH_KNOWN_PARAMETERS, undefined, BENCH_DESCRIPTOR_FILE);
  const model = new MarkerTrajectoryModel(scenario, skeleton, selection);
  const clean = model.predict(selection.free.map((p) => BENCH_TRUE_VALUES[p.pointer]));
  const noise = new RandomStream(NOISE_SEED, 0, StreamPurpose.parameters, 0);
  const header = ['time_s', ...MARKERS.flatMap((m) => ['x', 'y', 'z'].map((axis) => `${m.name}_${axis}_m`)), 'clamp_x_m', 'clamp_z_m'];
  const lines = [header.join(',')];
  for (let s = 0; s < frames; s++) {
    const cells = [(s / BENCH_SAMPLE_RATE_HZ).toFixed(2)];
    for (let k = 0; k < MARKERS.length * 3; k++) cells.push((clean[s * MARKERS.length * 3 + k] + BENCH_NOISE_STD_M * noise.nextNormal()).toFixed(6));
    cells.push(driveX[s].toFixed(6), driveZ[s].toFixed(6));
    lines.push(cells.join(','));
  }
  const descriptor = {
    measurementFormat: 1,
    description:
      'INVENTED FOR THE DEMO, not a real measurement. Korrin Bay test tank: the inspection rover\'s tether (12 parts as built, weighed at 0.25 kg) hanging from the rover\'s clamp, which drags its top about in x and z. Four markers tracked at 50 Hz for 2 s. Made by scenarios/bench/make-korrin-tether-bench.ts from chosen "true" values (length 2.1 m, axial stiffness 6500 N, bending rigidity 0.006 N·m², damping ratio 0.11, gravity -9.81 m/s², normal drag 1150 N·s/m³) plus 1 mm of normal noise per coordinate.',
    sampleRateHz: BENCH_SAMPLE_RATE_HZ,
    table: BENCH_TABLE_FILE,
    markers: MARKERS,
    drive: { 'top-offset-x': 'clamp_x_m', 'top-offset-z': 'clamp_z_m' },
    knownParameters: BENCH_KNOWN_PARAMETERS,
  };
  return { descriptorText: `${JSON.stringify(descriptor, null, 2)}\n`, csvText: `${lines.join('\n')}\n` };
}

if (process.argv[1] && fileURLToPath(import.meta.url) === process.argv[1]) {
  const files = makeKorrinTetherBench(loadTetherScenario());
  writeFileSync(fileURLToPath(new URL(BENCH_DESCRIPTOR_FILE, import.meta.url)), files.descriptorText);
  writeFileSync(fileURLToPath(new URL(BENCH_TABLE_FILE, import.meta.url)), files.csvText);
  console.log(`wrote scenarios/bench/${BENCH_DESCRIPTOR_FILE} and scenarios/bench/${BENCH_TABLE_FILE}`);
}
