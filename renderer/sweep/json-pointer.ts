// RFC 6901 JSON pointers: how the form names each field, and how problems from the scenario
// checker find the field they belong to. Splitting a pointer is the scenario checker's own.
import { pointerSegments } from '../../sim/scenario/json-source-map.ts';

export function pointerOf(parent: string, key: string | number): string {
  return `${parent}/${String(key).replace(/~/g, '~0').replace(/\//g, '~1')}`;
}

/** The value at pointer, or undefined when any step is missing. */
export function valueAt(document: unknown, pointer: string): unknown {
  let value = document;
  for (const token of pointerSegments(pointer)) {
    if (value === null || typeof value !== 'object') return undefined;
    value = (value as Record<string, unknown>)[token];
  }
  return value;
}

/** Sets the value at pointer, creating objects on the way; `undefined` deletes the member. */
export function setValueAt(document: Record<string, unknown>, pointer: string, value: unknown): void {
  const tokens = pointerSegments(pointer);
  if (tokens.length === 0) throw new RangeError('cannot replace the whole document through a field');
  let parent: Record<string, unknown> | unknown[] = document;
  for (let i = 0; i < tokens.length - 1; i++) {
    const next: unknown = (parent as Record<string, unknown>)[tokens[i]];
    if (next === null || typeof next !== 'object') {
      const created = {};
      (parent as Record<string, unknown>)[tokens[i]] = created;
      parent = created;
    } else parent = next as Record<string, unknown>;
  }
  const last = tokens[tokens.length - 1];
  if (value === undefined) {
    if (Array.isArray(parent)) parent.splice(Number(last), 1);
    else delete parent[last];
  } else (parent as Record<string, unknown>)[last] = value;
}

/** The pointer and each of its ancestors, nearest first ("/a/b" → "/a/b", "/a", ""). */
export function pointerAncestry(pointer: string): string[] {
  const out = [pointer];
  let p = pointer;
  while (p !== '') {
    p = p.slice(0, p.lastIndexOf('/'));
    out.push(p);
  }
  return out;
}
