// Reads one JSON document of any size from a byte source without ever holding it as one string
// (V8 cannot make a string longer than about 2^29 characters, so a 600 MB manifest cannot be
// read with readFile + JSON.parse). The caller says which containers to walk into; every other
// value is collected whole — bounded in size and nesting depth — and parsed by JSON.parse, so
// what is accepted is exactly JSON (RFC 8259). Values come out one at a time as the scanner
// reaches them, in document order, with their path from the root.
//
// Scanning works on bytes: every structural character of JSON is ASCII, and no byte of a
// multi-byte UTF-8 sequence is below 0x80, so a byte-wise scan never splits a character wrongly.
import { PliantError } from '../../errors/pliant-error.ts';

export type JsonPath = readonly (string | number)[];

export type JsonStreamEvent =
  /** A value collected whole at `path`. */
  | { kind: 'value'; path: JsonPath; value: unknown; line: number }
  /** A walked object or array at `path` opened. */
  | { kind: 'open'; path: JsonPath; container: 'object' | 'array'; line: number }
  /** A walked object or array at `path` closed. */
  | { kind: 'close'; path: JsonPath; line: number };

export interface ByteSource {
  /** Fills `into` from the start with the next bytes; 0 at the end. */
  read(into: Uint8Array): number;
}

export interface JsonStreamLimits {
  /** Largest value collected whole, in bytes of JSON text. */
  maxValueBytes: number;
  /** Deepest nesting inside a collected value (JSON.parse recurses; deep input would overflow its stack). */
  maxDepth: number;
}

/** Malformed or over-limit input; `line` is 1-based. */
export class JsonStreamError extends PliantError {
  constructor(readonly line: number, readonly problem: string) {
    super('environment', 'json-damaged', `line ${line}: ${problem}`);
    this.name = 'JsonStreamError';
  }
}

const CHUNK_BYTES = 1 << 20;
const QUOTE = 0x22;
const BACKSLASH = 0x5c;
const NEWLINE = 0x0a;

function isSpace(b: number): boolean {
  return b === 0x20 || b === 0x0a || b === 0x09 || b === 0x0d;
}

function isOpen(b: number): boolean {
  return b === 0x7b || b === 0x5b;
}

function shown(b: number): string {
  if (b < 0) return 'the end of the file';
  if (b >= 0x20 && b < 0x7f) return `'${String.fromCharCode(b)}'`;
  return `the byte 0x${b.toString(16).padStart(2, '0')}`;
}

class ByteCursor {
  chunk = new Uint8Array(CHUNK_BYTES);
  pos = 0;
  end = 0;
  line = 1;
  private done = false;

  constructor(private readonly source: ByteSource) {}

  /** The next byte without taking it, -1 at the end. */
  peek(): number {
    if (this.pos < this.end) return this.chunk[this.pos];
    return this.refill() ? this.chunk[this.pos] : -1;
  }

  refill(): boolean {
    if (this.done) return false;
    this.end = this.source.read(this.chunk);
    this.pos = 0;
    if (this.end === 0) this.done = true;
    return this.end > 0;
  }

  skipSpace(): number {
    for (;;) {
      while (this.pos < this.end) {
        const b = this.chunk[this.pos];
        if (!isSpace(b)) return b;
        if (b === NEWLINE) this.line++;
        this.pos++;
      }
      if (!this.refill()) return -1;
    }
  }
}

/** Growable byte buffer for one collected value. */
class ValueBytes {
  private bytes = new Uint8Array(4096);
  length = 0;

  constructor(private readonly maxBytes: number, private readonly startLine: number) {}

  append(from: Uint8Array, start: number, end: number): void {
    const needed = this.length + (end - start);
    if (needed > this.maxBytes) {
      throw new JsonStreamError(this.startLine, `a value starting here is longer than ${this.maxBytes} bytes, more than Pliant reads as one piece`);
    }
    if (needed > this.bytes.length) {
      const grown = new Uint8Array(Math.min(this.maxBytes, Math.max(needed, this.bytes.length * 2)));
      grown.set(this.bytes.subarray(0, this.length));
      this.bytes = grown;
    }
    this.bytes.set(from.subarray(start, end), this.length);
    this.length = needed;
  }

