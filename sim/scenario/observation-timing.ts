// The time base of an observation in whole records: its frame stride (from frameStride, or from
// rateHz, which must divide the record rate) and its latency (latencyS, which must be a whole
// number of record intervals). Both are fixed for the sweep, like the record interval itself,
// and refused rather than rounded, so the observed times are exactly a subset of the record times.
import { OBSERVATION_TIMING_TOLERANCE } from './scenario-limits.ts';
import type { ScenarioProblem } from './scenario-problem.ts';
import type { ObservationSpec, TimeSpec } from './scenario-types.ts';

export interface ObservationTiming {
  frameStride: number;
  latencyRecords: number;
}

export type ObservationTimingResult = { ok: true; timing: ObservationTiming } | { ok: false; problems: ScenarioProblem[] };

function nearlyWhole(value: number): number | null {
  const whole = Math.round(value);
  return Math.abs(value - whole) <= OBSERVATION_TIMING_TOLERANCE * Math.max(1, Math.abs(value)) ? whole : null;
}

function shortNumber(value: number): string {
  return String(Number(value.toPrecision(6)));
}

export function observationTiming(spec: ObservationSpec, time: TimeSpec): ObservationTimingResult {
  const problems: ScenarioProblem[] = [];
  const intervalS = time.recordIntervalS;
  const recordRateHz = 1 / intervalS;
  let frameStride = 1;
  if (spec.frameStride !== undefined && spec.rateHz !== undefined) {
    problems.push({ pointer: '/observation/rateHz', message: 'is given together with frameStride; give one of them (frameStride counts records, rateHz is frames per second)' });
  } else if (spec.frameStride !== undefined) {
    frameStride = spec.frameStride;
  } else if (spec.rateHz !== undefined) {
    const ratio = recordRateHz / spec.rateHz;
    const whole = nearlyWhole(ratio);
    if (ratio < 1 && whole !== 1) {
      problems.push({ pointer: '/observation/rateHz', message: `${spec.rateHz} Hz is above the record rate of ${shortNumber(recordRateHz)} Hz (1 / recordIntervalS); a sensor cannot see more often than the simulator records, so use at most ${shortNumber(recordRateHz)} Hz` });
    } else if (whole === null) {
      const lower = Math.floor(ratio);
      // Twelve digits: close enough to the record rate over k to be accepted when copied.
      const suggestions = [lower, lower + 1].map((k) => `${Number((recordRateHz / k).toPrecision(12))} Hz (${k === 1 ? 'every record' : `every ${k} records`})`).join(' or ');
      problems.push({
        pointer: '/observation/rateHz',
        message: `${spec.rateHz} Hz does not divide the record rate of ${shortNumber(recordRateHz)} Hz (1 / recordIntervalS): the sensor sees every k-th record, so use the record rate divided by a whole number, e.g. ${suggestions}, or give frameStride instead`,
      });
    } else {
      frameStride = whole;
    }
  }
  let latencyRecords = 0;
  const records = spec.latencyS / intervalS;
  const wholeRecords = nearlyWhole(records);
  if (wholeRecords === null) {
    const lower = Math.floor(records);
    problems.push({
      pointer: '/observation/latencyS',
      message: `${spec.latencyS} s is not a whole number of record intervals (${intervalS} s); latency is not rounded, so use ${shortNumber(lower * intervalS)} or ${shortNumber((lower + 1) * intervalS)} s`,
    });
  } else if (wholeRecords > time.recordedSteps) {
    problems.push({
      pointer: '/observation/latencyS',
      message: `${spec.latencyS} s is ${wholeRecords} record intervals, longer than the ${time.recordedSteps} recorded steps: nothing would ever be observed; use at most ${shortNumber(time.recordedSteps * intervalS)} s`,
    });
  } else {
    latencyRecords = wholeRecords;
  }
  return problems.length > 0 ? { ok: false, problems } : { ok: true, timing: { frameStride, latencyRecords } };
}
