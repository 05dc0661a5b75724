// The tangent stiffness K = −∂F/∂x of a model's elastic forces (springs, bending hinges and
// clamps) over a chosen list of free coordinates, as a dense symmetric matrix: what a
// normal-mode analysis linearises. Gravity and buoyancy are uniform, so they add nothing to K
// (they enter only through the tensions of the state linearised about); damping, fluid and
// contact forces are left out, so the modes are those of the undamped system in free space.
//
// Springs are exact: a spring of stiffness k, length L, unit axis n and tension T = k(L − L0)
// has the block G = k·n·nᵀ + (T/L)·(I − n·nᵀ) (the axial part and the geometric "string" part;
// standard result of structural analysis, common practice, no source), with K_aa = K_bb = G and
// K_ab = K_ba = −G. Hinges and clamps go by central differences of their force with a step of
// BENDING_STEP_RATIO times the shortest rest length (truncation error about the ratio squared
// over 6, some 2e-13 relative; rounding about machine epsilon over the ratio times the hinge's
// bending angle, which vanishes for a straight chain at rest), then K is
// symmetrised, since the bending force is conservative and its exact K is symmetric.
import { BENDING_PART_ELASTIC, writeBendingForcePart } from './bending-force-parts.ts';
import type { Model } from './model.ts';

/** Step of the bending differences over the shortest spring rest length, dimensionless. */
export const BENDING_STEP_RATIO = 1e-6;

/**
 * K over `coordinates` (each 3·node + axis, of free nodes), row-major n × n, N/m. The model's
 * positions are perturbed while the bending part is differenced and restored exactly.
 */
export function stiffnessMatrix(model: Model, coordinates: Int32Array): Float64Array {
  const n = coordinates.length;
  const slot = new Int32Array(3 * model.nodeCount).fill(-1);
  for (let c = 0; c < n; c++) slot[coordinates[c]] = c;
  const k = new Float64Array(n * n);
  addSpringStiffness(model, slot, n, k);
  if (hasBending(model)) addBendingStiffness(model, coordinates, k);
  return k;
}

function hasBending(model: Model): boolean {
  for (let h = 0; h < model.hingeCount; h++) if (model.hingeStiffnessNm[h] !== 0) return true;
  for (let c = 0; c < model.clampCount; c++) if (model.clampStiffnessNm[c] !== 0) return true;
  return false;
}

function addSpringStiffness(model: Model, slot: Int32Array, n: number, k: Float64Array): void {
  const x = model.positionM;
  const g = new Float64Array(9);
  for (let s = 0; s < model.springCount; s++) {
    const a = model.springNodeA[s];
    const b = model.springNodeB[s];
    const d = [x[3 * b] - x[3 * a], x[3 * b + 1] - x[3 * a + 1], x[3 * b + 2] - x[3 * a + 2]];
    const length = Math.sqrt(d[0] * d[0] + d[1] * d[1] + d[2] * d[2]);
    if (length === 0) continue;
    const axial = model.stiffnessNPerM[s];
    const geometric = (axial * (length - model.restLengthM[s])) / length;
    for (let i = 0; i < 3; i++) {
      for (let j = 0; j < 3; j++) {
        const nn = (d[i] / length) * (d[j] / length);
        g[3 * i + j] = axial * nn + geometric * ((i === j ? 1 : 0) - nn);
      }
    }
    for (let i = 0; i < 3; i++) {
      const ra = slot[3 * a + i];
      const rb = slot[3 * b + i];
      for (let j = 0; j < 3; j++) {
        const ca = slot[3 * a + j];
        const cb = slot[3 * b + j];
        const value = g[3 * i + j];
        if (ra >= 0 && ca >= 0) k[ra * n + ca] += value;
        if (rb >= 0 && cb >= 0) k[rb * n + cb] += value;
        if (ra >= 0 && cb >= 0) k[ra * n + cb] -= value;
        if (rb >= 0 && ca >= 0) k[rb * n + ca] -= value;
      }
    }
  }
}

function addBendingStiffness(model: Model, coordinates: Int32Array, k: Float64Array): void {
  const n = coordinates.length;
  let shortestM = Infinity;
  for (let s = 0; s < model.springCount; s++) if (model.restLengthM[s] > 0) shortestM = Math.min(shortestM, model.restLengthM[s]);
  const stepM = BENDING_STEP_RATIO * (Number.isFinite(shortestM) ? shortestM : 1);
  const x = model.positionM;
  const plus = new Float64Array(3 * model.nodeCount);
  const minus = new Float64Array(3 * model.nodeCount);
  const bending = new Float64Array(n * n);
  for (let c = 0; c < n; c++) {
    const coordinate = coordinates[c];
    const original = x[coordinate];
    x[coordinate] = original + stepM;
    writeBendingForcePart(model, BENDING_PART_ELASTIC, plus);
    x[coordinate] = original - stepM;
    writeBendingForcePart(model, BENDING_PART_ELASTIC, minus);
    x[coordinate] = original;
    // Column c of K is −∂F/∂x_c.
    for (let r = 0; r < n; r++) bending[r * n + c] = -(plus[coordinates[r]] - minus[coordinates[r]]) / (2 * stepM);
  }
  for (let r = 0; r < n; r++) {
    for (let c = 0; c < n; c++) k[r * n + c] += 0.5 * (bending[r * n + c] + bending[c * n + r]);
  }
}
