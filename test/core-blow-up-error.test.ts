// What a run reports when it blows up: the error must say which episode, which recorded step,
// which node (a moving one) and the likely cause, in words a user can act on, without a stack
// trace. The instability itself is the textbook one: semi-implicit Euler on an oscillator is
// unstable for ω·dt > 2 (Hairer, Lubich & Wanner, Geometric Numerical Integration, ch. I).
// The wording checks are project rules (common practice, no source).
import { describe, expect, it } from 'vitest';

import { checkForBlowUp, DEFAULT_BLOW_UP_LIMITS } from '../sim/core/blow-up-check.ts';
import { likelyCause,SimulationBlowUpError } from '../sim/core/simulation-error.ts';
import { recordTrajectory } from '../sim/episode/record-episode.ts';
import { buildChain } from '../sim/systems/chain.ts';
import { buildSpringOscillator } from './support/spring-oscillator.ts';
import { zeroGravityWorld } from './support/zero-gravity-world.ts';

function catchBlowUp(run: () => void): SimulationBlowUpError {
  try {
    run();
  } catch (error) {
    if (error instanceof SimulationBlowUpError) return error;
    throw error;
  }
  throw new Error('expected the run to blow up, but it finished');
}

describe('blow-up report (project rule: what, where, how to fix; common practice, no source)', () => {
  it('an oversized sub-step names episode, recorded step, moving node, spring and the stability limit', () => {
    // ω = 40 rad/s, dt = 2.2/ω: the step matrix has spectral radius ≈ 1.7, so it grows fast.
    const model = buildSpringOscillator({ massKg: 0.25, stiffnessNPerM: 400, restLengthM: 0.5, initialDisplacementM: 0.01 });
    const base = catchBlowUp(() => recordTrajectory(model, zeroGravityWorld(), new Float64Array(0), { recordIntervalS: 2.2 / 40, recordedSteps: 200, substeps: 1 }));
    const error = base.inEpisode(17);
    expect(error).toBeInstanceOf(SimulationBlowUpError);
    expect(error.name).toBe('SimulationBlowUpError');
    expect(error.episode).toBe(17);
    expect(error.details).toEqual(base.details);
    const { step, node, kind } = error.details;
    expect(step).toBeGreaterThan(0);
    expect(node).toBe(1);
    expect(error.message).toContain('episode 17');
    expect(error.message).toContain(`recorded step ${step}`);
    expect(error.message).toContain('node 1');
    expect(error.message).toContain('likely cause: the sub-step 5.500e-2 s exceeds the stability limit 5.000e-2 s');
    expect(error.message).toContain('"substeps": "auto"');
    // The growing oscillation first pulls the spring past ten times its rest length.
    expect(kind).toBe('over-stretch');
    expect(error.message).toContain('spring 0');
    expect(error.details.value).toBeGreaterThan(10);
    expect(error.message).toContain(`stretched to ${error.details.value.toFixed(2)}× its rest length`);
    // One line of prose, no stack frames.
    expect(error.message).not.toMatch(/\n|\bat .*\.ts:\d+/);
    expect(base.message).not.toContain('episode');
  });

  it('a spring squeezed below a tenth of its rest length is reported as compressed, not stretched', () => {
    // At ω·dt = 2.02 the first limit crossed is the compression side.
    const model = buildSpringOscillator({ massKg: 0.25, stiffnessNPerM: 400, restLengthM: 0.5, initialDisplacementM: 0.01 });
    const error = catchBlowUp(() => recordTrajectory(model, zeroGravityWorld(), new Float64Array(0), { recordIntervalS: 2.02 / 40, recordedSteps: 200, substeps: 1 }));
    expect(error.details.kind).toBe('over-stretch');
    expect(error.details.value).toBeLessThan(0.1);
    expect(error.message).toContain(`spring compressed to ${error.details.value.toFixed(2)}× its rest length`);
    expect(error.message).not.toContain('stretched to');
  });

  it('the same run with "auto" sub-steps does not blow up', () => {
    const model = buildSpringOscillator({ massKg: 0.25, stiffnessNPerM: 400, restLengthM: 0.5, initialDisplacementM: 0.01 });
    const trajectory = recordTrajectory(model, zeroGravityWorld(), new Float64Array(0), { recordIntervalS: 2.2 / 40, recordedSteps: 200, substeps: 'auto' });
    // Auto uses at most half the critical step 2/ω.
    expect(trajectory.dtS).toBeLessThanOrEqual(0.5 * (2 / 40));
    expect(trajectory.substeps).toBe(3);
  });

  it('a handle force too large for the stiffness is reported as over-stretch at a stable step', () => {
    const system = buildChain({
      partCount: 4, lengthM: 0.4, totalMassKg: 0.2, axialStiffnessN: 5, secondNeighbourSpringRatio: 0, dampingRatio: 0.5,
      diameterM: 0.01, anchor: 'top-pinned', originM: [0, 0, 0], directionUnit: [1, 0, 0], forceHandles: [-1], forceAxes: ['x'], drivenAxes: [],
    });
    const steps = 100;
    const controls = new Float64Array(steps).fill(200); // 200 N on a 5 N-rigidity tether
    const error = catchBlowUp(() => recordTrajectory(system.model, zeroGravityWorld(), controls, { recordIntervalS: 0.01, recordedSteps: steps, substeps: 'auto' }));
    expect(error.details.kind).toBe('over-stretch');
    expect(error.details.dtS).toBeLessThan(error.details.criticalDtS);
    expect(error.message).toContain('stretched to');
    expect(error.message).toContain('control forces or actuation too large for the stiffness');
  });

  it('non-finite state and over-speed are reported with their own causes', () => {
    const model = buildSpringOscillator({ massKg: 1, stiffnessNPerM: 1, restLengthM: 1, initialDisplacementM: 0 });
    model.velocityMPerS[3] = 2000;
    const fast = catchBlowUp(() => checkForBlowUp(model, DEFAULT_BLOW_UP_LIMITS, 4, 1e-3, 1));
    expect(fast.details).toMatchObject({ kind: 'over-speed', step: 4, node: 1, value: 2000 });
    expect(fast.message).toContain('speed 2.000e+3 m/s');
    expect(fast.message).toContain('implausible speed');
    model.velocityMPerS[3] = 0;
    model.positionM[4] = Number.NaN;
    const broken = catchBlowUp(() => checkForBlowUp(model, DEFAULT_BLOW_UP_LIMITS, 9, 1e-3, 1));
    expect(broken.details).toMatchObject({ kind: 'non-finite', step: 9, node: 1 });
    expect(broken.message).toContain('non-finite position or velocity');
    expect(likelyCause(broken.details)).toContain('NaN or infinite');
  });
});
