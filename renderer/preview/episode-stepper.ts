// Runs one sampled episode a few recorded steps at a time, so the preview can show frames while
// the rest is still being computed. It performs exactly the arithmetic of recordTrajectory
// (sim/episode/record-episode.ts) in the same order — same sub-steps, same controls, same
// blow-up checks — so a previewed episode is the episode `generate` writes.
import type { BlowUpLimits } from '../../sim/core/blow-up-check.ts';
import { checkForBlowUp, DEFAULT_BLOW_UP_LIMITS } from '../../sim/core/blow-up-check.ts';
import { ENERGY_TERM_COUNT, measureEnergies } from '../../sim/core/energy.ts';
import type { Model } from '../../sim/core/model.ts';
import { Simulator } from '../../sim/core/simulator.ts';
import type { World } from '../../sim/core/world.ts';
import type { RecordingSettings } from '../../sim/episode/record-episode.ts';
import { resolveSubsteps } from '../../sim/episode/record-episode.ts';

export class EpisodeStepper {
  readonly steps: number;
  readonly substeps: number;
  readonly dtS: number;
  readonly criticalDtS: number;
  /** Recorded frames produced so far (the initial state is frame 0). */
  framesDone = 0;
  private readonly simulator: Simulator;
  private readonly control: Float64Array;
  private readonly limits: BlowUpLimits;

  constructor(
    readonly model: Model,
    readonly world: World,
    readonly controls: Float64Array,
    readonly settings: RecordingSettings,
  ) {
    this.steps = settings.recordedSteps;
    const resolved = resolveSubsteps(model, world, settings);
    this.substeps = resolved.substeps;
    this.dtS = resolved.dtS;
    this.criticalDtS = resolved.criticalDtS;
    this.limits = settings.limits ?? DEFAULT_BLOW_UP_LIMITS;
    this.simulator = new Simulator(model, world);
    this.control = new Float64Array(model.controlChannelCount);
    if (controls.length !== this.steps * model.controlChannelCount) {
      throw new RangeError(`controls hold ${controls.length} values, expected ${this.steps} steps × ${model.controlChannelCount} channels`);
    }
  }

  get frameCount(): number {
    return this.steps + 1;
  }

  /**
   * Writes up to `maxFrames` further frames into the chunk arrays (positions as float32 for
   * drawing) and returns how many it wrote. Throws SimulationBlowUpError like recordTrajectory.
   */
  advance(maxFrames: number, positionsM: Float32Array, timeS: Float64Array, energiesJ: Float64Array): number {
    const model = this.model;
    const n3 = model.nodeCount * 3;
    const channels = model.controlChannelCount;
    let written = 0;
    while (written < maxFrames && this.framesDone < this.frameCount) {
      const frame = this.framesDone;
      if (frame === 0) {
        checkForBlowUp(model, this.limits, 0, this.dtS, this.criticalDtS);
      } else {
        const t = frame - 1;
        for (let c = 0; c < channels; c++) this.control[c] = this.controls[t * channels + c];
        this.simulator.setControls(this.control);
        this.simulator.advanceInterval(this.settings.recordIntervalS, this.substeps);
        checkForBlowUp(model, this.limits, frame, this.dtS, this.criticalDtS);
      }
      const x = model.positionM;
      const o = written * n3;
      for (let k = 0; k < n3; k++) positionsM[o + k] = x[k];
      timeS[written] = frame * this.settings.recordIntervalS;
      measureEnergies(model, this.world, energiesJ, ENERGY_TERM_COUNT * written);
      this.framesDone++;
      written++;
    }
    return written;
  }
}
