// Named parameters and derived values. The expression grammar is our own, so its references
// are (a) worked examples computed by hand and (b) JavaScript's own IEEE-754 double arithmetic
// on random expression trees built here, which the parser must reproduce exactly from the
// printed text (with and without redundant parentheses, so precedence and associativity are
// tested too). Interval bounds are checked against points drawn inside the intervals. The
// scenario tests check the promises of the format: one draw per parameter and episode, shared
// by every place that names it, from the stream of its own pointer; problems named at their
// pointer and line; every resolved value in the labels; seed.json reproducing it.
import { mkdtempSync, readFileSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join, resolve } from 'node:path';

import fc from 'fast-check';
import { describe, expect, it } from 'vitest';

import { checkedScenario } from '../renderer/preview/checked-scenario.ts';
import { runCli } from '../sim/cli/main.ts';
import { makeSeedFile, parseSeedFile, renderSeedFile } from '../sim/dataset/manifest/seed-file.ts';
import type { DerivedExpression } from '../sim/random/derived-expression.ts';
import {
  derivedInterval,
  evaluateDerived,
  ExpressionSyntaxError,
  isWholeByConstruction,
  parseDerivedExpression,
} from '../sim/random/derived-expression.ts';
import { sampleValue } from '../sim/random/distribution.ts';
import { checkScenarioText, checkScenarioValue } from '../sim/scenario/check-scenario.ts';
import { designParameters } from '../sim/scenario/design/scenario-design.ts';
import { EpisodeDraws } from '../sim/scenario/episode-draws.ts';
import { scenarioForEpisode } from '../sim/scenario/linked-parameters.ts';
import { parameterStream } from '../sim/scenario/parameter-streams.ts';
import { sampleEpisode } from '../sim/scenario/sample-episode.ts';
import type { Scenario } from '../sim/scenario/scenario-types.ts';

const ROOT = resolve(import.meta.dirname, '..');
const eelText = readFileSync(join(ROOT, 'scenarios/korrin-eel.json'), 'utf8');
const tetherText = readFileSync(join(ROOT, 'scenarios/korrin-tether.json'), 'utf8');

function value(text: string, params: Record<string, number> = {}): number {
  return evaluateDerived(parseDerivedExpression(text), (name) => {
    if (!(name in params)) throw new Error(`no ${name}`);
    return params[name];
  });
}

function checked(scenario: unknown): Scenario {
  const result = checkScenarioValue(scenario);
  if (!result.ok) throw new Error(JSON.stringify(result.problems));
  return result.scenario;
}

function problemsOf(scenario: unknown) {
  const result = checkScenarioValue(scenario);
  if (result.ok) throw new Error('expected problems');
  return result.problems;
}

function tether(): Record<string, any> {
  const s = JSON.parse(tetherText);
  s.episodes = 6;
  return s;
}

