// FNV-1a 32, which keys every parameter's random sub-stream by its JSON pointer. Known answers
// from the FNV reference test vectors (Fowler/Noll/Vo test_fnv.c; also listed in the IETF
// draft "The FNV Non-Cryptographic Hash Algorithm", draft-eastlake-fnv): "" → 0x811c9dc5,
// "a" → 0xe40c292c, "b" → 0xe70c2de5, "foobar" → 0xbf9cf968. The UTF-8 path is checked
// against the bytes Debian's Python produces with str.encode('utf-8').
import { describe, expect, it } from 'vitest';

import { fnv1a32, xorFold24 } from '../sim/scenario/fnv1a.ts';
import { parameterSubStream } from '../sim/scenario/parameter-streams.ts';
import { referencePythonAvailability, runReferencePython } from './support/reference-python.ts';

describe('FNV-1a 32 known answers (FNV reference test vectors, draft-eastlake-fnv)', () => {
  it.each([
    ['', 0x811c9dc5],
    ['a', 0xe40c292c],
    ['b', 0xe70c2de5],
    ['foobar', 0xbf9cf968],
  ])('fnv1a32(%j) = published value', (text, expected) => {
    expect(fnv1a32(text)).toBe(expected);
  });

  it('folds to 24 bits by xor-folding the top byte (the reduction on the FNV page): "" → 0x811c9dc5 → 0x1c9d44', () => {
    // 0x81 ^ 0x1c9dc5 = 0x1c9d44, worked by hand from the published hash of "".
    expect(xorFold24(0x811c9dc5)).toBe(0x1c9d44);
    expect(parameterSubStream('')).toBe(0x1c9d44);
  });
});

const python = referencePythonAvailability();

describe.runIf(python.available)('FNV-1a over UTF-8 bytes (bytes from Python str.encode("utf-8"))', () => {
  it('matches the byte-wise definition for pointers with 2-, 3- and 4-byte characters', () => {
    const texts = ['/system/partCount', '/controls/force-node12-y/amplitude', '/system/materials/0/é', '/a~1b/Ω/€', '/😀/x', 'Korrin Bay ✓'];
    const script = [
      'import json, sys',
      'texts = json.load(sys.stdin)',
      'out = []',
      'for t in texts:',
      '    h = 0x811c9dc5',
      '    for b in t.encode("utf-8"):',
      '        h = ((h ^ b) * 0x01000193) & 0xffffffff',
      '    out.append(h)',
      'print(json.dumps(out))',
    ].join('\n');
    const expected = runReferencePython<number[]>(script, texts);
    expect(texts.map(fnv1a32)).toEqual(expected);
  });
});
