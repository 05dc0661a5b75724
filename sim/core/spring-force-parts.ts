// The spring force of spring-forces.ts taken apart for the energy ledger and force recording:
// the elastic part k·(L − L0) and the damping part c·(Δv·n) per node, and the total axial
// tension per spring. Same geometry and operation order as the hot loop, so each part agrees
// with its share of the summed force to rounding. Runs only when accounting or recording is on.
import type { Model } from './model.ts';

/** Which part of the axial force to write: 0 elastic, 1 damping. */
export const SPRING_PART_ELASTIC = 0;
export const SPRING_PART_DAMPING = 1;

/** Writes (not adds) the chosen part of every spring's force on its nodes, N, 3 per node. */
export function writeSpringForcePart(model: Model, part: number, forceN: Float64Array): void {
  forceN.fill(0);
  const x = model.positionM;
  const v = model.velocityMPerS;
  const a = model.springNodeA;
  const b = model.springNodeB;
  for (let s = 0; s < model.springCount; s++) {
    const ia = 3 * a[s];
    const ib = 3 * b[s];
    const dx = x[ib] - x[ia];
    const dy = x[ib + 1] - x[ia + 1];
    const dz = x[ib + 2] - x[ia + 2];
    const length = Math.sqrt(dx * dx + dy * dy + dz * dz);
    if (length === 0) continue;
    const inv = 1 / length;
    const nx = dx * inv;
    const ny = dy * inv;
    const nz = dz * inv;
    let f: number;
    if (part === SPRING_PART_ELASTIC) {
      f = model.stiffnessNPerM[s] * (length - model.restLengthM[s]);
    } else {
      f = model.dampingNsPerM[s] * ((v[ib] - v[ia]) * nx + (v[ib + 1] - v[ia + 1]) * ny + (v[ib + 2] - v[ia + 2]) * nz);
    }
    forceN[ia] += f * nx;
    forceN[ia + 1] += f * ny;
    forceN[ia + 2] += f * nz;
    forceN[ib] -= f * nx;
    forceN[ib + 1] -= f * ny;
    forceN[ib + 2] -= f * nz;
  }
}

/** Axial force of every spring, elastic plus damping, N; positive in tension. */
export function writeSpringTensions(model: Model, tensionN: Float64Array): void {
  const x = model.positionM;
  const v = model.velocityMPerS;
  const a = model.springNodeA;
  const b = model.springNodeB;
  for (let s = 0; s < model.springCount; s++) {
    const ia = 3 * a[s];
    const ib = 3 * b[s];
    const dx = x[ib] - x[ia];
    const dy = x[ib + 1] - x[ia + 1];
    const dz = x[ib + 2] - x[ia + 2];
    const length = Math.sqrt(dx * dx + dy * dy + dz * dz);
    if (length === 0) {
      tensionN[s] = 0;
      continue;
    }
    const inv = 1 / length;
    const dvn = (v[ib] - v[ia]) * dx * inv + (v[ib + 1] - v[ia + 1]) * dy * inv + (v[ib + 2] - v[ia + 2]) * dz * inv;
    tensionN[s] = model.stiffnessNPerM[s] * (length - model.restLengthM[s]) + model.dampingNsPerM[s] * dvn;
  }
}
