// FNV-1a, the 32-bit Fowler/Noll/Vo hash (FNV-1a variant: xor the byte, then multiply by the
// FNV prime), over the UTF-8 bytes of a string. It turns a parameter's JSON pointer into the
// word that picks its random sub-stream, so a parameter's draws depend on its place in the
// scenario alone and adding or removing another parameter never moves them.

const FNV32_OFFSET_BASIS = 0x811c9dc5;
const FNV32_PRIME = 0x01000193;

/** FNV-1a 32 of the UTF-8 encoding of `text`, as an unsigned 32-bit integer. */
export function fnv1a32(text: string): number {
  let hash = FNV32_OFFSET_BASIS;
  for (let i = 0; i < text.length; i++) {
    let codePoint = text.charCodeAt(i);
    // A high surrogate followed by a low one is one code point of four UTF-8 bytes.
    if (codePoint >= 0xd800 && codePoint <= 0xdbff && i + 1 < text.length) {
      const low = text.charCodeAt(i + 1);
      if (low >= 0xdc00 && low <= 0xdfff) {
        codePoint = 0x10000 + ((codePoint - 0xd800) << 10) + (low - 0xdc00);
        i++;
      }
    }
    if (codePoint < 0x80) {
      hash = Math.imul(hash ^ codePoint, FNV32_PRIME);
    } else if (codePoint < 0x800) {
      hash = Math.imul(hash ^ (0xc0 | (codePoint >> 6)), FNV32_PRIME);
      hash = Math.imul(hash ^ (0x80 | (codePoint & 0x3f)), FNV32_PRIME);
    } else if (codePoint < 0x10000) {
      hash = Math.imul(hash ^ (0xe0 | (codePoint >> 12)), FNV32_PRIME);
      hash = Math.imul(hash ^ (0x80 | ((codePoint >> 6) & 0x3f)), FNV32_PRIME);
      hash = Math.imul(hash ^ (0x80 | (codePoint & 0x3f)), FNV32_PRIME);
    } else {
      hash = Math.imul(hash ^ (0xf0 | (codePoint >> 18)), FNV32_PRIME);
      hash = Math.imul(hash ^ (0x80 | ((codePoint >> 12) & 0x3f)), FNV32_PRIME);
      hash = Math.imul(hash ^ (0x80 | ((codePoint >> 6) & 0x3f)), FNV32_PRIME);
      hash = Math.imul(hash ^ (0x80 | (codePoint & 0x3f)), FNV32_PRIME);
    }
  }
  return hash >>> 0;
}

/**
 * A 32-bit hash folded to 24 bits by xor-folding the top byte into the rest, the reduction the
 * FNV authors recommend for hash sizes that are not a power of two of bits.
 */
export function xorFold24(hash32: number): number {
  return ((hash32 >>> 24) ^ hash32) & 0xffffff;
}
