// The header of an NPY file (NumPy Enhancement Proposal 1 and numpy/lib/format.py): the magic
// string, version, header length and the Python-literal dictionary with 'descr',
// 'fortran_order' and 'shape'. Writing reproduces NumPy's own layout byte for byte so our files
// and numpy.save's agree; reading accepts versions 1.0, 2.0 and 3.0.
import { DatasetReadError } from './dataset-read-error.ts';

/** "\x93NUMPY" */
export const NPY_MAGIC = Uint8Array.of(0x93, 0x4e, 0x55, 0x4d, 0x50, 0x59);

// NumPy aligns the start of the data to 64 bytes so it can be memory-mapped for any dtype.
const ARRAY_ALIGN = 64;
// NumPy leaves room in the header for the first axis to grow to 21 digits in place.
const GROWTH_AXIS_MAX_DIGITS = 21;
// NumPy itself refuses headers over 10 000 characters unless told to trust the file; plain
// arrays of any rank stay far below this.
const MAX_HEADER_BYTES = 100_000;

export interface NpyHeader {
  readonly version: readonly [number, number];
  /** The 'descr' value, e.g. '<f8'; a structured dtype's list is reported as unsupported when read. */
  readonly descr: string;
  readonly fortranOrder: boolean;
  readonly shape: readonly number[];
  /** Offset of the first data byte from the start of the file. */
  readonly dataOffset: number;
}

/** Python's repr of a tuple of ints: '()', '(3,)', '(2, 3, 4)'. */
function shapeRepr(shape: readonly number[]): string {
  if (shape.length === 1) return `(${shape[0]},)`;
  return `(${shape.join(', ')})`;
}

/** A version 1.0 header for C-ordered data, exactly as numpy.save writes it. */
export function encodeNpyHeader(descr: string, shape: readonly number[]): Uint8Array {
  let dict = `{'descr': '${descr}', 'fortran_order': False, 'shape': ${shapeRepr(shape)}, }`;
  if (shape.length > 0) dict += ' '.repeat(Math.max(0, GROWTH_AXIS_MAX_DIGITS - String(shape[0]).length));
  const textLength = dict.length + 1; // + the closing '\n'
  const prefixLength = NPY_MAGIC.length + 2 + 2;
  const padding = ARRAY_ALIGN - ((prefixLength + textLength) % ARRAY_ALIGN);
  const headerLength = textLength + padding;
  if (headerLength > 0xffff) throw new RangeError(`NPY header of ${headerLength} bytes does not fit version 1.0`);
  const bytes = new Uint8Array(prefixLength + headerLength);
  bytes.set(NPY_MAGIC, 0);
  bytes[6] = 1;
  bytes[7] = 0;
  bytes[8] = headerLength & 0xff;
  bytes[9] = headerLength >>> 8;
  const text = dict + ' '.repeat(padding) + '\n';
  for (let i = 0; i < text.length; i += 1) bytes[prefixLength + i] = text.charCodeAt(i);
  return bytes;
}

type PyValue = string | number | boolean | null | PyTuple | PyValue[] | Map<string, PyValue>;
interface PyTuple {
  readonly tuple: PyValue[];
}

const HEADER_FIX = 'write the file with numpy.save';

/** Reads and checks the header at the start of `bytes`; `path` is only used in messages. */
export function parseNpyHeader(bytes: Uint8Array, path: string): NpyHeader {
  for (let i = 0; i < NPY_MAGIC.length; i += 1) {
    if (bytes[i] !== NPY_MAGIC[i]) {
      throw new DatasetReadError(path, 'bytes 0-5', 'this is not an NPY file (it does not start with "\\x93NUMPY")', HEADER_FIX);
    }
  }
  if (bytes.length < 10) throw new DatasetReadError(path, 'header', 'the file ends inside the NPY header', HEADER_FIX);
  const major = bytes[6];
  const minor = bytes[7];
  let lengthBytes: number;
  if (major === 1 && minor === 0) lengthBytes = 2;
  else if ((major === 2 || major === 3) && minor === 0) lengthBytes = 4;
  else {
    throw new DatasetReadError(path, 'bytes 6-7', `NPY format version ${major}.${minor} is not known (1.0, 2.0 and 3.0 are)`, HEADER_FIX);
  }
  const view = new DataView(bytes.buffer, bytes.byteOffset, bytes.byteLength);
  if (bytes.length < 8 + lengthBytes) throw new DatasetReadError(path, 'header', 'the file ends inside the NPY header', HEADER_FIX);
  const headerLength = lengthBytes === 2 ? view.getUint16(8, true) : view.getUint32(8, true);
  if (headerLength > MAX_HEADER_BYTES) {
    throw new DatasetReadError(path, 'header', `the header claims ${headerLength} bytes, far more than a plain array needs`, HEADER_FIX);
  }
  const textStart = 8 + lengthBytes;
  const dataOffset = textStart + headerLength;
  if (bytes.length < dataOffset) {
    throw new DatasetReadError(path, 'header', `the header says it is ${headerLength} bytes long but the file ends before that`, HEADER_FIX);
  }
  const raw = bytes.subarray(textStart, dataOffset);
  // Versions 1.0 and 2.0 are Latin-1 by definition; 3.0 is UTF-8.
  const text = major === 3 ? new TextDecoder('utf-8').decode(raw) : latin1(raw);
  const dict = new LiteralParser(text, path).parseHeader();

  const keys = [...dict.keys()].sort();
  if (keys.join(',') !== 'descr,fortran_order,shape') {
    throw new DatasetReadError(path, 'header', `the header dictionary has keys [${keys.join(', ')}] instead of descr, fortran_order and shape`, HEADER_FIX);
  }
  const descr = dict.get('descr');
  if (typeof descr !== 'string') {
    throw new DatasetReadError(path, 'header', 'the array has a structured (record) dtype, which Pliant does not read',
      'save each field as its own array, e.g. numpy.save(path, a["field"])');
  }
  const fortranOrder = dict.get('fortran_order');
  if (typeof fortranOrder !== 'boolean') {
    throw new DatasetReadError(path, 'header', "'fortran_order' must be True or False", HEADER_FIX);
  }
  const shapeValue = dict.get('shape');
  const shape = isTuple(shapeValue) ? shapeValue.tuple : undefined;
  if (shape === undefined || !shape.every((extent) => typeof extent === 'number' && Number.isSafeInteger(extent) && extent >= 0)) {
    throw new DatasetReadError(path, 'header', "'shape' must be a tuple of non-negative integers", HEADER_FIX);
  }
  return { version: [major, minor], descr, fortranOrder, shape: shape as number[], dataOffset };
}

