// Reads scenario text with a parser that keeps offsets (jsonc-parser in strict JSON mode: no
// comments, no trailing commas), so every problem found on the parsed value can be shown at its
// line and column; and turns the parser's own syntax errors into plain words at their place.
import type { Node as JsonNode, ParseError } from 'jsonc-parser';
import { parseTree, printParseErrorCode } from 'jsonc-parser';

import type { ScenarioProblem } from './scenario-problem.ts';

export interface SourcePosition {
  line: number;
  column: number;
}

export interface JsonSourceMap {
  /** Where the value at `pointer` is written: the member's key for object members, else the value. */
  positionOf(pointer: string): SourcePosition;
}

export type ParsedJsonText = { ok: true; value: unknown; sourceMap: JsonSourceMap } | { ok: false; problems: ScenarioProblem[] };

const SYNTAX_WORDS: Record<string, string> = {
  InvalidSymbol: 'unexpected character; JSON allows only objects, arrays, "strings", numbers, true, false and null',
  InvalidNumberFormat: 'malformed number; write numbers like 12, -0.5 or 2.5e-3 (no leading zeros, no trailing dot)',
  PropertyNameExpected: 'expected a key in double quotes, like "name"; a trailing comma before } is not allowed in JSON',
  ValueExpected: 'expected a value; a trailing comma before ] or } is not allowed in JSON',
  ColonExpected: 'expected ":" between a key and its value',
  CommaExpected: 'expected "," between two members or items',
  CloseBraceExpected: 'expected "}" to close the object opened earlier',
  CloseBracketExpected: 'expected "]" to close the array opened earlier',
  EndOfFileExpected: 'unexpected text after the end of the JSON document',
  InvalidCommentToken: 'comments are not allowed in a scenario file (it is plain JSON); use the "description" member instead',
  UnexpectedEndOfComment: 'unterminated comment; comments are not allowed in a scenario file',
  UnexpectedEndOfString: 'unterminated string; close it with a double quote on the same line',
  UnexpectedEndOfNumber: 'number ends unexpectedly; write digits after the dot or exponent',
  InvalidUnicode: 'invalid \\u escape; write four hexadecimal digits, like \\u00e9',
  InvalidEscapeCharacter: 'invalid escape in a string; only \\" \\\\ \\/ \\b \\f \\n \\r \\t and \\uXXXX are allowed',
  InvalidCharacter: 'control character inside a string; write it as an escape such as \\n or \\t',
};

/**
 * Deepest nesting of objects and arrays read. Scenarios and the files beside them nest a few
 * levels; the offset parser and the duplicate-key walk recurse, so thousands of levels would
 * overflow the stack instead of getting a message.
 */
export const MAX_JSON_DEPTH = 100;

const BYTE_ORDER_MARK = '\uFEFF';

/** Offset of the bracket that opens level MAX_JSON_DEPTH + 1, or -1; strings are skipped. */
function tooDeepAt(text: string): number {
  let depth = 0;
  let inString = false;
  for (let i = 0; i < text.length; i++) {
    const c = text.charCodeAt(i);
    if (inString) {
      if (c === 0x5c) i += 1;
      else if (c === 0x22) inString = false;
    } else if (c === 0x22) inString = true;
    else if (c === 0x7b || c === 0x5b) {
      depth += 1;
      if (depth > MAX_JSON_DEPTH) return i;
    } else if (c === 0x7d || c === 0x5d) depth -= 1;
  }
  return -1;
}

/** Parses JSON text; the first syntax error (later ones are usually its echoes) or duplicate keys make it fail. */
export function parseJsonText(rawText: string, fileName = 'the file'): ParsedJsonText {
  // Some editors start UTF-8 files with a byte-order mark; it is not part of the JSON (RFC 8259
  // §8.1 lets parsers ignore it), so it is dropped. Columns on line 1 are then off by one
  // invisible character, which no one can see.
  const text = rawText.startsWith(BYTE_ORDER_MARK) ? rawText.slice(1) : rawText;
  const lineStarts = lineStartOffsets(text);
  const at = (offset: number): SourcePosition => offsetToPosition(lineStarts, offset);
  const deep = tooDeepAt(text);
  if (deep !== -1) {
    return { ok: false, problems: [{ pointer: '', message: `JSON nesting: more than ${MAX_JSON_DEPTH} levels of objects and arrays; ${fileName} cannot be a scenario or measurement file of Pliant's (they nest a few levels), check that it is the file you meant`, ...at(deep) }] };
  }
  const errors: ParseError[] = [];
  const root = parseTree(text, errors, { disallowComments: true, allowTrailingComma: false, allowEmptyContent: false });
  if (errors.length > 0 || root === undefined) {
    const first = errors[0];
    const position = first ? at(first.offset) : at(0);
    const name = first ? printParseErrorCode(first.error) : 'ValueExpected';
    const words = text.trim() === '' ? `${fileName} is empty; a scenario is a JSON object {...}` : (SYNTAX_WORDS[name] ?? `JSON syntax error (${name})`);
    return { ok: false, problems: [{ pointer: '', message: `JSON syntax: ${words}`, ...position }] };
  }
  const duplicates: ScenarioProblem[] = [];
  findDuplicateKeys(root, '', duplicates, at);
  if (duplicates.length > 0) return { ok: false, problems: duplicates };
  let value: unknown;
  try {
    value = JSON.parse(text);
  } catch (error) {
    // The offset parser accepted it, so this is one of the rare texts the two read differently.
    return { ok: false, problems: [{ pointer: '', message: `JSON syntax: ${(error as Error).message}`, line: 1, column: 1 }] };
  }
  return { ok: true, value, sourceMap: { positionOf: (pointer) => at(offsetOfPointer(root, pointer)) } };
}

