// A whole calibration: choose the free parameters, fit them to the measured marker positions,
// judge what the data can and cannot tell, and fit again with the parameters it cannot tell
// held at the scenario's nominal values, so every number reported comes from a well-posed fit.
import type { Scenario } from '../../scenario/scenario-types.ts';
import { CalibrationInputError } from './calibration-input-error.ts';
import type { FreeParameter, ParameterSelection } from './free-parameters.ts';
import { selectParameters, thetaOf, valueOf } from './free-parameters.ts';
import type { FitSettings } from './levenberg-marquardt-fit.ts';
import { DEFAULT_FIT_SETTINGS, MarkerFit } from './levenberg-marquardt-fit.ts';
import { MarkerTrajectoryModel } from './marker-trajectory-model.ts';
import type { Measurement } from './measurement.ts';
import type { ParameterUncertainty } from './parameter-uncertainty.ts';
import { parameterUncertainty } from './parameter-uncertainty.ts';

/** Central-difference step in θ for the Jacobian the standard errors come from. */
export const COVARIANCE_JACOBIAN_STEP_THETA = 1e-5;

export interface CalibrationOptions {
  /** JSON pointers to fit instead of every distributed parameter (`--fit`). */
  fitPointers?: readonly string[];
  /**
   * Where the fit starts, by JSON pointer (seam for a grey-box estimate); parameters not
   * named start at the scenario's nominal value.
   */
  initialEstimate?: Readonly<Record<string, number>>;
  fitSettings?: FitSettings;
}

export interface FittedParameter {
  pointer: string;
  scaling: FreeParameter['scaling'];
  nominal: number;
  start: number;
  /** Fitted value; the nominal value when not identifiable. */
  value: number;
  /** Standard error in the parameter's unit; null when not identifiable. */
  standardError: number | null;
  identifiable: boolean;
  /** Why the data cannot tell it, when not identifiable. */
  reason: string | null;
  searchMin: number;
  searchMax: number;
  /** True when the fitted value sits on the search box's edge (within 1e-6 in θ). */
  atSearchEdge: boolean;
}

export interface CalibrationResult {
  selection: ParameterSelection;
  parameters: FittedParameter[];
  /** Uncertainty of the final fit, over its identifiable parameters (same order as `fittedPointers`). */
  uncertainty: ParameterUncertainty | null;
  fittedPointers: string[];
  iterations: number;
  simulations: number;
  fitRounds: number;
  substeps: number;
  recordIntervalS: number;
  residualCount: number;
  startRmsM: number;
  rmsM: number;
  /** Per frame, RMS over every marker coordinate, at the start values and at the fit, m. */
  frameTimesS: Float64Array;
  startFrameRmsM: Float64Array;
  fittedFrameRmsM: Float64Array;
  blowUps: number;
  /**
   * Set when frame 0 differs from the simulated start by more than START_MISMATCH_SIGMAS σ̂:
   * the bench run did not start from the scenario's laid-out shape at rest.
   */
  startMismatch: string | null;
}

export const START_MISMATCH_SIGMAS = 5;

