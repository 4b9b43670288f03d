import { defineConfig } from 'vitest/config';

export default defineConfig({
  test: {
    include: ['tests/**/*.test.ts'],
    // The long fuzz suites run only with `npm run test:long` (vitest.long.config.mts).
    exclude: ['**/node_modules/**', 'tests/**/*.long.test.ts'],
    environment: 'node',
    testTimeout: 30_000,
    hookTimeout: 60_000,
    // Browser end-to-end files each launch one Chromium; two cores, so keep parallelism modest.
    maxWorkers: 2,
  },
});
