// Runs one built system through its control sequence and records the trajectory: positions and
// velocities at every record time (T + 1 samples including the start), the controls applied in
// each interval (T), and the energies. Sub-steps come from the stability bound when 'auto'.
// A blow-up stops the run with SimulationBlowUpError; nothing half-good is returned.
import type { Model } from '../core/model.ts';
import type { World } from '../core/world.ts';
import { Simulator } from '../core/simulator.ts';
import type { StepKernel } from '../core/step-kernel-choice.ts';
import { autoSubsteps, stabilityBound } from '../core/stability-bound.ts';
import { ENERGY_COUNT, measureEnergies } from '../core/energy.ts';
import { checkForBlowUp, DEFAULT_BLOW_UP_LIMITS } from '../core/blow-up-check.ts';
import type { BlowUpLimits } from '../core/blow-up-check.ts';

export interface RecordingSettings {
  recordIntervalS: number;
  recordedSteps: number;
  substeps: number | 'auto';
  /** Fraction of the critical step used by 'auto', default 0.5. */
  autoSafety?: number;
  limits?: BlowUpLimits;
}

export interface RecordedTrajectory {
  nodeCount: number;
  channelCount: number;
  steps: number;
  substeps: number;
  dtS: number;
  criticalDtS: number;
  /** (T+1) record times, s. */
  timeS: Float64Array;
  /** (T+1) × N × 3, m. */
  positionM: Float64Array;
  /** (T+1) × N × 3, m/s. */
  velocityMPerS: Float64Array;
  /** T × C, in each channel's unit. */
  controls: Float64Array;
  /** (T+1) × ENERGY_COUNT: kinetic, elastic, gravitational, bending, J. */
  energiesJ: Float64Array;
}

/** Sub-steps and sub-step length a recording will use for this model. */
export function resolveSubsteps(model: Model, world: World, settings: RecordingSettings): { substeps: number; dtS: number; criticalDtS: number } {
  const bound = stabilityBound(model, world.airDragPerS);
  const substeps = settings.substeps === 'auto' ? autoSubsteps(settings.recordIntervalS, bound, settings.autoSafety) : settings.substeps;
  return { substeps, dtS: settings.recordIntervalS / substeps, criticalDtS: bound.criticalDtS };
}

/** `kernel` picks the step's implementation (default: WebAssembly where it runs); it never changes the result. */
export function recordTrajectory(model: Model, world: World, controls: Float64Array, settings: RecordingSettings, kernel?: StepKernel): RecordedTrajectory {
  const steps = settings.recordedSteps;
  const n = model.nodeCount;
  const channels = model.controlChannelCount;
  if (controls.length !== steps * channels) {
    throw new RangeError(`controls hold ${controls.length} values, expected ${steps} steps × ${channels} channels`);
  }
  const { substeps, dtS, criticalDtS } = resolveSubsteps(model, world, settings);
  const limits = settings.limits ?? DEFAULT_BLOW_UP_LIMITS;
  const simulator = new Simulator(model, world, { kernel });
  const timeS = new Float64Array(steps + 1);
  const positionM = new Float64Array((steps + 1) * n * 3);
  const velocityMPerS = new Float64Array((steps + 1) * n * 3);
  const energiesJ = new Float64Array((steps + 1) * ENERGY_COUNT);
  const control = new Float64Array(channels);
  checkForBlowUp(model, limits, 0, dtS, criticalDtS);
  positionM.set(model.positionM, 0);
  velocityMPerS.set(model.velocityMPerS, 0);
  measureEnergies(model, world, energiesJ, 0);
  for (let t = 0; t < steps; t++) {
    for (let c = 0; c < channels; c++) control[c] = controls[t * channels + c];
    simulator.setControls(control);
    simulator.advanceInterval(settings.recordIntervalS, substeps);
    checkForBlowUp(model, limits, t + 1, dtS, criticalDtS);
    timeS[t + 1] = (t + 1) * settings.recordIntervalS;
    positionM.set(model.positionM, (t + 1) * n * 3);
    velocityMPerS.set(model.velocityMPerS, (t + 1) * n * 3);
    measureEnergies(model, world, energiesJ, ENERGY_COUNT * (t + 1));
  }
  return { nodeCount: n, channelCount: channels, steps, substeps, dtS, criticalDtS, timeS, positionM, velocityMPerS, controls: controls.slice(), energiesJ };
}
