// Manifests larger than any string. V8 cannot make a string of more than 2^29 − 24 UTF-16 units
// on 64-bit machines (v8::String::kMaxLength; from memory), so Node's readFile(path, 'utf8')
// refuses such a file with ERR_STRING_TOO_LONG (Node.js errors documentation) — a tether
// manifest passes that size at about 69,000 episodes. The streaming reader must read the same
// manifest.json piece by piece: inspect, verify and `generate --resume` are run on a
// synthetic manifest of 100,000 episodes, made by replicating the records of a real two-episode
// tether run with each episode's id, index and seed changed consistently, and written with
// Pliant's own streamed manifest writer. They run in a child Node.js whose heap is capped at
// 256 MiB (--max-old-space-size, Node.js CLI documentation), a third of the manifest's size, so
// any of them holding the whole file would fail.
//
// The scanner itself is checked against JSON.parse (ECMA-262's JSON grammar, RFC 8259) on
// arbitrary JSON values from fast-check, read one byte at a time so every chunk boundary,
// including those inside multi-byte UTF-8 characters (RFC 3629), is crossed.
import { spawnSync } from 'node:child_process';
import { createHash } from 'node:crypto';
import { copyFileSync, linkSync, mkdirSync, mkdtempSync, readFileSync, rmSync, statSync, writeFileSync } from 'node:fs';
import { readFile } from 'node:fs/promises';
import { tmpdir } from 'node:os';
import { dirname, join, resolve } from 'node:path';

import fc from 'fast-check';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';

import { runCli } from '../sim/cli/main.ts';
import type { ByteSource } from '../sim/dataset/formats/json-stream-scanner.ts';
import { JsonStreamError, scanJsonStream } from '../sim/dataset/formats/json-stream-scanner.ts';
import { StreamedList, writeStreamedJson } from '../sim/dataset/formats/streamed-json.ts';
import { episodeId, episodeNpzPath } from '../sim/dataset/manifest/dataset-files.ts';
import type { DataFileRecord, DatasetManifest, EpisodeRecord } from '../sim/dataset/manifest/dataset-manifest.ts';
import { readManifestStream } from '../sim/dataset/manifest/manifest-stream.ts';
import { writeDatasetTextStreamed } from '../sim/dataset/write/dataset-file-writer.ts';

const ROOT = resolve(import.meta.dirname, '..');
const LAUNCHER = join(ROOT, 'sim/cli/pliant-launcher.mjs');
// The demo tether recording only two steps, so 100,000 NPZ files hash quickly; the manifest
// records are as large as the demo's (their size comes from labels and array descriptions).
const TETHER = join(mkdtempSync(join(tmpdir(), 'pliant-big-scenario-')), 'korrin-tether-short.json');
const EPISODES = 100_000;
let documentCount = 0;
const V8_MAX_STRING_UNITS = 2 ** 29 - 24;
const work = mkdtempSync(join(tmpdir(), 'pliant-big-manifest-'));
const small = join(work, 'small');
const big = join(work, 'big');
const GENERATE_FLAGS = ['--episodes', '2', '--format', 'npz', '--workers', '1', '--progress', 'none'];

function bytesSource(bytes: Uint8Array, piece: number): ByteSource {
  let at = 0;
  return {
    read(into) {
      const n = Math.min(piece, into.byteLength, bytes.length - at);
      into.set(bytes.subarray(at, at + n));
      at += n;
      return n;
    },
  };
}

function pliant(args: string[]): { status: number | null; stdout: string; stderr: string } {
  const run = spawnSync(process.execPath, ['--max-old-space-size=256', LAUNCHER, ...args], { cwd: work, encoding: 'utf8', timeout: 600_000 });
  return { status: run.status, stdout: run.stdout, stderr: run.stderr };
}

beforeAll(async () => {
  const scenario = JSON.parse(readFileSync(join(ROOT, 'scenarios/korrin-tether.json'), 'utf8')) as { time: { recordedSteps: number } };
  scenario.time.recordedSteps = 2;
  writeFileSync(TETHER, JSON.stringify(scenario, null, 2));
  const out = { stdout: '', stderr: '' };
  const code = await runCli(['generate', TETHER, '--out', small, ...GENERATE_FLAGS], {
    stdout: (t) => void (out.stdout += t),
    stderr: (t) => void (out.stderr += t),
    isTerminal: false,
    env: {},
    cwd: work,
  });
  expect(out.stderr).toBe('');
  expect(code).toBe(0);

  const real = JSON.parse(readFileSync(join(small, 'manifest.json'), 'utf8')) as DatasetManifest;
  const template = real.episodes.find((e) => e.status === 'ok')!;
  const templateFile = real.files.find((f) => f.kind === 'episode-npz' && f.episodes[0] === template.id)!;
  mkdirSync(join(big, 'episodes'), { recursive: true });
  // The documents: seed.json, CARD.md and the card's pictures under card/.
  for (const { path } of real.documents) {
    mkdirSync(dirname(join(big, path)), { recursive: true });
    copyFileSync(join(small, path), join(big, path));
  }
  documentCount = real.documents.length;
  // Every episode's NPZ file is a hard link to a copy of the one real file: same bytes, same
  // SHA-256. ext4 allows 65,000 links to one inode (ext4 documentation), so a fresh copy every 50,000.
  let source = '';
  for (let i = 0; i < EPISODES; i++) {
    if (i % 50_000 === 0) copyFileSync(join(small, templateFile.path), (source = join(work, `npz-copy-${i}`)));
    linkSync(source, join(big, episodeNpzPath(episodeId(i, EPISODES))));
  }
  const splits = Object.fromEntries(Object.keys(real.splits).map((s) => [s, { ok: s === template.split ? EPISODES : 0, rejected: 0 }]));
  function* records(): Generator<EpisodeRecord> {
    for (let i = 0; i < EPISODES; i++) {
      const id = episodeId(i, EPISODES);
      yield { ...template, id, index: i, seed: { ...template.seed, episodeIndex: i }, files: [episodeNpzPath(id)] };
    }
  }
  // The digest of the made-up records, as LAYOUT.md defines it: SHA-256 over each record's
  // JSON.stringify text and a line feed.
  const digest = createHash('sha256');
  for (const record of records()) digest.update(`${JSON.stringify(record)}\n`);
  const manifest = {
    ...real,
    episodeCount: EPISODES,
    splits,
    episodes: new StreamedList(records),
    episodeRecordsSha256: digest.digest('hex'),
    files: new StreamedList(function* (): Generator<DataFileRecord> {
      for (let i = 0; i < EPISODES; i++) {
        const id = episodeId(i, EPISODES);
        yield { ...templateFile, path: episodeNpzPath(id), episodes: [id] };
      }
    }),
  };
  writeDatasetTextStreamed(big, 'manifest.json', (emit) => {
    writeStreamedJson(manifest, emit);
    emit('\n');
  });
}, 600_000);

