// The committed WebAssembly kernel is what its source builds to: the build script
// (build/build-step-kernel.mjs, pinned AssemblyScript compiler, fixed flags) is run into a temp
// folder and its generated module must equal sim/core/wasm/step-kernel-bytes.ts byte for byte,
// so source and binary cannot drift apart. Also checked: the embedded base64 decodes (our own
// decoder, against Node's Buffer and the test vectors of RFC 4648 §10) to those bytes, whose
// SHA-256 (FIPS 180-4, Node's crypto) is the one recorded; the module imports only its memory
// (WebAssembly JS API, WebAssembly.Module.imports); and it exports every pass that the source's
// header lists as mirroring a JavaScript function, so that list stays true.
import { spawnSync } from 'node:child_process';
import { createHash } from 'node:crypto';
import { mkdtempSync, readFileSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join, resolve } from 'node:path';

import { afterAll, describe, expect, it } from 'vitest';

import { bytesFromBase64 } from '../sim/core/wasm/base64-bytes.ts';
import { STEP_KERNEL_BASE64, STEP_KERNEL_SHA256 } from '../sim/core/wasm/step-kernel-bytes.ts';

const ROOT = resolve(import.meta.dirname, '..');
interface ModuleEntry { module?: string; name: string; kind: string }
/** The WebAssembly JS API, typed here because the project's TypeScript libraries leave it out. */
const WasmApi = (globalThis as unknown as {
  WebAssembly: { Module: { new (bytes: Uint8Array): object; imports(m: object): ModuleEntry[]; exports(m: object): ModuleEntry[] } };
}).WebAssembly;
const out = mkdtempSync(join(tmpdir(), 'pliant-wasm-rebuild-'));
afterAll(() => rmSync(out, { recursive: true, force: true }));

describe('WebAssembly step kernel build (rebuilt from source, compared with the committed bytes)', () => {
  it('a rebuild gives the committed generated module, byte for byte', () => {
    const run = spawnSync(process.execPath, [join(ROOT, 'build/build-step-kernel.mjs'), '--out', out], { cwd: ROOT, encoding: 'utf8' });
    expect(run.status, run.stderr).toBe(0);
    const rebuilt = readFileSync(join(out, 'step-kernel-bytes.ts'));
    const committed = readFileSync(join(ROOT, 'sim/core/wasm/step-kernel-bytes.ts'));
    expect(rebuilt.equals(committed), 'the kernel source changed without `npm run build:wasm`').toBe(true);
    const wasm = readFileSync(join(out, 'step-kernel.wasm'));
    expect(Buffer.from(bytesFromBase64(STEP_KERNEL_BASE64)).equals(wasm)).toBe(true);
    expect(createHash('sha256').update(wasm).digest('hex')).toBe(STEP_KERNEL_SHA256);
  }, 120_000);

  it('decodes base64 like RFC 4648 §10 and like Node\'s Buffer', () => {
    const vectors: [string, string][] = [['', ''], ['f', 'Zg=='], ['fo', 'Zm8='], ['foo', 'Zm9v'], ['foob', 'Zm9vYg=='], ['fooba', 'Zm9vYmE='], ['foobar', 'Zm9vYmFy']];
    for (const [plain, encoded] of vectors) expect(Buffer.from(bytesFromBase64(encoded)).toString('latin1')).toBe(plain);
    const all = Uint8Array.from({ length: 256 }, (_, i) => i);
    expect(Buffer.from(bytesFromBase64(Buffer.from(all).toString('base64'))).equals(Buffer.from(all))).toBe(true);
    expect(Buffer.from(bytesFromBase64(STEP_KERNEL_BASE64)).equals(Buffer.from(STEP_KERNEL_BASE64, 'base64'))).toBe(true);
    expect(() => bytesFromBase64('Zm9')).toThrow(/4-character/);
    expect(() => bytesFromBase64('Zm9*')).toThrow(/alphabet/);
  });

  it('imports only env.memory and exports every pass its header says it mirrors', () => {
    const module = new WasmApi.Module(bytesFromBase64(STEP_KERNEL_BASE64));
    expect(WasmApi.Module.imports(module)).toEqual([{ module: 'env', name: 'memory', kind: 'memory' }]);
    const exported = new Set(WasmApi.Module.exports(module).filter((e) => e.kind === 'function').map((e) => e.name));
    const source = readFileSync(join(ROOT, 'sim/core/wasm/assembly/step-kernel.ts'), 'utf8');
    const listed = [...source.matchAll(/^\/\/ {3}(\w+) +sim\/core\//gm)].map((m) => m[1]);
    expect(listed.length).toBeGreaterThanOrEqual(13);
    for (const name of listed) expect(exported.has(name), `${name} is listed as a mirrored pass but not exported`).toBe(true);
  });
});
