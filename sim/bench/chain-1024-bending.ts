// The chain-1024-bending case: the chain-1024 reference chain (chain-1024.ts) with bending
// rigidity, fixed by definition like it: a hinge at every interior node i (nodes i−1, i, i+1)
// with k = 0.05 N·m (EI = k·ℓ = 5e-4 N·m² at ℓ = 0.01 m) and bending damping η = 1e-5 N·m·s,
// and a clamp holding segment (0, 1) along +x with k = 0.1 N·m (2·EI/ℓ) and η = 2e-5 N·m·s,
// the passes of sim/core/bending-forces.ts after the springs. Same gravity, dt and 10,000
// steps. native/chain_kernel.c run with the argument "bending" is the same kernel in C.
// Throughput is still counted in spring updates per second (the same 2,045 springs a step),
// so its rates compare with chain-1024's and the gap is what the 1,022 hinges cost.
import type { Model } from '../core/model.ts';
import { Simulator } from '../core/simulator.ts';
import type { StepKernel } from '../core/step-kernel-choice.ts';
import { defaultWorld } from '../core/world.ts';
import { buildChain1024Builder, CHAIN_1024_DT_S, CHAIN_1024_NODES, CHAIN_1024_STEPS, cpuSecondsSince } from './chain-1024.ts';

export const CHAIN_1024_HINGE_STIFFNESS_NM = 0.05;
export const CHAIN_1024_HINGE_DAMPING_NMS = 1e-5;
export const CHAIN_1024_CLAMP_STIFFNESS_NM = 0.1;
export const CHAIN_1024_CLAMP_DAMPING_NMS = 2e-5;

export function buildChain1024Bending(): Model {
  const builder = buildChain1024Builder();
  for (let i = 1; i + 1 < CHAIN_1024_NODES; i++) builder.addHinge(i - 1, i, i + 1, CHAIN_1024_HINGE_STIFFNESS_NM, CHAIN_1024_HINGE_DAMPING_NMS);
  builder.addClamp(0, 1, CHAIN_1024_CLAMP_STIFFNESS_NM, CHAIN_1024_CLAMP_DAMPING_NMS);
  return builder.build();
}

/** Runs the case with the given kernel and returns the checksum (sum of positions) and timing. */
export function runChain1024Bending(kernel: StepKernel): { kernel: StepKernel; checksum: number; seconds: number; cpuSeconds: number; springUpdates: number } {
  const model = buildChain1024Bending();
  const simulator = new Simulator(model, defaultWorld(), { kernel });
  const cpuStart = process.cpuUsage();
  const start = performance.now();
  simulator.advanceSteps(CHAIN_1024_DT_S, CHAIN_1024_STEPS);
  const seconds = (performance.now() - start) / 1000;
  const cpuSeconds = cpuSecondsSince(cpuStart);
  let checksum = 0;
  for (let i = 0; i < model.positionM.length; i++) checksum += model.positionM[i];
  return { kernel: simulator.kernel, checksum, seconds, cpuSeconds, springUpdates: model.springCount * CHAIN_1024_STEPS };
}
