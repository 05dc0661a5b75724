// The second floor: every node keeps its initial velocity, x_t = x_0 + t·Δt·v_0, v_t = v_0
// (uniform rectilinear motion, the first-order Taylor extrapolation of the initial state).
import type { RolloutStart } from './rollout-start.ts';

export function constantVelocityRollout(start: RolloutStart, out: { positionM: Float64Array; velocityMPerS: Float64Array }): void {
  const width = 3 * start.nodeCount;
  const x0 = start.positionM;
  const v0 = start.velocityMPerS;
  for (let t = 0; t <= start.steps; t++) {
    const elapsedS = t * start.recordIntervalS;
    const o = t * width;
    for (let i = 0; i < width; i++) {
      out.positionM[o + i] = x0[i] + elapsedS * v0[i];
      out.velocityMPerS[o + i] = v0[i];
    }
  }
}
