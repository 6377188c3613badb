import { availableParallelism } from 'node:os';
import { defineConfig } from 'vitest/config';

export default defineConfig({
  test: {
    include: ['test/**/*.test.ts'],
    testTimeout: 60_000,
    hookTimeout: 60_000,
    pool: 'forks',
    // vitest's default leaves one core idle (one worker on a two-core machine); much of this suite
    // waits on reference programs (ccx, gmsh, python), so every core gets a test file.
    maxWorkers: Math.max(2, availableParallelism()),
    // expect.poll waits for the browser and for rebuilds; its 1 s default fails on a loaded machine.
    expect: { poll: { timeout: 20_000, interval: 50 } },
  },
});
