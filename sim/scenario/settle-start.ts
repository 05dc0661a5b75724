// "Settled" starts: before recording, the episode's system relaxes for settleS seconds under
// its own world (gravity, buoyancy, fluid) with every control at 0 and extra mass-proportional
// drag, so a hanging chain or a resting body starts at rest where it would hang or rest, not
// falling from its built shape. Its velocities are then set to zero; start velocities and noise
// come after. The run uses the stability bound's sub-steps with the extra drag included.
import type { Model } from '../core/model.ts';
import { Simulator } from '../core/simulator.ts';
import { autoSubsteps, stabilityBound } from '../core/stability-bound.ts';
import type { StepKernel } from '../core/step-kernel-choice.ts';
import type { World } from '../core/world.ts';

export function settleStart(model: Model, world: World, settleS: number, settleDragPerS: number, intervalS: number, autoSafety: number, kernel?: StepKernel): void {
  if (!(settleS > 0)) return;
  const settling: World = { ...world, airDragPerS: world.airDragPerS + settleDragPerS };
  const simulator = new Simulator(model, settling, { kernel });
  simulator.setControls(new Float64Array(Math.max(1, model.controlChannelCount)));
  const substeps = autoSubsteps(intervalS, stabilityBound(model, settling.airDragPerS), autoSafety);
  const intervals = Math.ceil(settleS / intervalS);
  for (let t = 0; t < intervals; t++) simulator.advanceInterval(intervalS, substeps);
  model.velocityMPerS.fill(0);
}
