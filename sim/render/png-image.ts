// Writes one palette picture as a PNG file's bytes: signature, IHDR (8-bit palette colour,
// type 3), PLTE, one zlib IDAT with filter type 0 on every row, IEND (PNG specification, 2nd
// edition, W3C 2003). Deflate is fflate's at a fixed level, so the same picture gives the same
// bytes.
import { zlibSync } from 'fflate';

import { crc32 } from './crc32.ts';
import type { IndexedFrame } from './indexed-frame.ts';

const SIGNATURE = [137, 80, 78, 71, 13, 10, 26, 10];

function chunk(type: string, data: Uint8Array): Uint8Array {
  const out = new Uint8Array(12 + data.length);
  const view = new DataView(out.buffer);
  view.setUint32(0, data.length);
  for (let i = 0; i < 4; i++) out[4 + i] = type.charCodeAt(i);
  out.set(data, 8);
  view.setUint32(8 + data.length, crc32(out.subarray(4, 8 + data.length)));
  return out;
}

export function encodePng(frame: IndexedFrame, palette: readonly number[][]): Uint8Array {
  if (palette.length === 0 || palette.length > 256) throw new RangeError(`a PNG palette holds 1 to 256 colours, not ${palette.length}`);
  const header = new Uint8Array(13);
  const view = new DataView(header.buffer);
  view.setUint32(0, frame.widthPx);
  view.setUint32(4, frame.heightPx);
  header.set([8, 3, 0, 0, 0], 8);
  const plte = new Uint8Array(palette.length * 3);
  palette.forEach((rgb, i) => plte.set(rgb.slice(0, 3), 3 * i));
  const rows = new Uint8Array(frame.heightPx * (frame.widthPx + 1));
  for (let y = 0; y < frame.heightPx; y++) {
    rows.set(frame.pixels.subarray(y * frame.widthPx, (y + 1) * frame.widthPx), y * (frame.widthPx + 1) + 1);
  }
  const parts = [Uint8Array.from(SIGNATURE), chunk('IHDR', header), chunk('PLTE', plte), chunk('IDAT', zlibSync(rows, { level: 6 })), chunk('IEND', new Uint8Array(0))];
  const out = new Uint8Array(parts.reduce((n, p) => n + p.length, 0));
  let offset = 0;
  for (const part of parts) {
    out.set(part, offset);
    offset += part.length;
  }
  return out;
}
