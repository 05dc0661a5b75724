// The trivial floor: every node stays where it started and keeps its initial velocity as the
// velocity it reports (x_t = x_0, v_t = v_0). Any model worth its training should beat it.
import type { RolloutStart } from './rollout-start.ts';

export function persistenceRollout(start: RolloutStart, out: { positionM: Float64Array; velocityMPerS: Float64Array }): void {
  const width = 3 * start.nodeCount;
  for (let t = 0; t <= start.steps; t++) {
    out.positionM.set(start.positionM.subarray(0, width), t * width);
    out.velocityMPerS.set(start.velocityMPerS.subarray(0, width), t * width);
  }
}
