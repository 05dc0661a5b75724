// The bytes of one episode's NPZ file, at the deflate level the scenario's `export.compression`
// stands for (sim/scenario/export-compression.ts). The writer's output depends only on the
// arrays and that level, so an episode gives the same bytes on every machine and every thread.
import { COMPRESSION_LEVELS, type ExportCompression } from '../../scenario/export-compression.ts';
import type { NamedArray } from '../formats/named-array.ts';
import { encodeNpz } from '../formats/npz.ts';

export function encodeEpisodeNpz(arrays: readonly NamedArray[], compression: ExportCompression): Uint8Array {
  const level = COMPRESSION_LEVELS[compression].npzDeflateLevel;
  return level === 0 ? encodeNpz(arrays, { compression: 'stored' }) : encodeNpz(arrays, { compression: 'deflate', deflateLevel: level });
}
