// The messages between the episode pool and its worker threads.
import type { ErrorReport } from '../../errors/error-report.ts';
import type { EpisodeOutcome } from './episode-outcome.ts';

export type ToEpisodeWorker = { type: 'episode'; index: number } | { type: 'stop' };

export type FromEpisodeWorker =
  | { type: 'outcome'; index: number; outcome: EpisodeOutcome }
  | { type: 'failed'; index: number; error: ErrorReport };
