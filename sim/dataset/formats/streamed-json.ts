// Writes JSON text laid out exactly as JSON.stringify(value, null, 2) lays it out, while the
// long lists in it (a manifest's episode and file records) are produced one item at a time and
// handed on as text, so a manifest of any size is written without being held in memory.
//
// The layout rule it relies on (ECMA-262, JSON.stringify with a gap of two spaces): a value
// nested d levels deep is its own stringified text with every line break followed by 2·d more
// spaces; JSON text never holds a raw line break inside a string, so that substitution is exact.

/** A JSON array whose items are made only when the array is written. */
export class StreamedList {
  /** `items` is called once per write, so the list can be written again. */
  constructor(readonly items: () => Iterable<unknown>) {}
}

const GAP = '  ';

function isPlainObject(value: unknown): value is Record<string, unknown> {
  if (value === null || typeof value !== 'object' || Array.isArray(value)) return false;
  const prototype = Object.getPrototypeOf(value);
  return (prototype === Object.prototype || prototype === null) && typeof (value as { toJSON?: unknown }).toJSON !== 'function';
}

/** Only objects with a streamed list among their own members are taken apart; all else is stringified whole. */
function holdsStreamedList(value: Record<string, unknown>): boolean {
  for (const key of Object.keys(value)) if (value[key] instanceof StreamedList) return true;
  return false;
}

function nestedText(value: unknown, depth: number): string | undefined {
  const text = JSON.stringify(value, null, 2);
  if (text === undefined || depth === 0) return text;
  return text.replaceAll('\n', `\n${GAP.repeat(depth)}`);
}

/** Writes `value` as JSON.stringify(value, null, 2) would, passing the text to `emit` in pieces. */
export function writeStreamedJson(value: unknown, emit: (text: string) => void): void {
  if (isStreamed(value)) {
    writeStreamed(value, 0, emit);
    return;
  }
  const text = nestedText(value, 0);
  if (text === undefined) throw new TypeError('a value JSON cannot represent (undefined, a function or a symbol) cannot be written as a JSON document');
  emit(text);
}

function isStreamed(value: unknown): value is StreamedList | Record<string, unknown> {
  return value instanceof StreamedList || (isPlainObject(value) && holdsStreamedList(value));
}

function writeStreamed(value: StreamedList | Record<string, unknown>, depth: number, emit: (text: string) => void): void {
  if (value instanceof StreamedList) writeList(value, depth, emit);
  else writeObject(value, depth, emit);
}

function writeList(list: StreamedList, depth: number, emit: (text: string) => void): void {
  const inner = `\n${GAP.repeat(depth + 1)}`;
  let first = true;
  for (const item of list.items()) {
    emit(first ? `[${inner}` : `,${inner}`);
    first = false;
    if (isStreamed(item)) {
      writeStreamed(item, depth + 1, emit);
    } else {
      // JSON.stringify writes array members it cannot represent as null.
      emit(nestedText(item, depth + 1) ?? 'null');
    }
  }
  emit(first ? '[]' : `\n${GAP.repeat(depth)}]`);
}

function writeObject(object: Record<string, unknown>, depth: number, emit: (text: string) => void): void {
  const inner = `\n${GAP.repeat(depth + 1)}`;
  let first = true;
  for (const key of Object.keys(object)) {
    const member = object[key];
    const prefix = `${first ? '{' : ','}${inner}${JSON.stringify(key)}: `;
    if (isStreamed(member)) {
      emit(prefix);
      writeStreamed(member, depth + 1, emit);
    } else {
      const text = nestedText(member, depth + 1);
      // JSON.stringify leaves out members it cannot represent.
      if (text === undefined) continue;
      emit(prefix + text);
    }
    first = false;
  }
  emit(first ? '{}' : `\n${GAP.repeat(depth)}}`);
}
