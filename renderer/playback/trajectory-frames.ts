// One episode's recorded motion held for playback: positions per frame (float32, what the GPU
// takes anyway), record times, energies and the control vector of every interval. Sized once
// for the whole episode; the preview fills it as the worker streams frames in, dataset playback
// fills it in one go.
import { ENERGY_TERM_COUNT } from '../../sim/core/energy.ts';

export class TrajectoryFrames {
  /** (frames) × nodes × 3, m. */
  readonly positionsM: Float32Array;
  /** Record time of each frame, s. */
  readonly timeS: Float64Array;
  /** (frames) × ENERGY_TERM_COUNT in ENERGY_TERMS order, J; NaN where not recorded. */
  readonly energiesJ: Float64Array;
  /** (frames − 1) × channels: the control vector applied from frame t to t + 1. */
  readonly controls: Float64Array;
  /** Frames received so far. */
  filled = 0;

  constructor(
    readonly nodeCount: number,
    readonly channelCount: number,
    /** Frames in the whole episode (recorded steps + 1). */
    readonly frameCount: number,
  ) {
    this.positionsM = new Float32Array(frameCount * nodeCount * 3);
    this.timeS = new Float64Array(frameCount);
    this.energiesJ = new Float64Array(frameCount * ENERGY_TERM_COUNT).fill(Number.NaN);
    this.controls = new Float64Array(Math.max(0, frameCount - 1) * channelCount);
  }

  get complete(): boolean {
    return this.filled >= this.frameCount;
  }

  /** Offset of frame f's first coordinate in positionsM. */
  positionOffset(frame: number): number {
    return frame * this.nodeCount * 3;
  }

  /** Offset in `controls` of the vector that acts on frame f (the last interval's for the final frame). */
  controlOffset(frame: number): number {
    const interval = Math.min(frame, this.frameCount - 2);
    return Math.max(0, interval) * this.channelCount;
  }

  /** Copies frames [first, first + count) in; a later chunk may not leave a gap. */
  receive(first: number, count: number, positionsM: Float32Array, timeS: Float64Array, energiesJ: Float64Array | null, controls: Float64Array | null): void {
    if (first > this.filled) throw new RangeError(`frames ${this.filled}…${first - 1} are missing before chunk at ${first}`);
    this.positionsM.set(positionsM, this.positionOffset(first));
    this.timeS.set(timeS, first);
    if (energiesJ) this.energiesJ.set(energiesJ, ENERGY_TERM_COUNT * first);
    if (controls) {
      // Chunks carry the controls of their own intervals, which end one short of the last frame.
      const room = this.controls.length - first * this.channelCount;
      this.controls.set(controls.length <= room ? controls : controls.subarray(0, room), first * this.channelCount);
    }
    this.filled = Math.max(this.filled, first + count);
  }
}
