// JSON Schema (draft 2020-12) of a value spec, as plain objects for the scenario schema to
// embed wherever a number may be randomised. Physical limits of the quantity (a stiffness above
// zero, a ratio below one) are passed in and applied to constants and to every range bound.
// The scenario has well over a hundred such places but only a dozen distinct sets of limits,
// so each place is a {"$ref"} to one shared definition per set of limits (VALUE_SPEC_DEFINITIONS,
// which the scenario schema puts under $defs): written out in every place, ajv generated 5.6 MB
// of checking code and the compile cost about 140 MB of memory and a second; shared, 0.2 MB,
// 15 MB and 0.15 s. The place keeps its own description and default beside the $ref.
import { MAX_EXPRESSION_LENGTH, PARAMETER_NAME_PATTERN, PARAMS_POINTER } from './derived-expression.ts';
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

/** Shared value-spec definitions by $defs name, filled as valueSpecSchema is called. */
export const VALUE_SPEC_DEFINITIONS: Record<string, JsonSchema> = {};

const DEFINITIONS_POINTER = '#/$defs/';

/** The $defs name for one set of limits, e.g. "valueSpec-exclusiveMinimum0-maximum1". */
function definitionName(options: ValueSpecSchemaOptions): string {
  const parts = ['valueSpec'];
  if (options.integer === true) parts.push('integer');
  if (options.anyJsonChoice === true) parts.push('anyChoice');
  for (const keyword of BOUND_KEYWORDS) if (options[keyword] !== undefined) parts.push(`${keyword}${options[keyword]}`);
  return parts.join('-');
}

/**
 * Schema of one value spec at one place: `description` names the quantity and its SI unit. The
 * result refers to its shared definition, so it only checks inside a schema whose $defs hold
 * VALUE_SPEC_DEFINITIONS (the scenario schema); standaloneValueSpecSchema is the self-contained form.
 */
export function valueSpecSchema(description: string, options: ValueSpecSchemaOptions = {}): JsonSchema {
  const kinds = distributionKinds(options.integer === true);
  const name = definitionName(options);
  VALUE_SPEC_DEFINITIONS[name] ??= valueSpecDefinition(options);
  const schema: JsonSchema = {
    description: `${description} A number for a fixed value, or {"kind": ...} for a value drawn once per episode: ${kinds.join(', ')}; or {"ref": "${PARAMS_POINTER}/<name>"} for a named parameter, or {"expr": "2 * ${PARAMS_POINTER}/<name>"} for a value derived from named parameters.`,
    $ref: `${DEFINITIONS_POINTER}${name}`,
  };
  if (options.default !== undefined) schema.default = options.default;
  return schema;
}

/** The distribution kinds a value may be drawn from; whole-number quantities have no continuous ones. */
function distributionKinds(integer: boolean): string[] {
  return integer ? ['integer', 'categorical'] : ['uniform', 'log-uniform', 'normal', 'integer', 'categorical'];
}

/** A value spec schema that checks on its own: the place's schema with its definition under $defs. */
export function standaloneValueSpecSchema(description: string, options: ValueSpecSchemaOptions = {}): JsonSchema {
  const name = definitionName(options);
  return { ...valueSpecSchema(description, options), $defs: { [name]: VALUE_SPEC_DEFINITIONS[name] } };
}

/** The shared part: a number within the limits, or a distribution object whose bounds are within them. */
function valueSpecDefinition(options: ValueSpecSchemaOptions): JsonSchema {
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
  if (!integer) {
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
  branches.push(
    branch('integer', { min: boundedNumber('Smallest whole number, included.', options, true), max: boundedNumber('Largest whole number, included.', options, true) }, ['min', 'max']),
    branch('categorical', { values: choiceValues, weights }, ['values']),
  );
  return {
    // if/then/else rather than a union type: errors then point into the branch actually meant.
    if: { type: 'number' },
    then: boundedNumber('A fixed value, in the unit of the value.', options, integer),
    else: {
      type: 'object',
      if: { properties: { ref: {} }, required: ['ref'] },
      then: linkedReference(),
      else: {
        if: { properties: { expr: {} }, required: ['expr'] },
        then: linkedExpression(),
        else: {
          required: ['kind'],
          properties: { kind: { enum: distributionKinds(integer) } },
          allOf: branches,
        },
      },
    },
  };
}

// The place's own limits apply to a linked value too, but only the checker can tell the range
// an expression reaches (sim/scenario/linked-parameters.ts), so the schema checks the form alone.
// Each definition gets its own copy: schema-problems.ts finds an error's definition by the
// identity of its schema node. The enclosing "else" has already required an object.
function linkedReference(): JsonSchema {
  return {
    properties: {
      ref: {
        type: 'string',
        pattern: `^${PARAMS_POINTER}/${PARAMETER_NAME_PATTERN.slice(1)}`,
        description: `JSON pointer of a named parameter, "${PARAMS_POINTER}/<name>": this place takes that parameter's value, drawn once per episode and shared by every place that names it.`,
      },
    },
    required: ['ref'],
    additionalProperties: false,
  };
}

function linkedExpression(): JsonSchema {
  return {
    properties: {
      expr: {
        type: 'string',
        minLength: 1,
        maxLength: MAX_EXPRESSION_LENGTH,
        description: `Arithmetic of named parameters, e.g. "2 * ${PARAMS_POINTER}/stiffnessPa + 1e3": numbers, ${PARAMS_POINTER}/<name>, + - * /, parentheses, min, max, abs and round.`,
      },
    },
    required: ['expr'],
    additionalProperties: false,
  };
}
