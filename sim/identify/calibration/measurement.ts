// A bench measurement as the calibration reads it: marker positions at evenly spaced frames,
// which model node each marker sits on, the recorded drive of each control channel, and the
// values the bench knows directly. Plain data, checked by read-measurement.ts.

export interface MeasurementMarker {
  name: string;
  /** Node index in the model built from the scenario. */
  node: number;
}

export interface MeasuredDrive {
  /** Control channel name of the built system, e.g. "top-offset-x". */
  channel: string;
  /**
   * One value per frame; value s is the control applied from frame s to frame s + 1, as in an
   * episode's `controls` array (the last frame's value is not used).
   */
  values: Float64Array;
}

export interface Measurement {
  /** The descriptor file as the user named it, for messages and reports. */
  source: string;
  description: string;
  sampleRateHz: number;
  markers: MeasurementMarker[];
  frameCount: number;
  /** frameCount × markers × 3, m, frame-major. */
  positionsM: Float64Array;
  drive: MeasuredDrive[];
  /** Values measured on the bench (JSON pointer → value): used as given, never fitted. */
  knownParameters: Record<string, number>;
}
