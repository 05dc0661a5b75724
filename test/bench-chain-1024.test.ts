// The chain-1024 reference case: its checksum (sum of all position coordinates after 10,000
// steps) must be 408.1644 to six significant digits, the value given for this case in the
// project's issue, which fixed the case's definition; and `pliant bench --case chain-1024` prints
// exactly one JSON line with the keys documented in sim/bench/chain-1024.ts. No timing is
// asserted: benchmarks measure, they are not timed tests.
import { spawnSync } from 'node:child_process';

import { describe, expect, it } from 'vitest';

import { buildChain1024, runChain1024 } from '../sim/bench/chain-1024.ts';

// Reference value of the case: 408.1644 (project issue).
const ISSUE_CHECKSUM_6_DIGITS = '408.164';

describe('chain-1024 benchmark case', () => {
  it('is the chain the issue defines: 1,024 nodes, 1,023 structural + 1,022 bending springs, node 0 pinned', () => {
    const model = buildChain1024();
    expect(model.nodeCount).toBe(1024);
    expect(model.springCount).toBe(1023 + 1022);
    expect(model.inverseMassPerKg[0]).toBe(0);
    expect(model.inverseMassPerKg[1]).toBe(1 / 0.01);
  });

  it('ends on checksum 408.1644 to six significant digits (project issue)', () => {
    const { checksum, springUpdates } = runChain1024();
    expect(checksum.toPrecision(6)).toBe(ISSUE_CHECKSUM_6_DIGITS);
    expect(springUpdates).toBe((1023 + 1022) * 10_000);
  });

  it('`pliant bench --case chain-1024` prints one JSON line with case, spring_updates_per_s, seconds, checksum', () => {
    const run = spawnSync(process.execPath, ['sim/cli/pliant-launcher.mjs', 'bench', '--case', 'chain-1024'], { cwd: process.cwd(), encoding: 'utf8', timeout: 110_000 });
    expect(run.stderr).toBe('');
    expect(run.status).toBe(0);
    const lines = run.stdout.split('\n').filter((line) => line !== '');
    expect(lines).toHaveLength(1);
    const line = JSON.parse(lines[0]) as Record<string, unknown>;
    expect(Object.keys(line).sort()).toEqual(['case', 'checksum', 'kernel', 'seconds', 'spring_updates_per_s']);
    expect(line.kernel).toBe('js');
    expect(line.case).toBe('chain-1024');
    expect((line.checksum as number).toPrecision(6)).toBe(ISSUE_CHECKSUM_6_DIGITS);
    expect(Number.isInteger(line.spring_updates_per_s)).toBe(true);
    expect(line.spring_updates_per_s as number).toBeGreaterThan(0);
    expect(line.seconds as number).toBeGreaterThan(0);
  });
});
