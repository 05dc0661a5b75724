// Loads the HDF5 library (h5wasm, HDF5 compiled to WebAssembly, writing real files through
// Node's file system) once, and runs HDF5 calls under two controls that reproducible,
// quiet dataset files need:
//
// - A pinned clock. HDF5 stamps every object header it creates with access, modification,
//   change and birth times (object time tracking is on by default, and h5wasm does not expose
//   H5Pset_obj_track_times to turn it off). Its clock reads JavaScript's Date.now, so while the
//   calls run Date.now returns a fixed instant and the stamps are the same on every run.
// - Captured diagnostics. On failure HDF5 prints its error stack to standard error; the calls'
//   standard-error output is collected instead, so the caller can turn it into one clear message
//   (and tell a full disk from other failures) rather than show the user a C stack trace.
//
// Both controls last only for one synchronous run of calls, and JavaScript runs nothing else
// in between, so no other code ever sees the pinned clock.
import type * as H5wasm from 'h5wasm';

export type Hdf5Library = typeof H5wasm;

let loading: Promise<Hdf5Library> | undefined;

/** The HDF5 library, ready to use; loading takes a moment the first time only. */
export function loadHdf5Library(): Promise<Hdf5Library> {
  loading ??= importWithoutNavigator();
  return loading;
}

// The emscripten start-up code looks at navigator.userAgent to refuse old browsers; in an
// Electron main process navigator exists and reads like a browser's, so hide it while loading
// (the workaround h5wasm's README gives for Electron).
async function importWithoutNavigator(): Promise<Hdf5Library> {
  const descriptor = Object.getOwnPropertyDescriptor(globalThis, 'navigator');
  const hide = descriptor?.configurable === true;
  if (hide) Object.defineProperty(globalThis, 'navigator', { value: undefined, configurable: true });
  try {
    const library = (await import('h5wasm/node')) as Hdf5Library;
    await library.ready;
    return library;
  } finally {
    if (hide) Object.defineProperty(globalThis, 'navigator', descriptor);
  }
}

export interface Hdf5RunResult<T> {
  /** Present when the calls returned. */
  readonly value?: T;
  /** Present when the calls threw. */
  readonly error?: unknown;
  /** Everything HDF5 wrote to standard error meanwhile; empty when nothing went wrong. */
  readonly diagnostics: string;
}

interface EmscriptenStream {
  readonly fd: number;
}
type StreamWrite = (stream: EmscriptenStream, buffer: Uint8Array, offset: number, length: number, position?: number) => number;
interface WritableFs {
  write: StreamWrite;
}

const STDERR_FD = 2;

/** Runs synchronous HDF5 calls with the clock pinned at `fixedTimeS` (seconds since 1970) and standard error captured. */
export function runHdf5Calls<T>(library: Hdf5Library, fixedTimeS: number, calls: () => T): Hdf5RunResult<T> {
  const fs = library.FS as unknown as WritableFs | null;
  const originalWrite = fs?.write;
  let diagnostics = '';
  const decoder = new TextDecoder();
  // Standard error goes through the emscripten file layer's write; other descriptors pass on.
  // If a future h5wasm changes this layer the capture simply does not happen and HDF5's text
  // reaches the terminal as before.
  if (fs && typeof originalWrite === 'function') {
    fs.write = (stream, buffer, offset, length, position) => {
      if (stream.fd !== STDERR_FD) return originalWrite.call(fs, stream, buffer, offset, length, position);
      diagnostics += decoder.decode(buffer.subarray(offset, offset + length), { stream: true });
      return length;
    };
  }
  const realNow = Date.now;
  const fixedMs = fixedTimeS * 1000;
  Date.now = () => fixedMs;
  try {
    return { value: calls(), diagnostics };
  } catch (error) {
    return { error, diagnostics };
  } finally {
    Date.now = realNow;
    if (fs && typeof originalWrite === 'function') fs.write = originalWrite;
  }
}
