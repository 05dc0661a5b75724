// Reads the scenario JSON Schema the way the form needs it: resolves $ref, merges the branch of
// an if/then/else or oneOf that applies to the current value, and sorts each place into one kind
// of editor. Anything the form has no editor for becomes a small JSON text box, so every valid
// scenario stays editable.

export type SchemaObject = { [keyword: string]: unknown };

export type FieldKind =
  | { kind: 'value-spec'; integer: boolean; distributionKinds: string[] }
  | { kind: 'enum'; values: (string | number | boolean | null)[] }
  | { kind: 'const'; value: unknown }
  | { kind: 'boolean' }
  | { kind: 'number'; integer: boolean }
  | { kind: 'string'; multiline: boolean }
  | { kind: 'object'; properties: Record<string, SchemaObject>; required: string[]; discriminator: DiscriminatorInfo | null }
  | { kind: 'record'; valueSchema: SchemaObject }
  | { kind: 'array'; itemSchema: SchemaObject; fixedLength: number | null }
  | { kind: 'variants'; variants: VariantInfo[] }
  | { kind: 'scalar'; types: string[] }
  | { kind: 'json' };

/** An object whose "kind" member (or other const member) picks which members it has. */
export interface DiscriminatorInfo {
  key: string;
  values: string[];
}

export interface VariantInfo {
  label: string;
  schema: SchemaObject;
}

const isObject = (v: unknown): v is SchemaObject => typeof v === 'object' && v !== null && !Array.isArray(v);

export class SchemaReader {
  constructor(readonly root: SchemaObject) {}

  /** Follows local $refs ("#/$defs/name") to the schema they name. */
  resolve(schema: unknown): SchemaObject {
    let current: SchemaObject = isObject(schema) ? schema : {};
    for (let guard = 0; guard < 32 && typeof current.$ref === 'string'; guard++) {
      const ref = current.$ref as string;
      if (!ref.startsWith('#')) break;
      let target: unknown = this.root;
      for (const token of ref.slice(1).split('/').filter(Boolean)) {
        target = isObject(target) ? target[decodeURIComponent(token).replace(/~1/g, '/').replace(/~0/g, '~')] : undefined;
      }
      const { $ref: _ignored, ...rest } = current;
      current = { ...(isObject(target) ? target : {}), ...rest };
    }
    return current;
  }

  /** The schema as it applies to `value`: $ref resolved, matching if/then/else and allOf branches merged in. */
  effective(schema: unknown, value: unknown): SchemaObject {
    let s = this.resolve(schema);
    if (isObject(s.if)) {
      const branch = this.matches(s.if, value) ? s.then : s.else;
      const { if: _i, then: _t, else: _e, ...rest } = s;
      s = merge(rest, this.effective(branch, value));
    }
    if (Array.isArray(s.allOf)) {
      const { allOf, ...rest } = s;
      s = rest;
      for (const part of allOf) s = merge(s, this.effective(part, value));
    }
    return s;
  }

  classify(schema: unknown, value: unknown): FieldKind {
    const raw = this.resolve(schema);
    if (isValueSpec(raw)) {
      const kinds = this.distributionKinds(raw);
      const constant = isObject(raw.then) ? raw.then : {};
      return { kind: 'value-spec', integer: constant.type === 'integer', distributionKinds: kinds };
    }
    // "if it has member X then this form, else that one" is a choice between two forms.
    if (isObject(raw.if) && Array.isArray(raw.if.required) && !('type' in raw.if) && !hasConstMember(raw.if.properties) && isObject(raw.then) && isObject(raw.else)) {
      return { kind: 'variants', variants: [raw.then, raw.else].map((v, i) => ({ label: this.variantLabel(v, i), schema: this.resolve(v) })) };
    }
    const variants = raw.oneOf ?? raw.anyOf;
    if (Array.isArray(variants)) {
      return { kind: 'variants', variants: variants.map((v, i) => ({ label: this.variantLabel(v, i), schema: this.resolve(v) })) };
    }
    const rawTypes = typeList(raw);
    if (rawTypes.length > 1 && !rawTypes.includes('object') && !rawTypes.includes('array')) return { kind: 'scalar', types: rawTypes };
    // "A word, an object or a whole number", told apart by type (sub-steps: "auto", {"accuracy": ε}
    // or a count): a choice between forms, so each can be picked, not only the one written.
    const byType = this.typeBranches(raw, rawTypes);
    if (byType.length > 1) return { kind: 'variants', variants: byType };
    const s = this.effective(raw, value);
    if ('const' in s) return { kind: 'const', value: s.const };
    if (Array.isArray(s.enum)) return { kind: 'enum', values: s.enum as (string | number | boolean | null)[] };
    const types = typeList(s);
    if (types.length === 1 || (types.length === 0 && isObject(s.properties))) {
      const type = types[0] ?? 'object';
      if (type === 'boolean') return { kind: 'boolean' };
      if (type === 'number' || type === 'integer') return { kind: 'number', integer: type === 'integer' };
      if (type === 'string') return { kind: 'string', multiline: (s.maxLength as number | undefined ?? 1000) > 200 };
      if (type === 'object' && isObject(s.properties)) {
        return {
          kind: 'object',
          properties: Object.fromEntries(Object.entries(s.properties).map(([k, v]) => [k, v as SchemaObject])),
          required: Array.isArray(s.required) ? (s.required as string[]) : [],
          discriminator: this.discriminator(raw, s),
        };
      }
      if (type === 'object' && isObject(s.additionalProperties)) return { kind: 'record', valueSchema: s.additionalProperties };
      if (type === 'array' && isObject(s.items ?? s.prefixItems)) {
        const fixed = typeof s.minItems === 'number' && s.minItems === s.maxItems ? s.minItems : null;
        return { kind: 'array', itemSchema: (s.items ?? s.prefixItems) as SchemaObject, fixedLength: fixed };
      }
    }
    return { kind: 'json' };
  }

