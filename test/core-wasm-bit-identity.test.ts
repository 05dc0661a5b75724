// The WebAssembly step kernel against its specification, the JavaScript kernel: every system
// below is run once with each kernel through the same calls, and positions, velocities and
// forces must agree as IEEE 754 binary64 bit patterns (compared as BigUint64Array words), not
// merely as numbers. Bit identity is possible because WebAssembly's f64 add, sub, mul, div and
// sqrt are the IEEE 754 operations with round-to-nearest-even (WebAssembly Core Specification
// 2.0, §4.3.3 "Floating-Point Operations") and it has no implicit fused multiply-add, and
// ECMAScript's Number arithmetic is the same binary64 arithmetic (ECMA-262, §6.1.6.1 "The
// Number Type"); Math.sqrt on V8 uses the correctly rounded hardware square root (from memory,
// checked here by the results themselves).
//
// The table is meant to grow. A new force pass or contact pass in the JavaScript kernel must be
// registered in sim/core/wasm/wasm-kernel-coverage.ts; until it is ported, the systems that use
// it run JavaScript under kernel 'wasm' and fail here on the kernel check, not silently.
// Add a row for each new feature of the step. Chains with bending rigidity (hinges, clamps,
// bending damping) and pinned and driven nodes by index are rows below; every scenario's first
// episode is compared including its settling run.
import { readdirSync, readFileSync } from 'node:fs';
import { join, resolve } from 'node:path';

import { describe, expect, it } from 'vitest';

import { buildChain1024, CHAIN_1024_DT_S } from '../sim/bench/chain-1024.ts';
import { buildLattice8x8x8, LATTICE_CONTROL_INTERVAL_S,latticeWorld } from '../sim/bench/lattice-8x8x8.ts';
import type { Model } from '../sim/core/model.ts';
import { Simulator } from '../sim/core/simulator.ts';
import { autoSubsteps, stabilityBound } from '../sim/core/stability-bound.ts';
import type { StepKernel } from '../sim/core/step-kernel-choice.ts';
import { resolveStepKernel } from '../sim/core/step-kernel-choice.ts';
import type { World } from '../sim/core/world.ts';
import { defaultWorld } from '../sim/core/world.ts';
import { sha256Hex } from '../sim/dataset/formats/file-digest.ts';
import { computeEpisodeOutcome } from '../sim/dataset/write/episode-outcome.ts';
import { ReplayTable } from '../sim/dataset/write/replay-inputs.ts';
import { recordTrajectory } from '../sim/episode/record-episode.ts';
import { checkScenarioText } from '../sim/scenario/check-scenario.ts';
import { sampleEpisode } from '../sim/scenario/sample-episode.ts';
import type { Scenario } from '../sim/scenario/scenario-types.ts';
import type { ChainParameters } from '../sim/systems/chain.ts';
import { buildChain } from '../sim/systems/chain.ts';
import type { LatticeMaterial, MaterialMap2D, MaterialMap3D } from '../sim/systems/lattice.ts';
import { buildLattice } from '../sim/systems/lattice.ts';

const ROOT = resolve(import.meta.dirname, '..');

/** Index of the first element whose bit pattern differs (or the shorter length), −1 if none. */
function firstBitDifference(a: Float64Array, b: Float64Array): number {
  if (a.length !== b.length) return Math.min(a.length, b.length);
  const wa = new BigUint64Array(a.buffer, a.byteOffset, a.length);
  const wb = new BigUint64Array(b.buffer, b.byteOffset, b.length);
  for (let i = 0; i < wa.length; i++) if (wa[i] !== wb[i]) return i;
  return -1;
}

function expectSameBits(label: string, js: Float64Array, wasm: Float64Array): void {
  const at = firstBitDifference(js, wasm);
  expect(at, `${label}: first differing element ${at} (js ${js[at]}, wasm ${wasm[at]})`).toBe(-1);
}

/** How a system is driven: fixed steps, or control intervals with a control vector each. */
type Drive =
  | { kind: 'steps'; dtS: number; count: number; oneCall: boolean }
  | { kind: 'intervals'; intervalS: number; substeps: number; count: number; controls: (t: number, out: Float64Array) => void };

interface Row {
  name: string;
  build(): { model: Model; world: World };
  drive: Drive;
}

interface RunResult {
  kernel: StepKernel;
  positionM: Float64Array;
  velocityMPerS: Float64Array;
  forceN: Float64Array;
  timeS: number;
  start: Float64Array;
}

