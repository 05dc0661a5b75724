// The plain C build of the chain-1024 kernel (native/chain_kernel.c): compiled with gcc at bench
// time into a temporary folder, run as a child process, its one JSON line parsed. Without gcc
// the caller gets a reason to print instead, never an exception.
import { spawnSync } from 'node:child_process';
import { mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { fileURLToPath } from 'node:url';

export const NATIVE_COMPILER = 'gcc';
/**
 * -ffp-contract=off keeps gcc from fusing a·b + c into one rounding (FMA), which JavaScript
 * never does; with it the C build performs the same roundings and reaches the same checksum
 * bit for bit, so the throughput comparison is between two builds of one computation.
 */
export const NATIVE_FLAGS = ['-O3', '-march=native', '-ffp-contract=off', '-std=c11'];

const SOURCE_PATH = fileURLToPath(new URL('./native/chain_kernel.c', import.meta.url));

export interface NativeRun {
  springUpdatesPerS: number;
  seconds: number;
  /** CPU seconds of the C process over the run. */
  cpuSeconds: number;
  checksum: number;
}

export type NativeBuild =
  | { ok: true; binaryPath: string; compiler: string; dispose(): void }
  | { ok: false; reason: string };

/** Compiles the C kernel; the caller must call dispose() to remove the temporary folder. */
export function buildNativeChainKernel(): NativeBuild {
  return buildNativeKernel(SOURCE_PATH, 'chain_kernel');
}

/** Compiles one C source of native/ with NATIVE_FLAGS into a temporary folder. */
export function buildNativeKernel(sourcePath: string, binaryName: string): NativeBuild {
  const probe = spawnSync(NATIVE_COMPILER, ['--version'], { encoding: 'utf8' });
  if (probe.error || probe.status !== 0) {
    return { ok: false, reason: `${NATIVE_COMPILER} not found on PATH; install it (Debian: apt-get install gcc) to compare the JavaScript kernel with its C build` };
  }
  const compiler = probe.stdout.split('\n')[0].trim();
  const folder = mkdtempSync(join(tmpdir(), 'pliant-bench-'));
  const dispose = () => rmSync(folder, { recursive: true, force: true });
  const binaryPath = join(folder, binaryName);
  const compile = spawnSync(NATIVE_COMPILER, [...NATIVE_FLAGS, '-o', binaryPath, sourcePath, '-lm'], { encoding: 'utf8' });
  if (compile.status !== 0) {
    dispose();
    const detail = (compile.stderr || String(compile.error ?? '')).trim().split('\n')[0];
    return { ok: false, reason: `${NATIVE_COMPILER} could not compile ${sourcePath}: ${detail}` };
  }
  return { ok: true, binaryPath, compiler, dispose };
}

/** Runs the compiled kernel once ("bending": the chain-1024-bending case) and parses its line. */
export function runNativeChainKernel(binaryPath: string, steps: number, variant: 'plain' | 'bending' = 'plain'): NativeRun {
  const run = spawnSync(binaryPath, variant === 'bending' ? [String(steps), 'bending'] : [String(steps)], { encoding: 'utf8' });
  if (run.status !== 0) {
    throw new Error(`the C build of chain-1024 (${binaryPath}) exited with ${run.status}: ${run.stderr.trim()}`);
  }
  return parseNativeLine(run.stdout);
}

/** The one JSON line a C kernel prints. */
export function parseNativeLine(stdout: string): NativeRun {
  const line = JSON.parse(stdout) as { spring_updates_per_s: number; seconds: number; cpu_seconds: number; checksum: number };
  return { springUpdatesPerS: line.spring_updates_per_s, seconds: line.seconds, cpuSeconds: line.cpu_seconds, checksum: line.checksum };
}

export type BenchLine = Record<string, number | string>;

/**
 * Builds the C kernel, hands its path to `measure`, and removes it again. A missing compiler
 * becomes a `skipped` line and a failed compile or run a `failed` line, so `pliant bench` goes
 * on with its other cases.
 */
export function withNativeChainKernel(measure: (binaryPath: string, compiler: string) => BenchLine): BenchLine {
  return withNativeKernel(buildNativeChainKernel(), measure);
}

/** withNativeChainKernel for any build of buildNativeKernel. */
export function withNativeKernel(build: NativeBuild, measure: (binaryPath: string, compiler: string) => BenchLine): BenchLine {
  if (!build.ok) return { skipped: build.reason };
  try {
    return measure(build.binaryPath, build.compiler);
  } catch (error) {
    return { failed: (error as Error).message };
  } finally {
    build.dispose();
  }
}
