// The chain-1024 reference case, fixed by definition so runs can be compared across machines
// and against the plain C build of the same kernel: 1,024 nodes at rest on the x axis with
// spacing 0.01 m, 0.01 kg each, node 0 pinned; structural springs (i, i+1) k = 200 N/m,
// c = 0.05 N·s/m, rest 0.01 m; bending springs (i, i+2) k = 20 N/m, c = 0.005 N·s/m, rest
// 0.02 m; gravity (0, −9.81, 0); no drag, no contact; dt = 1e-4 s fixed, 10,000 steps.
// The checksum is the sum of all position coordinates at the end (expected 408.1644…).
// Its bench line: {"case":"chain-1024","kernel":…,"spring_updates_per_s":…,"seconds":…,"checksum":…},
// the checksum to 10 significant digits; the kernel is js unless `pliant bench --kernel wasm`.
// native/chain_kernel.c is the same kernel in C.
import type { Model } from '../core/model.ts';
import { NODE_PINNED, RELATION_SECOND_NEIGHBOUR, RELATION_STRUCTURAL } from '../core/model.ts';
import { ModelBuilder } from '../core/model-builder.ts';
import { Simulator } from '../core/simulator.ts';
import type { StepKernel } from '../core/step-kernel-choice.ts';
import { defaultWorld } from '../core/world.ts';
import type { BenchmarkCase } from './benchmark-case.ts';

export const CHAIN_1024_NODES = 1024;
export const CHAIN_1024_STEPS = 10_000;
export const CHAIN_1024_DT_S = 1e-4;

export function buildChain1024(): Model {
  return buildChain1024Builder().build();
}

/** The builder of buildChain1024 before build(), for cases that add to the chain. */
export function buildChain1024Builder(): ModelBuilder {
  return buildReferenceChainBuilder(CHAIN_1024_NODES);
}

/** The reference chain's definition with `nodes` nodes instead of 1,024 (the scaling case). */
export function buildReferenceChainBuilder(nodes: number): ModelBuilder {
  const builder = new ModelBuilder(8, 2, 0);
  for (let i = 0; i < nodes; i++) {
    builder.addNode({ positionM: [0.01 * i, 0, 0], massKg: 0.01, flags: i === 0 ? NODE_PINNED : 0 });
  }
  for (let i = 0; i + 1 < nodes; i++) builder.addSpring(i, i + 1, 200, 0.05, RELATION_STRUCTURAL, 0.01);
  for (let i = 0; i + 2 < nodes; i++) builder.addSpring(i, i + 2, 20, 0.005, RELATION_SECOND_NEIGHBOUR, 0.02);
  return builder;
}

/** Runs the case with the given kernel (default js) and returns the checksum and timing. */
export function runChain1024(kernel: StepKernel = 'js'): { checksum: number; seconds: number; cpuSeconds: number; springUpdates: number } {
  const model = buildChain1024();
  const simulator = new Simulator(model, defaultWorld(), { kernel });
  const cpuStart = process.cpuUsage();
  const start = performance.now();
  simulator.advanceSteps(CHAIN_1024_DT_S, CHAIN_1024_STEPS);
  const seconds = (performance.now() - start) / 1000;
  const cpuSeconds = cpuSecondsSince(cpuStart);
  let checksum = 0;
  for (let i = 0; i < model.positionM.length; i++) checksum += model.positionM[i];
  return { checksum, seconds, cpuSeconds, springUpdates: model.springCount * CHAIN_1024_STEPS };
}

/**
 * CPU seconds of this process (user + system, all its threads) since `start`. On a shared
 * machine wall time includes the time other work held the core; CPU time does not.
 */
export function cpuSecondsSince(start: NodeJS.CpuUsage): number {
  const used = process.cpuUsage(start);
  return (used.user + used.system) / 1e6;
}

export const chain1024Case: BenchmarkCase = {
  name: 'chain-1024',
  async run(options = {}) {
    const kernel = options.kernel ?? 'js';
    const { checksum, seconds, springUpdates } = runChain1024(kernel);
    return { kernel, spring_updates_per_s: Math.round(springUpdates / seconds), seconds: Number(seconds.toFixed(4)), checksum: Number(checksum.toPrecision(10)) };
  },
};
