// Preloaded (node --import) into a `pliant` process by the cli-start bench: at exit it writes the
// process's peak resident memory (getrusage's maximum, KiB) and its CPU seconds (user + system)
// as JSON to the file PLIANT_BENCH_PROBE_FILE names. A child's peak can only be read from inside
// it; this adds one tiny module to its start.
import { writeFileSync } from 'node:fs';

const target = process.env.PLIANT_BENCH_PROBE_FILE;
if (target) {
  process.on('exit', () => {
    const usage = process.resourceUsage();
    writeFileSync(target, `${JSON.stringify({ maxRssKib: usage.maxRSS, cpuS: (usage.userCPUTime + usage.systemCPUTime) / 1e6 })}\n`);
  });
}