  view(): Uint8Array {
    return this.bytes.subarray(0, this.length);
  }
}

const decoder = new TextDecoder('utf-8', { fatal: true });

/**
 * Walks the document in `source`: containers for which `walk(path)` is true are walked (their
 * members reported one by one), everything else is collected whole.
 */
export function* scanJsonStream(source: ByteSource, walk: (path: JsonPath) => boolean, limits: JsonStreamLimits): Generator<JsonStreamEvent> {
  const cursor = new ByteCursor(source);
  // RFC 8259 §8.1: a parser may ignore a byte-order mark; Pliant never writes one.
  if (cursor.peek() === 0xef && cursor.end - cursor.pos >= 3 && cursor.chunk[cursor.pos + 1] === 0xbb && cursor.chunk[cursor.pos + 2] === 0xbf) cursor.pos += 3;
  if (cursor.skipSpace() < 0) throw new JsonStreamError(cursor.line, 'the file is empty; a JSON document was expected');
  yield* valueAt(cursor, [], walk, limits);
  const after = cursor.skipSpace();
  if (after >= 0) throw new JsonStreamError(cursor.line, `unexpected ${shown(after)} after the end of the JSON document`);
}

function* valueAt(cursor: ByteCursor, path: JsonPath, walk: (path: JsonPath) => boolean, limits: JsonStreamLimits): Generator<JsonStreamEvent> {
  const first = cursor.skipSpace();
  if (first < 0) throw new JsonStreamError(cursor.line, 'the file ends where a value was expected');
  if (isOpen(first) && walk(path)) {
    if (first === 0x7b) yield* walkObject(cursor, path, walk, limits);
    else yield* walkArray(cursor, path, walk, limits);
    return;
  }
  const line = cursor.line;
  yield { kind: 'value', path, value: collect(cursor, limits), line };
}

function* walkObject(cursor: ByteCursor, path: JsonPath, walk: (path: JsonPath) => boolean, limits: JsonStreamLimits): Generator<JsonStreamEvent> {
  yield { kind: 'open', path, container: 'object', line: cursor.line };
  cursor.pos++;
  let b = cursor.skipSpace();
  if (b === 0x7d) {
    cursor.pos++;
    yield { kind: 'close', path, line: cursor.line };
    return;
  }
  for (;;) {
    if (b !== QUOTE) throw new JsonStreamError(cursor.line, `expected a member name in double quotes, found ${shown(b)}`);
    const key = collect(cursor, limits) as string;
    b = cursor.skipSpace();
    if (b !== 0x3a) throw new JsonStreamError(cursor.line, `expected ':' after the member name "${key}", found ${shown(b)}`);
    cursor.pos++;
    yield* valueAt(cursor, [...path, key], walk, limits);
    b = cursor.skipSpace();
    if (b === 0x2c) {
      cursor.pos++;
      b = cursor.skipSpace();
      continue;
    }
    if (b === 0x7d) {
      cursor.pos++;
      yield { kind: 'close', path, line: cursor.line };
      return;
    }
    throw new JsonStreamError(cursor.line, `expected ',' or '}' after the member "${key}", found ${shown(b)}`);
  }
}

function* walkArray(cursor: ByteCursor, path: JsonPath, walk: (path: JsonPath) => boolean, limits: JsonStreamLimits): Generator<JsonStreamEvent> {
  yield { kind: 'open', path, container: 'array', line: cursor.line };
  cursor.pos++;
  let b = cursor.skipSpace();
  if (b === 0x5d) {
    cursor.pos++;
    yield { kind: 'close', path, line: cursor.line };
    return;
  }
  for (let index = 0; ; index++) {
    yield* valueAt(cursor, [...path, index], walk, limits);
    b = cursor.skipSpace();
    if (b === 0x2c) {
      cursor.pos++;
      continue;
    }
    if (b === 0x5d) {
      cursor.pos++;
      yield { kind: 'close', path, line: cursor.line };
      return;
    }
    throw new JsonStreamError(cursor.line, `expected ',' or ']' after item ${index}, found ${shown(b)}`);
  }
}

