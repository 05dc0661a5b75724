// Material maps drawn as text with a legend. The reference is the numeric form each one stands
// for, written out by hand here (a worked example of the orientation rule: text top first,
// numbers bottom first; 3-D levels are plans seen from above with rows along z), and the Korrin
// Bay fin as it was written in numbers before its demo was redrawn as text: the same maps, and
// so the same sampled bodies, bit for bit.
import { readFileSync } from 'node:fs';
import { join, resolve } from 'node:path';

import { describe, expect, it } from 'vitest';

import { checkScenarioText, checkScenarioValue } from '../sim/scenario/check-scenario.ts';
import { sampleEpisode } from '../sim/scenario/sample-episode.ts';
import type { LatticeSystemSpec, MapListShapeSpec } from '../sim/scenario/scenario-types.ts';

const ROOT = resolve(import.meta.dirname, '..');
const finText = readFileSync(join(ROOT, 'scenarios/korrin-fin.json'), 'utf8');

function mapsOf(value: unknown): unknown[] {
  const checked = checkScenarioValue(value);
  if (!checked.ok) throw new Error(JSON.stringify(checked.problems));
  return ((checked.scenario.system as LatticeSystemSpec).shape as MapListShapeSpec).maps;
}

function finWith(maps: unknown[]): Record<string, any> {
  const fin = JSON.parse(finText);
  fin.system.shape.maps = maps;
  return fin;
}

describe('material maps drawn as text', () => {
  it('the fin demo draws the maps it had in numbers (1 port, 2 starboard, 3 tip; bottom level first)', () => {
    expect(mapsOf(JSON.parse(finText))).toEqual([
      [[[1, 2]], [[1, 2]], [[1, 2]], [[3, 3]]],
      [[[1, 2]], [[1, 2]], [[1, 2]], [[1, 2]], [[3, 3]]],
      [[[1, 2]], [[1, 2]], [[1, 2]], [[1, 2]], [[1, 2]], [[3, 3]]],
      [[[1, 2], [1, 2]], [[1, 2], [1, 2]], [[1, 2], [1, 2]], [[3, 3], [3, 3]]],
    ]);
  });

  it('2-D rows are read top first, "." and null legend entries are empty, and 3-D levels are plans from above', () => {
    const legend = { P: 'port-actuator', S: 'starboard-actuator', t: 'tip-silicone', _: null };
    expect(mapsOf(finWith([{ legend, rows: ['t..', 'PS_', 'PPS'] }]))).toEqual([[[1, 1, 2], [1, 2, 0], [3, 0, 0]]]);
    // Top level: one tip cell at z = 1; bottom level: port at z = 0, starboard at z = 1.
    expect(mapsOf(finWith([{ legend, levels: [['..', '.t'], ['P.', 'S.']] }]))).toEqual([[[[1, 0], [2, 0]], [[0, 0], [0, 3]]]]);
  });

  it('the same sampled fin, bit for bit, from the text and the numeric form', () => {
    const numeric = finWith(mapsOf(JSON.parse(finText)));
    const fromText = checkScenarioValue(JSON.parse(finText));
    const fromNumbers = checkScenarioValue(numeric);
    if (!fromText.ok || !fromNumbers.ok) throw new Error('the fin does not check');
    for (const index of [0, 1, 2, 3, 4, 5]) {
      const a = sampleEpisode(fromText.scenario, index).system.model;
      const b = sampleEpisode(fromNumbers.scenario, index).system.model;
      expect(a.nodeCount).toBe(b.nodeCount);
      expect(Buffer.from(a.positionM.buffer).equals(Buffer.from(b.positionM.buffer))).toBe(true);
      expect(Array.from(a.cellMaterial)).toEqual(Array.from(b.cellMaterial));
    }
  });

  it('a character the legend does not name, and a legend naming a missing material, are placed at their line', () => {
    const text = finText.replace('"tt",', '"tx",').replace('"t": "tip-silicone"', '"t": "tip-silikone"');
    const checked = checkScenarioText(text, 'korrin-fin.json');
    expect(checked.ok).toBe(false);
    if (checked.ok) return;
    const unknownCharacter = checked.problems.find((p) => p.message.includes('"x" at character 2'));
    expect(unknownCharacter?.pointer).toBe('/system/shape/maps/3/levels/0/0');
    expect(unknownCharacter?.message).toContain('add it to /system/shape/maps/3/legend');
    const lines = text.split('\n');
    expect(lines[(unknownCharacter?.line ?? 0) - 1]).toContain('"tx"');
    const missing = checked.problems.find((p) => p.message.includes('"tip-silikone"'));
    expect(missing?.pointer).toBe('/system/shape/maps/0/legend/t');
    expect(missing?.message).toContain('"tip-silicone"');
  });

  it('a map that is neither numbers nor text with a legend is a schema problem, not a crash', () => {
    const checked = checkScenarioValue(finWith([{ rows: ['PS'] }]));
    expect(checked.ok).toBe(false);
    if (checked.ok) return;
    expect(checked.problems.some((p) => p.pointer === '/system/shape/maps/0' && p.message.includes('"legend"'))).toBe(true);
  });
});
