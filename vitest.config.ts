import { availableParallelism } from 'node:os';
import { defineConfig } from 'vitest/config';

// No test measures speed (that is `npm run bench`), so every file runs in the one pass of `npm test`,
// beside the others, on however busy a machine.
//
// Workers: one per core and at least two. Vitest's default in a run is one fewer than the cores, which on the
// 2-core machines CI runs on is a single file at a time; the suite then spends about a third of its wall time
// waiting (services starting, child processes, timers, PostgreSQL), not computing. Every file that touches
// PostgreSQL takes a schema of its own (test/helpers/storage.ts), so files do not collide.
export default defineConfig({
  test: {
    include: ['test/**/*.test.ts'],
    environment: 'node',
    testTimeout: 30_000,
    hookTimeout: 60_000,
    maxWorkers: Math.max(2, availableParallelism()),
  },
});