/** Adds line and column to every problem the map can place. */
export function placeProblems(problems: readonly ScenarioProblem[], sourceMap: JsonSourceMap): ScenarioProblem[] {
  return problems.map((p) => ({ ...p, ...sourceMap.positionOf(p.pointer) }));
}

/** The segments of an RFC 6901 pointer, unescaped. */
export function pointerSegments(pointer: string): string[] {
  if (pointer === '') return [];
  return pointer
    .slice(1)
    .split('/')
    .map((s) => s.replace(/~1/g, '/').replace(/~0/g, '~'));
}

function offsetOfPointer(root: JsonNode, pointer: string): number {
  let node = root;
  let offset = root.offset;
  for (const segment of pointerSegments(pointer)) {
    const next = childNode(node, segment);
    // A pointer past what exists (a missing member) is shown at the deepest part that exists.
    if (next === undefined) return offset;
    node = next.value;
    offset = next.keyOffset ?? node.offset;
  }
  return offset;
}

function childNode(node: JsonNode, segment: string): { value: JsonNode; keyOffset?: number } | undefined {
  if (node.type === 'object') {
    // The last of duplicate keys wins in JSON.parse; duplicates are refused before this is used.
    for (const property of node.children ?? []) {
      const [key, value] = property.children ?? [];
      if (key?.value === segment && value !== undefined) return { value, keyOffset: key.offset };
    }
    return undefined;
  }
  if (node.type === 'array' && /^(0|[1-9][0-9]*)$/.test(segment)) {
    const item = node.children?.[Number(segment)];
    return item === undefined ? undefined : { value: item };
  }
  return undefined;
}

function findDuplicateKeys(node: JsonNode, pointer: string, out: ScenarioProblem[], at: (offset: number) => SourcePosition): void {
  if (node.type === 'object') {
    const seen = new Map<string, JsonNode>();
    for (const property of node.children ?? []) {
      const [key, value] = property.children ?? [];
      if (key === undefined) continue;
      const name = String(key.value);
      const childPointer = `${pointer}/${name.replace(/~/g, '~0').replace(/\//g, '~1')}`;
      const earlier = seen.get(name);
      if (earlier !== undefined) {
        const first = at(earlier.offset);
        out.push({
          pointer: childPointer,
          message: `duplicate key "${name}" (first written at line ${first.line}, column ${first.column}); keep only one of them`,
          ...at(key.offset),
        });
      } else {
        seen.set(name, key);
      }
      if (value !== undefined) findDuplicateKeys(value, childPointer, out, at);
    }
  } else if (node.type === 'array') {
    (node.children ?? []).forEach((item, i) => findDuplicateKeys(item, `${pointer}/${i}`, out, at));
  }
}

function lineStartOffsets(text: string): number[] {
  const starts = [0];
  for (let i = 0; i < text.length; i++) {
    const c = text.charCodeAt(i);
    if (c === 10) starts.push(i + 1);
    else if (c === 13) {
      if (text.charCodeAt(i + 1) === 10) i++;
      starts.push(i + 1);
    }
  }
  return starts;
}

function offsetToPosition(lineStarts: readonly number[], offset: number): SourcePosition {
  let low = 0;
  let high = lineStarts.length - 1;
  while (low < high) {
    const mid = (low + high + 1) >> 1;
    if (lineStarts[mid] <= offset) low = mid;
    else high = mid - 1;
  }
  return { line: low + 1, column: offset - lineStarts[low] + 1 };
}
