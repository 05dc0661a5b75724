// Decodes standard base64 (RFC 4648 §4, with padding) into bytes. The core needs it to unpack
// the embedded WebAssembly kernel and may not rely on Node's Buffer or the page's atob.

const VALUE_OF = new Int8Array(128).fill(-1);
const ALPHABET = 'ABCDEFGHIJKLMNOPQRSTUVWXYZabcdefghijklmnopqrstuvwxyz0123456789+/';
for (let i = 0; i < ALPHABET.length; i++) VALUE_OF[ALPHABET.charCodeAt(i)] = i;

export function bytesFromBase64(text: string): Uint8Array {
  if (text.length % 4 !== 0) throw new RangeError(`base64 text of ${text.length} characters is not a whole number of 4-character groups`);
  const padding = text.endsWith('==') ? 2 : text.endsWith('=') ? 1 : 0;
  const out = new Uint8Array((text.length / 4) * 3 - padding);
  let o = 0;
  for (let i = 0; i < text.length; i += 4) {
    let group = 0;
    for (let j = 0; j < 4; j++) {
      const code = text.charCodeAt(i + j);
      const value = code === 61 /* '=' */ && i + j >= text.length - padding ? 0 : code < 128 ? VALUE_OF[code] : -1;
      if (value < 0) throw new RangeError(`character ${i + j} of the base64 text is not in the base64 alphabet`);
      group = (group << 6) | value;
    }
    if (o < out.length) out[o++] = (group >> 16) & 255;
    if (o < out.length) out[o++] = (group >> 8) & 255;
    if (o < out.length) out[o++] = group & 255;
  }
  return out;
}
