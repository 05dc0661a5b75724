// Test runner configuration: every suite lives under test/, runs in Node, and may take a
// while because several suites call the Debian NumPy/SciPy interpreter or drive Chromium.
import { defineConfig } from 'vitest/config';

export default defineConfig({
  test: {
    include: ['test/**/*.test.ts'],
    environment: 'node',
    testTimeout: 120_000,
    hookTimeout: 180_000,
    pool: 'forks',
    maxWorkers: 2,
    reporters: ['default'],
  },
});
