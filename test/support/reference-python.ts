// Runs reference computations in Debian's Python (NumPy, SciPy, h5py under /usr/bin/python3).
// Off CI a missing interpreter makes the calling suite skip with a reason; under CI=true it is a
// failure, because CI installs these packages and a silent skip would hide a broken check.
import { spawnSync } from 'node:child_process';
import { existsSync } from 'node:fs';

export const REFERENCE_PYTHON = '/usr/bin/python3';

export interface PythonAvailability {
  available: boolean;
  reason: string;
}

let cached: PythonAvailability | undefined;

export function referencePythonAvailability(): PythonAvailability {
  if (cached) return cached;
  if (!existsSync(REFERENCE_PYTHON)) {
    cached = { available: false, reason: `${REFERENCE_PYTHON} not found (apt-get install python3-numpy python3-scipy python3-h5py)` };
  } else {
    const probe = spawnSync(REFERENCE_PYTHON, ['-c', 'import numpy, scipy, h5py'], { encoding: 'utf8' });
    cached = probe.status === 0
      ? { available: true, reason: '' }
      : { available: false, reason: `NumPy/SciPy/h5py not importable from ${REFERENCE_PYTHON}: ${probe.stderr.trim()}` };
  }
  if (!cached.available && process.env.CI === 'true') {
    throw new Error(`Reference Python is required under CI=true: ${cached.reason}`);
  }
  if (!cached.available) console.warn(`[skip] reference Python checks skipped: ${cached.reason}`);
  return cached;
}

/** Run a Python script with a JSON value on stdin; parse its stdout as JSON. */
export function runReferencePython<T = unknown>(script: string, input: unknown, timeoutMs = 300_000): T {
  const result = spawnSync(REFERENCE_PYTHON, ['-c', script], {
    input: JSON.stringify(input),
    encoding: 'utf8',
    maxBuffer: 512 * 1024 * 1024,
    timeout: timeoutMs,
  });
  if (result.status !== 0) {
    throw new Error(`reference Python failed (exit ${result.status}): ${result.stderr}`);
  }
  return JSON.parse(result.stdout) as T;
}

let torchCached: PythonAvailability | undefined;

/** PyTorch from Debian (python3-torch) under the same interpreter; skips or fails like the rest. */
export function referenceTorchAvailability(): PythonAvailability {
  if (torchCached) return torchCached;
  const base = referencePythonAvailability();
  if (!base.available) {
    torchCached = base;
  } else {
    const probe = spawnSync(REFERENCE_PYTHON, ['-c', 'import torch'], { encoding: 'utf8' });
    torchCached = probe.status === 0
      ? { available: true, reason: '' }
      : { available: false, reason: `PyTorch not importable from ${REFERENCE_PYTHON} (apt-get install python3-torch): ${probe.stderr.trim()}` };
  }
  if (!torchCached.available && process.env.CI === 'true') {
    throw new Error(`Reference PyTorch is required under CI=true: ${torchCached.reason}`);
  }
  if (!torchCached.available && base.available) console.warn(`[skip] reference PyTorch checks skipped: ${torchCached.reason}`);
  return torchCached;
}
