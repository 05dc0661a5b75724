// Shows a dataset run's progress: a one-line bar with episodes per second and time left on a
// terminal, one JSON object per line for scripts (`--progress json`), or nothing.
import type { GenerationEvent } from '../dataset/write/generation-progress.ts';

export type ProgressMode = 'bar' | 'json' | 'none';

const BAR_WIDTH = 28;

function clock(seconds: number): string {
  if (!Number.isFinite(seconds)) return '--:--';
  const s = Math.max(0, Math.round(seconds));
  const h = Math.floor(s / 3600);
  const m = Math.floor((s % 3600) / 60);
  const rest = String(s % 60).padStart(2, '0');
  return h > 0 ? `${h}:${String(m).padStart(2, '0')}:${rest}` : `${m}:${rest}`;
}

export class ProgressDisplay {
  private startedMs = 0;
  private doneAtStart = 0;
  private lastDrawMs = 0;

  constructor(
    private readonly mode: ProgressMode,
    private readonly write: (text: string) => void,
    private readonly nowMs: () => number = () => Date.now(),
  ) {}

  readonly onEvent = (event: GenerationEvent): void => {
    if (this.mode === 'json') {
      this.write(`${JSON.stringify(event)}\n`);
      return;
    }
    if (this.mode === 'none') return;
    if (event.type === 'start') {
      this.startedMs = this.nowMs();
      this.doneAtStart = event.alreadyDone;
      this.draw(event.alreadyDone, event.total, 0, true);
    } else if (event.type === 'episode') {
      this.draw(event.done, event.total, event.rejected, event.done === event.total);
    } else if (event.type === 'assemble') {
      this.write(`\r\x1b[Kwriting ${event.file}`);
    } else {
      this.write(`\r\x1b[K`);
    }
  };

  private draw(done: number, total: number, rejected: number, force: boolean): void {
    const now = this.nowMs();
    // Redrawing more than ten times a second only costs time on a slow terminal.
    if (!force && now - this.lastDrawMs < 100) return;
    this.lastDrawMs = now;
    const fraction = total === 0 ? 1 : done / total;
    const filled = Math.round(fraction * BAR_WIDTH);
    const elapsedS = (now - this.startedMs) / 1000;
    const rate = elapsedS > 0 ? (done - this.doneAtStart) / elapsedS : 0;
    const eta = rate > 0 ? (total - done) / rate : Infinity;
    const flagged = rejected > 0 ? `  ${rejected} rejected` : '';
    this.write(`\r\x1b[K[${'█'.repeat(filled)}${'░'.repeat(BAR_WIDTH - filled)}] ${done}/${total} episodes  ${rate.toFixed(1)} ep/s  ETA ${clock(eta)}${flagged}`);
  }
}
