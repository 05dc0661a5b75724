// The WebAssembly kernel in a page's Web Worker under the app's Content-Security-Policy, in
// Debian's headless Chromium: the real sim/core, bundled by esbuild as the renderer's worker is,
// runs the chain-1024 and lattice-8x8x8 reference cases in a dedicated worker served with the
// CSP header of electron/content-security-policy.ts. The worker must pick the WebAssembly
// kernel and end on the same binary64 bit patterns as the JavaScript kernel in Node (WebAssembly
// Core Specification 2.0 §4.3.3; ECMA-262 §6.1.6.1). The same worker under the policy without
// 'wasm-unsafe-eval' must be refused WebAssembly (CSP Level 3; from memory) and fall back to the
// JavaScript kernel with the same bits, which shows the source is needed and the fallback works.
import { mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import type { Server } from 'node:http';
import { createServer } from 'node:http';
import type { AddressInfo } from 'node:net';
import { tmpdir } from 'node:os';
import { join } from 'node:path';

import { build } from 'esbuild';
import type { Browser } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';

import { CONTENT_SECURITY_POLICY } from '../electron/content-security-policy.ts';
import { buildChain1024, CHAIN_1024_DT_S } from '../sim/bench/chain-1024.ts';
import { buildLattice8x8x8, LATTICE_CONTROL_INTERVAL_S,latticeControl, latticeSubsteps, latticeWorld } from '../sim/bench/lattice-8x8x8.ts';
import { Simulator } from '../sim/core/simulator.ts';
import { defaultWorld } from '../sim/core/world.ts';
import { launchChromium } from './support/e2e-browser.ts';
import { REPO_ROOT } from './support/e2e-web-app.ts';
import { chromiumAvailability } from './support/reference-chromium.ts';

const chromium = chromiumAvailability();
const CHAIN_STEPS = 400;
const LATTICE_INTERVALS = 4;
const STRICT_CSP = CONTENT_SECURITY_POLICY.replace(" 'wasm-unsafe-eval'", '');

// Runs in the worker (bundled) and in Node: the same calls, the state as hexadecimal words.
const WORKER_SOURCE = `
import { Simulator } from '${REPO_ROOT}/sim/core/simulator.ts';
import { resolveStepKernel } from '${REPO_ROOT}/sim/core/step-kernel-choice.ts';
import { defaultWorld } from '${REPO_ROOT}/sim/core/world.ts';
import { buildChain1024, CHAIN_1024_DT_S } from '${REPO_ROOT}/sim/bench/chain-1024.ts';
import { buildLattice8x8x8, latticeControl, latticeSubsteps, latticeWorld, LATTICE_CONTROL_INTERVAL_S } from '${REPO_ROOT}/sim/bench/lattice-8x8x8.ts';
const hex = (a) => Array.from(new BigUint64Array(a.buffer, a.byteOffset, a.length), (w) => w.toString(16)).join(',');
try {
  const kernel = resolveStepKernel();
  const chain = buildChain1024();
  const chainSim = new Simulator(chain, defaultWorld());
  chainSim.advanceSteps(CHAIN_1024_DT_S, ${CHAIN_STEPS});
  const lattice = buildLattice8x8x8();
  const world = latticeWorld();
  const latticeSim = new Simulator(lattice, world);
  const u = new Float64Array(1);
  for (let t = 0; t < ${LATTICE_INTERVALS}; t++) {
    u[0] = latticeControl(t);
    latticeSim.setControls(u);
    latticeSim.advanceInterval(LATTICE_CONTROL_INTERVAL_S, latticeSubsteps(lattice, world));
  }
  postMessage({ kernel, kernels: [chainSim.kernel, latticeSim.kernel], chain: hex(chain.positionM) + '|' + hex(chain.velocityMPerS), lattice: hex(lattice.positionM) + '|' + hex(lattice.velocityMPerS) });
} catch (error) {
  postMessage({ error: String(error && error.stack || error) });
}
`;
const MAIN_SOURCE = `
const worker = new Worker('worker.js');
worker.onmessage = (event) => { window.kernelResult = event.data; };
worker.onerror = (event) => { window.kernelResult = { error: 'worker error: ' + event.message }; };
`;

const hex = (a: Float64Array) => Array.from(new BigUint64Array(a.buffer, a.byteOffset, a.length), (w) => w.toString(16)).join(',');

function nodeReference(): { chain: string; lattice: string } {
  const chain = buildChain1024();
  new Simulator(chain, defaultWorld(), { kernel: 'js' }).advanceSteps(CHAIN_1024_DT_S, CHAIN_STEPS);
  const lattice = buildLattice8x8x8();
  const world = latticeWorld();
  const sim = new Simulator(lattice, world, { kernel: 'js' });
  const u = new Float64Array(1);
  for (let t = 0; t < LATTICE_INTERVALS; t++) {
    u[0] = latticeControl(t);
    sim.setControls(u);
    sim.advanceInterval(LATTICE_CONTROL_INTERVAL_S, latticeSubsteps(lattice, world));
  }
  return { chain: `${hex(chain.positionM)}|${hex(chain.velocityMPerS)}`, lattice: `${hex(lattice.positionM)}|${hex(lattice.velocityMPerS)}` };
}

interface WorkerResult { kernel?: string; kernels?: string[]; chain?: string; lattice?: string; error?: string }

describe.skipIf(!chromium.available)('WebAssembly kernel in a page Web Worker under the app CSP (headless Chromium)', () => {
  let server: Server;
  let browser: Browser;
  let base = '';
  const work = mkdtempSync(join(tmpdir(), 'pliant-wasm-worker-'));
  afterAll(async () => {
    await browser?.close();
    await new Promise<void>((done) => (server ? server.close(() => done()) : done()));
    rmSync(work, { recursive: true, force: true });
  });

  beforeAll(async () => {
    writeFileSync(join(work, 'entry.ts'), WORKER_SOURCE);
    const bundle = await build({ entryPoints: [join(work, 'entry.ts')], bundle: true, format: 'iife', platform: 'browser', write: false, logLevel: 'silent' });
    const workerJs = bundle.outputFiles[0].text;
    const html = '<!doctype html><meta charset="utf-8"><title>kernel</title><script src="main.js"></script>';
    server = createServer((request, response) => {
      const [, policy, file] = (request.url ?? '').split('/');
      const csp = policy === 'strict' ? STRICT_CSP : CONTENT_SECURITY_POLICY;
      const body = file === 'worker.js' ? workerJs : file === 'main.js' ? MAIN_SOURCE : file === 'index.html' ? html : null;
      if (body === null) {
        response.writeHead(404, { 'content-security-policy': csp }).end();
        return;
      }
      const type = file.endsWith('.html') ? 'text/html; charset=utf-8' : 'text/javascript; charset=utf-8';
      response.writeHead(200, { 'content-type': type, 'content-security-policy': csp }).end(body);
    });
    await new Promise<void>((done) => server.listen(0, '127.0.0.1', () => done()));
    base = `http://127.0.0.1:${(server.address() as AddressInfo).port}`;
    browser = await launchChromium();
  }, 120_000);

  async function runIn(policy: 'app' | 'strict'): Promise<WorkerResult> {
    const page = await browser.newPage();
    try {
      await page.goto(`${base}/${policy}/index.html`);
      await page.waitForFunction(() => (globalThis as unknown as { kernelResult?: unknown }).kernelResult !== undefined, undefined, { timeout: 90_000 });
      return await page.evaluate(() => (globalThis as unknown as { kernelResult: WorkerResult }).kernelResult);
    } finally {
      await page.close();
    }
  }

  it('with the app CSP the worker steps with WebAssembly and ends on the JavaScript kernel\'s bits', async () => {
    const result = await runIn('app');
    expect(result.error).toBeUndefined();
    expect(result.kernel).toBe('wasm');
    expect(result.kernels).toEqual(['wasm', 'wasm']);
    const reference = nodeReference();
    expect(result.chain === reference.chain, 'chain-1024 state differs').toBe(true);
    expect(result.lattice === reference.lattice, 'lattice-8x8x8 state differs').toBe(true);
  }, 120_000);

  it('without \'wasm-unsafe-eval\' WebAssembly is refused and the worker falls back to the JavaScript kernel, same bits', async () => {
    const result = await runIn('strict');
    expect(result.error).toBeUndefined();
    expect(result.kernels).toEqual(['js', 'js']);
    const reference = nodeReference();
    expect(result.chain === reference.chain).toBe(true);
    expect(result.lattice === reference.lattice).toBe(true);
  }, 120_000);
});
