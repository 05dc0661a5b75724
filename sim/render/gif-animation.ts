// Encodes a sequence of palette pictures as one looping animated GIF with gifenc. GIF delays
// are whole hundredths of a second and browsers slow down delays under 0.02 s (common
// practice, no source), so callers pick a frame stride that keeps each delay at 0.02 s or more;
// the delay of each frame is rounded from the episode's own time, so rounding never accumulates.
import * as gifencModule from 'gifenc';

import type { IndexedFrame } from './indexed-frame.ts';

export interface GifTiming {
  /** Time of each picture in the episode, s. */
  timesS: readonly number[];
  /** Playback speed: 1 plays in real time. */
  speed: number;
}

// gifenc ships a CommonJS build (what Node's loader takes, as a default export) and an ES
// module build (what bundlers take, with named exports): accept either.
const GIFEncoder = gifencModule.GIFEncoder ?? gifencModule.default.GIFEncoder;

export function encodeGif(frames: readonly IndexedFrame[], palette: number[][], timing: GifTiming): Uint8Array {
  const gif = GIFEncoder();
  let shownCs = 0;
  frames.forEach((frame, i) => {
    // The last picture holds for as long as the one before it.
    const nextS = i + 1 < timing.timesS.length ? timing.timesS[i + 1] : timing.timesS[i] + (i > 0 ? timing.timesS[i] - timing.timesS[i - 1] : 0.1);
    const endCs = Math.round(((nextS - timing.timesS[0]) / timing.speed) * 100);
    const delayCs = Math.max(2, endCs - shownCs);
    shownCs += delayCs;
    gif.writeFrame(frame.pixels, frame.widthPx, frame.heightPx, i === 0 ? { palette, delay: delayCs * 10, repeat: 0 } : { delay: delayCs * 10 });
  });
  gif.finish();
  return gif.bytes();
}
