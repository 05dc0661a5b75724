// The bytes of one episode's NPZ file. Deflate (what numpy.savez_compressed writes) because
// connectivity and feature arrays shrink well; the writer's output depends only on the arrays,
// so an episode gives the same bytes on every machine and every thread.
import { encodeNpz } from './npz.ts';
import type { NamedArray } from './named-array.ts';

export function encodeEpisodeNpz(arrays: readonly NamedArray[]): Uint8Array {
  return encodeNpz(arrays, { compression: 'deflate' });
}
