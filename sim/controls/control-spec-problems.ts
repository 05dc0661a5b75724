// What a control spec's JSON Schema cannot say, checked before any drawing so that an error
// never depends on the seed: every member's whole range must be valid (a hold time above zero,
// frequencies below the record rate's Nyquist limit, min ranges wholly below max ranges).
import type { NumericValueSpec } from '../random/distribution.ts';
import { specBounds } from '../random/distribution.ts';
import type { SpecProblem } from '../random/spec-problem.ts';
import { childPointer, unknownKindProblem, unknownMemberProblems } from '../random/spec-problem.ts';
import { findValueSpecProblems } from '../random/value-spec-problems.ts';
import { CONTROL_KINDS, MAX_COMPONENT_COUNT, MAX_STEP_COUNT } from './control-spec.ts';

/** How one numeric member's values are restricted. */
type MemberRule = 'any' | 'non-negative' | 'positive' | 'frequency' | 'hold' | 'step-count' | 'component-count';

interface KindLayout {
  required: Record<string, MemberRule>;
  optional: Record<string, MemberRule>;
  /** Pairs of members whose ranges must not overlap, so no episode draws the first above the second. */
  ordered: [string, string][];
}

const LAYOUTS: Record<string, KindLayout> = {
  none: { required: {}, optional: {}, ordered: [] },
  constant: { required: { value: 'any' }, optional: {}, ordered: [] },
  'piecewise-constant': { required: { holdS: 'hold', min: 'any', max: 'any' }, optional: {}, ordered: [['min', 'max']] },
  'ornstein-uhlenbeck': { required: { meanValue: 'any', std: 'non-negative', timeConstantS: 'positive' }, optional: {}, ordered: [] },
  'band-limited': { required: { cutoffHz: 'frequency', std: 'non-negative', componentCount: 'component-count' }, optional: {}, ordered: [] },
  sinusoid: { required: { amplitude: 'any', frequencyHz: 'frequency' }, optional: { phaseRad: 'any', offset: 'any' }, ordered: [] },
  chirp: {
    required: { amplitude: 'any', startFrequencyHz: 'frequency', endFrequencyHz: 'frequency' },
    optional: { phaseRad: 'any', offset: 'any' },
    ordered: [],
  },
  steps: { required: { stepCount: 'step-count', min: 'any', max: 'any' }, optional: {}, ordered: [['min', 'max']] },
  'step-list': { required: {}, optional: {}, ordered: [] },
  replay: { required: {}, optional: {}, ordered: [] },
};

const SPECIAL_MEMBERS: Record<string, readonly string[]> = { 'step-list': ['timesS', 'values'], replay: ['file', 'column'] };

/**
 * Problems of one control spec at `pointer`. With `recordIntervalS` the checks that depend on
 * the record rate (Nyquist limit, hold time) run too; an empty list means it can be generated.
 */
export function findControlSpecProblems(spec: unknown, pointer: string, recordIntervalS?: number): SpecProblem[] {
  const problems: SpecProblem[] = [];
  if (spec === null || typeof spec !== 'object' || Array.isArray(spec)) {
    problems.push({ pointer, message: 'a control spec must be an object with "kind"', fix: 'write e.g. {"kind": "none"} or {"kind": "constant", "value": 0}' });
    return problems;
  }
  const record = spec as Record<string, unknown>;
  const kind = record.kind;
  const layout = typeof kind === 'string' ? LAYOUTS[kind] : undefined;
  if (layout === undefined) {
    problems.push(unknownKindProblem(pointer, kind, CONTROL_KINDS, 'control'));
    return problems;
  }
  const allowed = ['kind', 'clip', ...Object.keys(layout.required), ...Object.keys(layout.optional), ...(SPECIAL_MEMBERS[kind as string] ?? [])];
  problems.push(...unknownMemberProblems(record, allowed, pointer, `a ${kind} control`));
  const context = { problems, recordIntervalS };
  for (const [name, rule] of Object.entries(layout.required)) {
    if (record[name] === undefined) {
      problems.push({ pointer: childPointer(pointer, name), message: `"${name}" is missing`, fix: `give "${name}" as a number or a value spec` });
    } else {
      checkMember(record[name], childPointer(pointer, name), rule, context);
    }
  }
  for (const [name, rule] of Object.entries(layout.optional)) {
    if (record[name] !== undefined) checkMember(record[name], childPointer(pointer, name), rule, context);
  }
  for (const [first, second] of layout.ordered) checkOrdered(record, pointer, first, second, problems);
  if (kind === 'step-list') checkStepList(record, pointer, problems);
  if (kind === 'replay') checkReplay(record, pointer, problems);
  if (record.clip !== undefined) checkClip(record.clip, childPointer(pointer, 'clip'), context);
  return problems;
}

