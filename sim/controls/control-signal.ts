// Generates one channel's control signal for one episode: draws the spec's parameters once,
// writes the signal at every record time into a step-major array (zero-order hold between
// records), applies the clip and then the ramp-in window (ramp-in.ts), and returns the drawn
// parameters as ground-truth labels.
import type { NumericValueSpec } from '../random/distribution.ts';
import { sampleValue } from '../random/distribution.ts';
import type { JsonValue } from '../random/json-value.ts';
import type { RandomStream } from '../random/random-stream.ts';
import { childPointer, SpecError } from '../random/spec-problem.ts';
import type { ClipSpec, ControlKind, ControlSpec } from './control-spec.ts';
import { findControlSpecProblems } from './control-spec-problems.ts';
import { fillHeld, fillPiecewiseConstant, fillSwitchedLevels } from './held-levels.ts';
import { drawMultisine, fillMultisine } from './multisine-signal.ts';
import { fillOrnsteinUhlenbeck } from './ornstein-uhlenbeck-signal.ts';
import { applyRampIn } from './ramp-in.ts';
import { fillChirp, fillSinusoid } from './sinusoid-signal.ts';

/** The parameters one episode drew for a channel, in the spec's member names and units. */
export interface SampledControl {
  kind: ControlKind;
  [member: string]: JsonValue;
}

export interface ControlSignalOptions {
  /** The column a "replay" spec names, already read from its file: one value per record. */
  replay?: Float64Array;
  /** JSON pointer of the spec in its scenario, so errors point at the right place. */
  pointer?: string;
  /**
   * Length of the ramp-in window, s (0: none). It acts after the clip, so the signal starts
   * at 0 even when the clip's range leaves 0 out.
   */
  rampInS?: number;
}

/**
 * Fills out[t * channelCount + channel] for t in [0, stepCount). Draws come from `stream` in a
 * fixed order (the members as listed in the spec's type, then clip, then the signal's own
 * randomness), so the same stream position always gives the same signal. Give each channel
 * its own sub-stream, new RandomStream(seed, episode, StreamPurpose.controls, channelIndex), so
 * that adding a channel or changing one channel's spec leaves the others as they were.
 */
