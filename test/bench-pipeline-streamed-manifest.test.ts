// manifest.json is written member by member so that a large sweep's manifest never sits in
// memory (sim/dataset/formats/streamed-json.ts), yet its text must stay exactly what
// JSON.stringify(manifest, null, 2) gives (ECMA-262 §25.5.2, the engine's own implementation is
// the reference), so that datasets written before and after are the same bytes. Checked on
// values that exercise the layout rules (empty lists, members JSON leaves out, nesting, text that
// needs escaping) and on a real manifest, which Debian Python's json module must read back to
// the same value.
import { mkdtempSync, readFileSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';

import { afterAll, describe, expect, it } from 'vitest';

import { runCli } from '../sim/cli/main.ts';
import { StreamedList, writeStreamedJson } from '../sim/dataset/formats/streamed-json.ts';
import { referencePythonAvailability, runReferencePython } from './support/reference-python.ts';

const python = referencePythonAvailability();
const work = mkdtempSync(join(tmpdir(), 'pliant-streamed-manifest-'));
afterAll(() => rmSync(work, { recursive: true, force: true }));

function streamed(value: unknown): string {
  let text = '';
  writeStreamedJson(value, (piece) => {
    text += piece;
  });
  return text;
}

/** The same value with every StreamedList replaced by a plain array, as JSON.stringify would see it. */
function materialised(value: unknown): unknown {
  if (value instanceof StreamedList) return [...value.items()].map(materialised);
  if (Array.isArray(value)) return value.map(materialised);
  if (value !== null && typeof value === 'object') return Object.fromEntries(Object.entries(value).map(([k, v]) => [k, materialised(v)]));
  return value;
}

describe('streamed JSON has the layout of JSON.stringify(value, null, 2) (ECMA-262)', () => {
  const cases: Record<string, unknown> = {
    'a streamed list at the top': new StreamedList(() => [1, 'two', { three: [3, 3, 3] }, null]),
    'empty streamed lists and objects': { a: new StreamedList(() => []), b: {}, c: [], d: new StreamedList(() => [[], {}]) },
    'members JSON leaves out, and list items it writes as null': {
      gone: undefined,
      fn: () => 1,
      kept: new StreamedList(() => [undefined, () => 2, 'x']),
      last: undefined,
    },
    'objects with streamed members inside streamed lists': {
      files: new StreamedList(function* () {
        yield { path: 'a.h5', episodes: new StreamedList(() => ['ep-000000', 'ep-000001']), arrays: new StreamedList(() => [{ name: 'ep-000000/time', shape: [151] }]) };
        yield { path: 'b.npz', episodes: ['ep-000002'] };
      }),
      run: { host: 'korrin-bay', when: '2026-04-12T08:00:00.000Z' },
    },
    'text that needs escaping, and numbers at the edges': {
      description: 'Korrin Bay "tank" \\ line\nbreak\ttab \u0001 é 🐟 \ud800',
      numbers: new StreamedList(() => [0, -0, 1e21, 5e-324, -1.5, 123456789.125]),
    },
    'keys that look like indices keep JSON.stringify order': { b: 1, 2: 'two', a: new StreamedList(() => [1]), 1: 'one' },
  };
  for (const [name, value] of Object.entries(cases)) {
    it(name, () => {
      expect(streamed(value)).toBe(JSON.stringify(materialised(value), null, 2));
    });
  }

  it('refuses a top-level value JSON cannot represent', () => {
    expect(() => streamed(undefined)).toThrow(/cannot be written as a JSON document/);
  });
});

describe('a generated manifest', () => {
  it.runIf(python.available)('is JSON.stringify(parsed, null, 2) plus a line break, and Python\'s json reads the same value', async () => {
    const outDir = join(work, 'fin');
    let stderr = '';
    const code = await runCli(
      ['generate', join(import.meta.dirname, '..', 'scenarios', 'korrin-fin.json'), '--out', outDir, '--episodes', '3', '--format', 'both', '--workers', '1', '--progress', 'none'],
      { stdout: () => {}, stderr: (t) => void (stderr += t), isTerminal: false, env: {}, cwd: work },
    );
    expect(stderr).toBe('');
    expect(code).toBe(0);
    const text = readFileSync(join(outDir, 'manifest.json'), 'utf8');
    const parsed = JSON.parse(text) as unknown;
    expect(text).toBe(`${JSON.stringify(parsed, null, 2)}\n`);
    // Python parses the file itself and compares with the value JavaScript parsed from it.
    const roundTrip = runReferencePython<{ same: boolean; episodes: number; files: number }>(
      `import json, sys
spec = json.load(sys.stdin)
m = json.load(open(spec["path"], encoding="utf-8"))
print(json.dumps({"same": m == spec["value"], "episodes": len(m["episodes"]), "files": len(m["files"])}))`,
      { path: join(outDir, 'manifest.json'), value: parsed },
    );
    const manifest = parsed as { episodes: unknown[]; files: unknown[] };
    expect(roundTrip).toEqual({ same: true, episodes: 3, files: manifest.files.length });
  }, 120_000);
});
