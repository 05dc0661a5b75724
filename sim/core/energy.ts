// Energy diagnostics recorded with every step: kinetic ½mv², elastic ½k(L − L0)² of the
// springs, gravitational −m·g·x of the free nodes (pinned and driven nodes are part of the
// support) and the bending energy of hinges and clamps (bending-energy.ts), in that order.
import type { Model } from './model.ts';
import type { World } from './world.ts';
import { bendingEnergyJ } from './bending-energy.ts';

/** Writes [kinetic, elastic, gravitational, bending] in J into out at offset. */
export function measureEnergies(model: Model, world: World, out: Float64Array, offset: number): void {
  const x = model.positionM;
  const v = model.velocityMPerS;
  const m = model.massKg;
  const invM = model.inverseMassPerKg;
  const gx = world.gravityMPerS2[0];
  const gy = world.gravityMPerS2[1];
  const gz = world.gravityMPerS2[2];
  let kinetic = 0;
  let gravitational = 0;
  for (let i = 0; i < model.nodeCount; i++) {
    if (invM[i] === 0) continue;
    const o = 3 * i;
    kinetic += 0.5 * m[i] * (v[o] * v[o] + v[o + 1] * v[o + 1] + v[o + 2] * v[o + 2]);
    gravitational -= m[i] * (gx * x[o] + gy * x[o + 1] + gz * x[o + 2]);
  }
  let elastic = 0;
  const a = model.springNodeA;
  const b = model.springNodeB;
  for (let s = 0; s < model.springCount; s++) {
    const ia = 3 * a[s];
    const ib = 3 * b[s];
    const dx = x[ib] - x[ia];
    const dy = x[ib + 1] - x[ia + 1];
    const dz = x[ib + 2] - x[ia + 2];
    const stretch = Math.sqrt(dx * dx + dy * dy + dz * dz) - model.restLengthM[s];
    elastic += 0.5 * model.stiffnessNPerM[s] * stretch * stretch;
  }
  out[offset] = kinetic;
  out[offset + 1] = elastic;
  out[offset + 2] = gravitational;
  out[offset + 3] = model.hingeCount + model.clampCount > 0 ? bendingEnergyJ(model, x) : 0;
}

/** The columns measureEnergies writes; bending is last so the first three keep their places. */
export const ENERGY_NAMES = ['kinetic', 'elastic', 'gravitational', 'bending'] as const;
export const ENERGY_COUNT = ENERGY_NAMES.length;
