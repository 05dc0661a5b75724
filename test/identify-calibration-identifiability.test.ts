// Calibration says when the data cannot tell parameters apart instead of printing numbers. A
// hanging mass-spring moves by a = g − (k/m)·stretch − (c/m)·v, and with c = 2ζ√(kμ) (Rao,
// Mechanical Vibrations) every term depends on stiffness and mass only through k/m (ω² = k/m):
// scaling both by the same factor leaves every trajectory unchanged, an exact null direction of
// the Jacobian. Fitting axial stiffness, mass and damping ratio of an invented Korrin Bay spring
// check must flag stiffness and mass (each naming the other), print no value or standard error
// for them, keep their specs in the fitted scenario, and still fit the damping ratio.
import { describe, expect, it } from 'vitest';

import { calibrate } from '../sim/identify/calibration/calibrate.ts';
import { fittedScenario } from '../sim/identify/calibration/fitted-scenario.ts';
import { checkScenarioValue } from '../sim/scenario/check-scenario.ts';
import { syntheticMeasurement } from './support/synthetic-measurement.ts';

const WRITTEN = {
  formatVersion: 1,
  name: 'korrin-spring-check',
  system: {
    kind: 'chain',
    partCount: 1,
    lengthM: 0.5,
    totalMassKg: { kind: 'uniform', min: 0.5, max: 1.5 },
    axialStiffnessN: { kind: 'log-uniform', min: 50, max: 500 },
    secondNeighbourSpringRatio: 0,
    dampingRatio: { kind: 'uniform', min: 0.02, max: 0.2 },
    diameterM: 0.008,
    anchor: 'top-pinned',
    originM: [0, 0, 0],
    directionUnit: [0, -1, 0],
  },
  world: { gravityMPerS2: [0, -9.81, 0] },
  controls: { default: { kind: 'none' } },
  time: { recordIntervalS: 0.02, recordedSteps: 10, substeps: 8 },
  episodes: 1,
  seed: 1,
};

describe('parameters the data cannot tell apart', () => {
  it('stiffness and mass of a spring are flagged, the damping ratio is fitted', () => {
    const checked = checkScenarioValue(WRITTEN);
    if (!checked.ok) throw new Error(JSON.stringify(checked.problems));
    // Truth on the nominal ratio k/m, so holding both at nominal leaves the damping ratio well posed.
    const truth = { '/system/totalMassKg': 1, '/system/axialStiffnessN': Math.sqrt(50 * 500), '/system/dampingRatio': 0.07 };
    const measurement = syntheticMeasurement({ scenario: checked.scenario, markers: [{ name: 'bob', node: 1 }], frameCount: 80, sampleRateHz: 50, trueValues: truth, noiseStdM: 0.001, seed: 99 });
    const result = calibrate(checked.scenario, measurement);
    const byPointer = Object.fromEntries(result.parameters.map((p) => [p.pointer, p]));
    for (const [pointer, partner] of [
      ['/system/axialStiffnessN', '/system/totalMassKg'],
      ['/system/totalMassKg', '/system/axialStiffnessN'],
    ]) {
      const p = byPointer[pointer];
      expect(p.identifiable).toBe(false);
      expect(p.standardError).toBeNull();
      expect(p.reason).toContain(`cannot tell it apart from ${partner}`);
    }
    const damping = byPointer['/system/dampingRatio'];
    expect(damping.identifiable).toBe(true);
    expect(Math.abs(damping.value - truth['/system/dampingRatio'])).toBeLessThan(3 * (damping.standardError as number));
    const fitted = fittedScenario(WRITTEN, result, 2, 'synthetic.json');
    expect(fitted.ok).toBe(true);
    const system = fitted.value.system as Record<string, unknown>;
    expect(system.totalMassKg).toEqual(WRITTEN.system.totalMassKg);
    expect(system.axialStiffnessN).toEqual(WRITTEN.system.axialStiffnessN);
    expect(system.dampingRatio).toMatchObject({ kind: 'uniform' });
  }, 60_000);
});
