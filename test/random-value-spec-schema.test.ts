// The value spec JSON Schema fragment, compiled by Ajv's draft 2020-12 implementation in strict
// mode (which also checks it against the 2020-12 meta-schema), and compared with the spec
// checker on the same documents so the schema and the sampler accept the same shapes.
// The standalone form carries its shared definition under $defs, as the scenario schema does.
import Ajv2020 from 'ajv/dist/2020.js';
import { describe, expect, it } from 'vitest';

import { findValueSpecProblems } from '../sim/random/value-spec-problems.ts';
import { standaloneValueSpecSchema as valueSpecSchema } from '../sim/random/value-spec-schema.ts';

function compile(schema: object) {
  const ajv = new Ajv2020({ strict: true, allErrors: true });
  return ajv.compile(schema);
}

describe('valueSpecSchema under Ajv 2020-12 strict mode', () => {
  it('is a valid draft 2020-12 schema with descriptions', () => {
    const ajv = new Ajv2020({ strict: true });
    const schema = valueSpecSchema('Young’s modulus of the tether jacket, in Pa.', { exclusiveMinimum: 0 });
    expect(ajv.validateSchema(schema)).toBe(true);
    expect(String(schema.description)).toMatch(/in Pa/);
  });

  it('accepts the Korrin Bay demo specs that the checker accepts, and both refuse the same broken ones', () => {
    const validate = compile(valueSpecSchema('Young’s modulus of the tether jacket, in Pa.', { exclusiveMinimum: 0 }));
    const good = [
      2.1e9,
      { kind: 'uniform', min: 1.5e9, max: 3e9 },
      { kind: 'log-uniform', min: 1e6, max: 1e9 },
      { kind: 'normal', mean: 2.1e9, std: 3e8, min: 1.5e9, max: 3e9 },
      { kind: 'integer', min: 1, max: 5 },
      { kind: 'categorical', values: [1e6, 1e7], weights: [3, 1] },
    ];
    for (const spec of good) {
      expect(validate(spec), JSON.stringify(validate.errors)).toBe(true);
      expect(findValueSpecProblems(spec, '')).toEqual([]);
    }
    const bad = [
      { kind: 'uniform', min: 1 },
      { kind: 'uniform', min: 1, max: 2, unit: 'Pa' },
      { kind: 'log-uniform', min: 0, max: 1 },
      { kind: 'normal', mean: 1, std: 0, min: 0, max: 2 },
      { kind: 'integer', min: 1.5, max: 3 },
      { kind: 'categorical', values: [] },
      { kind: 'gaussian', mean: 1, std: 1 },
      'stiff',
      null,
    ];
    for (const spec of bad) {
      expect(validate(spec), JSON.stringify(spec)).toBe(false);
      expect(findValueSpecProblems(spec, '').length, JSON.stringify(spec)).toBeGreaterThan(0);
    }
  });

  it('applies the quantity’s limits to constants and to every range bound', () => {
    const validate = compile(valueSpecSchema('Damping ratio of the fin springs.', { minimum: 0, maximum: 1 }));
    expect(validate(0.05)).toBe(true);
    expect(validate(1.5)).toBe(false);
    expect(validate({ kind: 'uniform', min: -0.1, max: 0.2 })).toBe(false);
    expect(validate({ kind: 'normal', mean: 2, std: 1, min: 0, max: 1 })).toBe(true);
    expect(validate({ kind: 'normal', mean: 0.5, std: 1, min: 0, max: 1.2 })).toBe(false);
    expect(validate({ kind: 'categorical', values: [0.1, 2] })).toBe(false);
  });

  it('an integer quantity takes only whole constants, "integer" and "categorical"', () => {
    const validate = compile(valueSpecSchema('Number of tether segments.', { integer: true, minimum: 2 }));
    expect(validate(12)).toBe(true);
    expect(validate(12.5)).toBe(false);
    expect(validate(1)).toBe(false);
    expect(validate({ kind: 'integer', min: 8, max: 24 })).toBe(true);
    expect(validate({ kind: 'uniform', min: 8, max: 24 })).toBe(false);
    expect(validate({ kind: 'categorical', values: [8, 16, 24] })).toBe(true);
  });

  it('a categorical spec takes any JSON values only when asked to', () => {
    const names = compile(valueSpecSchema('Fin material name.', { anyJsonChoice: true }));
    const numbers = compile(valueSpecSchema('Fin thickness, in m.'));
    const spec = { kind: 'categorical', values: ['silicone-a', 'silicone-b'] };
    expect(names(spec)).toBe(true);
    expect(numbers(spec)).toBe(false);
  });
});