function run(row: Row, kernel: StepKernel): RunResult {
  const { model, world } = row.build();
  const start = model.positionM.slice();
  const simulator = new Simulator(model, world, { kernel });
  const d = row.drive;
  if (d.kind === 'steps') {
    if (d.oneCall) simulator.advanceSteps(d.dtS, d.count);
    else for (let s = 0; s < d.count; s++) simulator.step(d.dtS);
  } else {
    const controls = new Float64Array(Math.max(1, model.controlChannelCount));
    for (let t = 0; t < d.count; t++) {
      d.controls(t, controls);
      simulator.setControls(controls);
      simulator.advanceInterval(d.intervalS, d.substeps);
    }
  }
  return { kernel: simulator.kernel, positionM: model.positionM, velocityMPerS: model.velocityMPerS, forceN: simulator.forceN.slice(), timeS: simulator.timeS, start };
}

const TETHER_SEGMENT: ChainParameters = {
  partCount: 24, lengthM: 1.2, totalMassKg: 0.3, axialStiffnessN: 400, secondNeighbourSpringRatio: 0.05, dampingRatio: 0.2,
  diameterM: 0.01, anchor: 'top-pinned', originM: [0, 0.5, 0], directionUnit: [1, -0.2, 0.1], forceHandles: [], forceAxes: [], drivenAxes: [],
};

const FIN_PAD: LatticeMaterial = { name: 'fin pad', youngsModulusPa: 5e4, densityKgPerM3: 1100, dampingRatio: 0.2, actuatorChannel: null, actuationStrainMax: 0 };
const FIN_ACTUATOR: LatticeMaterial = { name: 'fin actuator', youngsModulusPa: 8e4, densityKgPerM3: 1060, dampingRatio: 0.15, actuatorChannel: 0, actuationStrainMax: 0.12 };
const FIN_ACTUATOR_B: LatticeMaterial = { ...FIN_ACTUATOR, name: 'fin actuator b', actuatorChannel: 1 };

function chainSystem(over: Partial<ChainParameters>, world: World): { model: Model; world: World } {
  return { model: buildChain({ ...TETHER_SEGMENT, ...over }).model, world };
}

function latticeSystem(map: MaterialMap2D | MaterialMap3D, materials: LatticeMaterial[], base: 'free' | 'clamped', originM: [number, number, number], world: World) {
  return { model: buildLattice({ cellSizeM: 0.02, materialMap: map, materials, base, originM }).model, world };
}

/** A tether segment with bending rigidity EI (N·m², in the tether demo's range 0.002-0.02). */
function bentChain(over: Partial<ChainParameters>, world: World, wantDamping: boolean): { model: Model; world: World } {
  const system = chainSystem({ bendingStiffnessNm2: 0.005, ...over }, world);
  const m = system.model;
  // The rows below are about these passes: make sure each has what its name says.
  if (m.hingeCount === 0) throw new Error('bending row without hinges');
  const damped = m.hingeDampingNms.some((eta) => eta > 0) || m.clampDampingNms.some((eta) => eta > 0);
  if (damped !== wantDamping) throw new Error(`bending row: damping ${damped}, expected ${wantDamping}`);
  if ((over.clampedEnds?.length ?? 0) !== m.clampCount) throw new Error('bending row: clamp count differs from clampedEnds');
  return system;
}

function substepsFor(row: () => { model: Model; world: World }, intervalS: number): number {
  const { model, world } = row();
  return autoSubsteps(intervalS, stabilityBound(model, world.airDragPerS));
}

function withGround(staticFriction: number, kineticFriction: number, heightM = 0): World {
  const world = defaultWorld();
  world.ground = { enabled: true, heightM, staticFriction, kineticFriction };
  return world;
}

function inFluid(flow: [number, number, number], buoyancy: boolean): World {
  const world = defaultWorld();
  world.fluid = { enabled: true, densityKgPerM3: 1000, normalDragNsPerM3: 800, tangentialDragNsPerM3: 60, flowVelocityMPerS: flow, buoyancy };
  return world;
}

const wave = (hz: number, phase = 0) => (t: number) => Math.sin(2 * Math.PI * hz * (t + 0.5) * 0.01 + phase);

function intervalsRow(name: string, build: () => { model: Model; world: World }, count: number, controls: (t: number, out: Float64Array) => void): Row {
  return { name, build, drive: { kind: 'intervals', intervalS: 0.01, substeps: substepsFor(build, 0.01), count, controls } };
}

