import { defineConfig } from 'vitest/config';

// No test measures speed (that is `npm run bench`), so every file runs in the one pass of `npm test`,
// beside the others, on however busy a machine.
export default defineConfig({
  test: {
    include: ['test/**/*.test.ts'],
    environment: 'node',
    testTimeout: 30_000,
    hookTimeout: 60_000,
  },
});
