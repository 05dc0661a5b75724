// Total mechanical energy of a trajectory per recorded step, from its positions and velocities
// and the episode's static arrays, with the formulas the simulator records `energies` with
// (sim/core/energy.ts): kinetic ½·m·|v|² and gravitational −m·g·x of the free nodes (neither
// pinned nor driven: those belong to the support) plus elastic ½·k·(|x_b − x_a| − L0)² of every
// spring, plus bending k·(1 − cos φ) of every hinge and clamp of a chain with bending rigidity,
// computed as ½·k·|t_b − t_a|² of the unit tangents as sim/core/bending-energy.ts does. L0 is `edge_rest_length`, the rest length without actuation, so for actuated cells
// this is not the recorded elastic energy; the scorer therefore applies this one function to
// the recorded and the predicted trajectory alike and compares the two.
import type { FloatData } from '../predictions/prediction-arrays.ts';

export interface EnergyModel {
  nodes: number;
  /** Mass of each node that counts, 0 for pinned and driven nodes, kg. */
  freeMassKg: Float64Array;
  edgeA: Int32Array;
  edgeB: Int32Array;
  restLengthM: FloatData;
  stiffnessNPerM: FloatData;
  gravityMPerS2: readonly [number, number, number];
  /** (H, 3) node indices of the bending hinges; empty without bending rigidity. */
  hinges: Int32Array;
  hingeStiffnessNm: FloatData;
  /** (Q, 2) node indices (held end, neighbour) of the clamped ends. */
  clamps: Int32Array;
  /** (Q, 3) unit vectors the clamps hold their segments along. */
  clampDirection: FloatData;
  clampStiffnessNm: FloatData;
}

/** ½·|t_b − t_a|² for the unit tangents a0→a1 and b0→b1 at row offset o; 0 for a zero-length segment. */
function halfTangentGap2(x: FloatData, o: number, a0: number, a1: number, b0: number, b1: number, fixed: FloatData | null, q: number): number {
  let ax: number, ay: number, az: number;
  if (fixed) {
    ax = fixed[3 * q]; ay = fixed[3 * q + 1]; az = fixed[3 * q + 2];
  } else {
    const i = o + 3 * a0;
    const j = o + 3 * a1;
    ax = x[j] - x[i]; ay = x[j + 1] - x[i + 1]; az = x[j + 2] - x[i + 2];
    const la = Math.sqrt(ax * ax + ay * ay + az * az);
    if (la === 0) return 0;
    ax /= la; ay /= la; az /= la;
  }
  const i = o + 3 * b0;
  const j = o + 3 * b1;
  let bx = x[j] - x[i];
  let by = x[j + 1] - x[i + 1];
  let bz = x[j + 2] - x[i + 2];
  const lb = Math.sqrt(bx * bx + by * by + bz * bz);
  if (lb === 0) return 0;
  bx /= lb; by /= lb; bz /= lb;
  const wx = bx - ax;
  const wy = by - ay;
  const wz = bz - az;
  return 0.5 * (wx * wx + wy * wy + wz * wz);
}

/** Writes E(h) in J for h = 0 … rows−1 into outEnergyJ. */
export function totalEnergyPerStep(model: EnergyModel, positionsM: FloatData, velocitiesMPerS: FloatData, rows: number, outEnergyJ: Float64Array): void {
  const n = model.nodes;
  const m = model.freeMassKg;
  const [gx, gy, gz] = model.gravityMPerS2;
  const a = model.edgeA;
  const b = model.edgeB;
  const springs = a.length;
  for (let h = 0; h < rows; h++) {
    const o = 3 * n * h;
    let kinetic = 0;
    let gravitational = 0;
    for (let i = 0; i < n; i++) {
      const mi = m[i];
      if (mi === 0) continue;
      const j = o + 3 * i;
      const vx = velocitiesMPerS[j];
      const vy = velocitiesMPerS[j + 1];
      const vz = velocitiesMPerS[j + 2];
      kinetic += 0.5 * mi * (vx * vx + vy * vy + vz * vz);
      gravitational -= mi * (gx * positionsM[j] + gy * positionsM[j + 1] + gz * positionsM[j + 2]);
    }
    let elastic = 0;
    for (let s = 0; s < springs; s++) {
      const ia = o + 3 * a[s];
      const ib = o + 3 * b[s];
      const dx = positionsM[ib] - positionsM[ia];
      const dy = positionsM[ib + 1] - positionsM[ia + 1];
      const dz = positionsM[ib + 2] - positionsM[ia + 2];
      const stretch = Math.sqrt(dx * dx + dy * dy + dz * dz) - model.restLengthM[s];
      elastic += 0.5 * model.stiffnessNPerM[s] * stretch * stretch;
    }
    let bending = 0;
    const hinges = model.hinges;
    for (let k = 0; 3 * k < hinges.length; k++) {
      bending += model.hingeStiffnessNm[k] * halfTangentGap2(positionsM, o, hinges[3 * k], hinges[3 * k + 1], hinges[3 * k + 1], hinges[3 * k + 2], null, k);
    }
    const clamps = model.clamps;
    for (let q = 0; 2 * q < clamps.length; q++) {
      bending += model.clampStiffnessNm[q] * halfTangentGap2(positionsM, o, 0, 0, clamps[2 * q], clamps[2 * q + 1], model.clampDirection, q);
    }
    outEnergyJ[h] = kinetic + elastic + gravitational + bending;
  }
}
