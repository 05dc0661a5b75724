// Child process of the sweep-memory measurement: runs one `pliant generate` in this fresh
// process and prints, as one JSON line, the process's peak resident memory (main thread and
// worker threads share one address space, so this is all of it). Plain JavaScript because it
// must start the command line itself: through the TypeScript loader, as it always has, or with
// PLIANT_CLI_TSX=0 from the prebuilt bundle the `pliant` launcher runs (sim/cli/cli-bundle.mjs).
// tsx stays the default because test/bench-pipeline-memory.test.ts was set up with it: its
// start-up (and the worker bundling it brings, after the high-water reset) covers V8's growth of
// the main thread's young generation, which the lean bundled start shows — 200 → 2,000 short
// tether episodes on one worker peaked at 116 → 144 MB with heapUsed only 12.6 → 17.9 MB and
// heapTotal 30 → 55 MB (and 88 MB at 2,000 under --max-semi-space-size=1).
//
// Arguments: SCENARIO, then the generate flags (--out DIR --episodes N …). The scenario is
// first checked on its own (`pliant validate`), which compiles the scenario schema, the largest
// start-up cost; on Linux the high-water mark is then reset (/proc/self/clear_refs, "5"), so
// the second figure covers the sweep alone and is not hidden under that start-up peak.
import { readFileSync, writeFileSync } from 'node:fs';
import { pathToFileURL } from 'node:url';

import { bundledCliEntry, connectPrebuiltParts } from '../cli/cli-bundle.mjs';

const bundled = process.env.PLIANT_CLI_TSX === '0' ? await bundledCliEntry() : undefined;
let cli;
if (bundled !== undefined) {
  cli = await import(pathToFileURL(bundled).href);
  connectPrebuiltParts(cli, bundled);
} else {
  const { register } = await import('tsx/esm/api');
  register();
  cli = await import('../cli/main.ts');
}
const { runCli, defaultIo } = cli;

function highWaterKib() {
  try {
    return Number(/^VmHWM:\s+(\d+) kB$/m.exec(readFileSync('/proc/self/status', 'utf8'))[1]);
  } catch {
    return null;
  }
}

function resetHighWater() {
  try {
    writeFileSync('/proc/self/clear_refs', '5');
    return true;
  } catch {
    return false;
  }
}

const [scenarioPath, ...flags] = process.argv.slice(2);
// The commands' own output would mix with the measurement line; their problems still show.
const io = { ...defaultIo(), stdout: () => {} };
let code = await runCli(['validate', scenarioPath], io);
const startupKib = highWaterKib();
const reset = code === 0 && resetHighWater();
let seconds = 0;
if (code === 0) {
  const start = performance.now();
  code = await runCli(['generate', scenarioPath, ...flags], io);
  seconds = (performance.now() - start) / 1000;
}
const sweepKib = reset ? highWaterKib() : null;
// getrusage's maximum is the portable figure; where /proc exists the two high-water marks give it exactly.
const peakKib = startupKib !== null && sweepKib !== null ? Math.max(startupKib, sweepKib) : process.resourceUsage().maxRSS;
process.stdout.write(`${JSON.stringify({ code, seconds, peakKib, sweepPeakKib: sweepKib })}\n`);
process.exitCode = code;
