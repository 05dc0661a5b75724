// The curves plotted beside the 3-D view, taken out of a trajectory as it fills: one node's
// coordinates, the energies and their sum, and every control channel, each a full-length array
// of which the first `filled` entries are valid. Extending them touches only the new frames.
import { ENERGY_BASE_COUNT, ENERGY_NAMES, ENERGY_TERM_COUNT,ENERGY_TERMS } from '../../sim/core/energy.ts';
import type { TrajectoryFrames } from '../playback/trajectory-frames.ts';

const KINETIC = ENERGY_NAMES.indexOf('kinetic');
const ELASTIC = ENERGY_NAMES.indexOf('elastic');
const GRAVITATIONAL = ENERGY_NAMES.indexOf('gravitational');
const BENDING = ENERGY_NAMES.indexOf('bending');

export class TrajectorySeries {
  readonly xM: Float64Array;
  readonly yM: Float64Array;
  readonly zM: Float64Array;
  readonly kineticJ: Float64Array;
  readonly elasticJ: Float64Array;
  readonly gravitationalJ: Float64Array;
  readonly bendingJ: Float64Array;
  readonly totalJ: Float64Array;
  readonly controls: Float64Array[];
  filled = 0;
  private node: number;

  constructor(readonly frames: TrajectoryFrames, node: number) {
    const n = frames.frameCount;
    this.node = Math.min(Math.max(0, node), frames.nodeCount - 1);
    this.xM = new Float64Array(n);
    this.yM = new Float64Array(n);
    this.zM = new Float64Array(n);
    this.kineticJ = new Float64Array(n);
    this.elasticJ = new Float64Array(n);
    this.gravitationalJ = new Float64Array(n);
    this.bendingJ = new Float64Array(n);
    this.totalJ = new Float64Array(n);
    this.controls = Array.from({ length: frames.channelCount }, () => new Float64Array(n));
  }

  get selectedNode(): number {
    return this.node;
  }

  /** Chooses another node and refills its coordinates. */
  selectNode(node: number): void {
    this.node = Math.min(Math.max(0, Math.round(node)), this.frames.nodeCount - 1);
    this.fillCoordinates(0, this.filled);
  }

  /** Takes in the frames that arrived since the last call. */
  extend(): void {
    const from = this.filled;
    const to = this.frames.filled;
    if (to <= from) return;
    this.fillCoordinates(from, to);
    const e = this.frames.energiesJ;
    for (let f = from; f < to; f++) {
      const row = ENERGY_TERM_COUNT * f;
      this.kineticJ[f] = e[row + KINETIC];
      this.elasticJ[f] = e[row + ELASTIC];
      this.gravitationalJ[f] = e[row + GRAVITATIONAL];
      this.bendingJ[f] = e[row + BENDING];
      // The total is the balance's: kinetic and every potential, supports left out; the columns
      // recorded only with energy accounting (NaN when a file lacks them) count where present.
      let total = 0;
      for (let t = 0; t < ENERGY_TERM_COUNT; t++) {
        if (ENERGY_TERMS[t].role === 'support') continue;
        const value = e[row + t];
        if (t >= ENERGY_BASE_COUNT && Number.isNaN(value)) continue;
        total += value;
      }
      this.totalJ[f] = total;
    }
    const channels = this.frames.channelCount;
    for (let c = 0; c < channels; c++) {
      const out = this.controls[c];
      for (let f = from; f < to; f++) out[f] = this.frames.controls[this.frames.controlOffset(f) + c];
    }
    this.filled = to;
  }

  private fillCoordinates(from: number, to: number): void {
    const p = this.frames.positionsM;
    const stride = this.frames.nodeCount * 3;
    const o = 3 * this.node;
    for (let f = from; f < to; f++) {
      this.xM[f] = p[f * stride + o];
      this.yM[f] = p[f * stride + o + 1];
      this.zM[f] = p[f * stride + o + 2];
    }
  }
}
