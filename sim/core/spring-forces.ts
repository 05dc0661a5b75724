// Hooke springs with damping along the spring axis: f = k·(L − L0) + c·(Δv·n), applied as
// +f·n on node A and −f·n on node B. The hottest loop of the simulator.
//
// Why it reads the model's own arrays and no packed copy: on Node 20 every typed-array access
// here compiles to a bounds check, an index widening and a data-pointer add before the load,
// whatever the layout, and that per-access cost (not the number of arrays) sets the loop's
// speed. A packed [3a, 3b, L0, k, c] table, positions/velocities/forces interleaved in one
// array, 2×/4× unrolling, unsigned index arithmetic and a locality order that keeps every
// node's summation order were each measured (CPU time, chain-1024) and none was faster.
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
    // `| 0` lets the JIT use plain 32-bit index arithmetic without overflow checks; offsets
    // stay below 2³¹ for any model under 715 million nodes (a 17 GB position array).
    const ia = (3 * a[s]) | 0;
    const ib = (3 * b[s]) | 0;
    const ia1 = (ia + 1) | 0;
    const ia2 = (ia + 2) | 0;
    const ib1 = (ib + 1) | 0;
    const ib2 = (ib + 2) | 0;
    const dx = x[ib] - x[ia];
    const dy = x[ib1] - x[ia1];
    const dz = x[ib2] - x[ia2];
    const length = Math.sqrt(dx * dx + dy * dy + dz * dz);
    if (length === 0) continue; // coincident nodes have no axis; the blow-up check reports them
    const inv = 1 / length;
    const nx = dx * inv;
    const ny = dy * inv;
    const nz = dz * inv;
    const dvn = (v[ib] - v[ia]) * nx + (v[ib1] - v[ia1]) * ny + (v[ib2] - v[ia2]) * nz;
    const f = k[s] * (length - rest[s]) + c[s] * dvn;
    const fx = f * nx;
    const fy = f * ny;
    const fz = f * nz;
    forceN[ia] += fx;
    forceN[ia1] += fy;
    forceN[ia2] += fz;
    forceN[ib] -= fx;
    forceN[ib1] -= fy;
    forceN[ib2] -= fz;
  }
}
