// Runs one built system through its control sequence and records the trajectory: positions and
// velocities at every record time (T + 1 samples including the start), the controls applied in
// each interval (T), and the energies. Sub-steps come from the stability bound when 'auto', and
// from the stability bound and an accuracy target when {accuracy: ε}. With energy accounting
// on, the energy flows and both balances are recorded too; with force recording on, impulse-
// averaged forces per record interval. A blow-up stops the run with SimulationBlowUpError;
// nothing half-good is returned.
import { accuracySubsteps } from '../core/accuracy-substeps.ts';
import type { BlowUpLimits } from '../core/blow-up-check.ts';
import { checkForBlowUp, DEFAULT_BLOW_UP_LIMITS } from '../core/blow-up-check.ts';
import { ENERGY_BASE_COUNT, ENERGY_NAMES, ENERGY_TERM_COUNT, measureEnergies } from '../core/energy.ts';
import type { BalanceResiduals } from '../core/energy-balance.ts';
import { balanceResiduals } from '../core/energy-balance.ts';
import { FLOW_COLUMN_COUNT } from '../core/energy-flows.ts';
import type { Model } from '../core/model.ts';
import { Simulator } from '../core/simulator.ts';
import { autoSubsteps, stabilityBound } from '../core/stability-bound.ts';
import type { StepKernel } from '../core/step-kernel-choice.ts';
import type { World } from '../core/world.ts';

export interface RecordingSettings {
  recordIntervalS: number;
  recordedSteps: number;
  /** A count, 'auto' (stability bound), or {accuracy: ε}: stability and a relative energy band ε. */
  substeps: number | 'auto' | { accuracy: number };
  /** Fraction of the critical step used by 'auto' and {accuracy}, default 0.5. */
  autoSafety?: number;
  limits?: BlowUpLimits;
  /** Book every force's work and the contact losses (energy_flows, balances). Default off. */
  energyAccounting?: boolean;
  /** Record impulse-averaged spring tensions, contact and fluid forces. Default off. */
  recordForces?: boolean;
}

/** Impulse averages over each record interval [time[t], time[t+1]). */
export interface RecordedForces {
  /** T × E, N, positive in tension. */
  edgeTensionN: Float64Array;
  /** T × N × 3, N. */
  contactNormalForceN: Float64Array;
  contactFrictionForceN: Float64Array;
  fluidForceN: Float64Array;
}

export interface EnergyBalanceSummary {
  /** Largest |work balance residual| over the record times, J: rounding only. */
  workResidualMaxAbsJ: number;
  /** Largest |energy balance residual| over the record times, J: the integrator's energy error. */
  energyResidualMaxAbsJ: number;
  /** Energy balance residual at the last record time, J. */
  energyResidualFinalJ: number;
  /** Largest kinetic + elastic energy over the record times, J: a scale for the residuals. */
  scaleJ: number;
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
  /** (T+1) × W, J, the first W terms of ENERGY_TERMS: all with energy accounting, else ENERGY_BASE_COUNT (kinetic, elastic, gravitational, bending). */
  energiesJ: Float64Array;
  /** (T+1) × FLOW_COLUMNS.length, cumulative from time 0, J; null without energy accounting. */
  energyFlowsJ: Float64Array | null;
  balance: EnergyBalanceSummary | null;
  forces: RecordedForces | null;
}


