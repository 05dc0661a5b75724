// JSON Schema (draft 2020-12) of a value spec, as plain objects for the scenario schema to
// embed wherever a number may be randomised. Physical limits of the quantity (a stiffness above
// zero, a ratio below one) are passed in and applied to constants and to every range bound.
import type { JsonValue } from './json-value.ts';

export type JsonSchema = { [keyword: string]: JsonValue };

export interface ValueSpecSchemaOptions {
  minimum?: number;
  exclusiveMinimum?: number;
  maximum?: number;
  exclusiveMaximum?: number;
  /** Whole numbers only: constants, "integer" and "categorical" of whole numbers. */
  integer?: boolean;
  /** Choice values may be any JSON value (names, flags), not only numbers. */
  anyJsonChoice?: boolean;
  default?: number;
}

const BOUND_KEYWORDS = ['minimum', 'exclusiveMinimum', 'maximum', 'exclusiveMaximum'] as const;

function boundedNumber(description: string, options: ValueSpecSchemaOptions, integer: boolean): JsonSchema {
  const schema: JsonSchema = { type: integer ? 'integer' : 'number', description };
  for (const keyword of BOUND_KEYWORDS) {
    const bound = options[keyword];
    if (bound !== undefined) schema[keyword] = bound;
  }
  return schema;
}

function branch(kind: string, members: Record<string, JsonSchema>, required: string[]): JsonSchema {
  return {
    if: { properties: { kind: { const: kind } }, required: ['kind'] },
    then: {
      properties: { kind: { const: kind }, ...members },
      required: ['kind', ...required],
      additionalProperties: false,
    },
  };
}

/** Schema of one value spec; `description` names the quantity and its SI unit. */
export function valueSpecSchema(description: string, options: ValueSpecSchemaOptions = {}): JsonSchema {
  const integer = options.integer === true;
  const lower = boundedNumber('Lower end of the range, in the unit of the value.', options, integer);
  const upper = boundedNumber('Upper end of the range, in the unit of the value.', options, integer);
  const weights: JsonSchema = {
    type: 'array',
    items: { type: 'number', minimum: 0 },
    description: 'Relative chance of each value, one per value (optional; equal chances when left out).',
  };
  const choiceValues: JsonSchema = {
    type: 'array',
    minItems: 1,
    items: options.anyJsonChoice === true ? {} : boundedNumber('A possible value.', options, integer),
    description: 'The values to choose from.',
  };
  // A log-uniform range must stay above zero whatever the quantity allows.
  const logLowerLimit = Math.max(0, options.exclusiveMinimum ?? 0);
  const branches: JsonSchema[] = [];
  const kinds: string[] = [];
  if (!integer) {
    kinds.push('uniform', 'log-uniform', 'normal');
    branches.push(
      branch('uniform', { min: lower, max: upper }, ['min', 'max']),
      branch('log-uniform', { min: { ...lower, exclusiveMinimum: logLowerLimit }, max: { ...upper, exclusiveMinimum: logLowerLimit } }, ['min', 'max']),
      branch(
        'normal',
        {
          mean: { type: 'number', description: 'Mean before truncation, in the unit of the value; may lie outside [min, max].' },
          std: { type: 'number', exclusiveMinimum: 0, description: 'Standard deviation before truncation, in the unit of the value.' },
          min: { ...lower, description: 'Lower truncation bound, in the unit of the value.' },
          max: { ...upper, description: 'Upper truncation bound, in the unit of the value.' },
        },
        ['mean', 'std', 'min', 'max'],
      ),
    );
  }
  kinds.push('integer', 'categorical');
  branches.push(
    branch('integer', { min: boundedNumber('Smallest whole number, included.', options, true), max: boundedNumber('Largest whole number, included.', options, true) }, ['min', 'max']),
    branch('categorical', { values: choiceValues, weights }, ['values']),
  );
  const constant = boundedNumber(description, options, integer);
  if (options.default !== undefined) constant.default = options.default;
  const schema: JsonSchema = {
    description: `${description} A number for a fixed value, or {"kind": ...} for a value drawn once per episode: ${kinds.join(', ')}.`,
    // if/then/else rather than a union type: errors then point into the branch actually meant.
    if: { type: 'number' },
    then: constant,
    else: {
      type: 'object',
      required: ['kind'],
      properties: { kind: { enum: kinds } },
      allOf: branches,
    },
  };
  if (options.default !== undefined) schema.default = options.default;
  return schema;
}
