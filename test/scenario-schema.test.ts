// The scenario JSON Schema itself: valid against the official draft 2020-12 meta-schema (as
// bundled with ajv from json-schema.org), documented everywhere an editor shows help, and the
// source of the defaults a checked scenario receives.
import Ajv2020 from 'ajv/dist/2020.js';
import { describe, expect, it } from 'vitest';

import { checkScenarioValue } from '../sim/scenario/check-scenario.ts';
import { SCENARIO_SCHEMA } from '../sim/scenario/scenario-schema.ts';

type Json = any; // schema nodes are walked generically

/** The fewest members a valid scenario needs: a short tether (invented demo values). */
function minimalTether(): Json {
  return {
    formatVersion: 1,
    name: 'korrin-minimal',
    system: { kind: 'chain', partCount: 5, lengthM: 1, totalMassKg: 0.2, axialStiffnessN: 500, dampingRatio: 0.1, diameterM: 0.01, anchor: 'top-pinned' },
    time: { recordIntervalS: 0.02, recordedSteps: 10 },
    episodes: 3,
    seed: 1,
  };
}

describe('SCENARIO_SCHEMA', () => {
  it('is a valid draft 2020-12 schema (json-schema.org meta-schema, bundled with ajv)', () => {
    const ajv = new Ajv2020({ strict: false });
    expect(ajv.validateSchema(SCENARIO_SCHEMA), JSON.stringify(ajv.errors)).toBe(true);
    expect(SCENARIO_SCHEMA.$schema).toBe('https://json-schema.org/draft/2020-12/schema');
  });

  it('describes every member an editor can offer (project rule: SI unit in the key or the description)', () => {
    const undocumented: string[] = [];
    // Value specs and control specs are documented by their own modules' schemas (and tests);
    // `if` subschemas are conditions, not members.
    const walk = (node: Json, path: string): void => {
      if (node === null || typeof node !== 'object') return;
      if (node.if?.type === 'number' || path.endsWith('/$defs') || path.endsWith('/if')) return;
      if (node.properties) {
        for (const [key, child] of Object.entries<Json>(node.properties)) {
          const documented = typeof child.description === 'string' || typeof child.$ref === 'string' || child.const !== undefined;
          if (!documented) undocumented.push(`${path}/properties/${key}`);
        }
      }
      for (const [key, child] of Object.entries<Json>(node)) if (typeof child === 'object') walk(child, `${path}/${key}`);
    };
    walk(SCENARIO_SCHEMA, '#');
    expect(undocumented).toEqual([]);
  });

  it('chooses between forms only with if/then/else, never anyOf/oneOf (one error per problem; common practice, no source)', () => {
    // With anyOf/oneOf a validator reports every failed branch; the checker relies on their absence.
    const text = JSON.stringify(SCENARIO_SCHEMA);
    expect(text).not.toContain('"anyOf"');
    expect(text).not.toContain('"oneOf"');
  });

  it('fills a minimal scenario with the defaults the schema declares', () => {
    const result = checkScenarioValue(minimalTether());
    if (!result.ok) throw new Error(JSON.stringify(result.problems));
    const s = result.scenario;
    const props = SCENARIO_SCHEMA.properties as Json;
    expect(s.splits.fractions).toEqual(props.splits.properties.fractions.default);
    expect(s.splits.heldOut).toEqual([]);
    expect(s.export).toEqual({ format: props.export.properties.format.default, dtype: props.export.properties.dtype.default, forces: false, compression: props.export.properties.compression.default });
    expect(s.numerics).toEqual({ energyBalance: false, richardsonShare: 0 });
    expect(s.world.obstacles).toEqual([]);
    expect(s.time.substeps).toBe(props.time.properties.substeps.default);
    expect(s.time.autoSafety).toBe(props.time.properties.autoSafety.default);
    expect(s.world.gravityMPerS2).toEqual(props.world.properties.gravityMPerS2.default);
    expect(s.world.ground).toBeUndefined();
    expect(s.controls).toEqual({ default: props.controls.properties.default.default, channels: {}, rampInS: props.controls.properties.rampInS.default });
    expect(s.initialState).toEqual({
      positionNoiseM: 0, velocityNoiseMPerS: 0, rotationRad: 0, rotationAxisUnit: [0, 0, 1], translationM: [0, 0, 0],
      settleS: 0, settleDragPerS: 10, velocityMPerS: [0, 0, 0], spinRadPerS: [0, 0, 0],
    });
    expect(s.description).toBe('');
  });

  it('leaves the caller\'s value as written when filling defaults', () => {
    const value = minimalTether();
    const before = JSON.stringify(value);
    expect(checkScenarioValue(value).ok).toBe(true);
    expect(JSON.stringify(value)).toBe(before);
  });
});
