// Malformed scenario files must each be refused with one message per real problem, naming the
// JSON pointer (RFC 6901) of the offending value and the line:column where it is written. The
// expected positions are found independently in the test text (by searching for the key or
// token and counting lines), so they check the source map, not echo it. Limits and physical
// rules come from: the stability bound of semi-implicit Euler (ω·dt < 2, any numerical-methods
// text, e.g. Hairer, Lubich & Wanner, Geometric Numerical Integration, for the undamped case);
// Coulomb friction needs μ_k ≤ μ_s (common practice, no source); IEEE 754 doubles overflow
// above about 1.8e308 and hold whole numbers exactly only up to 2^53 (IEEE 754-2008).
import { describe, expect, it } from 'vitest';

import { checkScenarioText } from '../sim/scenario/check-scenario.ts';
import type { ScenarioProblem } from '../sim/scenario/scenario-problem.ts';
import { formatProblems } from '../sim/scenario/scenario-problem.ts';

type Json = any; // test fixtures are edited freely before being written out

/** A valid tether sweep of the Korrin Bay test tank (invented demo values). */
function tetherScenario(): Json {
  return {
    formatVersion: 1,
    name: 'korrin-tether-sweep',
    description: 'Inspection rover tether in the Korrin Bay test tank.',
    system: {
      kind: 'chain',
      partCount: { kind: 'integer', min: 10, max: 40 },
      lengthM: { kind: 'uniform', min: 2, max: 5 },
      totalMassKg: 0.8,
      axialStiffnessN: { kind: 'log-uniform', min: 1000, max: 20000 },
      secondNeighbourSpringRatio: 0.05,
      dampingRatio: 0.1,
      diameterM: 0.012,
      anchor: 'top-driven',
      drivenAxes: ['x', 'z'],
      forceHandles: [-1],
      forceAxes: ['y'],
    },
    world: {
      gravityMPerS2: [0, -9.81, 0],
      ground: { heightM: -6, staticFriction: 0.6, kineticFriction: 0.4 },
      fluid: { densityKgPerM3: 1000, normalDragNsPerM3: 50, tangentialDragNsPerM3: 5 },
    },
    controls: { default: { kind: 'sinusoid', amplitude: { kind: 'uniform', min: 0.05, max: 0.2 }, frequencyHz: 0.5 }, channels: {} },
    time: { recordIntervalS: 0.02, recordedSteps: 200, substeps: 'auto' },
    episodes: 100,
    seed: 42,
    splits: { fractions: { train: 0.8, validation: 0.1, test: 0.1 }, heldOut: [{ parameter: '/system/partCount', above: 35 }] },
  };
}

/** A valid fin: a clamped 2-D lattice with one actuated material. */
function finScenario(): Json {
  return {
    formatVersion: 1,
    name: 'korrin-fin',
    system: {
      kind: 'lattice',
      cellSizeM: 0.01,
      base: 'clamped',
      shape: { maps: [[[1, 1, 1], [2, 2, 2], [2, 0, 2]]] },
      materials: [
        { name: 'root', youngsModulusPa: 5e5, densityKgPerM3: 1100, dampingRatio: 0.05 },
        { name: 'actuator', youngsModulusPa: 2e5, densityKgPerM3: 1050, dampingRatio: 0.05, actuatorChannel: 0, actuationStrainMax: 0.1 },
      ],
    },
    time: { recordIntervalS: 0.01, recordedSteps: 100 },
    episodes: 10,
    seed: 3,
  };
}

/** 1-based line and column of the first `needle` at or after the first `after` (found by plain search). */
function locate(text: string, needle: string, after = ''): { line: number; column: number } {
  const start = after === '' ? 0 : text.indexOf(after);
  if (start < 0) throw new Error(`anchor ${after} not in the test text`);
  const offset = text.indexOf(needle, start);
  if (offset < 0) throw new Error(`needle ${needle} not in the test text`);
  const before = text.slice(0, offset);
  const line = before.split('\n').length;
  return { line, column: offset - (before.lastIndexOf('\n') + 1) + 1 };
}

