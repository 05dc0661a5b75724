// The control spec JSON Schema fragment, compiled by Ajv's draft 2020-12 implementation in
// strict mode, against the control spec checker and generator: every kind's Korrin Bay example
// is accepted by all three, and broken documents are refused by schema and checker alike.
import Ajv2020 from 'ajv/dist/2020.js';
import { describe, expect, it } from 'vitest';

import { generateControlSignal } from '../sim/controls/control-signal.ts';
import type { ControlSpec } from '../sim/controls/control-spec.ts';
import { CONTROL_KINDS } from '../sim/controls/control-spec.ts';
import { findControlSpecProblems } from '../sim/controls/control-spec-problems.ts';
import { controlSpecSchema, controlSpecSchemaFor } from '../sim/controls/control-spec-schema.ts';
import { RandomStream, StreamPurpose } from '../sim/random/random-stream.ts';
import { VALUE_SPEC_DEFINITIONS } from '../sim/random/value-spec-schema.ts';

const EXAMPLES: ControlSpec[] = [
  { kind: 'none' },
  { kind: 'constant', value: { kind: 'uniform', min: 0.5, max: 2 } },
  { kind: 'piecewise-constant', holdS: { kind: 'categorical', values: [0.5, 1] }, min: -1, max: 1, clip: { min: -0.8 } },
  { kind: 'ornstein-uhlenbeck', meanValue: 1.5, std: 0.4, timeConstantS: { kind: 'log-uniform', min: 0.1, max: 2 } },
  { kind: 'band-limited', cutoffHz: 3, std: 0.5, componentCount: { kind: 'integer', min: 8, max: 32 } },
  { kind: 'sinusoid', amplitude: 0.8, frequencyHz: 1.2, phaseRad: 0, offset: 0.1 },
  { kind: 'chirp', amplitude: 1, startFrequencyHz: 0.2, endFrequencyHz: 5, clip: { min: -1, max: 1 } },
  { kind: 'steps', stepCount: 4, min: 0, max: { kind: 'normal', mean: 20, std: 5, min: 10, max: 30 } },
  { kind: 'step-list', timesS: [0, 1.5, { kind: 'uniform', min: 2, max: 3 }], values: [0, 12, 4] },
  { kind: 'replay', file: 'korrin-bay/tether-pull.npy', column: 0 },
];

/** Compiled with the shared value-spec definitions its numbers refer to, as the scenario schema holds them. */
function compile(schema: object) {
  return new Ajv2020({ strict: true, allErrors: true }).compile({ ...schema, $defs: VALUE_SPEC_DEFINITIONS });
}

describe('controlSpecSchema under Ajv 2020-12 strict mode', () => {
  it('is a valid draft 2020-12 schema and its kind list matches the generator’s', () => {
    const ajv = new Ajv2020({ strict: true });
    expect(ajv.validateSchema(controlSpecSchema)).toBe(true);
    expect(EXAMPLES.map((e) => e.kind)).toEqual([...CONTROL_KINDS]);
  });

  it('accepts one example of every kind, which the checker accepts and the generator runs', () => {
    const validate = compile(controlSpecSchema);
    for (const spec of EXAMPLES) {
      expect(validate(spec), `${spec.kind}: ${JSON.stringify(validate.errors)}`).toBe(true);
      expect(findControlSpecProblems(spec, '/controls/0', 0.01)).toEqual([]);
      const out = new Float64Array(1000);
      const replay = spec.kind === 'replay' ? new Float64Array(1000).fill(3) : undefined;
      const labels = generateControlSignal(spec, new RandomStream(5, 0, StreamPurpose.controls), 0.01, 1000, out, 0, 1, { replay });
      expect(labels.kind).toBe(spec.kind);
      expect(out.every(Number.isFinite)).toBe(true);
    }
  });

  it('refuses broken specs, as the checker does', () => {
    const validate = compile(controlSpecSchema);
    const broken: unknown[] = [
      { kind: 'whistle' },
      { kind: 'sinusoid', amplitude: 1 },
      { kind: 'sinusoid', amplitude: 1, frequencyHz: 2, periodS: 0.5 },
      { kind: 'sinusoid', amplitude: 1, frequencyHz: -2 },
      { kind: 'ornstein-uhlenbeck', meanValue: 0, std: 1, timeConstantS: 0 },
      { kind: 'band-limited', cutoffHz: 3, std: 1, componentCount: 2.5 },
      { kind: 'steps', stepCount: -1, min: 0, max: 1 },
      { kind: 'constant', value: 1, clip: {} },
      { kind: 'constant', value: 1, clip: { low: 0 } },
      { kind: 'replay', file: '', column: 0 },
      { kind: 'replay', file: 'a.npy', column: -1 },
      { kind: 'step-list', timesS: [], values: [] },
      { kind: 'step-list', timesS: [-1], values: [0] },
      [],
    ];
    for (const spec of broken) {
      expect(validate(spec), JSON.stringify(spec)).toBe(false);
      expect(findControlSpecProblems(spec, '', 0.01).length, JSON.stringify(spec)).toBeGreaterThan(0);
    }
  });

  it('names the channel unit in its descriptions when given, SI by default', () => {
    const generic = JSON.stringify(controlSpecSchema);
    expect(generic).toMatch(/N for forces, m for displacements/);
    expect(generic).toMatch(/in Hz/);
    expect(generic).toMatch(/in s\b/);
    const tether = JSON.stringify(controlSpecSchemaFor('Pull on the rover tether.', { unit: 'N' }));
    expect(tether).toMatch(/Amplitude, in N\./);
    expect(tether).not.toMatch(/N for forces/);
  });
});
