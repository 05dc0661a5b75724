// Validates a parsed scenario against SCENARIO_SCHEMA with ajv (draft 2020-12) and turns ajv's
// errors into one plain message per real problem: the offending value's JSON pointer, what was
// expected there and what was found, with "did you mean …?" for misspelt keys and names.
// The schema picks between forms with if/then/else, never anyOf/oneOf, so ajv reports only
// the errors of the form a value evidently meant; the `if` echoes are dropped here.
// Defaults written in the schema are filled into the value as it is checked.
import type { ErrorObject, ValidateFunction } from 'ajv';
import Ajv2020 from 'ajv/dist/2020.js';

import type { JsonSchema } from '../random/value-spec-schema.ts';
import { closestName } from './closest-name.ts';
import { pointerSegments } from './json-source-map.ts';
import { prebuiltScenarioChecker } from './prebuilt-scenario-checker.ts';
import type { ScenarioProblem } from './scenario-problem.ts';
import { SCENARIO_SCHEMA } from './scenario-schema.ts';

/**
 * allowUnionTypes: some values are "a whole number or a string"; strictTypes would refuse
 * them. optimize: false halves the cold compile of this large schema (1.1 s instead of
 * 2.1 s on the 2-core reference machine) for a validation that runs once per file.
 * inlineRefs: false keeps each shared $defs entry one function instead of a copy per use
 * (the point of sharing them); verbose gives each error its schema node, which is how
 * absoluteSchemaPath tells which definition an error's relative path lies in. The prebuilt
 * checker (prebuilt-scenario-checker.ts) is compiled with these same options.
 */
export const SCENARIO_AJV_OPTIONS = { allErrors: true, useDefaults: true, strict: true, allowUnionTypes: true, inlineRefs: false, verbose: true, code: { optimize: false } } as const;

let compiled: ValidateFunction | undefined;

function validator(): ValidateFunction {
  if (compiled === undefined) {
    const prebuilt = prebuiltScenarioChecker();
    compiled = prebuilt !== undefined ? prebuilt((path) => nodeAt(SCENARIO_SCHEMA, path)) : new Ajv2020(SCENARIO_AJV_OPTIONS).compile(SCENARIO_SCHEMA);
  }
  return compiled;
}

/** Checks `value` in place (defaults are filled in); an empty list means it fits the schema. */
export function findSchemaProblems(value: unknown): ScenarioProblem[] {
  const validate = validator();
  if (validate(value)) return [];
  return describeErrors((validate.errors ?? []).map(withAbsoluteSchemaPath), value);
}

function nodeAt(root: unknown, segments: readonly string[]): unknown {
  let node = root;
  for (const segment of segments) node = node !== null && typeof node === 'object' ? (node as Record<string, unknown>)[segment] : undefined;
  return node;
}

/**
 * ajv writes the schema path of an error inside a separately compiled $defs entry relative to
 * that entry ("#/else/type"). This finds the entry whose node at that path is the error's own
 * schema node and prefixes its place, so the path reads from the schema's root as elsewhere.
 */
