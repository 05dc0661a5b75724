// Our semi-implicit Euler against an independent high-order integrator. The same small damped
// chain (6 nodes, top pinned, released horizontally under gravity, so it swings, stretches and
// snaps) is integrated by SciPy's solve_ivp with the 8th-order Dormand–Prince method DOP853 at
// rtol = atol = 1e-12 (Hairer, Nørsett & Wanner, Solving ODEs I; SciPy documentation) in
// Debian's /usr/bin/python3. The Python side gets only the model's data (positions, masses,
// springs) and writes the force law itself from the textbook definitions: gravity m·g, and per
// spring a Kelvin–Voigt element, tension k·(L − L0) + c·(relative velocity along the axis)
// (e.g. Rao, Mechanical Vibrations). Semi-implicit Euler is first-order (Hairer, Lubich &
// Wanner, Geometric Numerical Integration, ch. I): halving dt halves the error.
import { describe, expect, it } from 'vitest';

import { defaultWorld } from '../sim/core/world.ts';
import { recordTrajectory, resolveSubsteps } from '../sim/episode/record-episode.ts';
import type { ChainParameters } from '../sim/systems/chain.ts';
import { buildChain } from '../sim/systems/chain.ts';
import type { ChainReferenceResult as ReferenceResult } from './support/dop853-chain-reference.ts';
import { chainReferenceInput,DOP853_CHAIN_SCRIPT as REFERENCE_SCRIPT } from './support/dop853-chain-reference.ts';
import { referencePythonAvailability, runReferencePython } from './support/reference-python.ts';

const python = referencePythonAvailability();

const CHAIN: ChainParameters = {
  partCount: 5,
  lengthM: 1,
  totalMassKg: 0.5,
  axialStiffnessN: 500,
  secondNeighbourSpringRatio: 0.1,
  dampingRatio: 0.1,
  diameterM: 0.01,
  anchor: 'top-pinned',
  originM: [0, 2, 0],
  directionUnit: [1, 0, 0.2],
  forceHandles: [],
  forceAxes: [],
  drivenAxes: [],
};
const RECORD_INTERVAL_S = 0.05;
const RECORDED_STEPS = 10; // T = 0.5 s: about a quarter swing



describe.runIf(python.available)('semi-implicit Euler against SciPy DOP853 (solve_ivp, rtol = atol = 1e-12)', () => {
  it('error at T shrinks first-order (ratio 2 ± 0.3 over three halvings) and is below dt·g·T at the default dt', () => {
    const world = defaultWorld();
    const template = buildChain(CHAIN).model;
    const times = Array.from({ length: RECORDED_STEPS + 1 }, (_, t) => t * RECORD_INTERVAL_S);
    const reference = runReferencePython<ReferenceResult>(REFERENCE_SCRIPT, chainReferenceInput(template, world, times));
    expect(reference.status).toBe(0);
    expect(reference.positionM.length).toBe(RECORDED_STEPS + 1);

    const settings = { recordIntervalS: RECORD_INTERVAL_S, recordedSteps: RECORDED_STEPS, substeps: 'auto' as const };
    const defaultSubsteps = resolveSubsteps(template, world, settings).substeps;
    const errorsAtT: number[] = [];
    let worstAtDefault = 0;
    for (const factor of [1, 2, 4, 8]) {
      const model = buildChain(CHAIN).model;
      const trajectory = recordTrajectory(model, world, new Float64Array(0), { ...settings, substeps: defaultSubsteps * factor });
      const n3 = 3 * model.nodeCount;
      let errorAtT = 0;
      for (let t = 0; t <= RECORDED_STEPS; t++) {
        let worstNode = 0;
        for (let i = 0; i < model.nodeCount; i++) {
          const o = t * n3 + 3 * i;
          const r = reference.positionM[t];
          worstNode = Math.max(worstNode, Math.hypot(trajectory.positionM[o] - r[3 * i], trajectory.positionM[o + 1] - r[3 * i + 1], trajectory.positionM[o + 2] - r[3 * i + 2]));
        }
        if (factor === 1) worstAtDefault = Math.max(worstAtDefault, worstNode);
        if (t === RECORDED_STEPS) errorAtT = worstNode;
      }
      errorsAtT.push(errorAtT);
    }
    for (let h = 0; h + 1 < errorsAtT.length; h++) {
      expect(Math.abs(errorsAtT[h] / errorsAtT[h + 1] - 2)).toBeLessThan(0.3);
    }
    // Stated bound at the default dt. Semi-implicit Euler is the leapfrog scheme started with
    // v_½ = v_0 + dt·a_0 instead of v_0 + ½·dt·a_0 (derivation from the update formulas), so to
    // leading order a body released from rest under gravity is off by ½·dt·g·t. The bound is
    // twice that at T, because the whipping end of a falling chain accelerates faster than g.
    const defaultDtS = RECORD_INTERVAL_S / defaultSubsteps;
    const boundM = defaultDtS * 9.81 * RECORD_INTERVAL_S * RECORDED_STEPS;
    expect(worstAtDefault).toBeLessThan(boundM);
    // Even the finest run's error stays far above the reference's own (rtol 1e-12), so the
    // ratios above measure our scheme, not SciPy's.
    expect(errorsAtT[3]).toBeGreaterThan(1e-6);
  });
});