function latin1(raw: Uint8Array): string {
  let text = '';
  for (let i = 0; i < raw.length; i += 1) text += String.fromCharCode(raw[i]);
  return text;
}

function isTuple(value: PyValue | undefined): value is PyTuple {
  return typeof value === 'object' && value !== null && !Array.isArray(value) && !(value instanceof Map);
}

// A reader for the few Python literals an NPY header holds: dicts, tuples, lists, strings, ints,
// True, False and None. Anything else is refused rather than guessed at.
class LiteralParser {
  private position = 0;

  constructor(private readonly text: string, private readonly path: string) {}

  parseHeader(): Map<string, PyValue> {
    const value = this.parseValue();
    this.skipSpace();
    if (this.position !== this.text.length) this.fail('unexpected text after the header dictionary');
    if (!(value instanceof Map)) this.fail('the header is not a dictionary', 0);
    return value;
  }

  private fail(problem: string, at = this.position): never {
    throw new DatasetReadError(this.path, `header, character ${at + 1}`, problem, HEADER_FIX);
  }

  private skipSpace(): void {
    while (this.position < this.text.length && ' \t\r\n'.includes(this.text[this.position])) this.position += 1;
  }

  private parseValue(): PyValue {
    this.skipSpace();
    const c = this.text[this.position];
    if (c === '{') return this.parseDict();
    if (c === '(') return { tuple: this.parseSequence(')') };
    if (c === '[') return this.parseSequence(']');
    if (c === "'" || c === '"') return this.parseString();
    if (c !== undefined && /[-+0-9]/.test(c)) return this.parseInteger();
    for (const [word, value] of [['True', true], ['False', false], ['None', null]] as const) {
      if (this.text.startsWith(word, this.position)) {
        this.position += word.length;
        return value;
      }
    }
    return this.fail(c === undefined ? 'the header ends early' : `unexpected '${c}'`);
  }

  private parseDict(): Map<string, PyValue> {
    const dict = new Map<string, PyValue>();
    this.position += 1;
    for (;;) {
      this.skipSpace();
      if (this.text[this.position] === '}') {
        this.position += 1;
        return dict;
      }
      const keyAt = this.position;
      const key = this.parseValue();
      if (typeof key !== 'string') this.fail('dictionary keys must be strings', keyAt);
      this.skipSpace();
      if (this.text[this.position] !== ':') this.fail("expected ':'");
      this.position += 1;
      dict.set(key, this.parseValue());
      this.skipSpace();
      if (this.text[this.position] === ',') this.position += 1;
      else if (this.text[this.position] !== '}') this.fail("expected ',' or '}'");
    }
  }

  private parseSequence(close: string): PyValue[] {
    const items: PyValue[] = [];
    this.position += 1;
    for (;;) {
      this.skipSpace();
      if (this.text[this.position] === close) {
        this.position += 1;
        return items;
      }
      items.push(this.parseValue());
      this.skipSpace();
      if (this.text[this.position] === ',') this.position += 1;
      else if (this.text[this.position] !== close) this.fail(`expected ',' or '${close}'`);
    }
  }

  private parseString(): string {
    const quote = this.text[this.position];
    const start = this.position + 1;
    const end = this.text.indexOf(quote, start);
    if (end < 0) this.fail('a string is not closed');
    const value = this.text.slice(start, end);
    if (value.includes('\\')) this.fail('escape sequences are not expected in an NPY header', start);
    this.position = end + 1;
    return value;
  }

  private parseInteger(): number {
    const match = /^[-+]?[0-9]+/.exec(this.text.slice(this.position));
    if (match === null) return this.fail('expected a number');
    this.position += match[0].length;
    // Python 2 wrote long integers with an 'L' suffix; NumPy still accepts such headers.
    if (this.text[this.position] === 'L') this.position += 1;
    return Number(match[0]);
  }
}