describe('expression grammar: worked examples (computed by hand)', () => {
  it.each([
    ['2 * /params/k + 1e3', { k: 5 }, 1010],
    ['2 + 3 * 4', {}, 14],
    ['(2 + 3) * 4', {}, 20],
    ['1 - 2 - 3', {}, -4],
    ['8 / 4 / 2', {}, 1],
    ['-2 * 3', {}, -6],
    ['- -3', {}, 3],
    ['-/params/a - -3', { a: 2 }, 1],
    ['/params/a / /params/b', { a: 6, b: 3 }, 2],
    ['/params/a/2', { a: 6 }, 3],
    ['.5 + 1.', {}, 1.5],
    ['1e-3 * 1E3', {}, 1],
    ['min(3, 1, 2) + max(-1, -4)', {}, 0],
    ['abs(-2.5) * 2', {}, 5],
    // round is JavaScript's Math.round: halves go towards +infinity.
    ['round(2.5) + round(-2.5)', {}, 1],
    ['  /params/head_2 *(1+(/params/r-1)*4/8) ', { head_2: 70000, r: 0.5 }, 52500],
  ])('%s = %s', (text, params, expected) => {
    expect(value(text, params)).toBe(expected);
  });

  it.each([
    ['2 * (/params/k + 1', 19, 'expected ")" to close the "(" at column 5, found the end'],
    ['2 * ', 5, 'the expression ends where a number'],
    ['2 ** 3', 4, 'expected a number'],
    ['3 4', 3, 'expected an operator (+ - * /) or the end, found the number 4'],
    ['/param/k', 1, 'a pointer here must start with "/params/"'],
    ['/params/9k', 9, 'expected a parameter name after "/params/"'],
    ['sqrt(4)', 1, 'unknown function "sqrt"'],
    ['k + 1', 1, 'unknown function "k"; the functions are min, max, abs, round, and parameters are written /params/k'],
    ['min(1)', 1, 'min takes 2 to 16 arguments (got 1)'],
    ['2 % 3', 3, 'unexpected character "%"'],
    ['1e999', 1, 'too large for a double'],
  ])('%j fails at column %i', (text, column, reason) => {
    let error: unknown;
    try {
      parseDerivedExpression(text);
    } catch (e) {
      error = e;
    }
    expect(error).toBeInstanceOf(ExpressionSyntaxError);
    expect((error as ExpressionSyntaxError).column).toBe(column);
    expect((error as ExpressionSyntaxError).reason).toContain(reason);
  });

  it('refuses nesting beyond its depth limit with a message, not a stack overflow', () => {
    expect(() => parseDerivedExpression(`${'('.repeat(200)}1${')'.repeat(200)}`)).toThrow(/nested more than 64 deep/);
    expect(() => parseDerivedExpression('-'.repeat(200) + '1')).toThrow(/nested more than 64 deep/);
  });

  it('whole by construction: + - * and round keep whole numbers, a quotient never does', () => {
    const whole = (text: string) => isWholeByConstruction(parseDerivedExpression(text), (n) => n === 'n');
    expect(whole('2 * /params/n - 3')).toBe(true);
    expect(whole('round(/params/x / 3)')).toBe(true);
    expect(whole('/params/n / 1')).toBe(false);
    expect(whole('/params/x + 1')).toBe(false);
    expect(whole('0.5 * 2')).toBe(false);
  });
});

// Random trees: the reference evaluates them with JavaScript's own doubles (IEEE-754).
type Tree = DerivedExpression;
const NAMES = ['a', 'b', 'stiffnessPa'];

const treeArbitrary: fc.Arbitrary<Tree> = fc.letrec<{ tree: Tree }>((tie) => ({
  tree: fc.oneof(
    { depthSize: 'small', withCrossShrink: true },
    fc.double({ min: 0, max: 1e6, noNaN: true }).map((v): Tree => ({ kind: 'number', value: v })),
    fc.constantFrom(...NAMES).map((name): Tree => ({ kind: 'parameter', name, column: 0 })),
    tie('tree').map((operand): Tree => ({ kind: 'negate', operand })),
    fc.tuple(fc.constantFrom('+', '-', '*', '/') as fc.Arbitrary<'+' | '-' | '*' | '/'>, tie('tree'), tie('tree')).map(([operator, left, right]): Tree => ({ kind: 'binary', operator, left, right })),
    fc.tuple(fc.constantFrom('min', 'max') as fc.Arbitrary<'min' | 'max'>, fc.array(tie('tree'), { minLength: 2, maxLength: 4 })).map(([name, args]): Tree => ({ kind: 'call', name, args })),
    fc.tuple(fc.constantFrom('abs', 'round') as fc.Arbitrary<'abs' | 'round'>, tie('tree')).map(([name, arg]): Tree => ({ kind: 'call', name, args: [arg] })),
  ),
})).tree;

