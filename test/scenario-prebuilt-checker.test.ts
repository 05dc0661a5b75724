// The scenario checker written ahead of time for the prebuilt command line
// (sim/cli/scenario-checker-code.ts) must report exactly what ajv's run-time compile of the same
// schema reports: for the three demo scenarios (valid, defaults filled in the same way) and for
// a set of mistakes spread over the schema — many inside shared $defs entries, whose messages
// depend on ajv handing back the live schema node as parentSchema. The reference is ajv's own
// compile with the checker's options (sim/scenario/schema-problems.ts).
import { mkdirSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { createRequire } from 'node:module';
import { join, resolve } from 'node:path';

import { afterAll, describe, expect, it, vi } from 'vitest';

import { scenarioCheckerModuleCode } from '../sim/cli/scenario-checker-code.ts';

const ROOT = resolve(import.meta.dirname, '..');
// Inside the checkout, so the generated module finds ajv's run-time helpers in node_modules.
const work = join(ROOT, 'test-output', `prebuilt-checker-${process.pid}`);
mkdirSync(work, { recursive: true });
afterAll(() => rmSync(work, { recursive: true, force: true }));

type Json = any; // scenarios are edited freely before being checked
const demo = (name: string): Json => JSON.parse(readFileSync(join(ROOT, 'scenarios', `${name}.json`), 'utf8'));

/** [what is wrong, scenario]. */
function cases(): Array<[string, Json]> {
  const edits: Array<[string, string, (s: Json) => void]> = [
    ['valid tether', 'korrin-tether', () => {}],
    ['valid fin', 'korrin-fin', () => {}],
    ['valid eel', 'korrin-eel', () => {}],
    ['misspelt top-level key', 'korrin-tether', (s) => (s.episdes = 3)],
    ['a word inside a distribution', 'korrin-tether', (s) => (s.system.lengthM = { kind: 'uniform', min: 'short', max: 2 })],
    ['unknown distribution kind', 'korrin-tether', (s) => (s.system.dampingRatio = { kind: 'gaussian', mean: 0.1 })],
    ['the old name of a distribution', 'korrin-tether', (s) => (s.system.partCount = { kind: 'choice', values: [8, 12] })],
    ['log-uniform without max', 'korrin-tether', (s) => (s.world.fluid.normalDragNsPerM3 = { kind: 'log-uniform', min: 800 })],
    ['integer range with a fraction', 'korrin-tether', (s) => (s.system.partCount = { kind: 'integer', min: 2.5, max: 8 })],
    ['gravity with two components', 'korrin-tether', (s) => (s.world.gravityMPerS2 = [0, -9.81])],
    ['unknown anchor and axis', 'korrin-tether', (s) => { s.system.anchor = 'glued'; s.system.drivenAxes = ['w']; }],
    ['negative seed and zero episodes', 'korrin-tether', (s) => { s.seed = -1; s.episodes = 0; }],
    ['unknown key in a material template', 'korrin-eel', (s) => (s.system.materialTemplates.segment.youngsModulus = 1e5)],
    ['a material template value of the wrong type', 'korrin-eel', (s) => (s.system.materialTemplates.segment.dampingRatio = 'low')],
    ['a control channel of unknown kind', 'korrin-eel', (s) => (s.controls.channels['actuator-0'].kind = 'sine')],
    ['a control amplitude distribution with min above max given as text', 'korrin-eel', (s) => (s.controls.channels['actuator-1'].amplitude = { kind: 'uniform', min: '0.7', max: 1 })],
    ['a material without a name', 'korrin-fin', (s) => delete s.system.materials[0].name],
    ['an export format of the wrong kind', 'korrin-fin', (s) => (s.export = { format: 'csv', dtype: 'float16' })],
    ['time of the wrong type', 'korrin-fin', (s) => (s.time = { recordIntervalS: '0.01', recordedSteps: -3 })],
    ['splits that do not fit', 'korrin-tether', (s) => (s.splits.fractions = { train: 'most', validate: 0.1 })],
  ];
  return edits.map(([what, name, edit]) => {
    const scenario = demo(name);
    edit(scenario);
    return [what, scenario];
  });
}

async function freshFindSchemaProblems(prebuiltPath?: string): Promise<{ find: (value: unknown) => unknown; loads: () => number }> {
  vi.resetModules();
  let loads = 0;
  if (prebuiltPath !== undefined) {
    const { usePrebuiltScenarioChecker } = await import('../sim/scenario/prebuilt-scenario-checker.ts');
    usePrebuiltScenarioChecker(() => {
      loads++;
      return createRequire(import.meta.url)(prebuiltPath);
    });
  }
  const { findSchemaProblems } = await import('../sim/scenario/schema-problems.ts');
  return { find: findSchemaProblems, loads: () => loads };
}

describe('the prebuilt scenario checker reports as ajv compiled at run time does', () => {
  it('gives the same problems, in the same order and words, and fills in the same defaults', async () => {
    const path = join(work, 'scenario-checker.cjs');
    writeFileSync(path, scenarioCheckerModuleCode());
    const compiled = await freshFindSchemaProblems();
    const prebuilt = await freshFindSchemaProblems(path);
    let problemsSeen = 0;
    for (const [what, scenario] of cases()) {
      const a = structuredClone(scenario);
      const b = structuredClone(scenario);
      const expected = compiled.find(a);
      const actual = prebuilt.find(b);
      expect(actual, what).toEqual(expected);
      expect(b, `${what}: defaults filled in`).toEqual(a);
      problemsSeen += (expected as unknown[]).length;
      if (what.startsWith('valid')) expect(expected, what).toEqual([]);
      else expect((expected as unknown[]).length, what).toBeGreaterThan(0);
    }
    // The prebuilt module really was the one checking (not a silent fall-back to compiling).
    expect(prebuilt.loads()).toBe(1);
    expect(problemsSeen).toBeGreaterThan(20);
  });
});
