// The progress of one long job (an export or a regeneration) as a bar and a line of words, fed by
// the bridge's job.progress events. Events can arrive before the request that started the job
// has answered with its id, so the latest event of every job is kept until the id is known.
import type { JobProgress } from '../../sim/bridge/bridge-contract.ts';
import type { PliantBridge } from '../bridge/pliant-bridge.ts';
import { h } from '../ui/element.ts';
import { describeRate } from './progress-words.ts';

export class JobProgressView {
  readonly bar: HTMLProgressElement;
  readonly text: HTMLElement;
  private jobId: string | null = null;
  private readonly latest = new Map<string, JobProgress>();

  constructor(
    bridge: PliantBridge,
    role: string,
    /** Called once when the followed job is done, cancelled or failed. */
    private readonly ended: (p: JobProgress) => void,
  ) {
    this.bar = h('progress', { className: 'job-bar', attrs: { max: '1', value: '0', 'data-role': `${role}-progress` } });
    this.text = h('div', { className: 'progress-text', attrs: { 'data-role': `${role}-progress-text`, 'aria-live': 'polite' } });
    bridge.onEvent((event) => {
      if (event.name !== 'job.progress') return;
      if (event.payload.jobId === this.jobId) this.show(event.payload);
      else if (this.jobId === null) this.latest.set(event.payload.jobId, event.payload);
    });
  }

  get following(): boolean {
    return this.jobId !== null;
  }

  /** Clears the bar before a job starts. */
  reset(words: string): void {
    this.jobId = null;
    this.latest.clear();
    this.bar.max = 1;
    this.bar.value = 0;
    this.text.textContent = words;
    this.text.removeAttribute('data-done');
    this.text.removeAttribute('data-total');
    this.text.removeAttribute('data-state');
    this.text.removeAttribute('data-queue-position');
  }

  follow(jobId: string): void {
    this.jobId = jobId;
    const early = this.latest.get(jobId);
    this.latest.clear();
    if (early) this.show(early);
  }

  private show(p: JobProgress): void {
    this.bar.max = Math.max(1, p.total);
    this.bar.value = p.done;
    this.text.textContent = describeRate(p);
    this.text.setAttribute('data-done', String(p.done));
    this.text.setAttribute('data-total', String(p.total));
    this.text.setAttribute('data-state', p.state);
    if (p.state === 'queued') this.text.setAttribute('data-queue-position', String(p.queuePosition ?? ''));
    else this.text.removeAttribute('data-queue-position');
    if (p.state === 'running' || p.state === 'queued') return;
    this.jobId = null;
    this.ended(p);
  }
}
