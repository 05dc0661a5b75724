// Total mechanical energy of a trajectory per recorded step, from its positions and velocities
// and the episode's static arrays, with the formulas the simulator records `energies` with
// (sim/core/energy.ts): kinetic ½·m·|v|² and gravitational −m·g·x of the free nodes (neither
// pinned nor driven: those belong to the support) plus elastic ½·k·(|x_b − x_a| − L0)² of every
// spring. L0 is `edge_rest_length`, the rest length without actuation, so for actuated cells
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
    outEnergyJ[h] = kinetic + elastic + gravitational;
  }
}
