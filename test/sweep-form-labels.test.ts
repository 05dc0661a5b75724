// The Sweep form's labels and section counts, without a browser: every member of the scenario
// format has words in the schema (a new member without them fails here), the label joins the
// words with the unit the key carries ("Length, m"; SI unit symbols as in the SI Brochure, 9th
// edition, 2019, table 4), and each problem is counted in the innermost section that holds it.
import { describe, expect, it } from 'vitest';

import { fieldLabel } from '../renderer/sweep/field-label.ts';
import type { SchemaObject } from '../renderer/sweep/schema-shape.ts';
import { SchemaReader } from '../renderer/sweep/schema-shape.ts';
import { sectionOf } from '../renderer/sweep/section-of.ts';
import { unitOfField } from '../renderer/sweep/unit-from-key.ts';
import { SCENARIO_SCHEMA } from '../sim/scenario/scenario-schema.ts';

type Node = Record<string, unknown>;

function membersWithoutTitle(schema: unknown): string[] {
  const missing = new Set<string>();
  const visit = (node: unknown): void => {
    if (Array.isArray(node)) return node.forEach(visit);
    if (typeof node !== 'object' || node === null) return;
    const properties = (node as Node).properties;
    if (typeof properties === 'object' && properties !== null) {
      for (const [key, member] of Object.entries(properties as Node)) {
        if (typeof (member as Node)?.title !== 'string') missing.add(key);
      }
    }
    Object.values(node).forEach(visit);
  };
  visit(schema);
  return [...missing].sort();
}

describe('Sweep form labels', () => {
  it('every member of the scenario schema has a title', () => {
    expect(membersWithoutTitle(SCENARIO_SCHEMA)).toEqual([]);
  });

  it('labels read as words and unit, from the schema title and the key', () => {
    const chain = JSON.stringify(SCENARIO_SCHEMA);
    expect(chain).toContain('"title":"Length"');
    const label = (key: string, title: string, description?: string): string => fieldLabel(key, title, unitOfField(key, description));
    expect(label('lengthM', 'Length')).toBe('Length, m');
    expect(label('youngsModulusPa', "Young's modulus")).toBe("Young's modulus, Pa");
    expect(label('densityKgPerM3', 'Density')).toBe('Density, kg/m³');
    expect(label('gravityMPerS2', 'Gravity')).toBe('Gravity, m/s²');
    expect(label('normalDragNsPerM3', 'Normal drag')).toBe('Normal drag, N·s/m³');
    // Dimensionless values carry no unit after the words (the form marks them "dimensionless").
    expect(label('dampingRatio', 'Damping ratio', 'Damping ratio of each spring, dimensionless (1 is critical).')).toBe('Damping ratio');
    // A name the person chose is shown as written.
    expect(fieldLabel('actuator-0', undefined, null)).toBe('actuator-0');
  });

  it('counts a problem in the innermost listed section', () => {
    const entries = ['', '/system', '/system/materials', '/world'].map((pointer) => ({ pointer, label: pointer, nested: false }));
    expect(sectionOf('/system/materials/2/youngsModulusPa', entries)).toBe('/system/materials');
    expect(sectionOf('/system/lengthM/max', entries)).toBe('/system');
    expect(sectionOf('/worldly', entries)).toBe('');
    expect(sectionOf('/seed', entries)).toBe('');
    expect(sectionOf('', entries)).toBe('');
  });

  it('sub-steps offer each of their forms: "auto", a target accuracy, a whole number', () => {
    const reader = new SchemaReader(SCENARIO_SCHEMA as SchemaObject);
    const time = reader.resolve((SCENARIO_SCHEMA.properties as Node).time);
    const substeps = (time.properties as Node).substeps;
    const kind = reader.classify(substeps, 'auto');
    expect(kind.kind).toBe('variants');
    if (kind.kind !== 'variants') return;
    expect(kind.variants.map((v) => v.label)).toEqual(['auto', 'Sub-steps for a target accuracy', 'a whole number']);
    expect([reader.matchingVariant(kind.variants, 'auto'), reader.matchingVariant(kind.variants, { accuracy: 0.05 }), reader.matchingVariant(kind.variants, 4)]).toEqual([0, 1, 2]);
    // Picking a form starts from a value the schema accepts there.
    expect(kind.variants.map((v) => reader.defaultValue(v.schema))).toEqual(['auto', { accuracy: 0.001 }, 1]);
  });
});