  /** The forms of an if/then/else chain on `type` over a union of types, each with its type fixed. */
  private typeBranches(raw: SchemaObject, types: string[]): VariantInfo[] {
    if (types.length < 2) return [];
    const out: VariantInfo[] = [];
    const left = new Set(types);
    let node: SchemaObject = raw;
    for (let guard = 0; guard < 8 && isObject(node.if) && typeof node.if.type === 'string' && isObject(node.then); guard++) {
      const type = node.if.type;
      out.push(this.typedVariant(type, node.then));
      left.delete(type);
      if (!isObject(node.else)) return [];
      node = node.else;
    }
    if (out.length === 0) return [];
    // What is left after the last `if` is the form of the one remaining type.
    if (left.size === 1) out.push(this.typedVariant([...left][0], node));
    return out;
  }

  private typedVariant(type: string, branch: unknown): VariantInfo {
    const schema: SchemaObject = { ...this.resolve(branch), type };
    if (Array.isArray(schema.enum) && schema.enum.length === 1) return { label: String(schema.enum[0]), schema };
    if (type === 'integer' || type === 'number') return { label: type === 'integer' ? 'a whole number' : 'a number', schema };
    return { label: this.variantLabel(schema, 0), schema };
  }

  /** A starting value for a newly added member or a newly picked variant. */
  defaultValue(schema: unknown): unknown {
    const s = this.resolve(schema);
    if ('default' in s) return structuredClone(s.default);
    if ('const' in s) return s.const;
    if (Array.isArray(s.enum)) return s.enum[0];
    if (isValueSpec(s)) return typeof s.then === 'object' && isObject(s.then) ? lowestAllowed(s.then) : 0;
    const variants = s.oneOf ?? s.anyOf;
    if (Array.isArray(variants) && variants.length > 0) return this.defaultValue(variants[0]);
    const types = typeList(s);
    const type = types[0] ?? (isObject(s.properties) ? 'object' : undefined);
    if (type === 'object') {
      const out: Record<string, unknown> = {};
      const properties = isObject(s.properties) ? s.properties : {};
      const required = Array.isArray(s.required) ? (s.required as string[]) : [];
      for (const key of required) out[key] = this.defaultValue(properties[key]);
      return out;
    }
    if (type === 'array') {
      const count = typeof s.minItems === 'number' ? s.minItems : 0;
      return Array.from({ length: count }, () => this.defaultValue(s.items));
    }
    if (type === 'number' || type === 'integer') return lowestAllowed(s);
    if (type === 'boolean') return false;
    if (type === 'string') return '';
    if (type === 'null') return null;
    return null;
  }

  /** Index of the variant `value` is written in: the first whose consts and required members it has. */
  matchingVariant(variants: VariantInfo[], value: unknown): number {
    const index = variants.findIndex((v) => this.matches(v.schema, value));
    return index < 0 ? 0 : index;
  }

  private matches(condition: SchemaObject, value: unknown): boolean {
    if (condition.type === 'number') return typeof value === 'number';
    if (condition.type === 'integer') return typeof value === 'number' && Number.isInteger(value);
    if (condition.type === 'string') return typeof value === 'string';
    if (isObject(condition.properties)) {
      if (!isObject(value)) return false;
      for (const [key, sub] of Object.entries(condition.properties)) {
        if (isObject(sub) && 'const' in sub && value[key] !== sub.const) return false;
      }
      const required = Array.isArray(condition.required) ? (condition.required as string[]) : [];
      return required.every((k) => k in value);
    }
    if (Array.isArray(condition.required)) return isObject(value) && (condition.required as string[]).every((k) => k in value);
    return true;
  }