function reference(tree: Tree, params: Record<string, number>): number {
  switch (tree.kind) {
    case 'number':
      return tree.value;
    case 'parameter':
      return params[tree.name];
    case 'negate':
      return -reference(tree.operand, params);
    case 'binary': {
      const a = reference(tree.left, params);
      const b = reference(tree.right, params);
      return tree.operator === '+' ? a + b : tree.operator === '-' ? a - b : tree.operator === '*' ? a * b : a / b;
    }
    case 'call': {
      const args = tree.args.map((arg) => reference(arg, params));
      return tree.name === 'min' ? Math.min(...args) : tree.name === 'max' ? Math.max(...args) : tree.name === 'abs' ? Math.abs(args[0]) : Math.round(args[0]);
    }
  }
}

function leaf(tree: Tree): string | null {
  if (tree.kind === 'number') return String(tree.value);
  if (tree.kind === 'parameter') return `/params/${tree.name}`;
  return null;
}

/** Every operation in parentheses. */
function printFull(tree: Tree): string {
  const simple = leaf(tree);
  if (simple !== null) return simple;
  if (tree.kind === 'negate') return `(-${printFull(tree.operand)})`;
  if (tree.kind === 'binary') return `(${printFull(tree.left)} ${tree.operator} ${printFull(tree.right)})`;
  if (tree.kind === 'call') return `${tree.name}(${tree.args.map(printFull).join(', ')})`;
  throw new Error('unknown node');
}

const PRECEDENCE = { '+': 1, '-': 1, '*': 2, '/': 2 } as const;

function precedence(tree: Tree): number {
  if (tree.kind === 'binary') return PRECEDENCE[tree.operator];
  if (tree.kind === 'negate') return 3;
  return 4;
}

/** Only the parentheses precedence and left-to-right grouping need, and no spaces around "*" and "/". */
function printMinimal(tree: Tree): string {
  const simple = leaf(tree);
  if (simple !== null) return simple;
  if (tree.kind === 'negate') {
    const inner = printMinimal(tree.operand);
    return precedence(tree.operand) < 3 ? `-(${inner})` : `-${inner}`;
  }
  if (tree.kind === 'binary') {
    const own = PRECEDENCE[tree.operator];
    const left = precedence(tree.left) < own ? `(${printMinimal(tree.left)})` : printMinimal(tree.left);
    const right = precedence(tree.right) <= own ? `(${printMinimal(tree.right)})` : printMinimal(tree.right);
    return own === 2 ? `${left}${tree.operator}${right}` : `${left} ${tree.operator} ${right}`;
  }
  if (tree.kind === 'call') return `${tree.name}(${tree.args.map(printMinimal).join(',')})`;
  throw new Error('unknown node');
}

const paramsArbitrary = fc.record({
  a: fc.double({ min: -1e3, max: 1e3, noNaN: true }),
  b: fc.double({ min: -1e3, max: 1e3, noNaN: true }),
  stiffnessPa: fc.double({ min: 1e3, max: 1e6, noNaN: true }),
});

