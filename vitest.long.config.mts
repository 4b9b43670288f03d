import { defineConfig } from 'vitest/config';

// The long suites (`npm run test:long`): fuzzing at full size. Bounded in count and time by the
// suites themselves (see tests/fuzz/import.long.test.ts); one file at a time on two cores.
export default defineConfig({
  test: {
    include: ['tests/**/*.long.test.ts'],
    environment: 'node',
    testTimeout: 1_200_000,
    hookTimeout: 300_000,
    maxWorkers: 1,
  },
});
