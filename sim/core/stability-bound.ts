// A safe time step from the model alone. Semi-implicit Euler on a damped oscillator
// x'' = −ω²x − γx' is stable only while ω²·dt² + 2γ·dt < 4 (Jury criterion on its
// characteristic polynomial z² − (2 − γdt − ω²dt²)z + (1 − γdt); for γ = 0 this is the
// familiar ω·dt < 2). ω²_max and γ_max are bounded above by block Gershgorin discs
// (Feingold & Varga 1962) of the mass-normalised stiffness and damping matrices
// M^-½ K M^-½ and M^-½ C M^-½: for node i, Σ_springs k·(1/m_i + 1/√(m_i m_j)).
// A bending hinge with energy ½·k·|w|² has the Gauss–Newton stiffness k·JᵀJ (exact about a
// straight line), J = ∂w/∂x with blocks of norm 1/|e_a|, 1/|e_a| + 1/|e_b| and 1/|e_b| at its
// previous, middle and next node, so it adds k·|J_i|·Σ_j |J_j|/√(m_i m_j) to row i (and its
// damping η the same to the damping rows). For a uniform chain this gives 16·EI/(m·ℓ³), the
// largest eigenvalue of the discrete beam operator, so the bound stays tight.
import type { Model } from './model.ts';

export interface StabilityBound {
  /** Upper bound on the largest natural angular frequency, rad/s. */
  omegaMaxRadPerS: number;
  /** Upper bound on the largest mass-normalised damping rate, 1/s. */
  dampingRateMaxPerS: number;
  /** Largest time step for which every mode stays stable, s. */
  criticalDtS: number;
}

/**
 * Bound at the model's current configuration. Springs stretched beyond rest add geometric
 * stiffness k·(1 − L0/L) across their axis, so each spring counts as k·max(1, |1 − L0/L|).
 */
export function stabilityBound(model: Model, airDragPerS = 0): StabilityBound {
  const n = model.nodeCount;
  const stiffRow = new Float64Array(n);
  const dampRow = new Float64Array(n);
  const invM = model.inverseMassPerKg;
  const x = model.positionM;
  for (let s = 0; s < model.springCount; s++) {
    const a = model.springNodeA[s];
    const b = model.springNodeB[s];
    const dx = x[3 * b] - x[3 * a];
    const dy = x[3 * b + 1] - x[3 * a + 1];
    const dz = x[3 * b + 2] - x[3 * a + 2];
    const length = Math.sqrt(dx * dx + dy * dy + dz * dz);
    const geometric = length > 0 ? Math.abs(1 - model.restLengthM[s] / length) : 1;
    const k = model.stiffnessNPerM[s] * Math.max(1, geometric);
    const c = model.dampingNsPerM[s];
    const cross = Math.sqrt(invM[a] * invM[b]);
    stiffRow[a] += k * (invM[a] + cross);
    stiffRow[b] += k * (invM[b] + cross);
    dampRow[a] += c * (invM[a] + cross);
    dampRow[b] += c * (invM[b] + cross);
  }
  addBendingRows(model, stiffRow, dampRow);
  let omega2 = 0;
  let gamma = 0;
  for (let i = 0; i < n; i++) {
    if (invM[i] === 0) continue;
    if (stiffRow[i] > omega2) omega2 = stiffRow[i];
    if (dampRow[i] > gamma) gamma = dampRow[i];
  }
  gamma += airDragPerS;
  return {
    omegaMaxRadPerS: Math.sqrt(omega2),
    dampingRateMaxPerS: gamma,
    criticalDtS: criticalTimeStep(omega2, gamma),
  };
}

function addBendingRows(model: Model, stiffRow: Float64Array, dampRow: Float64Array): void {
  const x = model.positionM;
  const invM = model.inverseMassPerKg;
  const rootInvM = (i: number): number => Math.sqrt(invM[i]);
  const segment = (a: number, b: number): number => Math.hypot(x[3 * b] - x[3 * a], x[3 * b + 1] - x[3 * a + 1], x[3 * b + 2] - x[3 * a + 2]);
  const nodes = [0, 0, 0];
  const norms = [0, 0, 0];
  for (let h = 0; h < model.hingeCount; h++) {
    for (let j = 0; j < 3; j++) nodes[j] = model.hingeNodes[3 * h + j];
    const ia = 1 / segment(nodes[0], nodes[1]);
    const ib = 1 / segment(nodes[1], nodes[2]);
    if (!Number.isFinite(ia) || !Number.isFinite(ib)) continue;
    norms[0] = ia;
    norms[1] = ia + ib;
    norms[2] = ib;
    addRows(nodes, norms, 3, model.hingeStiffnessNm[h], model.hingeDampingNms[h], rootInvM, stiffRow, dampRow);
  }
  for (let q = 0; q < model.clampCount; q++) {
    nodes[0] = model.clampNodes[2 * q];
    nodes[1] = model.clampNodes[2 * q + 1];
    const inverseLength = 1 / segment(nodes[0], nodes[1]);
    if (!Number.isFinite(inverseLength)) continue;
    norms[0] = inverseLength;
    norms[1] = inverseLength;
    addRows(nodes, norms, 2, model.clampStiffnessNm[q], model.clampDampingNms[q], rootInvM, stiffRow, dampRow);
  }
}

function addRows(nodes: number[], norms: number[], count: number, k: number, eta: number, rootInvM: (i: number) => number, stiffRow: Float64Array, dampRow: Float64Array): void {
  for (let i = 0; i < count; i++) {
    let row = 0;
    for (let j = 0; j < count; j++) row += norms[j] * rootInvM(nodes[j]);
    const weight = norms[i] * rootInvM(nodes[i]) * row;
    stiffRow[nodes[i]] += k * weight;
    dampRow[nodes[i]] += eta * weight;
  }
}

/** Positive root of ω²·dt² + 2γ·dt − 4 = 0; Infinity for a model with no stiffness or damping. */
export function criticalTimeStep(omega2: number, gamma: number): number {
  if (omega2 === 0) return gamma > 0 ? 2 / gamma : Infinity;
  return (-gamma + Math.sqrt(gamma * gamma + 4 * omega2)) / omega2;
}

/** Default fraction of the critical step used when sub-steps are chosen automatically. */
export const AUTO_SUBSTEP_SAFETY = 0.5;

/** Smallest number of equal sub-steps per interval that keeps dt ≤ safety · critical dt. */
export function autoSubsteps(intervalS: number, bound: StabilityBound, safety = AUTO_SUBSTEP_SAFETY): number {
  if (!Number.isFinite(bound.criticalDtS)) return 1;
  return Math.max(1, Math.ceil(intervalS / (safety * bound.criticalDtS)));
}
