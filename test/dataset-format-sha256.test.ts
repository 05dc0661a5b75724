// SHA-256 of buffers and files through the one hashing module (file-digest.ts): known-answer
// vectors from FIPS 180-2 and the streamed file digest compared with Debian Python's hashlib.
import { mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';

import { afterAll, describe, expect, it } from 'vitest';

import { digestFile, sha256Hex } from '../sim/dataset/formats/file-digest.ts';
import { referencePythonAvailability, runReferencePython } from './support/reference-python.ts';

const python = referencePythonAvailability();
const ascii = (text: string) => new TextEncoder().encode(text);
const folder = mkdtempSync(join(tmpdir(), 'pliant-sha256-'));
afterAll(() => rmSync(folder, { recursive: true, force: true }));

describe('SHA-256 known answers (FIPS 180-2, Appendix B; digests from memory)', () => {
  it('B.1: "abc"', () => {
    expect(sha256Hex(ascii('abc'))).toBe('ba7816bf8f01cfea414140de5dae2223b00361a396177a9cb410ff61f20015ad');
  });

  it('B.2: the 448-bit two-block message "abcdbcde...nopq"', () => {
    expect(sha256Hex(ascii('abcdbcdecdefdefgefghfghighijhijkijkljklmklmnlmnomnopnopq')))
      .toBe('248d6a61d20638b8e5c026930c3e6039a33ce45964ff2167f6ecedd419db06c1');
  });

  it('B.3: one million repetitions of "a", also when fed in uneven pieces', () => {
    const million = new Uint8Array(1_000_000).fill(0x61);
    const expected = 'cdc76e5c9914fb9281a1c7e284d73e67f1809a48a497200e046d39ccc7112cd0';
    expect(sha256Hex(million)).toBe(expected);
    expect(sha256Hex([million.subarray(0, 63), million.subarray(63, 500_001), million.subarray(500_001)])).toBe(expected);
  });

  it('the empty message (NIST example values, from memory)', () => {
    expect(sha256Hex(new Uint8Array(0))).toBe('e3b0c44298fc1c149afbf4c8996fb92427ae41e4649b934ca495991b7852b855');
  });

  it('B.1 as a file streamed through digestFile', async () => {
    const path = join(folder, 'abc.txt');
    writeFileSync(path, 'abc');
    expect(await digestFile(path)).toEqual({ kind: 'hashed', sha256: 'ba7816bf8f01cfea414140de5dae2223b00361a396177a9cb410ff61f20015ad', sizeBytes: 3 });
  });
});

describe.runIf(python.available)('file digests against Debian Python hashlib.sha256', () => {
  it('a file longer than the 1 MiB read buffer (3 MiB + 17 bytes) hashes as hashlib does', async () => {
    const bytes = new Uint8Array(3 * (1 << 20) + 17);
    // A fixed byte pattern (a 32-bit LCG, Numerical Recipes constants) so the file has no repeating blocks.
    let state = 12345;
    for (let i = 0; i < bytes.length; i += 1) {
      state = (Math.imul(state, 1664525) + 1013904223) >>> 0;
      bytes[i] = state >>> 24;
    }
    const path = join(folder, 'korrin-bay-tether-log.bin');
    writeFileSync(path, bytes);
    const reference = runReferencePython<string>(
      'import hashlib, json, sys; p = json.load(sys.stdin); print(json.dumps(hashlib.sha256(open(p, "rb").read()).hexdigest()))',
      path,
    );
    expect(await digestFile(path)).toEqual({ kind: 'hashed', sha256: reference, sizeBytes: bytes.length });
    expect(sha256Hex(bytes)).toBe(reference);
  });
});

describe('unreadable files (common practice, no source)', () => {
  it('a missing file is "missing", a folder in its place "unreadable" (EISDIR), never a hash', async () => {
    expect(await digestFile(join(folder, 'no-such-file.npz'))).toEqual({ kind: 'missing' });
    expect(await digestFile(folder)).toEqual({ kind: 'unreadable', reason: 'EISDIR' });
  });
});