afterAll(() => {
  rmSync(work, { recursive: true, force: true });
  rmSync(resolve(TETHER, '..'), { recursive: true, force: true });
});

describe('a manifest of 100,000 episodes', () => {
  it('is larger than V8 can hold as one string, so a whole-file read cannot work', async () => {
    expect(statSync(join(big, 'manifest.json')).size).toBeGreaterThan(V8_MAX_STRING_UNITS);
    // What `inspect`, `verify` and `--resume` died of before: V8's "Invalid string length".
    await expect(readFile(join(big, 'manifest.json'), 'utf8')).rejects.toThrow(RangeError);
  });

  it('pliant inspect summarises it in a 256 MiB heap', () => {
    const run = pliant(['inspect', big]);
    expect(run.stderr).toBe('');
    expect(run.status).toBe(0);
    expect(run.stdout).toContain(`${EPISODES} of ${EPISODES} episodes`);
    expect(run.stdout).toMatch(new RegExp(`episode NPZ\\s+${EPISODES}\\s`));
  }, 600_000);

  it('pliant verify checks every one of its files in a 256 MiB heap', () => {
    const run = pliant(['verify', big]);
    expect(run.stderr).toBe('');
    expect(run.status).toBe(0);
    // Every NPZ file and the documents (seed.json, CARD.md, the card's pictures).
    expect(documentCount).toBeGreaterThan(2);
    expect(run.stdout).toContain(`ok — ${EPISODES + documentCount} files match`);
  }, 600_000);

  it('pliant generate --resume finds it complete in a 256 MiB heap', () => {
    const run = pliant(['generate', TETHER, '--out', big, ...GENERATE_FLAGS, '--resume']);
    expect(run.stderr).toBe('');
    expect(run.status).toBe(0);
    expect(run.stdout).toMatch(/already complete/);
    expect(run.stdout).toContain(`${EPISODES} `);
  }, 600_000);
});

describe('the streaming JSON scanner', () => {
  it('yields the members of any JSON object exactly as JSON.parse reads them, one byte at a time', () => {
    fc.assert(
      fc.property(fc.dictionary(fc.string(), fc.jsonValue()), fc.integer({ min: 1, max: 7 }), (object, piece) => {
        const text = JSON.stringify(object, null, piece % 2 === 0 ? 2 : undefined);
        const expected = JSON.parse(text) as Record<string, unknown>;
        const seen: [string, unknown][] = [];
        for (const event of scanJsonStream(bytesSource(new TextEncoder().encode(text), piece), (path) => path.length === 0, { maxValueBytes: 1 << 20, maxDepth: 1000 })) {
          if (event.kind === 'value') seen.push([event.path[0] as string, event.value]);
        }
        // Entries, not an object: a member named "__proto__" is an own member in JSON.parse's result.
        expect(seen).toEqual(Object.entries(expected));
      }),
      { numRuns: 100 },
    );
  });

  it('names the line of a syntax error and refuses values nested deeper than its limit', () => {
    const scan = (text: string): unknown[] => [...scanJsonStream(bytesSource(new TextEncoder().encode(text), 3), (p) => p.length === 0, { maxValueBytes: 1 << 20, maxDepth: 64 })];
    expect(() => scan('{\n  "a": 1\n  "b": 2\n}')).toThrow(new JsonStreamError(3, `expected ',' or '}' after the member "a", found '"'`));
    expect(() => scan(`{"deep": ${'['.repeat(65)}${']'.repeat(65)}}`)).toThrow(/nested more than 64 levels deep/);
    expect(() => scan('{"a": 1} x')).toThrow(/after the end of the JSON document/);
  });

  it('reports a damaged episode record by its JSON pointer and goes on to the next', () => {
    const path = join(work, 'damaged.json');
    const real = JSON.parse(readFileSync(join(small, 'manifest.json'), 'utf8')) as DatasetManifest;
    const damaged = { ...real, episodes: [{ ...real.episodes[0], status: 'fine' }, real.episodes[1]] };
    writeDatasetTextStreamed(work, 'damaged.json', (emit) => emit(JSON.stringify(damaged, null, 2)));
    const events = [...readManifestStream(path)];
    expect(events.filter((e) => e.kind === 'problem').map((e) => (e as { message: string }).message)).toContain('manifest.json /episodes/0/status: must be equal to one of the allowed values (one of "ok", "rejected")');
    expect(events.filter((e) => e.kind === 'episode').map((e) => (e as { position: number }).position)).toEqual([1]);
  });
});
