// The JSON shape of one control channel's signal over an episode. Every numeric member is a
// value spec drawn once per episode; the signal itself is then drawn from the channel's stream.
// Values are in the channel's unit: N for forces, m for displacements, dimensionless (-1 to 1)
// for actuators.
import type { NumericValueSpec } from '../random/distribution.ts';

/** Limits applied to the finished signal; either may be left out. */
export interface ClipSpec {
  min?: NumericValueSpec;
  max?: NumericValueSpec;
}

interface Clippable {
  clip?: ClipSpec;
}

/** Zero throughout. */
export interface NoControlSpec extends Clippable {
  kind: 'none';
}

export interface ConstantControlSpec extends Clippable {
  kind: 'constant';
  value: NumericValueSpec;
}

/** A new level drawn uniformly from [min, max) every holdS seconds. */
export interface PiecewiseConstantControlSpec extends Clippable {
  kind: 'piecewise-constant';
  holdS: NumericValueSpec;
  min: NumericValueSpec;
  max: NumericValueSpec;
}

/** Mean-reverting noise with stationary standard deviation `std` and correlation time `timeConstantS`. */
export interface OrnsteinUhlenbeckControlSpec extends Clippable {
  kind: 'ornstein-uhlenbeck';
  meanValue: NumericValueSpec;
  std: NumericValueSpec;
  timeConstantS: NumericValueSpec;
}

/** Random-phase multisine: componentCount equal sinusoids at k * cutoffHz / componentCount, total std `std`. */
export interface BandLimitedControlSpec extends Clippable {
  kind: 'band-limited';
  cutoffHz: NumericValueSpec;
  std: NumericValueSpec;
  componentCount: NumericValueSpec;
}

/** offset + amplitude * sin(2 pi frequencyHz t + phaseRad). */
export interface SinusoidControlSpec extends Clippable {
  kind: 'sinusoid';
  amplitude: NumericValueSpec;
  frequencyHz: NumericValueSpec;
  phaseRad?: NumericValueSpec;
  offset?: NumericValueSpec;
}

/** Sinusoid whose frequency runs linearly from startFrequencyHz at t = 0 to endFrequencyHz at the episode's end. */
export interface ChirpControlSpec extends Clippable {
  kind: 'chirp';
  amplitude: NumericValueSpec;
  startFrequencyHz: NumericValueSpec;
  endFrequencyHz: NumericValueSpec;
  phaseRad?: NumericValueSpec;
  offset?: NumericValueSpec;
}

/** stepCount switches at uniformly random times, each to a new level uniform in [min, max). */
export interface StepsControlSpec extends Clippable {
  kind: 'steps';
  stepCount: NumericValueSpec;
  min: NumericValueSpec;
  max: NumericValueSpec;
}

/** values[i] from timesS[i] on; timesS starts at 0 and does not decrease. */
export interface StepListControlSpec extends Clippable {
  kind: 'step-list';
  timesS: NumericValueSpec[];
  values: NumericValueSpec[];
}

/** One column of a recorded table, one row per record; the command line reads the file. */
export interface ReplayControlSpec extends Clippable {
  kind: 'replay';
  file: string;
  column: number;
}

export type ControlSpec =
  | NoControlSpec
  | ConstantControlSpec
  | PiecewiseConstantControlSpec
  | OrnsteinUhlenbeckControlSpec
  | BandLimitedControlSpec
  | SinusoidControlSpec
  | ChirpControlSpec
  | StepsControlSpec
  | StepListControlSpec
  | ReplayControlSpec;

export type ControlKind = ControlSpec['kind'];

export const CONTROL_KINDS: readonly ControlKind[] = [
  'none',
  'constant',
  'piecewise-constant',
  'ornstein-uhlenbeck',
  'band-limited',
  'sinusoid',
  'chirp',
  'steps',
  'step-list',
  'replay',
];

/** Caps that keep one channel's cost bounded; the schema and the checks share them. */
export const MAX_COMPONENT_COUNT = 4096;
export const MAX_STEP_COUNT = 100_000;
