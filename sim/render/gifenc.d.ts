// Types for the parts of gifenc (an untyped CommonJS package) that Pliant uses.
declare module 'gifenc' {
  export interface GifFrameOptions {
    palette?: number[][];
    delay?: number;
    repeat?: number;
    transparent?: boolean;
    transparentIndex?: number;
    first?: boolean;
  }
  export interface GifEncoderStream {
    writeFrame(index: Uint8Array, width: number, height: number, options?: GifFrameOptions): void;
    finish(): void;
    bytes(): Uint8Array;
  }
  export function GIFEncoder(options?: { auto?: boolean; initialCapacity?: number }): GifEncoderStream;
  const gifenc: { GIFEncoder: typeof GIFEncoder };
  export default gifenc;
}
