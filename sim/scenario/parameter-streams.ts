// Which random sub-stream each draw of an episode uses. A parameter's stream is keyed by its
// JSON pointer (FNV-1a folded to the 24 sub-stream bits), a control channel's by its name, so
// adding, removing or reordering parameters or channels leaves every other draw unchanged.
// These choices are part of the dataset format: changing them changes every regenerated file.
import { RandomStream, StreamPurpose } from '../random/random-stream.ts';
import { fnv1a32, xorFold24 } from './fnv1a.ts';

/** Sub-stream id of the parameter at `pointer` (purpose "parameters"). */
export function parameterSubStream(pointer: string): number {
  return xorFold24(fnv1a32(pointer));
}

export function parameterStream(seed: number | string, episodeIndex: number, pointer: string): RandomStream {
  return new RandomStream(seed, episodeIndex, StreamPurpose.parameters, parameterSubStream(pointer));
}

/** The stream one control channel's signal is drawn from, keyed by the channel's label prefix. */
export function controlStream(seed: number | string, episodeIndex: number, channelLabelPointer: string): RandomStream {
  return new RandomStream(seed, episodeIndex, StreamPurpose.controls, xorFold24(fnv1a32(channelLabelPointer)));
}

/** Growth, material and channel assignment of generated lattice shapes. */
export function shapeStream(seed: number | string, episodeIndex: number): RandomStream {
  return new RandomStream(seed, episodeIndex, StreamPurpose.shape, 0);
}

export const INITIAL_POSITION_SUB_STREAM = 0;
export const INITIAL_VELOCITY_SUB_STREAM = 1;

export function initialStateStream(seed: number | string, episodeIndex: number, subStream: number): RandomStream {
  return new RandomStream(seed, episodeIndex, StreamPurpose.initialState, subStream);
}

/** Decides whether an episode is rerun at half the sub-step (Richardson estimate). */
export function richardsonStream(seed: number | string, episodeIndex: number): RandomStream {
  return new RandomStream(seed, episodeIndex, StreamPurpose.numerics, 0);
}

export function splitStream(seed: number | string, episodeIndex: number): RandomStream {
  return new RandomStream(seed, episodeIndex, StreamPurpose.split, 0);
}

/** Noise of the observed positions: three normals per (frame, marker), in frame then marker order. */
export const OBSERVATION_NOISE_SUB_STREAM = 0;
/** Dropouts of the observed markers: one uniform per (frame, marker), in frame then marker order. */
export const OBSERVATION_DROPOUT_SUB_STREAM = 1;

export function observationStream(seed: number | string, episodeIndex: number, subStream: number): RandomStream {
  return new RandomStream(seed, episodeIndex, StreamPurpose.observation, subStream);
}