export function calibrate(scenario: Scenario, measurement: Measurement, options: CalibrationOptions = {}): CalibrationResult {
  const selection = selectParameters(scenario, measurement.knownParameters, options.fitPointers, measurement.source);
  const free = selection.free;
  for (const pointer of Object.keys(options.initialEstimate ?? {})) {
    if (!free.some((p) => p.pointer === pointer)) throw new CalibrationInputError(`initial estimate names ${pointer}, which is not among the fitted parameters (${free.map((p) => p.pointer).join(', ')})`);
  }
  const model = new MarkerTrajectoryModel(scenario, measurement, selection);
  const fit = new MarkerFit(model, measurement.positionsM);
  const start = Float64Array.from(free, (p) => options.initialEstimate?.[p.pointer] ?? p.nominal);
  const settings = options.fitSettings ?? DEFAULT_FIT_SETTINGS;

  let active = free.map((_, i) => i);
  let values: Float64Array = start;
  let iterations = 0;
  let fitRounds = 0;
  const reasons = new Map<number, string>();
  let uncertainty: ParameterUncertainty | null = null;
  let ssrM2 = fit.ssr(fit.predictValues(start));
  const startSsrM2 = ssrM2;
  while (active.length > 0) {
    const outcome = fit.fit(values, active, settings);
    fitRounds++;
    iterations += outcome.iterations;
    values = outcome.values;
    ssrM2 = outcome.ssrM2;
    const params = active.map((i) => free[i]);
    const theta = active.map((i) => thetaOf(free[i], values[i]));
    const columns = centralJacobian(fit, values, active, params, theta);
    uncertainty = parameterUncertainty(columns, params, theta, active.map((i) => values[i]), ssrM2);
    if (uncertainty.notIdentifiable.length === 0) break;
    for (const { index, reason } of uncertainty.notIdentifiable) {
      const which = active[index];
      reasons.set(which, reason);
      values[which] = free[which].nominal;
    }
    active = active.filter((i) => !reasons.has(i));
    uncertainty = null;
    if (active.length === 0) ssrM2 = fit.ssr(fit.predictValues(values));
  }

  const fittedPointers = active.map((i) => free[i].pointer);
  const parameters: FittedParameter[] = free.map((p, i) => {
    const position = active.indexOf(i);
    const identifiable = position !== -1;
    const theta = thetaOf(p, values[i]);
    const lo = Math.min(thetaOf(p, p.searchMin), thetaOf(p, p.searchMax));
    const hi = Math.max(thetaOf(p, p.searchMin), thetaOf(p, p.searchMax));
    return {
      pointer: p.pointer,
      scaling: p.scaling,
      nominal: p.nominal,
      start: start[i],
      value: values[i],
      standardError: identifiable && uncertainty ? uncertainty.seValue[position] : null,
      identifiable,
      reason: reasons.get(i) ?? null,
      searchMin: p.searchMin,
      searchMax: p.searchMax,
      atSearchEdge: identifiable && (theta - lo < 1e-6 || hi - theta < 1e-6),
    };
  });
  const frames = measurement.frameCount;
  const perFrame = measurement.markers.length * 3;
  const frameRms = (predicted: Float64Array): Float64Array => {
    const out = new Float64Array(frames);
    for (let s = 0; s < frames; s++) {
      let sum = 0;
      for (let k = 0; k < perFrame; k++) sum += (measurement.positionsM[s * perFrame + k] - predicted[s * perFrame + k]) ** 2;
      out[s] = Math.sqrt(sum / perFrame);
    }
    return out;
  };
  const n = measurement.positionsM.length;
  const fittedFrameRmsM = frameRms(fit.predictValues(values));
  // The residual scale: σ̂ when there is a fit, else the typical frame's RMS.
  const noiseM = uncertainty?.sigmaM ?? [...fittedFrameRmsM.slice(1)].sort((a, b) => a - b)[Math.floor((frames - 1) / 2)];
  const startMismatch =
    fittedFrameRmsM[0] > START_MISMATCH_SIGMAS * noiseM
      ? `frame 0 differs from the simulated start by ${fittedFrameRmsM[0].toExponential(2)} m RMS, more than ${START_MISMATCH_SIGMAS} times the residual scale ${noiseM.toExponential(2)} m: the simulation starts from the scenario's laid-out shape at rest, so the bench run must start there too (check originM, directionUnit, the marker nodes and the table's first frame; see sim/identify/calibration/MEASUREMENT.md)`
      : null;
  return {
    selection,
    parameters,
    uncertainty,
    fittedPointers,
    iterations,
    simulations: model.simulationCount,
    fitRounds,
    substeps: model.substeps,
    recordIntervalS: model.recordIntervalS,
    residualCount: n,
    startRmsM: Math.sqrt(startSsrM2 / n),
    rmsM: Math.sqrt(ssrM2 / n),
    frameTimesS: Float64Array.from({ length: frames }, (_, s) => s * model.recordIntervalS),
    startFrameRmsM: frameRms(fit.predictValues(start)),
    fittedFrameRmsM,
    blowUps: fit.blowUps,
    startMismatch,
  };
}

function centralJacobian(fit: MarkerFit, values: Float64Array, active: readonly number[], params: readonly FreeParameter[], theta: readonly number[]): Float64Array[] {
  const h = COVARIANCE_JACOBIAN_STEP_THETA;
  return active.map((which, j) => {
    const plus = Float64Array.from(values);
    const minus = Float64Array.from(values);
    plus[which] = valueOf(params[j], theta[j] + h);
    minus[which] = valueOf(params[j], theta[j] - h);
    const up = fit.predictValues(plus);
    const down = fit.predictValues(minus);
    const column = new Float64Array(up.length);
    for (let i = 0; i < up.length; i++) column[i] = (up[i] - down[i]) / (2 * h);
    return column;
  });
}