describe('expression grammar against JavaScript double arithmetic on random trees (fast-check)', () => {
  it('fully parenthesised text evaluates to the tree\'s IEEE-754 value, bit for bit', () => {
    fc.assert(
      fc.property(treeArbitrary, paramsArbitrary, (tree, params) => {
        expect(Object.is(value(printFull(tree), params), reference(tree, params))).toBe(true);
      }),
      { numRuns: 500 },
    );
  });

  it('text with only the parentheses precedence needs evaluates the same (precedence and left-to-right grouping)', () => {
    fc.assert(
      fc.property(treeArbitrary, paramsArbitrary, (tree, params) => {
        expect(Object.is(value(printMinimal(tree), params), reference(tree, params))).toBe(true);
      }),
      { numRuns: 500 },
    );
  });

  it('interval bounds hold every value at points inside the parameters\' intervals', () => {
    const interval = fc.tuple(fc.double({ min: -100, max: 100, noNaN: true }), fc.double({ min: 0, max: 100, noNaN: true }));
    fc.assert(
      fc.property(treeArbitrary, fc.tuple(interval, interval, interval), fc.tuple(fc.double({ min: 0, max: 1, noNaN: true }), fc.double({ min: 0, max: 1, noNaN: true }), fc.double({ min: 0, max: 1, noNaN: true })), (tree, ranges, at) => {
        const bounds = Object.fromEntries(NAMES.map((name, i) => [name, { min: ranges[i][0], max: ranges[i][0] + ranges[i][1] }]));
        const point = Object.fromEntries(NAMES.map((name, i) => [name, Math.min(bounds[name].max, bounds[name].min + at[i] * ranges[i][1])]));
        const x = reference(tree, point);
        const range = derivedInterval(tree, (name) => bounds[name]);
        if (!Number.isNaN(x)) {
          expect(range.min).toBeLessThanOrEqual(x);
          expect(range.max).toBeGreaterThanOrEqual(x);
        }
      }),
      { numRuns: 500 },
    );
  });
});

