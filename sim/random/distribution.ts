// The JSON shape of a randomised scenario value and how one is drawn: a plain number is fixed,
// an object with a "kind" names a distribution sampled once per episode from a RandomStream.
import type { JsonValue } from './json-value.ts';
import type { RandomStream } from './random-stream.ts';
import { SpecError } from './spec-problem.ts';
import { sampleTruncatedStandardNormal } from './truncated-normal.ts';
import { findValueSpecProblems } from './value-spec-problems.ts';

/** Uniform on [min, max). */
export interface UniformSpec {
  kind: 'uniform';
  min: number;
  max: number;
}

/** Log-uniform on [min, max], 0 < min: every decade between the bounds is equally likely. */
export interface LogUniformSpec {
  kind: 'log-uniform';
  min: number;
  max: number;
}

/** Normal with the given mean and standard deviation, truncated to [min, max] (exact rejection). */
export interface TruncatedNormalSpec {
  kind: 'normal';
  mean: number;
  std: number;
  min: number;
  max: number;
}

/** Uniform whole number in [min, max], both ends included. */
export interface IntegerSpec {
  kind: 'integer';
  min: number;
  max: number;
}

/** One of `values`, equally likely or in proportion to `weights` (same length, not all zero). */
export interface CategoricalSpec<T extends JsonValue = JsonValue> {
  kind: 'categorical';
  values: T[];
  weights?: number[];
}

export type NumericValueSpec = number | UniformSpec | LogUniformSpec | TruncatedNormalSpec | IntegerSpec | CategoricalSpec<number>;
export type ValueSpec = NumericValueSpec | CategoricalSpec;
export type ValueSpecKind = Exclude<ValueSpec, number>['kind'];

export const VALUE_SPEC_KINDS: readonly ValueSpecKind[] = ['uniform', 'log-uniform', 'normal', 'integer', 'categorical'];

export interface SpecBounds {
  min: number;
  max: number;
}

/** Draws one value. Throws a SpecError (with JSON pointers below `pointer`) for an invalid spec. */
export function sampleValue(spec: NumericValueSpec, stream: RandomStream, pointer?: string): number;
export function sampleValue(spec: ValueSpec, stream: RandomStream, pointer?: string): JsonValue;
export function sampleValue(spec: ValueSpec, stream: RandomStream, pointer = ''): JsonValue {
  const problems = findValueSpecProblems(spec, pointer);
  if (problems.length > 0) throw new SpecError(problems);
  if (typeof spec === 'number') return spec;
  switch (spec.kind) {
    case 'uniform':
      return spec.min + (spec.max - spec.min) * stream.nextFloat64();
    case 'log-uniform': {
      const logMin = Math.log(spec.min);
      const value = Math.exp(logMin + (Math.log(spec.max) - logMin) * stream.nextFloat64());
      // exp(log(x)) may land one ulp outside the bounds.
      return Math.min(spec.max, Math.max(spec.min, value));
    }
    case 'normal': {
      const z = sampleTruncatedStandardNormal(stream, (spec.min - spec.mean) / spec.std, (spec.max - spec.mean) / spec.std);
      return Math.min(spec.max, Math.max(spec.min, spec.mean + spec.std * z));
    }
    case 'integer':
      return stream.nextIntInclusive(spec.min, spec.max);
    case 'categorical':
      return spec.values[chooseIndex(spec, stream)];
  }
}

function chooseIndex(spec: CategoricalSpec, stream: RandomStream): number {
  const weights = spec.weights;
  if (weights === undefined) return stream.nextIntInclusive(0, spec.values.length - 1);
  let total = 0;
  for (const weight of weights) total += weight;
  const target = stream.nextFloat64() * total;
  let cumulative = 0;
  let lastPossible = 0;
  for (let i = 0; i < weights.length; i++) {
    if (weights[i] <= 0) continue;
    cumulative += weights[i];
    lastPossible = i;
    if (target < cumulative) return i;
  }
  // Rounding in the running sum can leave target just above it.
  return lastPossible;
}

/**
 * The smallest interval holding every value the spec can produce; null for a categorical spec whose
 * possible values are not all numbers.
 */
export function specBounds(spec: NumericValueSpec): SpecBounds;
export function specBounds(spec: ValueSpec): SpecBounds | null;
export function specBounds(spec: ValueSpec): SpecBounds | null {
  if (typeof spec === 'number') return { min: spec, max: spec };
  if (spec.kind !== 'categorical') return { min: spec.min, max: spec.max };
  let min = Infinity;
  let max = -Infinity;
  for (let i = 0; i < spec.values.length; i++) {
    if (spec.weights !== undefined && !(spec.weights[i] > 0)) continue;
    const value = spec.values[i];
    if (typeof value !== 'number') return null;
    min = Math.min(min, value);
    max = Math.max(max, value);
  }
  return { min, max };
}

/** True when the spec can produce only one value, so it needs no histogram and no label column. */
export function isConstant(spec: ValueSpec): boolean {
  if (typeof spec === 'number') return true;
  if (spec.kind !== 'categorical') return spec.min === spec.max;
  let first: string | undefined;
  for (let i = 0; i < spec.values.length; i++) {
    if (spec.weights !== undefined && !(spec.weights[i] > 0)) continue;
    const text = JSON.stringify(spec.values[i]);
    if (first === undefined) first = text;
    else if (text !== first) return false;
  }
  return true;
}
