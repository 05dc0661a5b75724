// Calibration against SciPy on the same least-squares problem. The simulator is TypeScript, so
// SciPy cannot call it; instead the test gives SciPy the same problem written independently in
// NumPy from its textbook definitions: one Hooke spring with an axial dashpot (c = 2ζ√(kμ), μ the
// reduced mass; Rao, Mechanical Vibrations) holding a hanging mass under gravity, stepped by
// semi-implicit Euler v ← v + h·F/m, y ← y + h·v (Hairer, Lubich & Wanner, Geometric Numerical
// Integration, ch. VI, from memory) with the same sub-step count. A one-part top-pinned Pliant chain is exactly
// that system (lumped end masses m/2, k = EA/L: sim/systems/chain.ts), so:
//  1. the NumPy trajectory at the true values equals Pliant's to rounding (checks the stand-in);
//  2. scipy.optimize.least_squares (method "lm", MINPACK) fitting the NumPy model to the same
//     noisy marker table lands on the values `calibrate` finds (within 0.001 standard error);
//  3. its textbook standard errors, sqrt(diag(σ̂²(JᵀJ)⁻¹)) with σ̂² = SSR/(n − p) (Seber & Wild,
//     Nonlinear Regression, 1989, ch. 2, from memory), from SciPy's Jacobian, equal ours to 1e-4 relative.
// (Measured when written: values within 2e-6 SE, standard errors within 1e-7 relative.)
// The scenario is an invented Korrin Bay spring check.
import { describe, expect, it } from 'vitest';

import { calibrate } from '../sim/identify/calibration/calibrate.ts';
import { checkScenarioValue } from '../sim/scenario/check-scenario.ts';
import type { Scenario } from '../sim/scenario/scenario-types.ts';
import { referencePythonAvailability, runReferencePython } from './support/reference-python.ts';
import type { SyntheticMeasurementSpec } from './support/synthetic-measurement.ts';
import { cleanPositions, syntheticMeasurement } from './support/synthetic-measurement.ts';

const python = referencePythonAvailability();

const LENGTH_M = 0.5;
const MASS_KG = 1;
const GRAVITY = -9.81;
const SUBSTEPS = 8;
const FRAMES = 80;
const RATE_HZ = 50;

function springScenario(): Scenario {
  const checked = checkScenarioValue({
    formatVersion: 1,
    name: 'korrin-spring-check',
    system: {
      kind: 'chain',
      partCount: 1,
      lengthM: LENGTH_M,
      totalMassKg: MASS_KG,
      axialStiffnessN: { kind: 'log-uniform', min: 50, max: 500 },
      secondNeighbourSpringRatio: 0,
      dampingRatio: { kind: 'uniform', min: 0.02, max: 0.2 },
      diameterM: 0.008,
      anchor: 'top-pinned',
      originM: [0, 0, 0],
      directionUnit: [0, -1, 0],
    },
    world: { gravityMPerS2: [0, GRAVITY, 0] },
    controls: { default: { kind: 'none' } },
    time: { recordIntervalS: 1 / RATE_HZ, recordedSteps: 10, substeps: SUBSTEPS },
    episodes: 1,
    seed: 1,
  });
  if (!checked.ok) throw new Error(JSON.stringify(checked.problems));
  return checked.scenario;
}

const SCIPY_FIT = String.raw`
import json, sys
import numpy as np
from scipy.optimize import least_squares
d = json.load(sys.stdin)
L, m, g, frames, substeps, h = d["L"], d["m"], d["g"], d["frames"], d["substeps"], d["dt"] / d["substeps"]
measured = np.array(d["measured"])
m1, mu = m / 2, (m / 2) * (m / 2) / m

def simulate(EA, zeta):
    k = EA / L
    c = 2 * zeta * np.sqrt(k * mu)
    y, v = -L, 0.0
    out = np.zeros((frames, 3))
    out[0, 1] = y
    for f in range(1, frames):
        for _ in range(substeps):
            ell = abs(y)
            n = y / ell                 # unit vector from the pinned top to the mass
            tension = k * (ell - L) + c * (v * n)
            v += h * (-tension * n + m1 * g) / m1
            y += h * v
        out[f, 1] = y
    return out.ravel()

def residual(p):
    return measured - simulate(p[0], p[1])

fit = least_squares(residual, d["start"], method="lm", xtol=1e-15, ftol=1e-15, gtol=1e-15)
J = fit.jac
ssr = float(fit.fun @ fit.fun)
sigma2 = ssr / (len(fit.fun) - len(fit.x))
cov = sigma2 * np.linalg.inv(J.T @ J)
print(json.dumps({"x": fit.x.tolist(), "se": np.sqrt(np.diag(cov)).tolist(), "ssr": ssr,
                  "atTruth": simulate(*d["truth"]).tolist(), "status": int(fit.status)}))
`;

describe.runIf(python.available)('calibration agrees with scipy.optimize.least_squares on a hanging spring', () => {
  it('same trajectory, same optimum, same standard errors', () => {
    const scenario = springScenario();
    const truth = { '/system/axialStiffnessN': 180, '/system/dampingRatio': 0.06 };
    const spec: SyntheticMeasurementSpec = { scenario, markers: [{ name: 'bob', node: 1 }], frameCount: FRAMES, sampleRateHz: RATE_HZ, trueValues: truth, noiseStdM: 0.001, seed: 4242 };
    const clean = cleanPositions(spec);
    const measurement = syntheticMeasurement(spec, clean);
    const ours = calibrate(scenario, measurement);
    const start = ours.parameters.map((p) => p.start);
    const reference = runReferencePython<{ x: number[]; se: number[]; ssr: number; atTruth: number[]; status: number }>(SCIPY_FIT, {
      L: LENGTH_M,
      m: MASS_KG,
      g: GRAVITY,
      frames: FRAMES,
      substeps: SUBSTEPS,
      dt: 1 / RATE_HZ,
      measured: Array.from(measurement.positionsM),
      start,
      truth: [truth['/system/axialStiffnessN'], truth['/system/dampingRatio']],
    });
    // 1. The NumPy stand-in is the same system: agreement to rounding over 80 frames.
    let worst = 0;
    for (let i = 0; i < clean.length; i++) worst = Math.max(worst, Math.abs(clean[i] - reference.atTruth[i]));
    expect(worst).toBeLessThan(1e-12);
    expect(reference.status).toBeGreaterThan(0);
    // 2. Same optimum.
    expect(ours.parameters.map((p) => p.pointer)).toEqual(['/system/axialStiffnessN', '/system/dampingRatio']);
    expect(ours.parameters.every((p) => p.identifiable)).toBe(true);
    ours.parameters.forEach((p, j) => {
      const se = p.standardError as number;
      expect(Math.abs(p.value - reference.x[j]) / se).toBeLessThan(0.001);
      // 3. Same standard errors.
      expect(Math.abs(se / reference.se[j] - 1)).toBeLessThan(1e-4);
    });
    expect(Math.abs(ours.rmsM ** 2 * ours.residualCount - reference.ssr) / reference.ssr).toBeLessThan(1e-6);
  }, 60_000);
});