const ROWS: Row[] = [
  { name: 'chain-1024 reference, step by step', build: () => ({ model: buildChain1024(), world: defaultWorld() }), drive: { kind: 'steps', dtS: CHAIN_1024_DT_S, count: 300, oneCall: false } },
  { name: 'chain-1024 reference, one call', build: () => ({ model: buildChain1024(), world: defaultWorld() }), drive: { kind: 'steps', dtS: CHAIN_1024_DT_S, count: 300, oneCall: true } },
  {
    name: 'lattice-8x8x8 reference (actuators, ground contact with friction)',
    build: () => ({ model: buildLattice8x8x8(), world: latticeWorld() }),
    drive: {
      kind: 'intervals', intervalS: LATTICE_CONTROL_INTERVAL_S, count: 6,
      substeps: autoSubsteps(LATTICE_CONTROL_INTERVAL_S, stabilityBound(buildLattice8x8x8(), 0)),
      controls: (t, u) => { u[0] = Math.sin(2 * Math.PI * 2 * (t + 0.5) * LATTICE_CONTROL_INTERVAL_S); },
    },
  },
  intervalsRow('hanging chain with air drag', () => { const w = defaultWorld(); w.airDragPerS = 0.7; return chainSystem({}, w); }, 20, () => {}),
  intervalsRow('both ends pinned, no second-neighbour springs', () => chainSystem({ anchor: 'both-pinned', secondNeighbourSpringRatio: 0 }, defaultWorld()), 20, () => {}),
  intervalsRow('tip pushed by handle forces on x and y', () => chainSystem({ forceHandles: [-1, 5], forceAxes: ['x', 'y'] }, defaultWorld()), 20, (t, u) => {
    u[0] = 0.3 * wave(3)(t); u[1] = 0.2 * wave(2, 1)(t); u[2] = -0.1; u[3] = 0.05 * wave(5)(t);
  }),
  intervalsRow('driven top on x and z (driven nodes)', () => chainSystem({ anchor: 'top-driven', drivenAxes: ['x', 'z'] }, defaultWorld()), 20, (t, u) => {
    u[0] = 0.05 * wave(2)(t); u[1] = 0.03 * wave(1, 0.5)(t);
  }),
  intervalsRow('free chain falling onto the ground (contact, static and kinetic friction)', () => chainSystem({ anchor: 'free', originM: [0, 0.05, 0], directionUnit: [1, 0, 0.3] }, withGround(0.6, 0.5)), 30, () => {}),
  intervalsRow('chain dragged along the ground by its tip, μ_k > μ_s (the clamp at zero)', () => chainSystem({ anchor: 'free', originM: [0, 0.001, 0], directionUnit: [1, 0, 0], forceHandles: [-1], forceAxes: ['x', 'y'] }, withGround(0.3, 0.9)), 30, (t, u) => {
    u[0] = 2 * wave(1)(t); u[1] = 0.2;
  }),
  intervalsRow('block started partly below a raised ground plane (lifted to it)', () => latticeSystem([[[1, 1], [1, 1]]], [FIN_PAD], 'free', [0, -0.004, 0], withGround(0.6, 0.5, 0.002)), 20, () => {}),
  intervalsRow('chain in a flowing fluid with buoyancy (segment drag), driven top', () => {
    const s = chainSystem({ anchor: 'top-driven', drivenAxes: ['y'], forceHandles: [-1], forceAxes: ['z'] }, inFluid([0.2, 0, -0.05], true));
    return s;
  }, 20, (t, u) => { u[0] = 0.02 * wave(1)(t); u[1] = 0.05 * wave(2)(t); }),
  intervalsRow('actuated 3-D fin in a flowing fluid (quad drag), two channels, clamped base', () => latticeSystem(
    [[[1, 1, 1], [1, 1, 1]], [[2, 3, 2], [3, 2, 3]]], [FIN_PAD, FIN_ACTUATOR, FIN_ACTUATOR_B], 'clamped', [0, 0, 0], inFluid([0.05, 0.01, 0], true),
  ), 20, (t, u) => { u[0] = wave(2)(t); u[1] = -wave(2, 0.3)(t); }),
  intervalsRow('actuated 2-D swimmer outline in still fluid (segment drag on a lattice)', () => latticeSystem(
    [[2, 3, 2, 3, 2], [1, 1, 1, 1, 1]], [FIN_PAD, FIN_ACTUATOR, FIN_ACTUATOR_B], 'free', [0, 0, 0], inFluid([0, 0, 0], false),
  ), 20, (t, u) => { u[0] = wave(3)(t); u[1] = wave(3, Math.PI / 2)(t); }),
  intervalsRow('EI, clamped at the top (hinges and one clamp, no bending damping)', () => bentChain({ clampedEnds: ['top'] }, defaultWorld(), false), 30, () => {}),
  intervalsRow('EI, clamped at both ends, pushed in the middle', () => bentChain({ anchor: 'free', clampedEnds: ['top', 'bottom'], forceHandles: [12], forceAxes: ['y', 'z'] }, defaultWorld(), false), 30, (t, u) => {
    u[0] = 0.4 * wave(3)(t); u[1] = 0.3 * wave(2, 1)(t);
  }),
  intervalsRow('EI with bending damping, clamped top, chain laid out bent', () => bentChain({ bendingStiffnessNm2: 0.01, bendingDampingRatio: 0.3, clampedEnds: ['top'] }, defaultWorld(), true), 30, () => {}),
  intervalsRow('EI with bending damping, straight vertical chain (|w|² under STRAIGHT_HINGE_W2 until pushed)', () => bentChain({
    bendingDampingRatio: 0.2, directionUnit: [0, -1, 0], forceHandles: [-1], forceAxes: ['x'],
  }, defaultWorld(), true), 30, (t, u) => { u[0] = t < 5 ? 0 : 0.05 * wave(2)(t); }),
  intervalsRow('EI with bending damping, pinned nodes by index (0, 8, tip), no clamp', () => bentChain({ anchor: 'free', pinnedNodes: [0, 8, -1], bendingDampingRatio: 0.1 }, defaultWorld(), true), 30, () => {}),
  intervalsRow('EI, driven nodes by index (12, tip) and a driven top held in direction by a clamp', () => bentChain({
    anchor: 'top-driven', drivenAxes: ['x', 'z'], drivenNodes: [12, -1], clampedEnds: ['top'], bendingDampingRatio: 0.1,
  }, defaultWorld(), true), 30, (t, u) => {
    u[0] = 0.05 * wave(2)(t); u[1] = 0.03 * wave(1, 0.5)(t); u[2] = 0.02 * wave(3)(t); u[3] = -0.01; u[4] = 0.04 * wave(1)(t); u[5] = 0.02 * wave(2, 2)(t);
  }),
  intervalsRow('EI with bending damping in a flowing fluid with buoyancy, clamped driven top (the tether demo\'s passes)', () => bentChain({
    anchor: 'top-driven', drivenAxes: ['x', 'z'], clampedEnds: ['top'], bendingDampingRatio: 0.1, bendingStiffnessNm2: 0.02,
  }, inFluid([0.1, 0, 0.05], true), true), 30, (t, u) => { u[0] = 0.05 * wave(1)(t); u[1] = 0.05 * wave(2)(t); }),
  intervalsRow('lattice with a shaking-table clamp group (driven face) and a pinned cell group', () => ({
    model: buildLattice({
      cellSizeM: 0.02, materialMap: [[[1, 1, 1], [1, 1, 1]], [[2, 1, 2], [1, 2, 1]]], materials: [FIN_PAD, FIN_ACTUATOR], base: 'free', originM: [0, 0, 0],
      clamps: [{ name: 'table', face: '-y', drivenAxes: ['x', 'y'] }, { name: 'peg', cells: [[2, 1, 1]], drivenAxes: [] }],
    }).model,
    world: defaultWorld(),
  }), 20, (t, u) => { u[0] = wave(3)(t); u[1] = 0.002 * wave(2)(t); u[2] = 0.001 * wave(5)(t); }),
  intervalsRow('actuated block on the ground in air (contact and actuation together)', () => latticeSystem(
    [[[1, 1], [1, 1]], [[2, 2], [2, 2]]], [FIN_PAD, FIN_ACTUATOR], 'free', [0, 0, 0], withGround(0.8, 0.6),
  ), 20, (t, u) => { u[0] = wave(4)(t); }),
];

