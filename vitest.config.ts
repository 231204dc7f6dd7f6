import { defineConfig } from 'vitest/config';

export default defineConfig({
  test: {
    include: ['tests/**/*.test.ts'],
    exclude: ['tests/browser/**', 'node_modules/**'],
    testTimeout: 60_000,
    pool: 'forks',
    globalSetup: ['tests/support/buildOnce.ts'],
  },
});
