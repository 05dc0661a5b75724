// Everything the JSON Schema of a value spec cannot say (min <= max, weights matching values,
// a positive log-uniform range), checked on raw JSON so the scenario layer can report all of it
// at once with pointers, and so that sampling never starts from a spec it would misread.
import type { SpecProblem } from './spec-problem.ts';
import { childPointer, unknownKindProblem, unknownMemberProblems } from './spec-problem.ts';

const MEMBERS: Record<string, readonly string[]> = {
  uniform: ['kind', 'min', 'max'],
  'log-uniform': ['kind', 'min', 'max'],
  normal: ['kind', 'mean', 'std', 'min', 'max'],
  integer: ['kind', 'min', 'max'],
  categorical: ['kind', 'values', 'weights'],
};

/** Problems of one value spec found at `pointer`; an empty list means it can be sampled. */
export function findValueSpecProblems(spec: unknown, pointer: string): SpecProblem[] {
  const problems: SpecProblem[] = [];
  if (typeof spec === 'number') {
    if (!Number.isFinite(spec)) problems.push({ pointer, message: `value ${spec} is not a finite number`, fix: 'write an ordinary number' });
    return problems;
  }
  if (spec === null || typeof spec !== 'object' || Array.isArray(spec)) {
    problems.push({
      pointer,
      message: `expected a number or an object with "kind", got ${JSON.stringify(spec) ?? String(spec)}`,
      fix: `write a number for a fixed value, or e.g. {"kind": "uniform", "min": 0.1, "max": 0.2}`,
    });
    return problems;
  }
  const record = spec as Record<string, unknown>;
  const kind = record.kind;
  const members = typeof kind === 'string' ? MEMBERS[kind] : undefined;
  if (members === undefined) {
    problems.push(unknownKindProblem(pointer, kind, Object.keys(MEMBERS), 'distribution'));
    return problems;
  }
  problems.push(...unknownMemberProblems(record, members, pointer, `a ${kind} spec`));
  if (kind === 'categorical') {
    checkChoice(record, pointer, problems);
    return problems;
  }
  const integer = kind === 'integer';
  const bounded = requireNumber(record, 'min', pointer, integer, problems) && requireNumber(record, 'max', pointer, integer, problems);
  const min = record.min as number;
  const max = record.max as number;
  if (bounded && min > max) {
    problems.push({ pointer: childPointer(pointer, 'max'), message: `max ${max} is below min ${min}`, fix: 'swap them or correct one' });
  }
  if (kind === 'log-uniform' && bounded && min <= 0) {
    problems.push({
      pointer: childPointer(pointer, 'min'),
      message: `log-uniform needs min > 0, got ${min}`,
      fix: 'give a positive lower bound, or use "uniform" for a range that includes zero',
    });
  }
  if (kind === 'normal') {
    requireNumber(record, 'mean', pointer, false, problems);
    if (requireNumber(record, 'std', pointer, false, problems) && !((record.std as number) > 0)) {
      problems.push({
        pointer: childPointer(pointer, 'std'),
        message: `std must be above 0, got ${record.std}`,
        fix: 'give a positive standard deviation, or write the mean as a plain number for a fixed value',
      });
    }
  }
  return problems;
}

function requireNumber(record: Record<string, unknown>, name: string, pointer: string, integer: boolean, problems: SpecProblem[]): boolean {
  const value = record[name];
  const ok = integer ? Number.isSafeInteger(value) : typeof value === 'number' && Number.isFinite(value);
  if (!ok) {
    problems.push({
      pointer: childPointer(pointer, name),
      message: value === undefined ? `"${name}" is missing` : `"${name}" is ${JSON.stringify(value)}, not ${integer ? 'a whole number' : 'a finite number'}`,
      fix: `give "${name}" as ${integer ? 'a whole number' : 'a number'}`,
    });
  }
  return ok;
}

function checkChoice(record: Record<string, unknown>, pointer: string, problems: SpecProblem[]): void {
  const values = record.values;
  const valuesPointer = childPointer(pointer, 'values');
  if (!Array.isArray(values) || values.length === 0) {
    problems.push({ pointer: valuesPointer, message: '"values" must be a non-empty array', fix: 'list the values to choose from, e.g. [0.5, 1, 2]' });
    return;
  }
  const weights = record.weights;
  if (weights === undefined) return;
  const weightsPointer = childPointer(pointer, 'weights');
  if (!Array.isArray(weights) || weights.length !== values.length) {
    problems.push({
      pointer: weightsPointer,
      message: `"weights" must be an array with one entry per value (${values.length})`,
      fix: 'give one weight per value, or leave "weights" out for equal chances',
    });
    return;
  }
  let total = 0;
  let allValid = true;
  weights.forEach((weight: unknown, i: number) => {
    if (typeof weight !== 'number' || !Number.isFinite(weight) || weight < 0) {
      allValid = false;
      problems.push({ pointer: childPointer(weightsPointer, i), message: `weight ${JSON.stringify(weight)} is not a number >= 0`, fix: 'use 0 or a positive number' });
    } else {
      total += weight;
    }
  });
  if (allValid && !(total > 0)) {
    problems.push({ pointer: weightsPointer, message: 'all weights are zero', fix: 'give at least one value a positive weight' });
  }
}
