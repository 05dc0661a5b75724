// The `score-korrin-tether` benchmark case (sim/bench/score-throughput.ts): one JSON line with
// exactly the documented keys, its rate the quotient of the episodes and seconds on the line
// (arithmetic, common practice, no source), the episode count that of the recorded episodes of
// a korrin-tether sweep of PLIANT_BENCH_SCORE_EPISODES episodes, and a positive peak memory for
// both child runs. No time is asserted: benchmarks measure.
import { spawnSync } from 'node:child_process';
import { join } from 'node:path';

import { describe, expect, it } from 'vitest';

import { SCORE_EPISODES_VARIABLE } from '../sim/bench/score-throughput.ts';

describe('score benchmark line', () => {
  it('score-korrin-tether: episodes, seconds, episodes_per_s, peak memory over all splits and over held-out', () => {
    const run = spawnSync(process.execPath, ['sim/cli/pliant-launcher.mjs', 'bench', '--case', 'score-korrin-tether'], {
      cwd: join(import.meta.dirname, '..'),
      encoding: 'utf8',
      env: { ...process.env, [SCORE_EPISODES_VARIABLE]: '40' },
      timeout: 300_000,
    });
    expect(run.stderr).toBe('');
    expect(run.status).toBe(0);
    const lines = run.stdout.split('\n').filter((l) => l !== '').map((l) => JSON.parse(l) as Record<string, number | string>);
    expect(lines.length).toBe(1);
    const line = lines[0];
    expect(line.case).toBe('score-korrin-tether');
    const keys = ['case', 'episodes', 'seconds', 'episodes_per_s', 'peak_rss_mb', 'held_out_episodes'];
    const heldOutKeys = (line.held_out_episodes as number) > 0 ? ['held_out_seconds', 'held_out_peak_rss_mb'] : [];
    expect(Object.keys(line).sort()).toEqual([...keys, ...heldOutKeys].sort());
    expect(line.episodes).toBeGreaterThan(0);
    expect(line.episodes).toBeLessThanOrEqual(40);
    const rate = (line.episodes as number) / (line.seconds as number);
    expect(Math.abs((line.episodes_per_s as number) - rate) / rate).toBeLessThan(2e-3);
    expect(line.peak_rss_mb).toBeGreaterThan(0);
    if (heldOutKeys.length > 0) expect(line.held_out_peak_rss_mb).toBeGreaterThan(0);
  }, 300_000);
});