interface CheckContext {
  problems: SpecProblem[];
  recordIntervalS: number | undefined;
}

function isWhole(spec: NumericValueSpec): boolean {
  if (typeof spec === 'number') return Number.isInteger(spec);
  if (spec.kind === 'integer') return true;
  if (spec.kind === 'categorical') return spec.values.every((value) => Number.isInteger(value));
  return false;
}

/** Checks a value spec and its range against the member's rule; false if it is unusable. */
function checkMember(spec: unknown, pointer: string, rule: MemberRule, context: CheckContext): boolean {
  const valueProblems = findValueSpecProblems(spec, pointer);
  if (valueProblems.length === 0 && !isNumericChoice(spec)) {
    valueProblems.push({ pointer, message: 'a categorical spec here must list numbers only', fix: 'give numeric values' });
  }
  if (valueProblems.length > 0) {
    context.problems.push(...valueProblems);
    return false;
  }
  const numeric = spec as NumericValueSpec;
  const { min, max } = specBounds(numeric);
  const say = (message: string, fix: string): void => {
    context.problems.push({ pointer, message, fix });
  };
  const range = min === max ? `${min}` : `[${min}, ${max}]`;
  switch (rule) {
    case 'any':
      break;
    case 'non-negative':
      if (min < 0) say(`must not be negative, but can be ${min}`, 'keep the whole range at or above 0');
      break;
    case 'positive':
      if (!(min > 0)) say(`must be above 0, but can be ${min}`, 'keep the whole range above 0');
      break;
    case 'frequency': {
      if (min < 0) say(`a frequency must not be negative, but can be ${min} Hz`, 'keep the whole range at or above 0 Hz');
      const dt = context.recordIntervalS;
      if (dt !== undefined && max > 0.5 / dt) {
        say(
          `frequency range ${range} Hz reaches above ${0.5 / dt} Hz, the Nyquist limit of a ${dt} s record interval`,
          'lower the frequency or record more often (a shorter record interval)',
        );
      }
      break;
    }
    case 'hold': {
      if (!(min > 0)) say(`hold time must be above 0, but can be ${min} s`, 'keep the whole range above 0 s');
      const dt = context.recordIntervalS;
      if (dt !== undefined && min < dt) {
        say(`hold time can be ${min} s, shorter than the ${dt} s record interval`, `keep holdS at or above ${dt} s`);
      }
      break;
    }
    case 'step-count':
    case 'component-count': {
      const low = rule === 'step-count' ? 0 : 1;
      const high = rule === 'step-count' ? MAX_STEP_COUNT : MAX_COMPONENT_COUNT;
      if (!isWhole(numeric)) say('must be a whole number', 'give a whole number, or an "integer" or "categorical" spec of whole numbers');
      else if (min < low || max > high) say(`can be outside ${low} to ${high} (range ${range})`, `keep it within ${low} to ${high}`);
      break;
    }
  }
  return true;
}

function isNumericChoice(spec: unknown): boolean {
  if (typeof spec !== 'object' || spec === null || (spec as { kind?: unknown }).kind !== 'categorical') return true;
  return (spec as { values: unknown[] }).values.every((value) => typeof value === 'number');
}