interface Case {
  name: string;
  /** Scenario text; built from a fixture by `edit` when not given. */
  text?: string;
  fixture?: () => Json;
  edit?: (s: Json) => void;
  pointer: string;
  /** Where the problem must be reported: the first `at` after `after`. */
  at: string;
  after?: string;
  message: string | RegExp;
  /** Number of problems expected (default 1: one message per real problem). */
  count?: number;
}

const pretty = (s: Json): string => JSON.stringify(s, null, 2);
const tetherText = pretty(tetherScenario());

/** The fin with its maps written compactly on one line, as people write small maps. */
function finWithMaps(mapsJson: string): string {
  const fin = finScenario();
  fin.system.shape.maps = '@MAPS@';
  return pretty(fin).replace('"@MAPS@"', mapsJson);
}

const CASES: Case[] = [
  // Broken JSON: the parser's own position.
  { name: 'missing comma between members', text: tetherText.replace('"episodes": 100,', '"episodes": 100'), pointer: '', at: '"seed"', message: 'JSON syntax: expected ","' },
  { name: 'trailing comma before }', text: tetherText.replace('"test": 0.1\n', '"test": 0.1,\n'), pointer: '', at: '}', after: '"test": 0.1,', message: 'trailing comma' },
  { name: 'a comment', text: tetherText.replace('"episodes": 100,', '"episodes": 100, // a hundred'), pointer: '', at: '//', message: 'comments are not allowed' },
  { name: 'unterminated string', text: tetherText.replace('"name": "korrin-tether-sweep"', '"name": "korrin-tether-sweep'), pointer: '', at: '"korrin-tether-sweep', message: 'unterminated string' },
  { name: 'single-quoted key', text: tetherText.replace('"seed": 42', "'seed': 42"), pointer: '', at: "'seed'", message: 'unexpected character' },
  { name: 'empty file', text: '', pointer: '', at: '', message: 'tether.json is empty' },
  { name: 'duplicate key', text: tetherText.replace('"totalMassKg": 0.8', '"totalMassKg": 0.8, "totalMassKg": 0.9'), pointer: '/system/totalMassKg', at: '"totalMassKg": 0.9', message: /duplicate key "totalMassKg" \(first written at line \d+, column 5\)/ },
  // Types and structure.
  { name: 'part count below 1', edit: (s) => (s.system.partCount = 0), pointer: '/system/partCount', at: '"partCount"', message: 'must be ≥ 1 (got 0)' },
  { name: 'part count not whole', edit: (s) => (s.system.partCount = 2.5), pointer: '/system/partCount', at: '"partCount"', message: 'must be a whole number or a distribution' },
  { name: 'part count as a word', edit: (s) => (s.system.partCount = 'ten'), pointer: '/system/partCount', at: '"partCount"', message: '(got "ten")' },
  { name: 'damping ratio as a flag', edit: (s) => (s.system.dampingRatio = true), pointer: '/system/dampingRatio', at: '"dampingRatio"', message: 'must be a number or a distribution' },
  { name: 'whole file is an array', text: '[1, 2]', pointer: '', at: '[', message: 'must be an object' },
  { name: 'gravity with two components', edit: (s) => (s.world.gravityMPerS2 = [0, -9.81]), pointer: '/world/gravityMPerS2', at: '"gravityMPerS2"', message: 'must have exactly 3 entries (got 2)' },
  { name: 'missing required member', edit: (s) => delete s.system.lengthM, pointer: '/system', at: '"system"', message: 'is missing the key "lengthM"' },
  { name: 'missing top-level section', edit: (s) => delete s.time, pointer: '', at: '{', message: 'is missing the key "time"' },
  { name: 'missing system kind', edit: (s) => delete s.system.kind, pointer: '/system', at: '"system"', message: 'is missing the key "kind" (one of "chain", "lattice")' },
  // Unknown keys and names, with did-you-mean.
  { name: 'misspelt top-level key', edit: (s) => (s.episdoes = 5), pointer: '/episdoes', at: '"episdoes"', message: 'unknown key "episdoes"; did you mean "episodes"?' },
  { name: 'misspelt chain key', edit: (s) => (s.system.diameterMM = 0.01), pointer: '/system/diameterMM', at: '"diameterMM"', message: 'did you mean "diameterM"?' },
  { name: 'abbreviated split name', edit: (s) => (s.splits.fractions = { train: 0.8, valid: 0.1, test: 0.1 }), pointer: '/splits/fractions/valid', at: '"valid"', message: 'did you mean "validation"?' },
  { name: 'misspelt anchor', edit: (s) => (s.system.anchor = 'top-pined'), pointer: '/system/anchor', at: '"anchor"', message: 'did you mean "top-pinned"?' },
  { name: 'misspelt distribution kind', edit: (s) => (s.system.lengthM.kind = 'unifrom'), pointer: '/system/lengthM/kind', at: '"kind"', after: '"lengthM"', message: 'did you mean "uniform"?' },
  { name: 'the old name of the categorical kind', edit: (s) => (s.system.lengthM = { kind: 'choice', values: [1.5, 2] }), pointer: '/system/lengthM/kind', at: '"kind"', after: '"lengthM"', message: '"choice" is now called "categorical": write "categorical"' },
  { name: 'bad export format', edit: (s) => (s.export = { format: 'zip' }), pointer: '/export/format', at: '"format"', message: 'must be one of "npz", "hdf5", "both" (got "zip")' },
  { name: 'unknown control kind', edit: (s) => (s.controls.default.kind = 'sine'), pointer: '/controls/default/kind', at: '"kind"', after: '"controls"', message: 'must be one of "none"' },
  { name: 'misspelt control channel', edit: (s) => (s.controls.channels['top-ofset-x'] = { kind: 'none' }), pointer: '/controls/channels/top-ofset-x', at: '"top-ofset-x"', message: 'did you mean "top-offset-x"?' },
  { name: 'format version from the future', edit: (s) => (s.formatVersion = 2), pointer: '/formatVersion', at: '"formatVersion"', message: 'must be 1 (got 2)' },
  { name: 'name with a space', edit: (s) => (s.name = 'Korrin Bay'), pointer: '/name', at: '"name"', message: '"Korrin Bay" is not allowed here' },
  // Numbers out of range.
  { name: 'negative mass', edit: (s) => (s.system.totalMassKg = -1), pointer: '/system/totalMassKg', at: '"totalMassKg"', message: 'must be > 0 (got -1)' },
  { name: 'mass range reaching below zero', edit: (s) => (s.system.totalMassKg = { kind: 'uniform', min: -1, max: 2 }), pointer: '/system/totalMassKg/min', at: '"min"', after: '"totalMassKg"', message: 'must be > 0 (got -1)' },
  { name: 'negative lattice density', fixture: finScenario, edit: (s) => (s.system.materials[1].densityKgPerM3 = -1050), pointer: '/system/materials/1/densityKgPerM3', at: '"densityKgPerM3"', after: '"actuator"', message: 'must be > 0 (got -1050)' },
  { name: 'number beyond double range', text: tetherText.replace('"totalMassKg": 0.8', '"totalMassKg": 1e400'), pointer: '/system/totalMassKg', at: '"totalMassKg"', message: 'must be a finite number' },
  { name: 'huge episode count', edit: (s) => (s.episodes = 1e12), pointer: '/episodes', at: '"episodes"', message: 'must be ≤ 100000000 (got 1000000000000)' },
  { name: 'chain above the node limit', edit: (s) => (s.system.partCount = 200000), pointer: '/system/partCount', at: '"partCount"', message: 'must be ≤ 99999 (got 200000)' },
  { name: 'seed above 2^53 as a number', text: tetherText.replace('"seed": 42', '"seed": 18446744073709551615'), pointer: '/seed', at: '"seed"', message: 'write it as a decimal string' },
  { name: 'seed string above 2^64 - 1', edit: (s) => (s.seed = '99999999999999999999'), pointer: '/seed', at: '"seed"', message: 'above 18446744073709551615 (2^64 - 1)' },
  // Distributions and physics beyond the schema.
  { name: 'inverted range', edit: (s) => (s.system.lengthM = { kind: 'uniform', min: 5, max: 2 }), pointer: '/system/lengthM/max', at: '"max"', after: '"lengthM"', message: 'max 2 is below min 5' },
  { name: 'normal with zero spread', edit: (s) => (s.system.lengthM = { kind: 'normal', mean: 3, std: 0, min: 2, max: 5 }), pointer: '/system/lengthM/std', at: '"std"', message: 'must be > 0 (got 0)' },
  { name: 'kinetic above static friction', edit: (s) => (s.world.ground.kineticFriction = 0.7), pointer: '/world/ground/kineticFriction', at: '"kineticFriction"', message: 'kinetic ≤ static' },
  { name: 'kinetic friction range overlapping static', edit: (s) => (s.world.ground.kineticFriction = { kind: 'uniform', min: 0.3, max: 0.65 }), pointer: '/world/ground/kineticFriction', at: '"kineticFriction"', message: 'can reach 0.65, above the lowest static friction 0.6' },
  { name: 'fractions not summing to 1', edit: (s) => (s.splits.fractions.test = 0.2), pointer: '/splits/fractions', at: '"fractions"', message: 'must sum to 1 (got train 0.8 + validation 0.1 + test 0.2 = 1.1)' },
  { name: 'fractions left incomplete', edit: (s) => (s.splits.fractions = { train: 0.9 }), pointer: '/splits/fractions', at: '"fractions"', message: '= 0.9)' },
  { name: 'held-out rule on an unknown parameter', edit: (s) => (s.splits.heldOut[0].parameter = '/system/partCont'), pointer: '/splits/heldOut/0/parameter', at: '"parameter"', message: 'did you mean "/system/partCount"?' },
  { name: 'held-out rule on a fixed parameter', edit: (s) => (s.splits.heldOut[0].parameter = '/system/totalMassKg'), pointer: '/splits/heldOut/0/parameter', at: '"parameter"', message: 'is fixed at 0.8 in every episode' },
  { name: 'held-out rule that can never match', edit: (s) => (s.splits.heldOut[0].above = 40), pointer: '/splits/heldOut/0', at: '{', after: '"heldOut"', message: 'can never match: "/system/partCount" is drawn from [10, 40]' },
  { name: 'held-out rule without a condition', edit: (s) => delete s.splits.heldOut[0].above, pointer: '/splits/heldOut/0', at: '{', after: '"heldOut"', message: 'add "above", "below" or "inside"' },
  { name: 'force handle beyond the shortest chain', edit: (s) => (s.system.forceHandles = [25]), pointer: '/system/forceHandles/0', at: '25', after: '"forceHandles"', message: 'the shortest chain (10 parts, nodes 0 to 10)' },
  { name: 'control frequency above the Nyquist limit', edit: (s) => (s.controls.default.frequencyHz = 40), pointer: '/controls/default/frequencyHz', at: '"frequencyHz"', message: 'Nyquist' },
  {
    name: 'fixed sub-steps the stability bound cannot meet',
    edit: (s) => (s.time.substeps = 2),
    pointer: '/time/substeps',
    at: '"substeps"',
    // Stiffest corner: 40 parts of 0.05 m with EA = 2e4 N, k = 4e5 N/m on 0.02 kg nodes.
    message: /use at least \d+ sub-steps/,
  },
  {
    name: 'too many node states per episode',
    edit: (s) => {
      s.system.partCount = 90000;
      s.time.recordedSteps = 1000;
      s.splits.heldOut = [];
    },
    pointer: '/time/recordedSteps',
    at: '"recordedSteps"',
    message: '1001 records × 90001 nodes (the largest system here) = 90091001 node states per episode, above the limit of 10000000',
  },
  // Lattice shapes.
  { name: 'map naming a missing material', text: finWithMaps('[[[1, 1, 1], [2, 2, 2], [2, 3, 2]]]'), pointer: '/system/shape/maps/0/2/1', at: '3', after: '"maps"', message: 'names material 3, but only 2 materials are listed' },
  { name: 'map mixing 2-D rows and 3-D layers', text: finWithMaps('[[[1, 1, 1], [[2, 2], 2, 2], [2, 0, 2]]]'), pointer: '/system/shape/maps/0/1/0', at: '[2, 2]', after: '"maps"', message: 'is a row, but this map is 2-D' },
  { name: 'map with no cells', text: finWithMaps('[[[1, 1], [2, 2]], [[0, 0], [0, 0]]]'), pointer: '/system/shape/maps/1', at: '[[0, 0]', after: '"maps"', message: 'has no cells' },
  {
    name: 'generator asked for more cells than its box holds',
    fixture: finScenario,
    edit: (s) => (s.system.shape = { generator: { dimension: 2, boundsCells: [4, 3], cellCount: { kind: 'integer', min: 5, max: 13 }, materialWeights: [1, 1] } }),
    pointer: '/system/shape/generator/cellCount',
    at: '"cellCount"',
    message: 'can reach 13 cells, more than the smallest box (4 × 3 = 12 cells) holds',
  },
  { name: 'material weights not one per material', fixture: finScenario, edit: (s) => (s.system.shape = { generator: { dimension: 2, boundsCells: [4, 3], cellCount: 6, materialWeights: [1] } }), pointer: '/system/shape/generator/materialWeights', at: '"materialWeights"', message: 'has 1 entry for 2 materials' },
];

