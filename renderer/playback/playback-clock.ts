// Playback state of one trajectory: which frame shows, whether time runs, how fast. Wall-clock
// time advances episode time by speed × elapsed; the shown frame is the last recorded one at
// or before that time. Streaming trajectories hold at the newest frame until more arrive.

export const PLAYBACK_SPEEDS = [0.1, 0.25, 0.5, 1, 2, 4] as const;

export class PlaybackClock {
  frame = 0;
  playing = false;
  speed = 1;
  loop = true;
  private episodeTimeS = 0;

  constructor(
    /** Time between frames, s. */
    readonly frameIntervalS: number,
    /** Frames in the whole episode. */
    readonly frameCount: number,
  ) {}

  /** Advances by elapsedS of wall-clock time; `available` frames are ready. Returns true when the frame changed. */
  advance(elapsedS: number, available: number): boolean {
    if (!this.playing || available === 0) return false;
    const before = this.frame;
    this.episodeTimeS += elapsedS * this.speed;
    let next = Math.floor(this.episodeTimeS / this.frameIntervalS + 1e-9);
    if (next >= this.frameCount && this.loop && available >= this.frameCount) {
      next = 0;
      this.episodeTimeS = 0;
    }
    if (next >= available) {
      next = available - 1;
      this.episodeTimeS = next * this.frameIntervalS;
    }
    this.frame = next;
    return this.frame !== before;
  }

  /** Jumps to frame f (clamped to the frames available); keeps playing if it was. */
  seek(frame: number, available: number): void {
    const last = Math.max(0, Math.min(this.frameCount, available) - 1);
    this.frame = Math.min(last, Math.max(0, Math.round(frame)));
    this.episodeTimeS = this.frame * this.frameIntervalS;
  }

  step(delta: number, available: number): void {
    this.playing = false;
    this.seek(this.frame + delta, available);
  }

  toggle(): void {
    this.playing = !this.playing;
    // Pressing play at the end starts over rather than doing nothing.
    if (this.playing && this.frame >= this.frameCount - 1) this.seek(0, 1);
  }
}
