// CRC-32 as PNG chunks carry it (ISO 3309 / ITU-T V.42 polynomial, reflected, 0xEDB88320; PNG
// specification, 2nd edition, section 5.5 and Annex D). fflate does not export its own and
// Node 20's zlib has none, so the few lines of the standard table method live here.

const TABLE = (() => {
  const table = new Uint32Array(256);
  for (let n = 0; n < 256; n++) {
    let c = n;
    for (let k = 0; k < 8; k++) c = c & 1 ? 0xedb88320 ^ (c >>> 1) : c >>> 1;
    table[n] = c >>> 0;
  }
  return table;
})();

/** CRC-32 of the bytes, continuing from `previous` (0 to start). */
export function crc32(bytes: Uint8Array, previous = 0): number {
  let c = (previous ^ 0xffffffff) >>> 0;
  for (let i = 0; i < bytes.length; i++) c = TABLE[(c ^ bytes[i]) & 0xff] ^ (c >>> 8);
  return (c ^ 0xffffffff) >>> 0;
}
