// Job progress in words: how many episodes (a render job: pictures) are done, how fast, and about
// how long is left; or, for a job waiting for a free place, where it stands in the queue.
import type { JobProgress } from '../../sim/bridge/bridge-contract.ts';

export function describeRate(p: JobProgress): string {
  const counted = p.kind === 'render' ? 'pictures' : 'episodes';
  if (p.state === 'queued') {
    return `waiting to start · ${p.queuePosition === 1 ? 'next in the queue' : `number ${p.queuePosition ?? '?'} in the queue`}`;
  }
  const head = `${p.done} of ${p.total} ${counted}`;
  const rate = p.episodesPerS > 0 ? ` · ${p.episodesPerS >= 10 ? p.episodesPerS.toFixed(0) : p.episodesPerS.toPrecision(2)} ${counted}/s` : '';
  if (p.state === 'done') return `${head} · done${rate}`;
  if (p.state === 'cancelled') return `${head} · cancelled`;
  if (p.state === 'failed') return `${head} · failed`;
  return `${head}${rate} · ${p.etaS === null ? 'time left not known yet' : `about ${formatDuration(p.etaS)} left`}`;
}

/** "45 s", "3 min 20 s", "2 h 05 min". */
export function formatDuration(seconds: number): string {
  const s = Math.max(0, Math.round(seconds));
  if (s < 60) return `${s} s`;
  if (s < 3600) return `${Math.floor(s / 60)} min ${String(s % 60).padStart(2, '0')} s`;
  return `${Math.floor(s / 3600)} h ${String(Math.floor((s % 3600) / 60)).padStart(2, '0')} min`;
}