describe('WebAssembly kernel is bit-identical to the JavaScript kernel (WebAssembly Core Specification 2.0 §4.3.3; ECMA-262 §6.1.6.1)', () => {
  it('WebAssembly runs here, so the comparisons below are not JavaScript against itself', () => {
    expect(resolveStepKernel()).toBe('wasm');
    expect(resolveStepKernel('js')).toBe('js');
  });

  for (const row of ROWS) {
    it(row.name, () => {
      const js = run(row, 'js');
      const wasm = run(row, 'wasm');
      expect([js.kernel, wasm.kernel]).toEqual(['js', 'wasm']);
      // The system moved, so equal bits say something.
      expect(firstBitDifference(js.start, js.positionM)).not.toBe(-1);
      expectSameBits('positions', js.positionM, wasm.positionM);
      expectSameBits('velocities', js.velocityMPerS, wasm.velocityMPerS);
      expectSameBits('forces of the last step', js.forceN, wasm.forceN);
      expect(Object.is(js.timeS, wasm.timeS)).toBe(true);
    });
  }

  it('the comparison sees a one-ulp change: a step 1 ulp longer gives different bits', () => {
    const row = ROWS[0];
    const d = row.drive as Extract<Drive, { kind: 'steps' }>;
    const longer = new Float64Array([d.dtS]);
    new BigUint64Array(longer.buffer)[0] += 1n;
    const base = run(row, 'js');
    const nudged = run({ ...row, drive: { ...d, dtS: longer[0] } }, 'js');
    expect(firstBitDifference(base.positionM, nudged.positionM)).not.toBe(-1);
  });
});

