// Calibration's standard errors mean what they say: synthetic measurements of an invented
// Korrin Bay pendulum spring (a two-part chain hung at 45°, swinging and stretching), made from
// fixed true values plus independent normal noise under 100 seeds, are fitted by `calibrate`, and
// the true values fall within ±1 and ±2 reported standard errors as often as the normal
// distribution says: 68.27 % and 95.45 % (the linearised least-squares estimate is asymptotically
// normal with covariance σ²(JᵀJ)⁻¹; Seber & Wild, Nonlinear Regression, 1989, ch. 2, from memory; n − p = 358,
// so Student's t is indistinguishable from the normal here). With 200 intervals (100 seeds × 2
// parameters) each count is binomial if the intervals are independent; the parameters of one
// seed are correlated, which widens the spread a little, so the accepted band is the binomial's
// central 99.99 % (exact binomial CDF, computed below), about ±3.9 binomial standard deviations.
import { describe, expect, it } from 'vitest';

import { calibrate } from '../sim/identify/calibration/calibrate.ts';
import { checkScenarioValue } from '../sim/scenario/check-scenario.ts';
import type { Scenario } from '../sim/scenario/scenario-types.ts';
import type { SyntheticMeasurementSpec } from './support/synthetic-measurement.ts';
import { cleanPositions, syntheticMeasurement } from './support/synthetic-measurement.ts';

const SEEDS = 100;
const TRUTH = { '/system/axialStiffnessN': 260, '/system/dampingRatio': 0.05 };

function pendulumScenario(): Scenario {
  const checked = checkScenarioValue({
    formatVersion: 1,
    name: 'korrin-pendulum-check',
    system: {
      kind: 'chain',
      partCount: 2,
      lengthM: 1,
      totalMassKg: 0.6,
      axialStiffnessN: { kind: 'log-uniform', min: 100, max: 1000 },
      secondNeighbourSpringRatio: 0,
      dampingRatio: { kind: 'uniform', min: 0.01, max: 0.2 },
      diameterM: 0.008,
      anchor: 'top-pinned',
      originM: [0, 0, 0],
      directionUnit: [1, -1, 0],
    },
    world: { gravityMPerS2: [0, -9.81, 0] },
    controls: { default: { kind: 'none' } },
    time: { recordIntervalS: 0.02, recordedSteps: 10, substeps: 'auto' },
    episodes: 1,
    seed: 1,
  });
  if (!checked.ok) throw new Error(JSON.stringify(checked.problems));
  return checked.scenario;
}

/** P(X ≤ x) for X ~ Binomial(n, p), summed exactly in log space. */
function binomialCdf(x: number, n: number, p: number): number {
  let logChoose = 0;
  let sum = 0;
  for (let k = 0; k <= x; k++) {
    if (k > 0) logChoose += Math.log((n - k + 1) / k);
    sum += Math.exp(logChoose + k * Math.log(p) + (n - k) * Math.log(1 - p));
  }
  return sum;
}

/** The smallest and largest counts of the binomial's central `mass`. */
function centralBand(n: number, p: number, mass: number): [number, number] {
  const tail = (1 - mass) / 2;
  let lo = 0;
  while (binomialCdf(lo, n, p) < tail) lo++;
  let hi = n;
  while (hi > 0 && 1 - binomialCdf(hi - 1, n, p) < tail) hi--;
  return [lo, hi];
}

describe('calibration standard errors cover the truth at the normal rates', () => {
  it(`over ${SEEDS} noise seeds`, () => {
    const scenario = pendulumScenario();
    const base: SyntheticMeasurementSpec = {
      scenario,
      markers: [
        { name: 'mid', node: 1 },
        { name: 'end', node: 2 },
      ],
      frameCount: 60,
      sampleRateHz: 50,
      trueValues: TRUTH,
      noiseStdM: 0.002,
      seed: 0,
    };
    const clean = cleanPositions(base);
    let inside1 = 0;
    let inside2 = 0;
    let intervals = 0;
    const sigmas: number[] = [];
    for (let seed = 1; seed <= SEEDS; seed++) {
      const result = calibrate(scenario, syntheticMeasurement({ ...base, seed }, clean));
      sigmas.push(result.uncertainty?.sigmaM ?? NaN);
      for (const p of result.parameters) {
        expect(p.identifiable, `${p.pointer} at seed ${seed}: ${p.reason}`).toBe(true);
        const z = Math.abs(p.value - TRUTH[p.pointer as keyof typeof TRUTH]) / (p.standardError as number);
        intervals++;
        if (z < 1) inside1++;
        if (z < 2) inside2++;
      }
    }
    const [lo1, hi1] = centralBand(intervals, 0.6827, 0.9999);
    const [lo2, hi2] = centralBand(intervals, 0.9545, 0.9999);
    console.log(`coverage over ${intervals} intervals: ±1 SE ${inside1} (band ${lo1}–${hi1}), ±2 SE ${inside2} (band ${lo2}–${hi2})`);
    expect(inside1).toBeGreaterThanOrEqual(lo1);
    expect(inside1).toBeLessThanOrEqual(hi1);
    expect(inside2).toBeGreaterThanOrEqual(lo2);
    expect(inside2).toBeLessThanOrEqual(hi2);
    // σ̂ estimates the noise it was made with: each of the 100 has a relative spread of about
    // 1/√(2·358) = 3.7 % (chi-square with 358 degrees of freedom), so their mean about 0.37 %; 1.5 % is 4 of those.
    const meanSigma = sigmas.reduce((a, b) => a + b, 0) / sigmas.length;
    expect(Math.abs(meanSigma / base.noiseStdM - 1)).toBeLessThan(0.015);
  }, 120_000);
});
