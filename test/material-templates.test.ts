// Lattice material templates. The reference is the plain form each templated scenario stands
// for, written out by hand here, and the Korrin Bay eel as it was written before its 16
// materials became one template: the checked scenarios are equal member for member, so the
// sampled bodies (and the demo's datasets) are the same bit for bit.
import { readFileSync } from 'node:fs';
import { join, resolve } from 'node:path';

import { describe, expect, it } from 'vitest';

import { checkedScenario } from '../renderer/preview/checked-scenario.ts';
import { checkScenarioText, checkScenarioValue } from '../sim/scenario/check-scenario.ts';
import { sampleEpisode } from '../sim/scenario/sample-episode.ts';

const ROOT = resolve(import.meta.dirname, '..');
const eelText = readFileSync(join(ROOT, 'scenarios/korrin-eel.json'), 'utf8');

function checked(value: unknown) {
  const result = checkScenarioValue(value);
  if (!result.ok) throw new Error(JSON.stringify(result.problems));
  return result.scenario;
}

// The eel's materials as the demo wrote them before templates: 16 full copies, written out by
// hand (segment s, bottom row on channel 2s, top row on 2s + 1). The head segment takes the
// template's stiffness, the shared /params/headStiffnessPa; the others override it with the
// linear fall towards the tail (see test/linked-parameters.test.ts for the values).
function eelWrittenInFull(): Record<string, any> {
  const eel = JSON.parse(eelText);
  delete eel.system.materialTemplates;
  eel.system.materials = [];
  for (let segment = 0; segment < 8; segment++) {
    for (const [offset, side] of [[0, 'bottom'], [1, 'top']] as const) {
      eel.system.materials.push({
        name: `segment-${segment}-${side}`,
        youngsModulusPa: segment === 0 ? { ref: '/params/headStiffnessPa' } : { expr: `/params/headStiffnessPa * (1 + (/params/tailStiffnessRatio - 1) * ${segment} / 7)` },
        densityKgPerM3: 1000,
        dampingRatio: 0.2,
        actuatorChannel: 2 * segment + offset,
        actuationStrainMax: 0.4,
      });
    }
  }
  return eel;
}

describe('material templates', () => {
  it('the eel demo checks to the same scenario as its 16 materials written in full', () => {
    const fromTemplates = checked(JSON.parse(eelText));
    const inFull = checked(eelWrittenInFull());
    expect(fromTemplates).toEqual(inFull);
    expect('materialTemplates' in fromTemplates.system).toBe(false);
  });

  it('the same sampled eel, bit for bit, from the template and the written-out form', () => {
    const a = checked(JSON.parse(eelText));
    const b = checked(eelWrittenInFull());
    for (const index of [0, 1, 7]) {
      const ea = sampleEpisode(a, index);
      const eb = sampleEpisode(b, index);
      expect(ea.labels).toEqual(eb.labels);
      expect(Buffer.from(ea.system.model.positionM.buffer).equals(Buffer.from(eb.system.model.positionM.buffer))).toBe(true);
    }
  });

  it('an instance overrides the template member by member; defaults fill what neither gives', () => {
    const eel = JSON.parse(eelText);
    eel.system.materialTemplates = {
      soft: { youngsModulusPa: 30000, densityKgPerM3: 1000, dampingRatio: 0.1, actuatorChannel: 4 },
    };
    eel.system.materials = [
      { name: 'plain-copy', template: 'soft' },
      { name: 'passive-stiff', template: 'soft', actuatorChannel: null, youngsModulusPa: { kind: 'uniform', min: 50000, max: 70000 } },
      { name: 'written-out', youngsModulusPa: 1, densityKgPerM3: 2, dampingRatio: 0 },
    ];
    eel.system.shape.maps = [[[1, 2, 3]]];
    eel.controls = {};
    const materials = (checked(eel).system as any).materials;
    // Hand-written expectation: template members, then the instance's, then the schema defaults
    // (actuatorChannel null, actuationStrainMax 0) for members given nowhere.
    expect(materials).toEqual([
      { name: 'plain-copy', youngsModulusPa: 30000, densityKgPerM3: 1000, dampingRatio: 0.1, actuatorChannel: 4, actuationStrainMax: 0 },
      { name: 'passive-stiff', youngsModulusPa: { kind: 'uniform', min: 50000, max: 70000 }, densityKgPerM3: 1000, dampingRatio: 0.1, actuatorChannel: null, actuationStrainMax: 0 },
      { name: 'written-out', youngsModulusPa: 1, densityKgPerM3: 2, dampingRatio: 0, actuatorChannel: null, actuationStrainMax: 0 },
    ]);
  });

  it('the preview worker expands templates to the same scenario as the checker', () => {
    const page = checkedScenario(eelText, 'korrin-eel.json');
    if (!page.ok) throw new Error(page.message);
    expect(page.scenario).toEqual(checked(JSON.parse(eelText)));
  });

  it('an unknown template is named at its line with the nearest template', () => {
    const text = eelText.replace('"name": "segment-3-top", "template": "segment"', '"name": "segment-3-top", "template": "segmnet"');
    const result = checkScenarioText(text, 'korrin-eel.json');
    expect(result.ok).toBe(false);
    if (result.ok) return;
    expect(result.problems).toHaveLength(1);
    const [problem] = result.problems;
    expect(problem.pointer).toBe('/system/materials/7/template');
    expect(problem.message).toContain('did you mean "segment"?');
    expect(problem.line).toBe(text.split('\n').findIndex((l) => l.includes('segmnet')) + 1);
  });

  it('a required member given neither by the material nor by its template is named with both places to give it', () => {
    const eel = JSON.parse(eelText);
    delete eel.system.materialTemplates.segment.dampingRatio;
    const result = checkScenarioValue(eel);
    expect(result.ok).toBe(false);
    if (result.ok) return;
    expect(result.problems).toHaveLength(16);
    expect(result.problems[0]).toEqual({ pointer: '/system/materials/0', message: 'material "segment-0-bottom" has no dampingRatio: give it here or in template "segment"' });
  });

  it('a template member is checked at its own pointer, and a template may not give a name', () => {
    const eel = JSON.parse(eelText);
    eel.system.materialTemplates.segment.densityKgPerM3 = -5;
    eel.system.materialTemplates.segment.name = 'x';
    const result = checkScenarioValue(eel);
    expect(result.ok).toBe(false);
    if (result.ok) return;
    expect(result.problems).toEqual([
      { pointer: '/system/materialTemplates/segment/name', message: 'unknown key "name"; the keys allowed here are "youngsModulusPa", "densityKgPerM3", "dampingRatio", "actuatorChannel", "actuationStrainMax"' },
      { pointer: '/system/materialTemplates/segment/densityKgPerM3', message: 'must be > 0 (got -5)' },
    ]);
  });
});