/** scenarios/*.json and scenarios/identification/*.json (the -fine tether). */
function demoScenarios(): { file: string; scenario: Scenario }[] {
  const files = [
    ...readdirSync(join(ROOT, 'scenarios')).filter((f) => f.endsWith('.json')).sort(),
    ...readdirSync(join(ROOT, 'scenarios/identification')).filter((f) => f.endsWith('.json')).sort().map((f) => `identification/${f}`),
  ];
  return files.map((file) => {
    const checked = checkScenarioText(readFileSync(join(ROOT, 'scenarios', file), 'utf8'), file);
    if (!checked.ok) throw new Error(`${file} does not pass its checks`);
    return { file, scenario: checked.scenario };
  });
}

describe('every scenario in scenarios/: the first episode recorded with each kernel, bit for bit', () => {
  const scenarios = demoScenarios();
  it('finds the demo scenarios', () => expect(scenarios.length).toBeGreaterThanOrEqual(3));
  for (const { file, scenario } of scenarios) {
    it(`${file}, episode 0: positions, velocities and energies at every record step`, () => {
      // The settling run (initialState.settleS) and the recording both use the kernel.
      const record = (kernel: StepKernel) => {
        const sampled = sampleEpisode(scenario, 0, { kernel });
        const used = new Simulator(sampled.system.model, sampled.world, { kernel }).kernel;
        return { used, trajectory: recordTrajectory(sampled.system.model, sampled.world, sampled.controls, sampled.recording, kernel) };
      };
      const jsRun = record('js');
      const wasmRun = record('wasm');
      // Not JavaScript against itself: the WebAssembly kernel covers this scenario's passes.
      expect([jsRun.used, wasmRun.used]).toEqual(['js', 'wasm']);
      const js = jsRun.trajectory;
      const wasm = wasmRun.trajectory;
      expect(js.steps).toBeGreaterThan(0);
      expectSameBits('positions', js.positionM, wasm.positionM);
      expectSameBits('velocities', js.velocityMPerS, wasm.velocityMPerS);
      expectSameBits('energies', js.energiesJ, wasm.energiesJ);
      expectSameBits('times', js.timeS, wasm.timeS);
    });
  }
});

describe('episode files: the NPZ bytes and manifest records of a small dataset do not depend on the kernel (SHA-256, FIPS 180-4)', () => {
  for (const { file, scenario } of demoScenarios()) {
    it(`${file}, episodes 0-2`, () => {
      for (let index = 0; index < Math.min(3, scenario.episodes); index++) {
        const sampled = sampleEpisode(scenario, index);
        expect(new Simulator(sampled.system.model, sampled.world, { kernel: 'wasm' }).kernel, `episode ${index} runs WebAssembly`).toBe('wasm');
        const js = computeEpisodeOutcome(scenario, index, scenario.export.dtype, new ReplayTable(), 'js');
        const wasm = computeEpisodeOutcome(scenario, index, scenario.export.dtype, new ReplayTable(), 'wasm');
        expect(js.npz, `episode ${index} was rejected; pick a scenario whose first episodes run`).not.toBeNull();
        expect(sha256Hex(wasm.npz!), `episode ${index}`).toBe(sha256Hex(js.npz!));
        expect(wasm.record).toEqual(js.record);
      }
    });
  }
});
