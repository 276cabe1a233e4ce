import { defineConfig } from 'vitest/config';

// The fast suite: everything under tests/ except the slow statistical studies in tests/slow/.
export default defineConfig({
  test: {
    include: ['tests/**/*.test.ts'],
    exclude: ['tests/slow/**', 'node_modules/**'],
    testTimeout: 120_000,
    hookTimeout: 120_000,
    pool: 'forks',
  },
});
