import { defineConfig } from 'vitest/config';

// `npm test` runs test/ops/off-loop.test.ts in a second pass on its own: it measures how quickly
// the service answers while estimations load the CPU, which other test files running beside it
// would disturb.
export default defineConfig({
  test: {
    include: ['test/**/*.test.ts'],
    environment: 'node',
    testTimeout: 30_000,
    hookTimeout: 60_000,
  },
});
