import { defineConfig } from 'vitest/config';

// `npm run mutate` only: the core tests of the mutated folders, without the build step and
// the command-line and browser tests of the default config (they exercise the same kernels
// far more slowly). See stryker.config.mjs.
export default defineConfig({
  test: {
    include: ['tests/core/design/**/*.test.ts', 'tests/core/evaluate/**/*.test.ts', 'tests/core/linalg/**/*.test.ts'],
    exclude: ['node_modules/**'],
    testTimeout: 60_000,
    pool: 'forks',
  },
});