describe('named parameters in a scenario', () => {
  it('the eel demo: one head stiffness shared by the template\'s users, falling linearly to the drawn tail ratio', () => {
    const eel = checkScenarioText(eelText, 'korrin-eel.json');
    if (!eel.ok) throw new Error(JSON.stringify(eel.problems));
    for (const index of [0, 5, 23]) {
      const { labels } = sampleEpisode(eel.scenario, index);
      const head = labels['/params/headStiffnessPa'] as number;
      const ratio = labels['/params/tailStiffnessRatio'] as number;
      // Each named parameter is drawn from the stream of its own pointer, as every other place is.
      expect(head).toBe(sampleValue({ kind: 'log-uniform', min: 25000, max: 60000 }, parameterStream(90210, index, '/params/headStiffnessPa')));
      expect(ratio).toBe(sampleValue({ kind: 'uniform', min: 0.5, max: 1 }, parameterStream(90210, index, '/params/tailStiffnessRatio')));
      for (let segment = 0; segment < 8; segment++) {
        // The demo's formula, in JavaScript doubles: E_s = E_head (1 + (r - 1) s / 7).
        const expected = segment === 0 ? head : head * (1 + ((ratio - 1) * segment) / 7);
        expect(labels[`/system/materials/${2 * segment}/youngsModulusPa`]).toBe(expected);
        expect(labels[`/system/materials/${2 * segment + 1}/youngsModulusPa`]).toBe(expected);
      }
      expect(labels['/system/materials/15/youngsModulusPa']).toBeCloseTo(head * ratio, 6);
    }
  });

  it('two uses of one parameter get the same value in an episode, and it changes between episodes', () => {
    const s = tether();
    s.params = { stiffnessN: { kind: 'log-uniform', min: 2000, max: 20000 } };
    s.system.axialStiffnessN = { ref: '/params/stiffnessN' };
    s.controls.channels = { 'top-offset-x': { kind: 'sinusoid', amplitude: { expr: '/params/stiffnessN / 1e6' }, frequencyHz: 0.5 } };
    const scenario = checked(s);
    const seen = new Set<number>();
    for (const index of [0, 1, 2]) {
      const { labels } = sampleEpisode(scenario, index);
      const k = labels['/params/stiffnessN'] as number;
      expect(labels['/system/axialStiffnessN']).toBe(k);
      // Control labels are keyed by channel name, as for every control.
      expect(labels['/controls/top-offset-x/amplitude']).toBe(k / 1e6);
      seen.add(k);
    }
    expect(seen.size).toBe(3);
  });

  it('a parameter may derive from others, in any written order', () => {
    const s = tether();
    s.params = { massKg: { expr: '/params/perMetreKg * 2' }, perMetreKg: { kind: 'uniform', min: 0.1, max: 0.2 } };
    s.system.totalMassKg = { ref: '/params/massKg' };
    const { labels } = sampleEpisode(checked(s), 3);
    expect(labels['/params/massKg']).toBe((labels['/params/perMetreKg'] as number) * 2);
    expect(labels['/system/totalMassKg']).toBe(labels['/params/massKg']);
  });

  it('a place written {"expr": "5"} builds the same system, bit for bit, and gets the same labels as the number 5', () => {
    const plain = tether();
    plain.system.bendingDampingRatio = 0.25;
    const linked = tether();
    linked.system.bendingDampingRatio = { expr: '0.5 / 2' };
    const a = sampleEpisode(checked(plain), 1);
    const b = sampleEpisode(checked(linked), 1);
    expect(b.labels).toEqual(a.labels);
    expect(Buffer.from(b.system.model.positionM.buffer).equals(Buffer.from(a.system.model.positionM.buffer))).toBe(true);
    expect(Buffer.from(b.controls.buffer).equals(Buffer.from(a.controls.buffer))).toBe(true);
  });

  it('a scenario without params passes through untouched (the same object, no labels added)', () => {
    const scenario = checked(tether());
    const draws = new EpisodeDraws(scenario.seed, 0);
    expect(scenarioForEpisode(scenario, draws, () => undefined)).toBe(scenario);
    expect(draws.labels).toEqual({});
  });

  it('an unknown name is named at its line with the closest parameter', () => {
    const text = eelText.replace('(1 + (/params/tailStiffnessRatio - 1) * 3 / 7)', '(1 + (/params/tailStifnessRatio - 1) * 3 / 7)');
    const result = checkScenarioText(text, 'korrin-eel.json');
    if (result.ok) throw new Error('expected problems');
    expect(result.problems).toHaveLength(1);
    expect(result.problems[0].pointer).toBe('/system/materials/6/youngsModulusPa/expr');
    expect(result.problems[0].message).toBe('names /params/tailStifnessRatio, which "params" does not define: did you mean /params/tailStiffnessRatio?');
    expect(result.problems[0].line).toBe(text.split('\n').findIndex((l) => l.includes('tailStifnessRatio')) + 1);
  });

  it('a ref without any params block says where to define it', () => {
    const s = tether();
    s.system.lengthM = { ref: '/params/lengthM' };
    expect(problemsOf(s)).toEqual([{ pointer: '/system/lengthM/ref', message: 'names /params/lengthM, which "params" does not define: define it under "params" at the top of the scenario, e.g. "params": {"lengthM": 1}' }]);
  });

  it('parameters that derive from each other are refused, with the cycle spelt out at each member', () => {
    const s = tether();
    s.params = { a: { expr: '/params/b + 1' }, b: { expr: '2 * /params/a' }, c: { ref: '/params/c' }, d: 3 };
    s.system.lengthM = { ref: '/params/a' };
    expect(problemsOf(s)).toEqual([
      { pointer: '/params/a/expr', message: 'derives from itself (/params/a → /params/b → /params/a); give one of these parameters a number or a distribution' },
      { pointer: '/params/b/expr', message: 'derives from itself (/params/b → /params/a → /params/b); give one of these parameters a number or a distribution' },
      { pointer: '/params/c/ref', message: 'derives from itself (/params/c → /params/c); give one of these parameters a number or a distribution' },
    ]);
  });

  it('a syntax error gives the column inside the expression and the line of the file', () => {
    const text = eelText.replace('(1 + (/params/tailStiffnessRatio - 1) * 2 / 7)"', '(1 + (/params/tailStiffnessRatio - 1) * 2 / 7"');
    const result = checkScenarioText(text, 'korrin-eel.json');
    if (result.ok) throw new Error('expected problems');
    const expression = '/params/headStiffnessPa * (1 + (/params/tailStiffnessRatio - 1) * 2 / 7';
    expect(result.problems[0]).toEqual({
      pointer: '/system/materials/4/youngsModulusPa/expr',
      message: `expression ${JSON.stringify(expression)} does not read at column ${expression.length + 1}: expected ")" to close the "(" at column 27, found the end`,
      line: text.split('\n').findIndex((l) => l.includes(expression)) + 1,
      column: text.split('\n').find((l) => l.includes(expression))!.indexOf('"expr"') + 1,
    });
  });

  it('the schema checks the form: a ref must be a /params pointer, and a ref takes no other keys', () => {
    const s = tether();
    s.params = { k: 1000 };
    s.system.axialStiffnessN = { ref: 'params/k' };
    s.system.totalMassKg = { ref: '/params/k', unit: 'kg' };
    const problems = problemsOf(s);
    expect(problems.map((p) => p.pointer)).toEqual(['/system/totalMassKg/unit', '/system/axialStiffnessN/ref']);
    expect(problems[0].message).toBe('unknown key "unit"; did you mean "ref"?'.replace('did you mean "ref"?', 'the keys allowed here are "ref"'));
    expect(problems[1].message).toContain('"params/k" is not allowed here');
  });

  it('a misspelt "ref" is pointed out beside the missing "kind"', () => {
    const s = tether();
    s.params = { k: 2 };
    s.system.lengthM = { refs: '/params/k' };
    expect(problemsOf(s)).toEqual([
      { pointer: '/system/lengthM', message: 'is missing the key "kind" (one of "uniform", "log-uniform", "normal", "integer", "categorical"); or, for a named parameter, did you mean "ref" instead of "refs"?' },
    ]);
  });

  it('a derived value is checked against the limits of the place that uses it, by interval arithmetic', () => {
    const s = tether();
    s.params = { k: { kind: 'uniform', min: 500, max: 2000 } };
    // totalMassKg must be > 0; k - 1000 reaches [-500, 1000].
    s.system.totalMassKg = { expr: '/params/k - 1000' };
    // dampingRatio must be >= 0; k / 1e4 reaches [0.05, 0.2]: fine.
    s.system.dampingRatio = { expr: '/params/k / 1e4' };
    expect(problemsOf(s)).toEqual([
      {
        pointer: '/system/totalMassKg/expr',
        message: '"/params/k - 1000" reaches [-500, 1000] by interval arithmetic over its parameters\' ranges, but its lowest value here must be > 0; change the expression or its parameters\' ranges',
      },
    ]);
  });

  it('a whole-number place takes only expressions that give whole numbers', () => {
    const s = tether();
    s.params = { n: { kind: 'integer', min: 4, max: 10 } };
    s.splits.heldOut = [];
    s.system.partCount = { expr: '/params/n / 2' };
    expect(problemsOf(s)).toEqual([
      { pointer: '/system/partCount/expr', message: '"/params/n / 2" need not give a whole number, but this place takes whole numbers; wrap it in round(...), or derive it from whole numbers with + - * only' },
    ]);
    s.system.partCount = { expr: '2 * /params/n' };
    const doubled = checked(s);
    const { labels } = sampleEpisode(doubled, 2);
    expect(labels['/system/partCount']).toBe(2 * (labels['/params/n'] as number));
    s.system.partCount = { expr: 'round(/params/n / 3)' };
    expect(sampleEpisode(checked(s), 2).labels['/system/partCount']).toBe(Math.round((labels['/params/n'] as number) / 3));
  });

  it('a malformed parameter distribution is reported once, at the parameter, not again at each use', () => {
    const s = tether();
    s.params = { k: { kind: 'uniform', min: 5000, max: 2000 } };
    s.system.axialStiffnessN = { ref: '/params/k' };
    s.system.lengthM = { expr: '/params/k / 2000' };
    expect(problemsOf(s)).toEqual([{ pointer: '/params/k/max', message: 'max 2000 is below min 5000; swap them or correct one' }]);
  });

  it('a divisor that can be zero is refused before any value is drawn', () => {
    const s = tether();
    s.params = { k: { kind: 'uniform', min: -1, max: 1 } };
    s.system.lengthM = { expr: '2 / /params/k' };
    const [problem] = problemsOf(s);
    expect(problem.pointer).toBe('/system/lengthM/expr');
    expect(problem.message).toContain('has no finite range');
  });

  it('a design places the named parameters, not the places that follow from them', () => {
    const s = tether();
    s.params = { stiffnessN: { kind: 'log-uniform', min: 2000, max: 20000 } };
    s.system.axialStiffnessN = { ref: '/params/stiffnessN' };
    s.design = { kind: 'latin-hypercube' };
    const scenario = checked(s);
    const pointers = designParameters(scenario).map((p) => p.pointer);
    expect(pointers[0]).toBe('/params/stiffnessN');
    expect(pointers).not.toContain('/system/axialStiffnessN');
    // Latin hypercube (McKay, Beckman & Conover 1979): each of the n equal-probability strata of
    // the parameter holds exactly one episode; for a log-uniform the strata are equal in log.
    const logs = Array.from({ length: scenario.episodes }, (_, i) => Math.log((sampleEpisode(scenario, i).labels['/system/axialStiffnessN'] as number) / 2000) / Math.log(10));
    const strata = logs.map((x) => Math.floor(x * scenario.episodes)).sort((a, b) => a - b);
    expect(strata).toEqual([0, 1, 2, 3, 4, 5]);
  });

  it('a held-out rule may name a linked place: it sees the value the episode resolves', () => {
    const s = tether();
    s.params = { stiffnessN: { kind: 'uniform', min: 2000, max: 20000 } };
    s.system.axialStiffnessN = { expr: '/params/stiffnessN * 1' };
    s.splits = { counts: { validation: 0, test: 0 }, heldOut: [{ split: 'held-out', parameter: '/system/axialStiffnessN', above: 11000 }] };
    const scenario = checked(s);
    for (let i = 0; i < scenario.episodes; i++) {
      const episode = sampleEpisode(scenario, i);
      expect(episode.split).toBe((episode.labels['/params/stiffnessN'] as number) > 11000 ? 'held-out' : 'train');
    }
  });

  it('seed.json holds the params and the linked forms as written, and reproduces the same episodes', () => {
    const eel = checkScenarioText(eelText, 'korrin-eel.json');
    if (!eel.ok) throw new Error('eel does not check');
    const text = renderSeedFile(makeSeedFile(eel.scenario, [], 'test'));
    const seed = JSON.parse(text);
    expect(seed.scenario.params).toEqual({ headStiffnessPa: { kind: 'log-uniform', min: 25000, max: 60000 }, tailStiffnessRatio: { kind: 'uniform', min: 0.5, max: 1 } });
    // Templates are expanded in the seed file, so every material shows its own stiffness.
    expect(seed.scenario.system.materials[0].youngsModulusPa).toEqual({ ref: '/params/headStiffnessPa' });
    expect(seed.scenario.system.materials[15].youngsModulusPa).toEqual({ expr: '/params/headStiffnessPa * (1 + (/params/tailStiffnessRatio - 1) * 7 / 7)' });
    const again = parseSeedFile(text, 'seed.json').scenario;
    for (const index of [0, 9]) {
      const a = sampleEpisode(eel.scenario, index);
      const b = sampleEpisode(again, index);
      expect(b.labels).toEqual(a.labels);
      expect(Buffer.from(b.system.model.positionM.buffer).equals(Buffer.from(a.system.model.positionM.buffer))).toBe(true);
      expect(Buffer.from(b.controls.buffer).equals(Buffer.from(a.controls.buffer))).toBe(true);
    }
  });

  it('the page\'s preview worker reads the same scenario and samples the same episode', () => {
    const page = checkedScenario(eelText, 'korrin-eel.json');
    if (!page.ok) throw new Error(page.message);
    const shell = checkScenarioText(eelText, 'korrin-eel.json');
    if (!shell.ok) throw new Error('eel does not check');
    expect(page.scenario).toEqual(shell.scenario);
    expect(sampleEpisode(page.scenario, 4).labels).toEqual(sampleEpisode(shell.scenario, 4).labels);
  });
});

