// Renders one recorded episode of a dataset folder, from its own files, as an animated GIF or
// a numbered PNG sequence: for papers, reviews and a quick look without the app. The episode is
// read as the app reads it (NPZ or HDF5 group, checked against the manifest), so a picture is
// always of the data a model is trained on.
import { DatasetRequestError } from '../dataset/formats/dataset-request-error.ts';
import type { NamedArray } from '../dataset/formats/named-array.ts';
import { DatasetReader } from '../dataset/read/dataset-reader.ts';
import { NODE_FEATURE_NAMES } from '../systems/graph-labels.ts';
import type { PictureView } from './episode-picture.ts';
import { EpisodePicture, PICTURE_PALETTE } from './episode-picture.ts';
import { encodeGif } from './gif-animation.ts';
import type { IndexedFrame } from './indexed-frame.ts';
import { encodePng } from './png-image.ts';

export interface RenderSettings {
  view: PictureView;
  widthPx: number;
  heightPx: number;
  /** Playback speed for GIFs: 1 is real time. */
  speed: number;
  /** Draw every k-th recorded frame; 'auto' keeps GIF frame delays at 0.02 s or more. */
  frameStride: number | 'auto';
}

/** Told after each picture is drawn; may await, so a worker can hear a cancel between pictures. */
export type FrameDrawnListener = (drawn: number, total: number) => void | Promise<void>;

/** An episode lacks an array a picture needs; each caller words how to check the folder. */
export class MissingPictureArrayError extends DatasetRequestError {
  constructor(readonly episodeId: string, readonly arrayName: string) {
    super(`episode ${episodeId} has no "${arrayName}" array, which a picture needs; check the folder with \`pliant verify\``, 'missing-picture-array');
  }
}

export interface RenderedEpisode {
  episodeId: string;
  frameTimesS: number[];
  frames: IndexedFrame[];
  strideUsed: number;
}

/** The shortest GIF delay browsers honour, s (common practice, no source). */
export const MIN_GIF_DELAY_S = 0.02;

function arrayNamed(arrays: NamedArray[], name: string, episodeId: string): NamedArray {
  const found = arrays.find((a) => a.name === name);
  if (!found) throw new MissingPictureArrayError(episodeId, name);
  return found;
}

export async function renderEpisode(datasetDir: string, episodeId: string, settings: RenderSettings, onFrameDrawn?: FrameDrawnListener): Promise<RenderedEpisode> {
  const reader = new DatasetReader();
  const read = await reader.episodeArrays(datasetDir, episodeId);
  const positions = arrayNamed(read.arrays, 'positions', episodeId);
  const time = arrayNamed(read.arrays, 'time', episodeId);
  const edges = arrayNamed(read.arrays, 'edges', episodeId);
  const features = arrayNamed(read.arrays, 'node_features', episodeId);
  const [frameCount, nodeCount] = positions.shape;
  const width = features.shape[1];
  const pinned = NODE_FEATURE_NAMES.indexOf('pinned');
  const driven = NODE_FEATURE_NAMES.indexOf('driven');
  const fixedNode = new Uint8Array(nodeCount);
  for (let n = 0; n < nodeCount; n++) fixedNode[n] = features.data[n * width + pinned] > 0 || features.data[n * width + driven] > 0 ? 1 : 0;
  const picture = new EpisodePicture(
    { nodeCount, frameCount, positionsM: positions.data as Float32Array | Float64Array, edges: Int32Array.from(edges.data), fixedNode },
    settings.widthPx,
    settings.heightPx,
    settings.view,
  );
  const intervalS = frameCount > 1 ? (time.data[frameCount - 1] - time.data[0]) / (frameCount - 1) : 1;
  const stride = settings.frameStride === 'auto' ? Math.max(1, Math.ceil((MIN_GIF_DELAY_S * settings.speed) / intervalS - 1e-9)) : settings.frameStride;
  const chosen: number[] = [];
  for (let f = 0; f < frameCount; f += stride) chosen.push(f);
  if (chosen[chosen.length - 1] !== frameCount - 1) chosen.push(frameCount - 1);
  const frames: IndexedFrame[] = [];
  for (const f of chosen) {
    frames.push(picture.draw(f));
    if (onFrameDrawn) await onFrameDrawn(frames.length, chosen.length);
  }
  return { episodeId, frameTimesS: chosen.map((f) => time.data[f]), frames, strideUsed: stride };
}

export function renderedGif(rendered: RenderedEpisode, speed: number): Uint8Array {
  return encodeGif(rendered.frames, PICTURE_PALETTE, { timesS: rendered.frameTimesS, speed });
}

export function renderedPngs(rendered: RenderedEpisode): Uint8Array[] {
  return rendered.frames.map((frame) => encodePng(frame, PICTURE_PALETTE));
}
