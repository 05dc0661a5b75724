// The energy stored in bending hinges and clamps, ½·k·|w|² each (bending-forces.ts), and the
// power their damping dissipates, η·(w·ẇ)²/|w|² each. |w|² is summed from w's components,
// not as 2(1 − cos φ), so nearly straight hinges keep their digits.
import { STRAIGHT_HINGE_W2 } from './bending-forces.ts';
import type { Model } from './model.ts';

/** Bending energy of `model` at `positionM` (3 per node, m), J. */
export function bendingEnergyJ(model: Model, positionM: Float64Array): number {
  return bendingSum(model, positionM, positionM, false);
}

/**
 * Power dissipated by bending damping at (positionM, velocityMPerS), W (≥ 0). The damping
 * forces of accumulateBendingForces and accumulateClampForces do exactly this much negative work
 * per second at that state.
 */
export function bendingDissipationW(model: Model, positionM: Float64Array, velocityMPerS: Float64Array): number {
  return bendingSum(model, positionM, velocityMPerS, true);
}

function bendingSum(model: Model, x: Float64Array, v: Float64Array, dissipation: boolean): number {
  let total = 0;
  const hinges = model.hingeNodes;
  for (let h = 0; h < model.hingeCount; h++) {
    const p = 3 * hinges[3 * h];
    const m = 3 * hinges[3 * h + 1];
    const n = 3 * hinges[3 * h + 2];
    const ta = unitTangent(x, p, m);
    const tb = unitTangent(x, m, n);
    if (ta === null || tb === null) continue;
    const w = [tb[0] - ta[0], tb[1] - ta[1], tb[2] - ta[2]];
    const w2 = w[0] * w[0] + w[1] * w[1] + w[2] * w[2];
    if (!dissipation) {
      total += 0.5 * model.hingeStiffnessNm[h] * w2;
      continue;
    }
    if (w2 <= STRAIGHT_HINGE_W2) continue;
    const wDot = tangentRate(x, v, m, n, tb, w) - tangentRate(x, v, p, m, ta, w);
    total += (model.hingeDampingNms[h] * wDot * wDot) / w2;
  }
  const clamps = model.clampNodes;
  const d = model.clampDirectionUnit;
  for (let q = 0; q < model.clampCount; q++) {
    const a = 3 * clamps[2 * q];
    const b = 3 * clamps[2 * q + 1];
    const t = unitTangent(x, a, b);
    if (t === null) continue;
    const w = [t[0] - d[3 * q], t[1] - d[3 * q + 1], t[2] - d[3 * q + 2]];
    const w2 = w[0] * w[0] + w[1] * w[1] + w[2] * w[2];
    if (!dissipation) {
      total += 0.5 * model.clampStiffnessNm[q] * w2;
      continue;
    }
    if (w2 <= STRAIGHT_HINGE_W2) continue;
    const wDot = tangentRate(x, v, a, b, t, w);
    total += (model.clampDampingNms[q] * wDot * wDot) / w2;
  }
  return total;
}

function unitTangent(x: Float64Array, from: number, to: number): number[] | null {
  const e = [x[to] - x[from], x[to + 1] - x[from + 1], x[to + 2] - x[from + 2]];
  const length = Math.hypot(e[0], e[1], e[2]);
  return length > 0 ? [e[0] / length, e[1] / length, e[2] / length] : null;
}

/** w·(dt/dt) for the segment from → to with unit tangent t: w·(I − t·tᵀ)·ė / |e|. */
function tangentRate(x: Float64Array, v: Float64Array, from: number, to: number, t: number[], w: number[]): number {
  const length = Math.hypot(x[to] - x[from], x[to + 1] - x[from + 1], x[to + 2] - x[from + 2]);
  const edot = [v[to] - v[from], v[to + 1] - v[from + 1], v[to + 2] - v[from + 2]];
  const along = t[0] * edot[0] + t[1] * edot[1] + t[2] * edot[2];
  let rate = 0;
  for (let k = 0; k < 3; k++) rate += w[k] * (edot[k] - along * t[k]);
  return rate / length;
}