describe('the Sweep screen\'s form reads the linked forms of the schema', () => {
  it('still sees every value spec as one, with its distribution kinds, past the ref and expr branches', async () => {
    const { SchemaReader } = await import('../renderer/sweep/schema-shape.ts');
    const { SCENARIO_SCHEMA } = await import('../sim/scenario/scenario-schema.ts');
    const reader = new SchemaReader(SCENARIO_SCHEMA as Record<string, unknown>);
    const chain = (SCENARIO_SCHEMA.properties as any).system.allOf[0].then.properties;
    expect(reader.classify(chain.lengthM, { ref: '/params/k' })).toEqual({ kind: 'value-spec', integer: false, distributionKinds: ['uniform', 'log-uniform', 'normal', 'integer', 'categorical'] });
    expect(reader.classify(chain.partCount, 12)).toEqual({ kind: 'value-spec', integer: true, distributionKinds: ['integer', 'categorical'] });
    expect(reader.classify((SCENARIO_SCHEMA.properties as any).params, {}).kind).toBe('record');
  });
});

describe('pliant generate and reproduce with named parameters', () => {
  it('the eel demo: the manifest labels the parameters and every resolved stiffness, the card says where each comes from, and reproduce finds every file identical', async () => {
    const work = mkdtempSync(join(tmpdir(), 'pliant-linked-'));
    try {
      const cli = async (args: string[]) => {
        let stdout = '';
        let stderr = '';
        const code = await runCli(args, { stdout: (t) => void (stdout += t), stderr: (t) => void (stderr += t), isTerminal: false, env: {}, cwd: work });
        return { code, stdout, stderr };
      };
      const made = await cli(['generate', join(ROOT, 'scenarios/korrin-eel.json'), '--out', join(work, 'eel'), '--episodes', '2', '--format', 'npz', '--workers', '1', '--progress', 'none']);
      expect(made.stderr).toBe('');
      expect(made.code).toBe(0);
      const manifest = JSON.parse(readFileSync(join(work, 'eel', 'manifest.json'), 'utf8'));
      const labels = manifest.episodes[1].labels;
      const head = labels['/params/headStiffnessPa'];
      const ratio = labels['/params/tailStiffnessRatio'];
      expect(labels['/system/materials/1/youngsModulusPa']).toBe(head);
      expect(labels['/system/materials/9/youngsModulusPa']).toBe(head * (1 + ((ratio - 1) * 4) / 7));
      const card = readFileSync(join(work, 'eel', 'CARD.md'), 'utf8');
      expect(card).toContain('### `/params/headStiffnessPa` (Pa)\n\nSampled from `{"kind":"log-uniform","min":25000,"max":60000}`.');
      expect(card).toContain('### `/system/materials/1/youngsModulusPa` (Pa)\n\nTakes the named parameter `/params/headStiffnessPa`.');
      expect(card).toContain('### `/system/materials/9/youngsModulusPa` (Pa)\n\nDerived from named parameters: `/params/headStiffnessPa * (1 + (/params/tailStiffnessRatio - 1) * 4 / 7)`.');
      const again = await cli(['reproduce', join(work, 'eel', 'seed.json'), '--out', join(work, 'again'), '--workers', '1', '--progress', 'none']);
      expect(again.stderr).toBe('');
      expect(again.code).toBe(0);
      expect(again.stdout.trim().split('\n').at(-1)).toMatch(/^all \d+ files identical$/);
    } finally {
      rmSync(work, { recursive: true, force: true });
    }
  }, 120_000);
});