function checkOrdered(record: Record<string, unknown>, pointer: string, first: string, second: string, problems: SpecProblem[]): void {
  const a = record[first];
  const b = record[second];
  if (findValueSpecProblems(a, '').length > 0 || findValueSpecProblems(b, '').length > 0) return;
  if (!isNumericChoice(a) || !isNumericChoice(b)) return;
  const high = specBounds(a as NumericValueSpec).max;
  const low = specBounds(b as NumericValueSpec).min;
  if (high > low) {
    problems.push({
      pointer: childPointer(pointer, second),
      message: `"${first}" can be ${high}, above the ${low} that "${second}" can be`,
      fix: `make every possible "${first}" at most every possible "${second}"`,
    });
  }
}

function checkStepList(record: Record<string, unknown>, pointer: string, problems: SpecProblem[]): void {
  const times = record.timesS;
  const values = record.values;
  const timesPointer = childPointer(pointer, 'timesS');
  const valuesPointer = childPointer(pointer, 'values');
  if (!Array.isArray(times) || times.length === 0) {
    problems.push({ pointer: timesPointer, message: '"timesS" must be a non-empty array of times in s', fix: 'list the switching times, starting with 0' });
    return;
  }
  if (!Array.isArray(values) || values.length !== times.length) {
    problems.push({ pointer: valuesPointer, message: `"values" must be an array with one value per time (${times.length})`, fix: 'give one value per entry of "timesS"' });
    return;
  }
  const context: CheckContext = { problems, recordIntervalS: undefined };
  const usable = times.map((time, i) => checkMember(time, childPointer(timesPointer, i), 'non-negative', context));
  values.forEach((value, i) => checkMember(value, childPointer(valuesPointer, i), 'any', context));
  if (!usable.every(Boolean)) return;
  const first = specBounds(times[0] as NumericValueSpec);
  if (first.min !== 0 || first.max !== 0) {
    problems.push({ pointer: childPointer(timesPointer, 0), message: 'the first time must be 0 s', fix: 'start the list at 0 so the value before the first switch is defined' });
  }
  for (let i = 1; i < times.length; i++) {
    const before = specBounds(times[i - 1] as NumericValueSpec).max;
    const after = specBounds(times[i] as NumericValueSpec).min;
    if (before > after) {
      problems.push({
        pointer: childPointer(timesPointer, i),
        message: `time ${i} can be ${after} s, before time ${i - 1} which can be ${before} s`,
        fix: 'list the times in order, with ranges that do not overlap',
      });
    }
  }
}

function checkReplay(record: Record<string, unknown>, pointer: string, problems: SpecProblem[]): void {
  if (typeof record.file !== 'string' || record.file.length === 0) {
    problems.push({ pointer: childPointer(pointer, 'file'), message: '"file" must name an NPY file', fix: 'give the path of the table, relative to the scenario file' });
  }
  if (!Number.isSafeInteger(record.column) || (record.column as number) < 0) {
    problems.push({ pointer: childPointer(pointer, 'column'), message: `"column" is ${JSON.stringify(record.column)}, not a whole number >= 0`, fix: 'give the column index, counting from 0' });
  }
}

function checkClip(clip: unknown, pointer: string, context: CheckContext): void {
  if (clip === null || typeof clip !== 'object' || Array.isArray(clip)) {
    context.problems.push({ pointer, message: '"clip" must be an object with "min" and/or "max"', fix: 'write e.g. {"min": -1, "max": 1}' });
    return;
  }
  const record = clip as Record<string, unknown>;
  context.problems.push(...unknownMemberProblems(record, ['min', 'max'], pointer, '"clip"'));
  if (record.min === undefined && record.max === undefined) {
    context.problems.push({ pointer, message: '"clip" has neither "min" nor "max"', fix: 'give at least one limit, or remove "clip"' });
  }
  const minOk = record.min === undefined || checkMember(record.min, childPointer(pointer, 'min'), 'any', context);
  const maxOk = record.max === undefined || checkMember(record.max, childPointer(pointer, 'max'), 'any', context);
  if (minOk && maxOk && record.min !== undefined && record.max !== undefined) checkOrdered(record, pointer, 'min', 'max', context.problems);
}
