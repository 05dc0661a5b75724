// Hooke springs with damping along the spring axis: f = k·(L − L0) + c·(Δv·n), applied as
// +f·n on node A and −f·n on node B. The hottest loop of the simulator.
import type { Model } from './model.ts';

export function accumulateSpringForces(model: Model, forceN: Float64Array): void {
  const x = model.positionM;
  const v = model.velocityMPerS;
  const a = model.springNodeA;
  const b = model.springNodeB;
  const rest = model.restLengthM;
  const k = model.stiffnessNPerM;
  const c = model.dampingNsPerM;
  const count = model.springCount;
  for (let s = 0; s < count; s++) {
    const ia = 3 * a[s];
    const ib = 3 * b[s];
    const dx = x[ib] - x[ia];
    const dy = x[ib + 1] - x[ia + 1];
    const dz = x[ib + 2] - x[ia + 2];
    const length = Math.sqrt(dx * dx + dy * dy + dz * dz);
    if (length === 0) continue; // coincident nodes have no axis; the blow-up check reports them
    const inv = 1 / length;
    const nx = dx * inv;
    const ny = dy * inv;
    const nz = dz * inv;
    const dvn = (v[ib] - v[ia]) * nx + (v[ib + 1] - v[ia + 1]) * ny + (v[ib + 2] - v[ia + 2]) * nz;
    const f = k[s] * (length - rest[s]) + c[s] * dvn;
    const fx = f * nx;
    const fy = f * ny;
    const fz = f * nz;
    forceN[ia] += fx;
    forceN[ia + 1] += fy;
    forceN[ia + 2] += fz;
    forceN[ib] -= fx;
    forceN[ib + 1] -= fy;
    forceN[ib + 2] -= fz;
  }
}
