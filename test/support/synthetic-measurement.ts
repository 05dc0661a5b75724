// Synthetic bench measurements for the calibration tests: a scenario simulated by the
// calibration's own model at chosen "true" values, plus independent normal noise of a chosen
// standard deviation on every marker coordinate (Philox stream keyed by the seed).
import { selectParameters } from '../../sim/identify/calibration/free-parameters.ts';
import { MarkerTrajectoryModel } from '../../sim/identify/calibration/marker-trajectory-model.ts';
import type { MeasuredDrive, Measurement, MeasurementMarker } from '../../sim/identify/calibration/measurement.ts';
import { RandomStream, StreamPurpose } from '../../sim/random/random-stream.ts';
import type { Scenario } from '../../sim/scenario/scenario-types.ts';

export interface SyntheticMeasurementSpec {
  scenario: Scenario;
  markers: MeasurementMarker[];
  frameCount: number;
  sampleRateHz: number;
  trueValues: Record<string, number>;
  noiseStdM: number;
  seed: number;
  drive?: MeasuredDrive[];
  knownParameters?: Record<string, number>;
}

/** The noise-free marker positions at the true values (frames × markers × 3). */
export function cleanPositions(spec: SyntheticMeasurementSpec): Float64Array {
  const skeleton = measurementOf(spec, new Float64Array(spec.frameCount * spec.markers.length * 3));
  const selection = selectParameters(spec.scenario, skeleton.knownParameters, Object.keys(spec.trueValues), skeleton.source);
  const model = new MarkerTrajectoryModel(spec.scenario, skeleton, selection);
  return model.predict(selection.free.map((p) => spec.trueValues[p.pointer]));
}

export function syntheticMeasurement(spec: SyntheticMeasurementSpec, clean = cleanPositions(spec)): Measurement {
  const noise = new RandomStream(spec.seed, 0, StreamPurpose.parameters, 7);
  const noisy = Float64Array.from(clean, (x) => x + spec.noiseStdM * noise.nextNormal());
  return measurementOf(spec, noisy);
}

function measurementOf(spec: SyntheticMeasurementSpec, positionsM: Float64Array): Measurement {
  return {
    source: `synthetic-${spec.seed}.json`,
    description: 'synthetic test measurement (invented)',
    sampleRateHz: spec.sampleRateHz,
    markers: spec.markers,
    frameCount: spec.frameCount,
    positionsM,
    drive: spec.drive ?? [],
    knownParameters: spec.knownParameters ?? {},
  };
}
