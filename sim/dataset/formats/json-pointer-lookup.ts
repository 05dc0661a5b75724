// Finds the value a JSON pointer (RFC 6901) names inside a parsed JSON document: the card looks
// up, for each sampled label, the distribution the scenario gave at that place.

/** The value at `pointer`, or undefined when the document has nothing there. */
export function valueAtPointer(document: unknown, pointer: string): unknown {
  if (pointer === '') return document;
  if (!pointer.startsWith('/')) return undefined;
  let node: unknown = document;
  for (const raw of pointer.slice(1).split('/')) {
    const key = raw.replace(/~1/g, '/').replace(/~0/g, '~');
    if (Array.isArray(node)) {
      if (!/^(0|[1-9][0-9]*)$/.test(key)) return undefined;
      node = node[Number(key)];
    } else if (node !== null && typeof node === 'object' && Object.prototype.hasOwnProperty.call(node, key)) {
      node = (node as Record<string, unknown>)[key];
    } else {
      return undefined;
    }
    if (node === undefined) return undefined;
  }
  return node;
}
