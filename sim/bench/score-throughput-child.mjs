// Child process of the score benchmark: runs one `pliant score` in this fresh process and prints,
// as one JSON line, its exit code, the seconds it took and the process's peak resident memory,
// so the figure holds nothing of the bench that generated the dataset. Plain JavaScript because
// it must register the TypeScript loader before it can load the command line.
//
// Arguments: the score arguments (DATASET PREDICTIONS --out DIR --split …).
import { readFileSync } from 'node:fs';

import { register } from 'tsx/esm/api';

register();
const { runCli, defaultIo } = await import('../cli/main.ts');

function highWaterKib() {
  try {
    return Number(/^VmHWM:\s+(\d+) kB$/m.exec(readFileSync('/proc/self/status', 'utf8'))[1]);
  } catch {
    return null;
  }
}

const io = { ...defaultIo(), stdout: () => {} };
const start = performance.now();
const code = await runCli(['score', ...process.argv.slice(2)], io);
const seconds = (performance.now() - start) / 1000;
const peakKib = highWaterKib() ?? process.resourceUsage().maxRSS;
process.stdout.write(`${JSON.stringify({ code, seconds, peakKib })}\n`);
process.exitCode = code;