describe('malformed scenarios are refused with pointer and line:column (positions found by text search)', () => {
  it('has at least 30 cases', () => {
    expect(CASES.length).toBeGreaterThanOrEqual(30);
  });

  for (const c of CASES) {
    it(c.name, () => {
      let text: string;
      if (c.text !== undefined) {
        text = c.text;
      } else {
        const scenario = (c.fixture ?? tetherScenario)();
        c.edit?.(scenario);
        text = pretty(scenario);
      }
      const result = checkScenarioText(text, 'tether.json');
      expect(result.ok).toBe(false);
      if (result.ok) return;
      const where = text === '' ? { line: 1, column: 1 } : locate(text, c.at, c.after);
      const match = result.problems.find((p: ScenarioProblem) => p.pointer === c.pointer);
      expect(match, formatProblems(result.problems, 'tether.json')).toBeDefined();
      expect({ line: match!.line, column: match!.column }).toEqual(where);
      if (typeof c.message === 'string') expect(match!.message).toContain(c.message);
      else expect(match!.message).toMatch(c.message);
      expect(result.problems).toHaveLength(c.count ?? 1);
    });
  }
});

describe('problem wording shared by the command line and the app', () => {
  it('formats as file:line:column pointer: message', () => {
    const scenario = tetherScenario();
    scenario.system.partCount = 0;
    const text = pretty(scenario);
    const result = checkScenarioText(text, 'tether.json');
    if (result.ok) throw new Error('expected problems');
    const { line, column } = locate(text, '"partCount"');
    expect(formatProblems(result.problems, 'tether.json')).toBe(`tether.json:${line}:${column} /system/partCount: must be ≥ 1 (got 0)`);
  });

  it('reports both problems of a renamed key: the missing one at its object, the unknown one at its key', () => {
    const scenario = tetherScenario();
    scenario.system.partCont = scenario.system.partCount;
    delete scenario.system.partCount;
    const text = pretty(scenario);
    const result = checkScenarioText(text, 'tether.json');
    if (result.ok) throw new Error('expected problems');
    expect(result.problems.map((p) => [p.pointer, p.line, p.column])).toEqual([
      ['/system', locate(text, '"system"').line, locate(text, '"system"').column],
      ['/system/partCont', locate(text, '"partCont"').line, locate(text, '"partCont"').column],
    ]);
    expect(result.problems[1].message).toBe('unknown key "partCont"; did you mean "partCount"?');
  });

  it('places problems in files with CRLF line ends on the right line', () => {
    const scenario = tetherScenario();
    scenario.episodes = 0;
    const lf = pretty(scenario);
    const crlf = lf.replace(/\n/g, '\r\n');
    const result = checkScenarioText(crlf, 'tether.json');
    if (result.ok) throw new Error('expected problems');
    expect({ line: result.problems[0].line, column: result.problems[0].column }).toEqual(locate(lf, '"episodes"'));
  });

  it('accepts both demo fixtures as written (the cases above fail for their edits alone)', () => {
    expect(checkScenarioText(tetherText, 'tether.json').ok).toBe(true);
    expect(checkScenarioText(pretty(finScenario()), 'fin.json').ok).toBe(true);
  });
});
