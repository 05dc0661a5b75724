// The C build of the chain-1024 kernel (sim/bench/native/chain_kernel.c) against the
// JavaScript kernel: with the same data layout, the same operations in the same order and no
// fused multiply-adds, IEEE 754 double arithmetic with round-to-nearest (IEEE 754-2008, §4.3 and
// §5.4: +, −, ×, ÷ and sqrt are correctly rounded) must give the same checksum bit for bit; and
// both must give the 408.1644 to six significant digits. Where gcc is missing, the
// bench must say so in its line instead of failing; that branch is checked instead.
import { describe, expect, it } from 'vitest';

import { CHAIN_1024_STEPS, runChain1024 } from '../sim/bench/chain-1024.ts';
import { chain1024NativeCase } from '../sim/bench/chain-1024-native.ts';
import { buildNativeChainKernel, runNativeChainKernel } from '../sim/bench/native-chain-kernel.ts';

describe('C build of the chain-1024 kernel', () => {
  it('reaches the JavaScript checksum bit for bit (IEEE 754 correct rounding), or reports that gcc is missing', async () => {
    const build = buildNativeChainKernel();
    if (!build.ok) {
      expect(build.reason).toMatch(/gcc not found on PATH; install it/);
      const line = await chain1024NativeCase.run();
      expect(line).toEqual({ skipped: build.reason });
      return;
    }
    try {
      const native = runNativeChainKernel(build.binaryPath, CHAIN_1024_STEPS);
      const js = runChain1024();
      expect(native.checksum.toPrecision(6)).toBe('408.164'); // project issue
      expect(native.checksum).toBe(js.checksum);
      expect(native.springUpdatesPerS).toBeGreaterThan(0);
    } finally {
      build.dispose();
    }
  });
});
