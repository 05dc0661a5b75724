// Sanity limits checked after every recorded step (not every sub-step, to keep the hot loop
// lean): finite state, springs within a stretch ratio, nodes under a speed limit. A violation
// throws SimulationBlowUpError so no episode is ever written as if it were good.
import type { Model } from './model.ts';
import { SimulationBlowUpError } from './simulation-error.ts';

export interface BlowUpLimits {
  /** Largest allowed L/L0 (and smallest allowed is its inverse), dimensionless. */
  maxStretchRatio: number;
  maxSpeedMPerS: number;
}

export const DEFAULT_BLOW_UP_LIMITS: BlowUpLimits = { maxStretchRatio: 10, maxSpeedMPerS: 1000 };

export function checkForBlowUp(model: Model, limits: BlowUpLimits, step: number, dtS: number, criticalDtS: number): void {
  const x = model.positionM;
  const v = model.velocityMPerS;
  const maxSpeed2 = limits.maxSpeedMPerS * limits.maxSpeedMPerS;
  for (let i = 0; i < model.nodeCount; i++) {
    const o = 3 * i;
    const s2 = v[o] * v[o] + v[o + 1] * v[o + 1] + v[o + 2] * v[o + 2];
    const p = x[o] + x[o + 1] + x[o + 2];
    if (!Number.isFinite(s2) || !Number.isFinite(p)) {
      throw new SimulationBlowUpError({ kind: 'non-finite', step, node: i, value: NaN, dtS, criticalDtS });
    }
    if (s2 > maxSpeed2) {
      throw new SimulationBlowUpError({ kind: 'over-speed', step, node: i, value: Math.sqrt(s2), dtS, criticalDtS });
    }
  }
  const maxRatio = limits.maxStretchRatio;
  for (let s = 0; s < model.springCount; s++) {
    const ia = 3 * model.springNodeA[s];
    const ib = 3 * model.springNodeB[s];
    const dx = x[ib] - x[ia];
    const dy = x[ib + 1] - x[ia + 1];
    const dz = x[ib + 2] - x[ia + 2];
    const ratio = Math.sqrt(dx * dx + dy * dy + dz * dz) / model.restLengthM[s];
    if (ratio > maxRatio || ratio < 1 / maxRatio) {
      // Name a node that actually moves: a pinned or driven end is never where it went wrong.
      const node = model.inverseMassPerKg[model.springNodeA[s]] === 0 ? model.springNodeB[s] : model.springNodeA[s];
      throw new SimulationBlowUpError({ kind: 'over-stretch', step, node, spring: s, value: ratio, dtS, criticalDtS });
    }
  }
}
