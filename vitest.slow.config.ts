import { defineConfig } from 'vitest/config';

// The slow suite (`npm run test:slow`): replicate-fit coverage and simulation studies that take
// more than a minute. CI runs it after the fast suite.
export default defineConfig({
  test: {
    include: ['tests/slow/**/*.test.ts'],
    passWithNoTests: true,
    testTimeout: 1_200_000,
    hookTimeout: 600_000,
    pool: 'forks',
  },
});