/** Sub-steps and sub-step length a recording will use for this model. */
export function resolveSubsteps(model: Model, world: World, settings: RecordingSettings): { substeps: number; dtS: number; criticalDtS: number } {
  const bound = stabilityBound(model, world.airDragPerS);
  const choice = settings.substeps;
  const substeps = typeof choice === 'number'
    ? choice
    : choice === 'auto'
      ? autoSubsteps(settings.recordIntervalS, bound, settings.autoSafety)
      : Math.max(autoSubsteps(settings.recordIntervalS, bound, settings.autoSafety), accuracySubsteps(settings.recordIntervalS, bound, choice.accuracy));
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
  const accounting = settings.energyAccounting === true || settings.recordForces === true;
  const simulator = new Simulator(model, world, { kernel, ledger: accounting ? { recordForces: settings.recordForces === true } : undefined });
  const timeS = new Float64Array(steps + 1);
  const positionM = new Float64Array((steps + 1) * n * 3);
  const velocityMPerS = new Float64Array((steps + 1) * n * 3);
  // Without accounting only the columns datasets always had, so their bytes stay as they were.
  const energyWidth = settings.energyAccounting ? ENERGY_TERM_COUNT : ENERGY_BASE_COUNT;
  const energiesJ = new Float64Array((steps + 1) * energyWidth);
  const control = new Float64Array(channels);
  const ledger = simulator.ledger;
  const energyFlowsJ = settings.energyAccounting ? new Float64Array((steps + 1) * FLOW_COLUMN_COUNT) : null;
  const forces: RecordedForces | null = settings.recordForces
    ? {
      edgeTensionN: new Float64Array(steps * model.springCount),
      contactNormalForceN: new Float64Array(steps * n * 3),
      contactFrictionForceN: new Float64Array(steps * n * 3),
      fluidForceN: new Float64Array(steps * n * 3),
    }
    : null;
  checkForBlowUp(model, limits, 0, dtS, criticalDtS);
  positionM.set(model.positionM, 0);
  velocityMPerS.set(model.velocityMPerS, 0);
  measureEnergies(model, world, energiesJ, 0, energyWidth);
  for (let t = 0; t < steps; t++) {
    for (let c = 0; c < channels; c++) control[c] = controls[t * channels + c];
    simulator.setControls(control);
    simulator.advanceInterval(settings.recordIntervalS, substeps);
    checkForBlowUp(model, limits, t + 1, dtS, criticalDtS);
    timeS[t + 1] = (t + 1) * settings.recordIntervalS;
    positionM.set(model.positionM, (t + 1) * n * 3);
    velocityMPerS.set(model.velocityMPerS, (t + 1) * n * 3);
    measureEnergies(model, world, energiesJ, energyWidth * (t + 1), energyWidth);
    if (ledger !== null && energyFlowsJ !== null) energyFlowsJ.set(ledger.flowsJ, FLOW_COLUMN_COUNT * (t + 1));
    if (ledger !== null && forces !== null) {
      ledger.takeAverageForces(forces.edgeTensionN, forces.contactNormalForceN, forces.contactFrictionForceN, forces.fluidForceN, t * model.springCount, t * n * 3);
    }
  }
  const balance = energyFlowsJ === null ? null : summariseBalance(energiesJ, energyFlowsJ, steps);
  return { nodeCount: n, channelCount: channels, steps, substeps, dtS, criticalDtS, timeS, positionM, velocityMPerS, controls: controls.slice(), energiesJ, energyFlowsJ, balance, forces };
}

function summariseBalance(energiesJ: Float64Array, energyFlowsJ: Float64Array, steps: number): EnergyBalanceSummary {
  const residuals: BalanceResiduals = { workJ: 0, energyJ: 0 };
  const kineticColumn = ENERGY_NAMES.indexOf('kinetic');
  const elasticColumn = ENERGY_NAMES.indexOf('elastic');
  const summary: EnergyBalanceSummary = { workResidualMaxAbsJ: 0, energyResidualMaxAbsJ: 0, energyResidualFinalJ: 0, scaleJ: 0 };
  for (let t = 0; t <= steps; t++) {
    balanceResiduals(energiesJ, 0, t, energyFlowsJ, t, residuals);
    summary.workResidualMaxAbsJ = Math.max(summary.workResidualMaxAbsJ, Math.abs(residuals.workJ));
    summary.energyResidualMaxAbsJ = Math.max(summary.energyResidualMaxAbsJ, Math.abs(residuals.energyJ));
    summary.energyResidualFinalJ = residuals.energyJ;
    const row = t * ENERGY_TERM_COUNT;
    summary.scaleJ = Math.max(summary.scaleJ, energiesJ[row + kineticColumn] + energiesJ[row + elasticColumn]);
  }
  return summary;
}
