// The worker's view of a scenario the shell has already checked: the parsed JSON with the
// schema's defaults filled in, as the checker fills them. The checker itself cannot run here:
// it compiles the schema with ajv, which generates code at run time, and the page's
// Content-Security-Policy rightly forbids that. So this walks SCENARIO_SCHEMA the way ajv's
// useDefaults does — at each object, every applying subschema's `properties` defaults are set
// where the member is missing, before its members, if/then/else branches and allOf parts are
// visited — and the end-to-end suite compares the result with checkScenarioText's on every demo.
import { drawTextMaps } from '../../sim/scenario/draw-text-maps.ts';
import { expandMaterialTemplates, hasMaterialTemplates } from '../../sim/scenario/material-templates.ts';
import { SCENARIO_SCHEMA } from '../../sim/scenario/scenario-schema.ts';
import type { Scenario } from '../../sim/scenario/scenario-types.ts';

type Schema = { [keyword: string]: unknown };

export type CheckedScenario = { ok: true; scenario: Scenario } | { ok: false; message: string };

export function checkedScenario(text: string, fileName: string): CheckedScenario {
  let value: unknown;
  try {
    value = JSON.parse(text);
  } catch (error) {
    return { ok: false, message: `${fileName} is not JSON: ${(error as Error).message}. Fix it on the Sweep screen.` };
  }
  if (typeof value !== 'object' || value === null || Array.isArray(value)) {
    return { ok: false, message: `${fileName} holds no JSON object. A scenario is one object; see the Sweep screen.` };
  }
  fillDefaults(SCENARIO_SCHEMA as Schema, value);
  if (hasMaterialTemplates(value)) {
    // As in the checker: expand, then fill the plain materials' defaults the templated ones lacked.
    const expanded = expandMaterialTemplates(value);
    if (expanded.length > 0) return { ok: false, message: `${fileName} ${expanded[0].pointer}: ${expanded[0].message}. Fix it on the Sweep screen.` };
    fillDefaults(SCENARIO_SCHEMA as Schema, value);
  }
  const scenario = value as Scenario;
  // The shell's check drew the same maps without problems; a problem here means it was skipped.
  const drawn = drawTextMaps(scenario);
  if (drawn.length > 0) return { ok: false, message: `${fileName} ${drawn[0].pointer}: ${drawn[0].message}. Fix it on the Sweep screen.` };
  return { ok: true, scenario };
}

/**
 * Fills `data` in place with the defaults `schema` names, as ajv's useDefaults does. Local
 * `$ref`s ("#/$defs/...") are followed within `root`.
 */
export function fillDefaults(given: Schema, data: unknown, root: Schema = given): void {
  const schema = resolveRef(given, root);
  const properties = isSchema(schema.properties) ? schema.properties : null;
  if (isPlainObject(data)) {
    if (properties) {
      for (const [key, sub] of Object.entries(properties)) {
        // ajv takes a default only from the member's own schema, not from behind a $ref.
        if (data[key] === undefined && isSchema(sub) && 'default' in sub) data[key] = structuredClone(sub.default);
      }
      for (const [key, sub] of Object.entries(properties)) if (data[key] !== undefined && isSchema(sub)) fillDefaults(sub, data[key], root);
    }
    if (isSchema(schema.additionalProperties)) {
      for (const [key, inner] of Object.entries(data)) if (!properties || !(key in properties)) fillDefaults(schema.additionalProperties, inner, root);
    }
  }
  if (Array.isArray(data) && isSchema(schema.items)) for (const item of data) fillDefaults(schema.items, item, root);
  if (isSchema(schema.if)) {
    const branch = satisfies(schema.if, data) ? schema.then : schema.else;
    if (isSchema(branch)) fillDefaults(branch, data, root);
  }
  if (Array.isArray(schema.allOf)) for (const part of schema.allOf) if (isSchema(part)) fillDefaults(part, data, root);
}

function resolveRef(schema: Schema, root: Schema): Schema {
  let current = schema;
  for (let guard = 0; guard < 32 && typeof current.$ref === 'string' && current.$ref.startsWith('#'); guard++) {
    let target: unknown = root;
    for (const token of current.$ref.slice(1).split('/').filter(Boolean)) {
      target = isSchema(target) ? target[decodeURIComponent(token).replace(/~1/g, '/').replace(/~0/g, '~')] : undefined;
    }
    if (!isSchema(target)) throw new RangeError(`the scenario schema's $ref ${current.$ref} names nothing`);
    const { $ref: _followed, ...siblings } = current;
    current = { ...target, ...siblings };
  }
  return current;
}

/** The conditions the scenario schema's `if`s use: a type, const members, required members. */
function satisfies(condition: Schema, data: unknown): boolean {
  if (condition.type !== undefined && !hasType(condition.type as string, data)) return false;
  if (isSchema(condition.properties)) {
    if (isPlainObject(data)) {
      for (const [key, sub] of Object.entries(condition.properties)) {
        if (isSchema(sub) && 'const' in sub && key in data && JSON.stringify(data[key]) !== JSON.stringify(sub.const)) return false;
      }
    }
  }
  if (Array.isArray(condition.required)) {
    if (!isPlainObject(data)) return true; // required constrains objects only
    for (const key of condition.required as string[]) if (!(key in data)) return false;
  }
  return true;
}

function hasType(type: string, data: unknown): boolean {
  switch (type) {
    case 'number':
      return typeof data === 'number';
    case 'integer':
      return typeof data === 'number' && Number.isInteger(data);
    case 'string':
      return typeof data === 'string';
    case 'object':
      return isPlainObject(data);
    case 'array':
      return Array.isArray(data);
    case 'boolean':
      return typeof data === 'boolean';
    case 'null':
      return data === null;
    default:
      return true;
  }
}

function isSchema(value: unknown): value is Schema {
  return typeof value === 'object' && value !== null && !Array.isArray(value);
}

function isPlainObject(value: unknown): value is Record<string, unknown> {
  return typeof value === 'object' && value !== null && !Array.isArray(value);
}
