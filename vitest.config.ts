import { defineConfig } from 'vitest/config';

// `npm test`: everything, including the real-browser checks in tests/browser/, which skip
// with a warning when /usr/bin/chromium is absent (see tests/browser/chromiumBrowser.ts).
export default defineConfig({
  test: {
    include: ['tests/**/*.test.ts'],
    exclude: ['node_modules/**'],
    testTimeout: 60_000,
    hookTimeout: 60_000,
    pool: 'forks',
    globalSetup: ['tests/support/buildOnce.ts'],
  },
});
