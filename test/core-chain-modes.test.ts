// Longitudinal normal modes of a fixed–fixed chain of N equal masses m joined by N + 1 equal
// springs k: ω_n = 2·√(k/m)·sin(nπ / (2(N + 1))), mode shape u_j ∝ sin(j·n·π/(N + 1))
// (French, Vibrations and Waves, coupled oscillators; chapter 5 from memory). Motion along
// the chain's axis keeps every spring force exactly linear, so a mode-shaped start stays in its
// mode and its period can be read from the zero crossings of the modal coordinate.
import { describe, expect, it } from 'vitest';

import { Simulator } from '../sim/core/simulator.ts';
import { stabilityBound } from '../sim/core/stability-bound.ts';
import type { ChainParameters } from '../sim/systems/chain.ts';
import { buildChain } from '../sim/systems/chain.ts';
import { zeroCrossingPeriodS } from './support/zero-crossing-period.ts';
import { zeroGravityWorld } from './support/zero-gravity-world.ts';

const FREE_MASSES = 12;
const PARTS = FREE_MASSES + 1;

function chainParameters(): ChainParameters {
  return {
    partCount: PARTS,
    lengthM: 1.3,
    totalMassKg: 0.65, // 0.05 kg per part: every interior node carries one part's mass
    axialStiffnessN: 26, // k = EA / segment = 26 / 0.1 = 260 N/m
    secondNeighbourSpringRatio: 0,
    dampingRatio: 0,
    diameterM: 0.01,
    anchor: 'both-pinned',
    originM: [0, 0, 0],
    directionUnit: [1, 0, 0],
    forceHandles: [],
    forceAxes: [],
    drivenAxes: [],
  };
}

function measureModePeriodS(n: number): { measured: number; expected: number } {
  const system = buildChain(chainParameters());
  const model = system.model;
  const kNPerM = model.stiffnessNPerM[0];
  const mKg = model.massKg[1];
  expect(kNPerM).toBeCloseTo(260, 10);
  expect(mKg).toBeCloseTo(0.05, 14);
  const omega = 2 * Math.sqrt(kNPerM / mKg) * Math.sin((n * Math.PI) / (2 * (FREE_MASSES + 1)));
  const shape = new Float64Array(FREE_MASSES + 2);
  for (let j = 1; j <= FREE_MASSES; j++) shape[j] = Math.sin((j * n * Math.PI) / (FREE_MASSES + 1));
  const amplitudeM = 1e-3;
  const segmentM = 0.1;
  for (let j = 1; j <= FREE_MASSES; j++) model.positionM[3 * j] = j * segmentM + amplitudeM * shape[j];
  const simulator = new Simulator(model, zeroGravityWorld());
  // A small, fixed fraction of the critical step for this mode keeps the scheme's own period
  // error ((ω·dt)²/24) below 1e-5.
  const dtS = Math.min(0.01 / omega, 0.1 * stabilityBound(model).criticalDtS);
  const periodS = (2 * Math.PI) / omega;
  const steps = Math.ceil((8.3 * periodS) / dtS);
  const modal = new Float64Array(steps);
  for (let s = 0; s < steps; s++) {
    simulator.step(dtS);
    let q = 0;
    for (let j = 1; j <= FREE_MASSES; j++) q += (model.positionM[3 * j] - j * segmentM) * shape[j];
    modal[s] = q;
  }
  return { measured: zeroCrossingPeriodS(modal, dtS), expected: periodS };
}

describe('fixed–fixed chain normal modes (French, Vibrations and Waves: ω_n = 2√(k/m)·sin(nπ/(2(N+1))))', () => {
  for (const n of [1, 2, 5, 9, 12]) {
    it(`mode ${n} of ${FREE_MASSES}: measured period within 0.1% of 2π/ω_n`, () => {
      const { measured, expected } = measureModePeriodS(n);
      expect(Math.abs(measured / expected - 1)).toBeLessThan(1e-3);
    });
  }
});
