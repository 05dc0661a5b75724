// One render job for the app: draws a recorded episode from its files as a looping GIF or a
// folder of numbered PNG pictures, with the same code and the same bytes as `pliant render`,
// and reports progress as the job runner's messages (electron/job-worker-protocol.ts). Expected
// failures — an unknown episode, a damaged file, a full disk — end the job with a message in the
// app's words, never a stack trace or a command-line flag.
import { mkdirSync } from 'node:fs';
import { join } from 'node:path';

import { writeFileAtomic } from '../dataset/formats/atomic-file.ts';
import { toDatasetWriteError } from '../dataset/formats/dataset-write-error.ts';
import type { JobMessage } from '../dataset/jobs/job-message.ts';
import { reportOf } from '../errors/error-report.ts';
import type { PictureView } from './episode-picture.ts';
import { MissingPictureArrayError, renderedGif, renderedPngs,renderEpisode } from './render-episode.ts';

export interface RenderJob {
  kind: 'render';
  /** Real absolute path of the dataset folder, already checked. */
  datasetDir: string;
  episodeId: string;
  /** 'gif': one looping animation; 'frames': frame-00000.png, frame-00001.png, … in a new folder. */
  output: 'gif' | 'frames';
  /** The .gif file to write, or the folder to create for the pictures; real, absolute, already checked to be writable. */
  outPath: string;
  view: PictureView;
  widthPx: number;
  heightPx: number;
  /** GIF playback speed, 1 = real time. */
  speed: number;
}

export type RenderJobMessage = JobMessage;

class RenderCancelled extends Error {}

const PROGRESS_INTERVAL_MS = 200;
/** How long drawing runs before the worker lets a waiting 'cancel' message in. */
const YIELD_INTERVAL_MS = 50;

export async function runRenderJob(job: RenderJob, post: (message: RenderJobMessage) => void, cancelled: () => boolean, nowMs: () => number = Date.now): Promise<void> {
  let done = 0;
  let total = 0;
  let lastPostMs = -Infinity;
  let lastYieldMs = nowMs();
  try {
    const rendered = await renderEpisode(
      job.datasetDir,
      job.episodeId,
      { view: job.view, widthPx: job.widthPx, heightPx: job.heightPx, speed: job.speed, frameStride: 'auto' },
      async (drawn, of) => {
        done = drawn;
        total = of;
        const now = nowMs();
        if (now - lastYieldMs >= YIELD_INTERVAL_MS) {
          await new Promise<void>((resolve) => setImmediate(resolve));
          lastYieldMs = nowMs();
        }
        if (cancelled()) throw new RenderCancelled();
        if (now - lastPostMs >= PROGRESS_INTERVAL_MS || drawn === of) {
          lastPostMs = now;
          post({ type: 'progress', done, total });
        }
      },
    );
    const frames = rendered.frames.length;
    const kept = rendered.strideUsed === 1 ? 'every recorded frame' : `one recorded frame in ${rendered.strideUsed}`;
    if (job.output === 'gif') {
      const bytes = renderedGif(rendered, job.speed);
      writeFileAtomic(job.outPath, bytes);
      post({ type: 'done', done: frames, total: frames, message: `Saved episode ${job.episodeId} as ${job.outPath}: ${frames} frames (${kept}), ${job.widthPx}×${job.heightPx} px, ${bytes.length} bytes.` });
    } else {
      try {
        mkdirSync(job.outPath);
      } catch (error) {
        throw toDatasetWriteError(error, job.outPath);
      }
      let bytes = 0;
      const pngs = renderedPngs(rendered);
      for (let i = 0; i < pngs.length; i++) {
        writeFileAtomic(join(job.outPath, `frame-${String(i).padStart(5, '0')}.png`), pngs[i]);
        bytes += pngs[i].length;
      }
      post({ type: 'done', done: frames, total: frames, message: `Saved episode ${job.episodeId} as ${frames} PNG pictures (${kept}) in ${job.outPath}: ${job.widthPx}×${job.heightPx} px, ${bytes} bytes in all.` });
    }
  } catch (error) {
    if (error instanceof RenderCancelled) {
      post({ type: 'cancelled', done, total });
      return;
    }
    const words = inAppWords(error, job);
    if (words === null) throw error;
    post({ type: 'failed', message: words });
  }
}

/** The app's words for an expected failure, or null for a defect the worker should report as one. */
function inAppWords(error: unknown, job: RenderJob): string | null {
  if (error instanceof MissingPictureArrayError) {
    return `Episode ${error.episodeId} has no "${error.arrayName}" array, which a picture needs. Check the dataset with "Verify checksums" on the Datasets screen.`;
  }
  const report = reportOf(error);
  return report.kind === 'bug' ? null : `Could not save episode ${job.episodeId}: ${report.message}`;
}