export function generateControlSignal(
  spec: ControlSpec,
  stream: RandomStream,
  recordIntervalS: number,
  stepCount: number,
  out: Float64Array,
  channel: number,
  channelCount: number,
  options: ControlSignalOptions = {},
): SampledControl {
  checkLayout(recordIntervalS, stepCount, out, channel, channelCount);
  const pointer = options.pointer ?? '';
  const problems = findControlSpecProblems(spec, pointer, recordIntervalS);
  if (problems.length > 0) throw new SpecError(problems);
  // Optional members (phaseRad, offset) default to 0; the checks above ensured the required ones.
  const draw = (member: NumericValueSpec | undefined, name: string): number =>
    member === undefined ? 0 : sampleValue(member, stream, childPointer(pointer, name));

  // Members first, then the clip, then the signal's own randomness: a constant clip draws
  // nothing, so adding or removing one leaves the signal unchanged.
  let sampled: SampledControl;
  let clip: DrawnClip | undefined;
  switch (spec.kind) {
    case 'none': {
      clip = drawClip(spec.clip, pointer, stream);
      fillHeld(out, channel, channelCount, 0, stepCount, 0);
      sampled = { kind: 'none' };
      break;
    }
    case 'constant': {
      const value = draw(spec.value, 'value');
      clip = drawClip(spec.clip, pointer, stream);
      fillHeld(out, channel, channelCount, 0, stepCount, value);
      sampled = { kind: 'constant', value };
      break;
    }
    case 'piecewise-constant': {
      const holdS = draw(spec.holdS, 'holdS');
      const min = draw(spec.min, 'min');
      const max = draw(spec.max, 'max');
      clip = drawClip(spec.clip, pointer, stream);
      const levelCount = fillPiecewiseConstant(out, channel, channelCount, stepCount, recordIntervalS, holdS, min, max, stream);
      sampled = { kind: 'piecewise-constant', holdS, min, max, levelCount };
      break;
    }
    case 'ornstein-uhlenbeck': {
      const meanValue = draw(spec.meanValue, 'meanValue');
      const std = draw(spec.std, 'std');
      const timeConstantS = draw(spec.timeConstantS, 'timeConstantS');
      clip = drawClip(spec.clip, pointer, stream);
      fillOrnsteinUhlenbeck(out, channel, channelCount, stepCount, recordIntervalS, meanValue, std, timeConstantS, stream);
      sampled = { kind: 'ornstein-uhlenbeck', meanValue, std, timeConstantS };
      break;
    }
    case 'band-limited': {
      const cutoffHz = draw(spec.cutoffHz, 'cutoffHz');
      const std = draw(spec.std, 'std');
      const componentCount = draw(spec.componentCount, 'componentCount');
      clip = drawClip(spec.clip, pointer, stream);
      const multisine = drawMultisine(cutoffHz, std, componentCount, stream);
      fillMultisine(out, channel, channelCount, stepCount, recordIntervalS, multisine);
      sampled = {
        kind: 'band-limited',
        cutoffHz,
        std,
        componentCount,
        componentAmplitude: multisine.componentAmplitude,
        componentFrequenciesHz: Array.from(multisine.frequenciesHz),
        componentPhasesRad: Array.from(multisine.phasesRad),
      };
      break;
    }
    case 'sinusoid': {
      const amplitude = draw(spec.amplitude, 'amplitude');
      const frequencyHz = draw(spec.frequencyHz, 'frequencyHz');
      const phaseRad = draw(spec.phaseRad, 'phaseRad');
      const offset = draw(spec.offset, 'offset');
      clip = drawClip(spec.clip, pointer, stream);
      fillSinusoid(out, channel, channelCount, stepCount, recordIntervalS, amplitude, frequencyHz, phaseRad, offset);
      sampled = { kind: 'sinusoid', amplitude, frequencyHz, phaseRad, offset };
      break;
    }
    case 'chirp': {
      const amplitude = draw(spec.amplitude, 'amplitude');
      const startFrequencyHz = draw(spec.startFrequencyHz, 'startFrequencyHz');
      const endFrequencyHz = draw(spec.endFrequencyHz, 'endFrequencyHz');
      const phaseRad = draw(spec.phaseRad, 'phaseRad');
      const offset = draw(spec.offset, 'offset');
      clip = drawClip(spec.clip, pointer, stream);
      fillChirp(out, channel, channelCount, stepCount, recordIntervalS, amplitude, startFrequencyHz, endFrequencyHz, phaseRad, offset);
      sampled = { kind: 'chirp', amplitude, startFrequencyHz, endFrequencyHz, phaseRad, offset, durationS: stepCount * recordIntervalS };
      break;
    }
    case 'steps': {
      const switchCount = draw(spec.stepCount, 'stepCount');
      const min = draw(spec.min, 'min');
      const max = draw(spec.max, 'max');
      clip = drawClip(spec.clip, pointer, stream);
      const durationS = stepCount * recordIntervalS;
      const switchTimesS = new Float64Array(switchCount);
      for (let i = 0; i < switchCount; i++) switchTimesS[i] = durationS * stream.nextFloat64();
      switchTimesS.sort();
      const levels = new Float64Array(switchCount + 1);
      for (let i = 0; i <= switchCount; i++) levels[i] = min + (max - min) * stream.nextFloat64();
      fillSwitchedLevels(out, channel, channelCount, stepCount, recordIntervalS, switchTimesS, levels);
      sampled = { kind: 'steps', stepCount: switchCount, min, max, switchTimesS: Array.from(switchTimesS), levels: Array.from(levels) };
      break;
    }
    case 'step-list': {
      const timesPointer = childPointer(pointer, 'timesS');
      const valuesPointer = childPointer(pointer, 'values');
      const timesS = spec.timesS.map((time, i) => sampleValue(time, stream, childPointer(timesPointer, i)));
      const values = spec.values.map((value, i) => sampleValue(value, stream, childPointer(valuesPointer, i)));
      clip = drawClip(spec.clip, pointer, stream);
      fillSwitchedLevels(out, channel, channelCount, stepCount, recordIntervalS, timesS.slice(1), values);
      sampled = { kind: 'step-list', timesS, values };
      break;
    }
    case 'replay': {
      const replay = options.replay;
      if (replay === undefined || replay.length < stepCount) {
        throw new SpecError([
          {
            pointer: childPointer(pointer, 'column'),
            message:
              replay === undefined
                ? `column ${spec.column} of ${spec.file} was not loaded`
                : `column ${spec.column} of ${spec.file} has ${replay.length} rows, the episode needs ${stepCount}`,
            fix: 'give the table at least one row per record of the episode, or shorten the episode',
          },
        ]);
      }
      clip = drawClip(spec.clip, pointer, stream);
      for (let t = 0; t < stepCount; t++) out[t * channelCount + channel] = replay[t];
      sampled = { kind: 'replay', file: spec.file, column: spec.column };
      break;
    }
  }
  if (clip !== undefined) {
    applyClip(out, channel, channelCount, stepCount, clip.min, clip.max);
    sampled.clip = clip.labels;
  }
  // A replayed table is a drive someone recorded or designed, start included (a bench drive
  // being calibrated against, say): windowing it would simulate a drive that never ran.
  if (spec.kind !== 'replay') applyRampIn(out, channel, channelCount, stepCount, recordIntervalS, options.rampInS ?? 0);
  return sampled;
}

