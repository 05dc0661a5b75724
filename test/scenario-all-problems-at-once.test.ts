// A scenario with a schema problem in one place and a reversed range in another reports both in
// one check, so the person fixes everything in one pass. The reversed range is judged by the same
// rule as on a file with no schema problem (a uniform distribution U(a, b) needs a ≤ b; textbook
// definition of the continuous uniform distribution), so its wording is compared with that case.
import { readFileSync } from 'node:fs';
import { join } from 'node:path';

import { describe, expect, it } from 'vitest';

import { checkScenarioText } from '../sim/scenario/check-scenario.ts';

const TETHER = readFileSync(join(import.meta.dirname, '..', 'scenarios', 'korrin-tether.json'), 'utf8');

function problemsOf(edit: (scenario: Record<string, any>) => void): { pointer: string; message: string; line?: number }[] {
  const scenario = JSON.parse(TETHER);
  edit(scenario);
  const checked = checkScenarioText(`${JSON.stringify(scenario, null, 2)}\n`, 'korrin-tether.json');
  return checked.ok ? [] : checked.problems;
}

describe('every problem at once', () => {
  const reversed = { kind: 'uniform', min: 2, max: 1 };

  it('a reversed range alone is reported at its pointer', () => {
    const alone = problemsOf((s) => (s.system.lengthM = reversed));
    expect(alone.map((p) => p.pointer)).toEqual(['/system/lengthM/max']);
  });

  it('a reversed range is reported together with a schema problem elsewhere, in the same words', () => {
    const alone = problemsOf((s) => (s.system.lengthM = reversed));
    const both = problemsOf((s) => {
      s.system.lengthM = reversed;
      s.system.dampingRatio = 'soft';
    });
    const pointers = both.map((p) => p.pointer);
    expect(pointers).toContain('/system/dampingRatio');
    expect(pointers).toContain('/system/lengthM/max');
    expect(both.find((p) => p.pointer === '/system/lengthM/max')?.message).toBe(alone[0].message);
    // Placed at its line like the schema problems, sorted by line.
    expect(both.every((p) => typeof p.line === 'number')).toBe(true);
    expect([...both].sort((a, b) => a.line! - b.line!)).toEqual(both);
  });

  it('a missing member beside the range does not hide it', () => {
    const both = problemsOf((s) => {
      s.system.lengthM = reversed;
      delete s.system.diameterM;
    });
    expect(both.map((p) => p.pointer).sort()).toEqual(['/system', '/system/lengthM/max']);
    expect(both.find((p) => p.pointer === '/system')?.message).toMatch(/diameterM/);
  });

  it('a range inside a broken value is left to the schema problem there', () => {
    const both = problemsOf((s) => (s.system.lengthM = { kind: 'uniform', min: 2, max: 1, typo: 3 }));
    expect(both.length).toBeGreaterThan(0);
    expect(both.every((p) => p.pointer.startsWith('/system/lengthM'))).toBe(true);
    expect(both.some((p) => /typo/.test(p.message))).toBe(true);
  });

  it('a well-formed file is unchanged: no extra problems', () => {
    expect(problemsOf(() => undefined)).toEqual([]);
  });
});
