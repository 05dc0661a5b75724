// The distribution checks the schema cannot express (min ≤ max, weights matching values, a
// positive log-uniform range), run on the parts of a scenario that are well formed while other
// parts still break the schema. Without this a person fixing a file would see a reversed range
// only after every schema problem was gone; now every problem is listed at once. The walk
// follows the schema beside the value and checks each place that is a value spec (a $ref to a
// shared valueSpec-* definition) whose value no schema problem lies at or under.
import { findValueSpecProblems } from '../random/value-spec-problems.ts';
import { isLinkedValue } from './linked-parameters.ts';
import type { ScenarioProblem } from './scenario-problem.ts';
import { SCENARIO_SCHEMA } from './scenario-schema.ts';

type Node = Record<string, unknown>;

const VALUE_SPEC_REF = /^#\/\$defs\/valueSpec(?:-|$)/;
const isNode = (v: unknown): v is Node => typeof v === 'object' && v !== null && !Array.isArray(v);
const pointerOfSegments = (segments: readonly string[]): string => segments.map((s) => `/${s.replace(/~/g, '~0').replace(/\//g, '~1')}`).join('');

/** Range problems of the well-formed value specs in `value`, a document `schemaProblems` were found in. */
export function findRangeProblemsBesideSchema(value: unknown, schemaProblems: readonly ScenarioProblem[]): ScenarioProblem[] {
  const broken = schemaProblems.map((p) => p.pointer);
  // Only problems in the value spec itself make it unfit to judge; one at an ancestor (a missing
  // sibling member, say) says nothing about this spec, which is checked on its own.
  const touchesProblem = (pointer: string): boolean => broken.some((p) => p === pointer || p.startsWith(`${pointer}/`));
  const found = new Map<string, ScenarioProblem[]>();

  const visit = (schema: unknown, instance: unknown, segments: string[], depth: number): void => {
    if (!isNode(schema) || depth > 64) return;
    const pointer = pointerOfSegments(segments);
    const ref = typeof schema.$ref === 'string' ? schema.$ref : '';
    if (VALUE_SPEC_REF.test(ref)) {
      // Only distributions: a plain number is fully judged by the schema, and a {"ref"} or
      // {"expr"} of the named parameters by linked-parameters.ts.
      if (!isNode(instance) || isLinkedValue(instance) || found.has(pointer) || touchesProblem(pointer)) return;
      found.set(pointer, findValueSpecProblems(instance, pointer).map((p) => ({ pointer: p.pointer, message: `${p.message}; ${p.fix}` })));
      return;
    }
    if (ref.startsWith('#/$defs/')) visit((SCENARIO_SCHEMA.$defs as Node)[ref.slice('#/$defs/'.length)], instance, segments, depth + 1);
    for (const keyword of ['allOf', 'anyOf', 'oneOf']) {
      const parts = schema[keyword];
      if (Array.isArray(parts)) for (const part of parts) visit(part, instance, segments, depth + 1);
    }
    // Both branches: a value spec sits only where the value is one, so the wrong branch finds none.
    visit(schema.then, instance, segments, depth + 1);
    visit(schema.else, instance, segments, depth + 1);
    if (isNode(instance)) {
      const properties = isNode(schema.properties) ? schema.properties : {};
      for (const [key, member] of Object.entries(instance)) {
        if (key in properties) visit(properties[key], member, [...segments, key], depth + 1);
        else if (isNode(schema.additionalProperties)) visit(schema.additionalProperties, member, [...segments, key], depth + 1);
      }
    } else if (Array.isArray(instance)) {
      const prefix = Array.isArray(schema.prefixItems) ? schema.prefixItems : [];
      instance.forEach((item, i) => visit(i < prefix.length ? prefix[i] : schema.items, item, [...segments, String(i)], depth + 1));
    }
  };

  visit(SCENARIO_SCHEMA, value, [], 0);
  return [...found.values()].flat();
}