interface DrawnClip {
  min: number;
  max: number;
  /** The limits the spec gave, as drawn; a side left out is not labelled. */
  labels: { [member: string]: JsonValue };
}

function drawClip(spec: ClipSpec | undefined, pointer: string, stream: RandomStream): DrawnClip | undefined {
  if (spec === undefined) return undefined;
  const clipPointer = childPointer(pointer, 'clip');
  const labels: { [member: string]: JsonValue } = {};
  let min = -Infinity;
  let max = Infinity;
  if (spec.min !== undefined) labels.min = min = sampleValue(spec.min, stream, childPointer(clipPointer, 'min'));
  if (spec.max !== undefined) labels.max = max = sampleValue(spec.max, stream, childPointer(clipPointer, 'max'));
  return { min, max, labels };
}

function applyClip(out: Float64Array, channel: number, channelCount: number, stepCount: number, min: number, max: number): void {
  for (let t = 0; t < stepCount; t++) {
    const i = t * channelCount + channel;
    const value = out[i];
    out[i] = value < min ? min : value > max ? max : value;
  }
}

function checkLayout(recordIntervalS: number, stepCount: number, out: Float64Array, channel: number, channelCount: number): void {
  if (!(recordIntervalS > 0) || !Number.isFinite(recordIntervalS)) {
    throw new RangeError(`recordIntervalS ${recordIntervalS} must be a positive number of seconds`);
  }
  if (!Number.isSafeInteger(stepCount) || stepCount < 0) throw new RangeError(`stepCount ${stepCount} must be a whole number >= 0`);
  if (!Number.isSafeInteger(channelCount) || channelCount < 1 || !Number.isSafeInteger(channel) || channel < 0 || channel >= channelCount) {
    throw new RangeError(`channel ${channel} must be a whole number below channelCount ${channelCount}`);
  }
  if (out.length < stepCount * channelCount) {
    throw new RangeError(`out holds ${out.length} values, fewer than ${stepCount} steps x ${channelCount} channels`);
  }
}
