// The job display's words (renderer/export/progress-words.ts) for a job waiting in the shell's
// queue, beside a running one: the queued job shows its place and no counts or rate, since it has
// not started. The running line is the worked example of the job runner's test (40 of 100
// episodes at 5 episodes/s, 12 s left; plain arithmetic, common practice, no source).
import { describe, expect, it } from 'vitest';

import { describeRate } from '../renderer/export/progress-words.ts';
import type { JobProgress } from '../sim/bridge/bridge-contract.ts';

const base: JobProgress = { jobId: 'job-1', kind: 'export', done: 0, total: 0, episodesPerS: 0, etaS: null, state: 'queued' };

describe('job progress in words', () => {
  it('names a waiting job\'s place in the queue', () => {
    expect(describeRate({ ...base, queuePosition: 1 })).toBe('waiting to start · next in the queue');
    expect(describeRate({ ...base, queuePosition: 3 })).toBe('waiting to start · number 3 in the queue');
  });

  it('counts, rates and times a running job', () => {
    expect(describeRate({ ...base, state: 'running', done: 40, total: 100, episodesPerS: 5, etaS: 12 })).toBe('40 of 100 episodes · 5.0 episodes/s · about 12 s left');
  });
});
