// A size in bytes as people read it: decimal kB/MB/GB (1 kB = 1000 B, the SI prefixes; common
// practice, no source) with the exact byte count beside it, so the figure can be checked.

const UNITS = ['kB', 'MB', 'GB', 'TB'] as const;

export function byteSize(bytes: number): string {
  const exact = `${bytes.toLocaleString('en')} bytes`;
  if (bytes < 1000) return exact;
  let value = bytes;
  let unit = -1;
  while (value >= 1000 && unit < UNITS.length - 1) {
    value /= 1000;
    unit += 1;
  }
  return `${Number(value.toPrecision(3))} ${UNITS[unit]} (${exact})`;
}
