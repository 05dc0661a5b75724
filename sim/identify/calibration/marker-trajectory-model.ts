// The model a calibration fits: parameter values in, simulated marker positions at the
// measurement's frames out. It simulates the scenario's system from its laid-out shape at rest,
// driven by the recorded drive in place of the scenario's sampled controls, at the measurement's
// sample rate. The sub-step count is fixed once for the whole fit (from the stiffest corner of
// the search box), because a count that changed with the parameters would make the residuals
// jump and the finite-difference Jacobian meaningless. The count is the one "auto" gives at the
// demanding corner of the scenario's own ranges (the corner `pliant validate` checks); a
// candidate beyond that corner that is too stiff for it blows up and counts as a failed step.
import type { RecordingSettings } from '../../episode/record-episode.ts';
import { recordTrajectory, resolveSubsteps } from '../../episode/record-episode.ts';
import { specBounds } from '../../random/distribution.ts';
import { closestName } from '../../scenario/closest-name.ts';
import type { Scenario } from '../../scenario/scenario-types.ts';
import { CalibrationInputError } from './calibration-input-error.ts';
import { buildCalibrationSystem } from './calibration-system.ts';
import type { ParameterSelection } from './free-parameters.ts';
import type { Measurement } from './measurement.ts';

export class MarkerTrajectoryModel {
  readonly substeps: number;
  readonly recordIntervalS: number;
  readonly nodeCount: number;
  readonly channelNames: string[];
  /** Simulations run so far (each candidate and each Jacobian column costs one). */
  simulationCount = 0;
  private readonly controls: Float64Array;
  private readonly markerNodes: Int32Array;

  constructor(
    readonly scenario: Scenario,
    readonly measurement: Measurement,
    readonly selection: ParameterSelection,
  ) {
    this.recordIntervalS = 1 / measurement.sampleRateHz;
    const nominal = buildCalibrationSystem(scenario, this.valueTable(selection.free.map((p) => p.nominal)));
    const channels = nominal.system.controlChannels;
    this.nodeCount = nominal.system.model.nodeCount;
    this.channelNames = channels.map((c) => c.name);
    this.markerNodes = Int32Array.from(measurement.markers.map((m) => m.node));
    measurement.markers.forEach((marker, i) => {
      if (marker.node >= this.nodeCount) {
        throw new CalibrationInputError(
          `${measurement.source} /markers/${i}/node: marker "${marker.name}" sits on node ${marker.node}, but the scenario's system has ${this.nodeCount} nodes (0 to ${this.nodeCount - 1}); check the node numbering or the scenario's part count`,
        );
      }
    });
    const steps = measurement.frameCount - 1;
    this.controls = new Float64Array(steps * channels.length);
    for (const drive of measurement.drive) {
      if (!this.channelNames.includes(drive.channel)) {
        const near = closestName(drive.channel, this.channelNames);
        throw new CalibrationInputError(
          `${measurement.source} /drive/${drive.channel}: the scenario's system has no control channel "${drive.channel}"${near ? `; did you mean "${near}"?` : '.'} Its channels are: ${this.channelNames.join(', ') || 'none'}`,
        );
      }
    }
    channels.forEach((channel, c) => {
      const drive = measurement.drive.find((d) => d.channel === channel.name);
      if (drive === undefined) {
        throw new CalibrationInputError(
          `${measurement.source} /drive: control channel "${channel.name}" (${channel.description}, ${channel.unit}) has no recorded signal; add "${channel.name}": "<column>" under "drive" (use a column of zeros if it was held still)`,
        );
      }
      for (let t = 0; t < steps; t++) this.controls[t * channels.length + c] = drive.values[t];
    });
    this.substeps = this.chooseSubsteps();
  }

  /** JSON pointer → value for the builders: the free values given, everything else fixed. */
  valueTable(freeValues: ArrayLike<number>): Map<string, number> {
    const table = new Map(this.selection.fixedValues);
    this.selection.free.forEach((p, i) => table.set(p.pointer, freeValues[i]));
    return table;
  }

  /** Simulated marker positions, frameCount × markers × 3, m. Throws SimulationBlowUpError. */
  predict(freeValues: ArrayLike<number>): Float64Array {
    this.simulationCount++;
    const { system, world } = buildCalibrationSystem(this.scenario, this.valueTable(freeValues));
    const trajectory = recordTrajectory(system.model, world, this.controls, this.recording(this.substeps));
    const frames = this.measurement.frameCount;
    const markers = this.markerNodes.length;
    const out = new Float64Array(frames * markers * 3);
    const n = this.nodeCount;
    for (let s = 0; s < frames; s++) {
      for (let m = 0; m < markers; m++) {
        const from = (s * n + this.markerNodes[m]) * 3;
        const to = (s * markers + m) * 3;
        out[to] = trajectory.positionM[from];
        out[to + 1] = trajectory.positionM[from + 1];
        out[to + 2] = trajectory.positionM[from + 2];
      }
    }
    return out;
  }

  private recording(substeps: RecordingSettings['substeps']): RecordingSettings {
    return { recordIntervalS: this.recordIntervalS, recordedSteps: this.measurement.frameCount - 1, substeps, autoSafety: this.scenario.time.autoSafety };
  }

  private chooseSubsteps(): number {
    const choice = this.scenario.time.substeps;
    if (typeof choice === 'number') return choice;
    const corner = this.selection.free.map((p) => {
      const { min, max } = specBounds(p.parameter.spec);
      return p.parameter.demanding === 'high' ? max : p.parameter.demanding === 'low' ? min : p.nominal;
    });
    let substeps = 1;
    for (const values of [corner, this.selection.free.map((p) => p.nominal)]) {
      const { system, world } = buildCalibrationSystem(this.scenario, this.valueTable(values));
      substeps = Math.max(substeps, resolveSubsteps(system.model, world, this.recording(choice)).substeps);
    }
    return substeps;
  }
}
