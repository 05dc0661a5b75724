// Forces that act on every free node by itself: gravity m·g, mass-proportional air drag
// −m·c·v, and buoyancy ρ_fluid·V·(−g) when the body is immersed. Written, not added, so this
// also clears the force buffer at the start of a step.
import type { Model } from './model.ts';
import type { World } from './world.ts';

export function writeBodyForces(model: Model, world: World, forceN: Float64Array): void {
  const m = model.massKg;
  const invM = model.inverseMassPerKg;
  const v = model.velocityMPerS;
  const volume = model.nodeVolumeM3;
  const gx = world.gravityMPerS2[0];
  const gy = world.gravityMPerS2[1];
  const gz = world.gravityMPerS2[2];
  const drag = world.airDragPerS;
  const buoyantDensity = world.fluid.enabled && world.fluid.buoyancy ? world.fluid.densityKgPerM3 : 0;
  const n = model.nodeCount;
  for (let i = 0; i < n; i++) {
    const o = 3 * i;
    if (invM[i] === 0) {
      forceN[o] = 0;
      forceN[o + 1] = 0;
      forceN[o + 2] = 0;
      continue;
    }
    // Effective weight: mass minus displaced fluid mass (Archimedes).
    const weightMass = m[i] - buoyantDensity * volume[i];
    const dragMass = m[i] * drag;
    forceN[o] = weightMass * gx - dragMass * v[o];
    forceN[o + 1] = weightMass * gy - dragMass * v[o + 1];
    forceN[o + 2] = weightMass * gz - dragMass * v[o + 2];
  }
}
