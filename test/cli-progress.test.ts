// The progress display of `pliant generate`: on a terminal a bar with episodes per second and the
// time left, computed as rate = episodes done since the start / elapsed seconds and time left =
// episodes remaining / rate (common practice, no source); with --progress json one JSON object
// per line (RFC 8259 text, parsed back with JSON.parse); nothing with --progress none.
import { describe, expect, it } from 'vitest';

import { ProgressDisplay } from '../sim/cli/progress-display.ts';
import type { GenerationEvent } from '../sim/dataset/write/generation-progress.ts';

function run(mode: 'bar' | 'json' | 'none', events: Array<[number, GenerationEvent]>): string {
  let now = 0;
  let out = '';
  const display = new ProgressDisplay(mode, (t) => void (out += t), () => now);
  for (const [at, event] of events) {
    now = at;
    display.onEvent(event);
  }
  return out;
}

const START: GenerationEvent = { type: 'start', total: 10, alreadyDone: 2, workers: 2, outDir: '/tank/run' };
const episode = (done: number, rejected = 0): GenerationEvent => ({ type: 'episode', id: `ep-00000${done}`, index: done, status: 'ok', done, total: 10, rejected });

describe('progress display', () => {
  it('shows episodes per second and the time left on a terminal, counting only this run\'s episodes', () => {
    // Resumed with 2 done; 4 more in 2 s: 2.0 episodes/s, 4 left: 2 s.
    const text = run('bar', [[0, START], [2000, episode(6, 1)]]);
    const last = text.split('\r').at(-1)!;
    expect(last).toContain('6/10 episodes');
    expect(last).toContain('2.0 ep/s');
    expect(last).toContain('ETA 0:02');
    expect(last).toContain('1 rejected');
    // 28-character bar, 6/10 filled: 17 of 28 (rounded).
    expect(last).toMatch(/\[█{17}░{11}\]/);
  });

  it('writes one parseable JSON object per event with --progress json', () => {
    const events: Array<[number, GenerationEvent]> = [[0, START], [500, episode(3)], [900, { type: 'finish', total: 10, ok: 10, rejected: 0, outDir: '/tank/run' }]];
    const lines = run('json', events).trimEnd().split('\n');
    expect(lines.map((l) => JSON.parse(l))).toEqual(events.map(([, e]) => e));
  });

  it('writes nothing with --progress none', () => {
    expect(run('none', [[0, START], [100, episode(3)]])).toBe('');
  });
});