  private discriminator(raw: SchemaObject, merged: SchemaObject): DiscriminatorInfo | null {
    const properties = isObject(merged.properties) ? merged.properties : {};
    for (const [key, sub] of Object.entries(properties)) {
      const resolved = this.resolve(sub);
      if (Array.isArray(resolved.enum) && hasBranchesOn(raw, key)) return { key, values: resolved.enum.map(String) };
    }
    // Branches given only as allOf of if/then on a const member.
    for (const key of ['kind']) {
      const values = branchValues(raw, key);
      if (values.length > 0) return { key, values };
    }
    return null;
  }

  private distributionKinds(valueSpec: SchemaObject): string[] {
    const otherwise = distributionBranch(valueSpec) ?? {};
    const kind = isObject(otherwise.properties) && isObject(otherwise.properties.kind) ? otherwise.properties.kind : {};
    return Array.isArray(kind.enum) ? kind.enum.map(String) : [];
  }

  private variantLabel(variant: unknown, index: number): string {
    const s = this.resolve(variant);
    if (typeof s.title === 'string') return s.title;
    if (typeof s.description === 'string' && s.description.length <= 40) return s.description.replace(/\.$/, '');
    const properties = isObject(s.properties) ? s.properties : {};
    for (const [key, sub] of Object.entries(properties)) {
      if (isObject(sub) && 'const' in sub) return `${key}: ${String(sub.const)}`;
    }
    if (Array.isArray(s.required) && s.required.length > 0) return `with ${(s.required as string[]).join(', ')}`;
    const types = typeList(s);
    return types.length > 0 ? types.join(' or ') : `form ${index + 1}`;
  }
}

/**
 * A value spec is "a number, or an object with a kind" (sim/random/value-spec-schema.ts): an
 * if/then/else on `type: number` whose else names the distribution kinds.
 */
function isValueSpec(s: SchemaObject): boolean {
  if (!isObject(s.if) || s.if.type !== 'number') return false;
  return distributionBranch(s) !== null;
}

/** The branch naming the distribution kinds: the value spec's else, past its {"ref"} and {"expr"} forms. */
function distributionBranch(s: SchemaObject): SchemaObject | null {
  let node: unknown = s.else;
  for (let depth = 0; depth < 4 && isObject(node); depth++) {
    const properties = node.properties;
    if (isObject(properties) && isObject(properties.kind) && Array.isArray(properties.kind.enum)) return node;
    node = node.else;
  }
  return null;
}

/** True when some member's schema fixes its value (`const`): then the if tells kinds apart, not forms. */
function hasConstMember(properties: unknown): boolean {
  return isObject(properties) && Object.values(properties).some((p) => isObject(p) && 'const' in p);
}

function typeList(s: SchemaObject): string[] {
  if (typeof s.type === 'string') return [s.type];
  return Array.isArray(s.type) ? (s.type as string[]) : [];
}

function lowestAllowed(s: SchemaObject): number {
  if (typeof s.default === 'number') return s.default;
  if (typeof s.minimum === 'number') return s.minimum;
  if (typeof s.exclusiveMinimum === 'number') return s.exclusiveMinimum + (s.type === 'integer' ? 1 : 1e-3);
  return 0;
}

function merge(a: SchemaObject, b: SchemaObject): SchemaObject {
  const out: SchemaObject = { ...a, ...b };
  if (isObject(a.properties) || isObject(b.properties)) {
    out.properties = { ...(isObject(a.properties) ? a.properties : {}), ...(isObject(b.properties) ? b.properties : {}) };
  }
  if (Array.isArray(a.required) || Array.isArray(b.required)) {
    out.required = [...new Set([...((a.required as string[]) ?? []), ...((b.required as string[]) ?? [])])];
  }
  return out;
}

function hasBranchesOn(s: SchemaObject, key: string): boolean {
  return branchValues(s, key).length > 0;
}

function branchValues(s: SchemaObject, key: string): string[] {
  const values: string[] = [];
  const visit = (node: unknown): void => {
    if (!isObject(node)) return;
    if (isObject(node.if) && isObject(node.if.properties)) {
      const sub = node.if.properties[key];
      if (isObject(sub) && 'const' in sub) values.push(String(sub.const));
    }
    if (Array.isArray(node.allOf)) node.allOf.forEach(visit);
    visit(node.else);
  };
  visit(s);
  return values;
}