function withAbsoluteSchemaPath(error: ErrorObject): ErrorObject {
  const segments = pointerSegments(error.schemaPath.replace(/^#/, ''));
  const holder = segments.slice(0, -1);
  if (nodeAt(SCENARIO_SCHEMA, holder) === error.parentSchema) return error;
  const definitions = (SCENARIO_SCHEMA.$defs ?? {}) as Record<string, unknown>;
  for (const [name, definition] of Object.entries(definitions)) {
    if (nodeAt(definition, holder) === error.parentSchema) return { ...error, schemaPath: `#/$defs/${name}${error.schemaPath.slice(1)}` };
  }
  return error;
}

// Keywords that change which part of the instance a subschema applies to.
/** Values earlier Pliant versions accepted, by their new names (the distribution kind "choice"). */
const RENAMED_VALUES: Readonly<Record<string, string>> = { choice: 'categorical' };

const DESCENDING = new Set(['properties', 'patternProperties', 'prefixItems', 'dependentSchemas', '$defs']);
const DESCENDING_LEAF = new Set(['items', 'additionalProperties', 'contains', 'propertyNames', 'unevaluatedProperties', 'unevaluatedItems']);
const COMBINING = new Set(['allOf', 'anyOf', 'oneOf']);

/**
 * The schema nodes that apply to the same instance location as the error, outermost first:
 * from the last keyword of the schema path that stepped into a member or item, down through
 * if/then/else and allOf/anyOf/oneOf, to the node holding the failing keyword.
 */
function schemasAtErrorLocation(schemaPath: string): JsonSchema[] {
  const segments = pointerSegments(schemaPath.replace(/^#/, ''));
  const nodes: JsonSchema[] = [SCENARIO_SCHEMA];
  let node: unknown = SCENARIO_SCHEMA;
  let locationStart = 0;
  // The last segment is the failing keyword itself.
  for (let i = 0; i < segments.length - 1; i++) {
    const segment = segments[i];
    node = (node as Record<string, unknown> | undefined)?.[segment];
    if (DESCENDING.has(segment) || COMBINING.has(segment)) {
      node = (node as Record<string, unknown> | undefined)?.[segments[++i]];
      if (DESCENDING.has(segment)) locationStart = nodes.length;
    } else if (DESCENDING_LEAF.has(segment)) {
      locationStart = nodes.length;
    }
    nodes.push(node as JsonSchema);
  }
  return nodes.slice(locationStart).filter((n) => n !== undefined && typeof n === 'object');
}

/** The schema node holding the failing keyword. */
function parentSchemaOf(schemaPath: string): JsonSchema | undefined {
  const schemas = schemasAtErrorLocation(schemaPath);
  return schemas[schemas.length - 1];
}

function valueAt(root: unknown, pointer: string): unknown {
  let value = root;
  for (const segment of pointerSegments(pointer)) {
    if (value === null || typeof value !== 'object') return undefined;
    value = (value as Record<string, unknown>)[segment];
  }
  return value;
}

function firstWith<K extends string>(schemas: JsonSchema[], keyword: K): JsonSchema | undefined {
  return schemas.find((s) => s[keyword] !== undefined);
}

function typeList(declared: unknown): string[] {
  return Array.isArray(declared) ? declared.map(String) : declared === undefined ? [] : [String(declared)];
}

/**
 * The types the value may have, from the outermost schema at its location: a "type" keyword,
 * or an if/then/else split on type (a value spec is "if a number then … else an object …").
 */
function expectedTypes(schemas: readonly JsonSchema[]): string[] | undefined {
  for (const s of schemas) {
    if (s.type !== undefined) return typeList(s.type);
    const condition = s.if as JsonSchema | undefined;
    const thenSchema = s.then as JsonSchema | undefined;
    const elseSchema = s.else as JsonSchema | undefined;
    if (condition?.type !== undefined && elseSchema?.type !== undefined) {
      return [...typeList(thenSchema?.type ?? condition.type), ...typeList(elseSchema.type)];
    }
  }
  return undefined;
}

function describeValue(value: unknown): string {
  if (typeof value === 'string') return JSON.stringify(value.length > 40 ? `${value.slice(0, 37)}...` : value);
  if (typeof value === 'number') return Number.isFinite(value) ? String(value) : 'a number too large for a double';
  if (Array.isArray(value)) return `an array of ${value.length}`;
  if (value === null) return 'null';
  if (typeof value === 'object') return 'an object';
  return String(value);
}

const TYPE_WORDS: Record<string, string> = {
  integer: 'a whole number',
  number: 'a number',
  string: 'a string',
  boolean: 'true or false',
  object: 'an object {...}',
  array: 'an array [...]',
  null: 'null',
};

function expectedTypeWords(types: string[]): string {
  const key = [...types].sort().join(',');
  if (key === 'number,object') return 'a number or a distribution such as {"kind": "uniform", "min": 1, "max": 2}';
  if (key === 'integer,object') return 'a whole number or a distribution such as {"kind": "integer", "min": 1, "max": 10}';
  const words = types.map((t) => TYPE_WORDS[t] ?? t);
  return words.length === 1 ? words[0] : `${words.slice(0, -1).join(', ')} or ${words[words.length - 1]}`;
}

function firstSentence(text: unknown): string {
  if (typeof text !== 'string') return '';
  const end = text.search(/\.(\s|$)/);
  return end < 0 ? text : text.slice(0, end + 1);
}

function quoteList(values: readonly unknown[]): string {
  return values.map((v) => JSON.stringify(v)).join(', ');
}

interface Described {
  pointer: string;
  message: string;
  /** Type errors supersede every other complaint about the same value. */
  isType: boolean;
}

function describeOne(error: ErrorObject, root: unknown): Described | undefined {
  const pointer = error.instancePath;
  const params = error.params as Record<string, unknown>;
  const value = valueAt(root, pointer);
  const parentSchema = (): JsonSchema | undefined => parentSchemaOf(error.schemaPath);
  const schemas = () => schemasAtErrorLocation(error.schemaPath);
  switch (error.keyword) {
    case 'if':
    case 'allOf':
      return undefined;
    case 'type': {
      const types = expectedTypes(schemas()) ?? String(params.type).split(',');
      if (typeof value === 'number' && !Number.isFinite(value)) {
        return { pointer, message: `must be a finite number (got a number too large for a double); write an ordinary number`, isType: true };
      }
      const hint = types.length > 1 && !types.includes('object') ? ` (${firstSentence(firstWith(schemas(), 'description')?.description)})` : '';
      return { pointer, message: `must be ${expectedTypeWords(types)}${hint} (got ${describeValue(value)})`, isType: true };
    }
    case 'required': {
      const missing = String(params.missingProperty);
      const properties = parentSchema()?.properties as Record<string, JsonSchema> | undefined;
      const member = properties?.[missing];
      const allowed = Array.isArray(member?.enum) ? ` (one of ${quoteList(member.enum as unknown[])})` : '';
      const about = firstSentence(member?.description);
      return { pointer, message: `is missing the key "${missing}"${allowed}${about ? `: ${about}` : ''}${linkedFormHint(missing, value)}`, isType: false };
    }
    case 'additionalProperties': {
      const key = String(params.additionalProperty);
      const known = Object.keys((parentSchema()?.properties as Record<string, unknown> | undefined) ?? {});
      const suggestion = closestName(key, known);
      const advice = suggestion !== undefined ? `did you mean "${suggestion}"?` : known.length > 0 ? `the keys allowed here are ${quoteList(known)}` : 'no keys are allowed here';
      const escaped = key.replace(/~/g, '~0').replace(/\//g, '~1');
      return { pointer: `${pointer}/${escaped}`, message: `unknown key "${key}"; ${advice}`, isType: false };
    }
    case 'enum': {
      // A name Pliant used before gets its new name, not the nearest spelling.
      const allowed = (params.allowedValues as unknown[]) ?? [];
      const renamed = typeof value === 'string' && Object.hasOwn(RENAMED_VALUES, value) ? RENAMED_VALUES[value] : undefined;
      const suggestion = typeof value === 'string' ? closestName(value, allowed.filter((a): a is string => typeof a === 'string')) : undefined;
      const advice = renamed !== undefined && allowed.includes(renamed)
        ? `; "${value as string}" is now called "${renamed}": write "${renamed}"`
        : suggestion !== undefined ? `; did you mean "${suggestion}"?` : '';
      return {
        pointer,
        message: `must be one of ${quoteList(allowed)} (got ${describeValue(value)})${advice}`,
        isType: false,
      };
    }
    case 'const': {
      const about = firstSentence(firstWith(schemas(), 'description')?.description);
      return { pointer, message: `must be ${JSON.stringify(params.allowedValue)} (got ${describeValue(value)})${about ? `: ${about}` : ''}`, isType: false };
    }
    case 'minimum':
    case 'maximum':
    case 'exclusiveMinimum':
    case 'exclusiveMaximum': {
      const symbol = { minimum: '≥', maximum: '≤', exclusiveMinimum: '>', exclusiveMaximum: '<' }[error.keyword];
      const hint = pointer === '/seed' && typeof value === 'number' && value > Number.MAX_SAFE_INTEGER
        ? '; a seed this large cannot be read exactly as a JSON number, so write it as a decimal string, e.g. "18446744073709551615"'
        : '';
      return { pointer, message: `must be ${symbol} ${params.limit} (got ${describeValue(value)})${hint}`, isType: false };
    }
    case 'minItems':
    case 'maxItems': {
      const count = Array.isArray(value) ? value.length : 0;
      const parent = parentSchema();
      if (parent?.minItems !== undefined && parent.minItems === parent.maxItems) {
        return { pointer, message: `must have exactly ${parent.minItems} entries (got ${count})`, isType: false };
      }
      const word = error.keyword === 'minItems' ? 'at least' : 'at most';
      return { pointer, message: `must have ${word} ${params.limit} entr${params.limit === 1 ? 'y' : 'ies'} (got ${count})`, isType: false };
    }
    case 'minLength':
    case 'maxLength': {
      const word = error.keyword === 'minLength' ? 'at least' : 'at most';
      return { pointer, message: `must be ${word} ${params.limit} characters long (got ${typeof value === 'string' ? value.length : 0})`, isType: false };
    }
    case 'pattern': {
      const about = firstWith(schemas(), 'description')?.description;
      return { pointer, message: `${describeValue(value)} is not allowed here${typeof about === 'string' ? `: ${about}` : ` (must match ${params.pattern})`}`, isType: false };
    }
    case 'uniqueItems':
      return { pointer, message: `lists the same value twice (entries ${params.j} and ${params.i}); list each only once`, isType: false };
    case 'minProperties':
      return { pointer, message: `must not be empty; give at least ${params.limit} key${params.limit === 1 ? '' : 's'} or leave it out`, isType: false };
    default:
      return { pointer, message: error.message ?? `does not fit the scenario format (${error.keyword})`, isType: false };
  }
}

/** A distribution missing its "kind" whose one key is a misspelt "ref" or "expr" ({"refs": …}). */
function linkedFormHint(missing: string, value: unknown): string {
  if (missing !== 'kind' || value === null || typeof value !== 'object' || Array.isArray(value)) return '';
  const keys = Object.keys(value);
  const near = keys.length === 1 ? closestName(keys[0], ['ref', 'expr']) : undefined;
  return near === undefined ? '' : `; or, for a named parameter, did you mean "${near}" instead of "${keys[0]}"?`;
}

function describeErrors(errors: readonly ErrorObject[], root: unknown): ScenarioProblem[] {
  const described = errors.map((e) => describeOne(e, root)).filter((d): d is Described => d !== undefined);
  const typed = new Set(described.filter((d) => d.isType).map((d) => d.pointer));
  const seen = new Set<string>();
  const problems: ScenarioProblem[] = [];
  for (const d of described) {
    if (!d.isType && typed.has(d.pointer)) continue;
    const key = `${d.pointer}\u0000${d.message}`;
    if (seen.has(key)) continue;
    seen.add(key);
    problems.push({ pointer: d.pointer, message: d.message });
  }
  return problems;
}
