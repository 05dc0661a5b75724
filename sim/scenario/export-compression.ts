// The scenario's `export.compression` choice and the deflate level each choice stands for, in
// NPZ members and in HDF5 chunks. A dataset's bytes depend on these levels, so they are fixed
// here, stated in the schema, the layout notes and the dataset card, and never tuned silently:
// changing a level changes the bytes every seed file with that choice regenerates.
export const EXPORT_COMPRESSIONS = ['fast', 'small', 'none'] as const;
export type ExportCompression = (typeof EXPORT_COMPRESSIONS)[number];

export interface CompressionLevels {
  /** 0 = stored (what numpy.savez writes), 1-9 = deflate at that level (numpy.savez_compressed's format). */
  readonly npzDeflateLevel: 0 | 1 | 6;
  /** 0 = contiguous, no filter; 1-9 = gzip filter at that level in chunks of about 1 MiB. */
  readonly hdf5DeflateLevel: 0 | 1 | 4;
  /**
   * Arrays with fewer data bytes stay contiguous and unfiltered even when hdf5DeflateLevel > 0:
   * a chunk index and filter message cost some kilobytes, more than deflate saves on a small
   * float array (measured with `pliant bench --case export-hdf5`).
   */
  readonly hdf5MinCompressedBytes: number;
}

export const COMPRESSION_LEVELS: Readonly<Record<ExportCompression, CompressionLevels>> = {
  fast: { npzDeflateLevel: 1, hdf5DeflateLevel: 1, hdf5MinCompressedBytes: 256 * 1024 },
  // The levels every dataset had before the choice existed, so their seed files still reproduce.
  small: { npzDeflateLevel: 6, hdf5DeflateLevel: 4, hdf5MinCompressedBytes: 0 },
  none: { npzDeflateLevel: 0, hdf5DeflateLevel: 0, hdf5MinCompressedBytes: 0 },
};

/** What a scenario without `export.compression` gets. */
export const DEFAULT_EXPORT_COMPRESSION: ExportCompression = 'fast';

/**
 * What a seed file without `export.compression` was written with: seed files from before the
 * choice existed all used these levels, and a seed file always regenerates its own bytes.
 */
export const SEED_COMPRESSION_BEFORE_CHOICE: ExportCompression = 'small';

/** One line per choice for the schema description, the layout notes and the card. */
export function describeCompression(choice: ExportCompression): string {
  const { npzDeflateLevel, hdf5DeflateLevel, hdf5MinCompressedBytes } = COMPRESSION_LEVELS[choice];
  const npz = npzDeflateLevel === 0 ? 'NPZ members stored uncompressed' : `NPZ members deflated at level ${npzDeflateLevel}`;
  const sized = hdf5MinCompressedBytes > 0 ? ` (arrays of ${hdf5MinCompressedBytes / 1024} KiB or more; smaller ones contiguous)` : '';
  const hdf5 = hdf5DeflateLevel === 0 ? 'HDF5 arrays contiguous, uncompressed' : `HDF5 arrays in gzip-filtered chunks at level ${hdf5DeflateLevel}${sized}`;
  return `${choice}: ${npz}; ${hdf5}`;
}