/** Counts the backslashes that end at `before - 1`, not looking before `from`. */
function backslashesBefore(chunk: Uint8Array, before: number, from: number): number {
  let k = before - 1;
  while (k >= from && chunk[k] === BACKSLASH) k--;
  return before - 1 - k;
}

/** Takes one whole value (string, number, literal, object or array) from the cursor and parses it. */
function collect(cursor: ByteCursor, limits: JsonStreamLimits): unknown {
  const startLine = cursor.line;
  // Made only when the value crosses a chunk boundary; most values lie inside one chunk and are decoded in place.
  let bytes: ValueBytes | null = null;
  let inPlace: Uint8Array | null = null;
  const first = cursor.peek();
  const scalar = first !== QUOTE && !isOpen(first);
  const maxDepth = limits.maxDepth;
  let depth = 0;
  let inString = false;
  // The first byte of the next chunk is escaped (the last one ended in an unpaired backslash).
  let escaped = false;
  let finished = false;
  let lines = 0;
  while (!finished) {
    const { chunk, end } = cursor;
    let i = cursor.pos;
    const start = i;
    while (i < end) {
      if (inString) {
        // Jump to the next quote; it closes the string unless an odd run of backslashes precedes it.
        const quote = chunk.indexOf(QUOTE, i);
        if (quote < 0) {
          const run = backslashesBefore(chunk, end, i);
          escaped = run === end - i ? ((escaped ? 1 : 0) + run) % 2 === 1 : run % 2 === 1;
          i = end;
          break;
        }
        const run = backslashesBefore(chunk, quote, i);
        const quoteEscaped = (run === quote - i ? (escaped ? 1 : 0) + run : run) % 2 === 1;
        escaped = false;
        i = quote + 1;
        if (quoteEscaped) continue;
        inString = false;
        if (depth === 0) {
          finished = true;
          break;
        }
        continue;
      }
      const b = chunk[i];
      if (scalar) {
        if (b === 0x20 || b === NEWLINE || b === 0x09 || b === 0x0d || b === 0x2c || b === 0x7d || b === 0x5d) {
          finished = true;
          break;
        }
        i++;
        continue;
      }
      i++;
      if (b === QUOTE) inString = true;
      else if (b === NEWLINE) lines++;
      else if (b === 0x7b || b === 0x5b) {
        depth++;
        if (depth > maxDepth) throw new JsonStreamError(cursor.line + lines, `a value starting on line ${startLine} is nested more than ${maxDepth} levels deep`);
      } else if (b === 0x7d || b === 0x5d) {
        depth--;
        if (depth === 0) {
          finished = true;
          break;
        }
      }
    }
    if (finished && bytes === null) {
      if (i - start > limits.maxValueBytes) throw new JsonStreamError(startLine, `a value starting here is longer than ${limits.maxValueBytes} bytes, more than Pliant reads as one piece`);
      inPlace = chunk.subarray(start, i);
    } else {
      bytes ??= new ValueBytes(limits.maxValueBytes, startLine);
      bytes.append(chunk, start, i);
    }
    cursor.pos = i;
    if (!finished && !cursor.refill()) {
      if (scalar) break;
      throw new JsonStreamError(cursor.line + lines, `the file ends inside a value that starts on line ${startLine}`);
    }
  }
  cursor.line += lines;
  let text: string;
  try {
    text = decoder.decode(inPlace ?? bytes?.view() ?? new Uint8Array(0));
  } catch {
    throw new JsonStreamError(startLine, 'the value starting here is not valid UTF-8');
  }
  try {
    return JSON.parse(text);
  } catch (error) {
    throw new JsonStreamError(startLine, `the value starting here is not valid JSON (${error instanceof Error ? error.message : String(error)})`);
  }
}
