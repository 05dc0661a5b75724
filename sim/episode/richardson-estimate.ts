// A Richardson estimate of an episode's position error: rerun it from the same start state
// with the same controls at half the sub-step and compare (Richardson extrapolation; e.g.
// Hairer, Nørsett & Wanner, Solving Ordinary Differential Equations I, §II.4). For a method of
// order p the global error is e(h) ≈ C·h^p, so with d = |x_h − x_{h/2}|:
//   error of the half-step run      ≈ d / (2^p − 1),
//   error of the recorded (h) run   ≈ d · 2^p / (2^p − 1).
// Semi-implicit Euler has p = 1, so the recorded run's error is ≈ 2·d; that is what the label
// holds, since the recorded trajectory is what a learner sees.
import type { Model } from '../core/model.ts';
import type { World } from '../core/world.ts';
import type { RecordedTrajectory, RecordingSettings } from './record-episode.ts';
import { recordTrajectory } from './record-episode.ts';

export const RICHARDSON_ORDER = 1;

export interface RichardsonEstimate {
  /** Sub-steps per record interval of the rerun (twice the recorded run's). */
  substepCount: number;
  /** Largest estimated error of a recorded node position over all records and nodes, m. */
  positionErrorMaxM: number;
  /** Root mean square of the estimated node position errors over all records and nodes, m. */
  positionErrorRmsM: number;
}

/** Start state to rerun from; take it before the first run moves the model. */
export interface StartState {
  positionM: Float64Array;
  velocityMPerS: Float64Array;
}

export function startStateOf(model: Model): StartState {
  return { positionM: model.positionM.slice(), velocityMPerS: model.velocityMPerS.slice() };
}

export function richardsonEstimate(model: Model, start: StartState, world: World, controls: Float64Array, settings: RecordingSettings, recorded: RecordedTrajectory): RichardsonEstimate {
  model.positionM.set(start.positionM);
  model.velocityMPerS.set(start.velocityMPerS);
  model.restLengthM.set(model.baseRestLengthM);
  const substepCount = 2 * recorded.substeps;
  const fine = recordTrajectory(model, world, controls, { ...settings, substeps: substepCount, energyAccounting: false, recordForces: false });
  const factor = 2 ** RICHARDSON_ORDER / (2 ** RICHARDSON_ORDER - 1);
  const h = recorded.positionM;
  const f = fine.positionM;
  let max = 0;
  let sum2 = 0;
  const points = h.length / 3;
  for (let p = 0; p < points; p++) {
    const o = 3 * p;
    const dx = h[o] - f[o];
    const dy = h[o + 1] - f[o + 1];
    const dz = h[o + 2] - f[o + 2];
    const d2 = dx * dx + dy * dy + dz * dz;
    sum2 += d2;
    if (d2 > max) max = d2;
  }
  return { substepCount, positionErrorMaxM: factor * Math.sqrt(max), positionErrorRmsM: factor * Math.sqrt(sum2 / points) };
}
