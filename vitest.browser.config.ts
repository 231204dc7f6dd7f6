import { defineConfig } from 'vitest/config';

// `npm run test:browser`: the real-browser checks only, and they fail when Chromium is missing.
export default defineConfig({
  test: {
    include: ['tests/browser/**/*.test.ts'],
    testTimeout: 120_000,
    hookTimeout: 60_000,
    env: { TIERPLAN_REQUIRE_CHROMIUM: '1' },
  },
});
