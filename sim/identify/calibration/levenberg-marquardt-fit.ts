// Minimises the sum of squared marker-position residuals over the scaled parameters θ with
// Levenberg–Marquardt (Levenberg 1944, Marquardt 1963) as ml-levenberg-marquardt implements it.
// That library fits y ≈ f(x; θ) to points (x, y); here x is the residual's index and f(i; θ) the
// i-th simulated coordinate, so one simulation answers every x of a candidate (cached by θ).
// We hand it a forward-difference Jacobian in θ (one simulation per parameter) rather than
// its default, whose absolute step of 0.1 suits no parameter here. The library always runs
// its full iteration count, so it is called in short rounds, and the fit stops when a round
// lowers the sum of squares by less than 1 % of σ̂² = SSR/(n − p). Near the optimum
// SSR(θ) − SSR(θ̂) ≈ σ̂²·d² with d the distance in standard errors (Seber & Wild 1989, ch. 5; chapter from memory), so
// a round that gains less than 0.01·σ̂² leaves the fit about 0.1 standard error or less from the
// optimum along the directions the data informs; along those it does not inform LM only
// crawls, and the calibration flags them instead of waiting.
import { levenbergMarquardt } from 'ml-levenberg-marquardt';

import { SimulationBlowUpError } from '../../core/simulation-error.ts';
import type { FreeParameter } from './free-parameters.ts';
import { thetaOf, valueOf } from './free-parameters.ts';
import type { MarkerTrajectoryModel } from './marker-trajectory-model.ts';

export interface FitSettings {
  /** Most Levenberg–Marquardt iterations in all rounds together. */
  maxIterations: number;
  iterationsPerRound: number;
  /** Stop when a round lowers the sum of squares by less than this fraction of σ̂². */
  varianceFractionStop: number;
  /** Starting Levenberg–Marquardt damping λ of each round, as a fraction of max diag(JᵀJ). */
  dampingRelative: number;
  /** Forward-difference step in θ for the optimiser's Jacobian. */
  jacobianStepTheta: number;
}

export const DEFAULT_FIT_SETTINGS: FitSettings = { maxIterations: 60, iterationsPerRound: 8, varianceFractionStop: 0.01, dampingRelative: 1e-6, jacobianStepTheta: 1e-6 };

export interface FitOutcome {
  theta: Float64Array;
  values: Float64Array;
  /** Sum of squared residuals at the start and at the optimum, m². */
  startSsrM2: number;
  ssrM2: number;
  iterations: number;
  /** Candidates that blew up (treated as failed steps). */
  blowUps: number;
}

/** Fits `free` (a subset of the model's free parameters, by index) from `startValues`. */
export class MarkerFit {
  blowUps = 0;
  private readonly cache = new Map<string, Float64Array>();

  constructor(
    private readonly model: MarkerTrajectoryModel,
    private readonly measuredM: Float64Array,
  ) {}

  /** Simulated coordinates at all free values (value space), NaN-filled when the run blew up. */
  predictValues(values: ArrayLike<number>): Float64Array {
    const key = Array.prototype.join.call(values, ',');
    const hit = this.cache.get(key);
    if (hit) return hit;
    let predicted: Float64Array;
    try {
      predicted = this.model.predict(values);
    } catch (error) {
      if (!(error instanceof SimulationBlowUpError)) throw error;
      this.blowUps++;
      predicted = new Float64Array(this.measuredM.length).fill(NaN);
    }
    if (this.cache.size > 8) this.cache.delete(this.cache.keys().next().value as string);
    this.cache.set(key, predicted);
    return predicted;
  }

  ssr(predicted: Float64Array): number {
    let sum = 0;
    for (let i = 0; i < predicted.length; i++) sum += (this.measuredM[i] - predicted[i]) ** 2;
    return sum;
  }

  /**
   * Fits the parameters whose indices are in `active`; the others stay at `values`' entries.
   * `values` holds every free parameter of the model, in value space.
   */
  fit(values: Float64Array, active: readonly number[], settings: FitSettings = DEFAULT_FIT_SETTINGS): FitOutcome {
    const free = this.model.selection.free;
    const all = Float64Array.from(values);
    const activeParams: FreeParameter[] = active.map((i) => free[i]);
    const toValues = (theta: ArrayLike<number>): Float64Array => {
      const out = Float64Array.from(all);
      active.forEach((i, j) => (out[i] = valueOf(activeParams[j], theta[j])));
      return out;
    };
    const n = this.measuredM.length;
    const x = new Float64Array(n);
    for (let i = 0; i < n; i++) x[i] = i;
    const data = { x, y: this.measuredM };
    const model = (theta: number[]) => {
      const predicted = this.predictValues(toValues(theta));
      return (i: number) => predicted[i];
    };
    const minTheta = activeParams.map((p) => Math.min(thetaOf(p, p.searchMin), thetaOf(p, p.searchMax)));
    const maxTheta = activeParams.map((p) => Math.max(thetaOf(p, p.searchMin), thetaOf(p, p.searchMax)));
    const h = settings.jacobianStepTheta;
    const jacobian = (theta: number[]) => {
      const base = this.predictValues(toValues(theta));
      const columns = theta.map((_, j) => {
        const step = theta[j] + h <= maxTheta[j] ? h : -h;
        const moved = theta.slice();
        moved[j] += step;
        const predicted = this.predictValues(toValues(moved));
        const column = new Float64Array(n);
        for (let i = 0; i < n; i++) column[i] = (predicted[i] - base[i]) / step;
        return column;
      });
      return (i: number) => columns.map((column) => column[i]);
    };
    let theta = activeParams.map((p, j) => Math.min(maxTheta[j], Math.max(minTheta[j], thetaOf(p, all[active[j]]))));
    const startSsrM2 = this.ssr(this.predictValues(toValues(theta)));
    // The library's damping is added to JᵀJ as λ·I; state it relative to JᵀJ's largest entry.
    const startJacobian = jacobian(theta);
    let startScaleM2 = 0;
    for (let j = 0; j < theta.length; j++) {
      let sum = 0;
      for (let i = 0; i < n; i++) sum += startJacobian(i)[j] ** 2;
      startScaleM2 = Math.max(startScaleM2, sum);
    }
    let ssrM2 = startSsrM2;
    let iterations = 0;
    // When no parameter moves any marker there is nothing to fit; the identifiability check
    // that follows says so.
    while (iterations < settings.maxIterations && ssrM2 > 0 && startScaleM2 > 0 && Number.isFinite(startScaleM2)) {
      const rounds = Math.min(settings.iterationsPerRound, settings.maxIterations - iterations);
      const result = levenbergMarquardt(data, model, {
        initialValues: theta,
        minValues: minTheta,
        maxValues: maxTheta,
        maxIterations: rounds,
        // Absolute in m²: only a tiny fraction of the start, so it never ends a fit early.
        errorTolerance: 1e-15 * startSsrM2,
        jacobianFunction: jacobian,
        damping: settings.dampingRelative * startScaleM2,
      });
      iterations += result.iterations;
      const gainM2 = ssrM2 - result.parameterError;
      if (result.parameterError < ssrM2) {
        theta = result.parameterValues;
        ssrM2 = result.parameterError;
      }
      const varianceM2 = ssrM2 / (n - active.length);
      if (!(gainM2 > settings.varianceFractionStop * varianceM2)) break;
    }
    return { theta: Float64Array.from(theta), values: toValues(theta), startSsrM2, ssrM2, iterations, blowUps: this.blowUps };
  }
}
