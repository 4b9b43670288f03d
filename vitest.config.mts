import { defineConfig } from 'vitest/config';

export default defineConfig({
  test: {
    include: ['tests/**/*.test.ts'],
    // The long fuzz suites run only with `npm run test:long` (vitest.long.config.mts).
    exclude: ['**/node_modules/**', 'tests/**/*.long.test.ts'],
    environment: 'node',
    testTimeout: 30_000,
    hookTimeout: 60_000,
    // expect.poll (the browser tests' "wait until the page shows …") gives up after 5 s, not the
    // default 1 s: an import's dry run starts the parsing worker, and CI machines are shared.
    // A wrong value still fails, only later.
    expect: { poll: { timeout: 5_000 } },
    // Browser end-to-end files each launch one Chromium; two cores, so keep parallelism modest.
    maxWorkers: 2,
  },
});
