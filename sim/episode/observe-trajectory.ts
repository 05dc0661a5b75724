// What a position sensor reports of a recorded trajectory: a subset of nodes (markers), every
// k-th record, a whole number of records late, with Gaussian noise on each coordinate and
// random dropouts. The ground truth is only read; the observation is a set of new arrays.
//
// The order of the draws is part of the dataset format. For each observed frame (ascending),
// for each marker (ascending): three normals (x, y, z) from the noise source and one uniform
// from the dropout source. They are drawn for every sample, also for dropped samples and those
// before the first state exists, so a change of noise level, dropout rate or latency never
// shifts the draws of any other sample.

/** The observation of one episode, resolved from the scenario's `observation` block. */
export interface ObservationSettings {
  /** Node index of each marker, in marker order. */
  markerNodes: Int32Array;
  /** Standard deviation of the noise added to each coordinate, m. */
  positionNoiseStdM: number;
  /** Observed frame j is taken at record j · frameStride. */
  frameStride: number;
  /** The frame taken at record r shows the state of record r − latencyRecords. */
  latencyRecords: number;
  /** Chance that a marker is missing from one frame, independently per frame and marker. */
  dropoutProbability: number;
}

/** The draws an observation needs (a RandomStream provides them). */
export interface ObservationDrawSource {
  /** Standard normal. */
  nextNormal(): number;
  /** Uniform on [0, 1). */
  nextFloat64(): number;
}

/** The ground truth an observation is made from (a RecordedTrajectory is one). */
export interface ObservedSource {
  nodeCount: number;
  /** Recorded steps T: records 0 to T exist. */
  steps: number;
  /** (T+1) record times, s. */
  timeS: Float64Array;
  /** (T+1) × N × 3, m. */
  positionM: Float64Array;
}

export interface ObservedTrajectory {
  frameCount: number;
  markerCount: number;
  /** Time of each observed frame (when the sensor reports it), s; a copy of the record times. */
  timeS: Float64Array;
  /** frames × markers × 3, m; NaN where the marker was not seen. */
  positionM: Float64Array;
  /** frames × markers: 1 seen, 0 not seen (dropped, or before the delayed state exists). */
  seen: Uint8Array;
  /** Node index of each marker. */
  markerNodes: Int32Array;
}

/** Frames an observation of `steps` recorded steps has: records 0, k, 2k, … up to T. */
export function observedFrameCount(steps: number, frameStride: number): number {
  return Math.floor(steps / frameStride) + 1;
}

/**
 * Observes `source` as `settings` describe. Throws RangeError for settings that contradict the
 * trajectory (a marker beyond the node count, a stride below 1): a programming error, since the
 * scenario checks and the episode's resolution refuse such settings with a pointer first.
 */
export function observeTrajectory(source: ObservedSource, settings: ObservationSettings, noise: ObservationDrawSource, dropout: ObservationDrawSource): ObservedTrajectory {
  const n = source.nodeCount;
  const markers = settings.markerNodes;
  const m = markers.length;
  const stride = settings.frameStride;
  const latency = settings.latencyRecords;
  const stdM = settings.positionNoiseStdM;
  const p = settings.dropoutProbability;
  if (!Number.isSafeInteger(stride) || stride < 1) throw new RangeError(`frameStride ${stride} is not a whole number ≥ 1`);
  if (!Number.isSafeInteger(latency) || latency < 0) throw new RangeError(`latencyRecords ${latency} is not a whole number ≥ 0`);
  if (!(stdM >= 0) || !Number.isFinite(stdM)) throw new RangeError(`positionNoiseStdM ${stdM} is not a finite number ≥ 0`);
  if (!(p >= 0 && p < 1)) throw new RangeError(`dropoutProbability ${p} is not in [0, 1)`);
  for (let k = 0; k < m; k++) {
    if (!(markers[k] >= 0 && markers[k] < n)) throw new RangeError(`marker ${k} is node ${markers[k]}, outside the ${n} nodes`);
  }
  const frames = observedFrameCount(source.steps, stride);
  const timeS = new Float64Array(frames);
  const positionM = new Float64Array(frames * m * 3);
  const seen = new Uint8Array(frames * m);
  const x = source.positionM;
  for (let j = 0; j < frames; j++) {
    const record = j * stride;
    timeS[j] = source.timeS[record];
    const shown = record - latency;
    for (let k = 0; k < m; k++) {
      const zx = noise.nextNormal();
      const zy = noise.nextNormal();
      const zz = noise.nextNormal();
      const dropped = dropout.nextFloat64() < p;
      const out = (j * m + k) * 3;
      if (dropped || shown < 0) {
        positionM[out] = NaN;
        positionM[out + 1] = NaN;
        positionM[out + 2] = NaN;
        continue;
      }
      const from = (shown * n + markers[k]) * 3;
      // Adding 0·z would turn a −0 coordinate into +0, so exact observations are copied.
      if (stdM > 0) {
        positionM[out] = x[from] + stdM * zx;
        positionM[out + 1] = x[from + 1] + stdM * zy;
        positionM[out + 2] = x[from + 2] + stdM * zz;
      } else {
        positionM[out] = x[from];
        positionM[out + 1] = x[from + 1];
        positionM[out + 2] = x[from + 2];
      }
      seen[j * m + k] = 1;
    }
  }
  return { frameCount: frames, markerCount: m, timeS, positionM, seen, markerNodes: markers.slice() };
}
