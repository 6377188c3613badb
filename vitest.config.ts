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
    // Test files share a worker's module cache: the stages are pure functions over plain data (no
    // mocks, no module state a test relies on), and loading them afresh for every file cost about a
    // minute of the suite's processor time (import 38–47 s against 20 s, measured on a fresh clone).
    isolate: false,
    // expect.poll waits for the browser and for rebuilds; its 1 s default fails on a loaded machine.
    expect: { poll: { timeout: 20_000, interval: 50 } },
  },
});
