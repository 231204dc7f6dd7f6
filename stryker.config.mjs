// Mutation testing of the numerical core: `npm run mutate` (Stryker, vitest runner).
// Mutates src/core/design, src/core/evaluate and src/core/linalg and runs the core tests of
// those folders (vitest.mutate.config.ts); a mutant that no test kills is a gap in the tests.
// One folder:  npm run mutate -- --mutate 'src/core/linalg/**/*.ts'
// Not part of `npm test` (it runs the suite once per mutant). Report: reports/mutation/.
/** @type {import('@stryker-mutator/api/core').PartialStrykerOptions} */
export default {
  testRunner: 'vitest',
  vitest: { configFile: 'vitest.mutate.config.ts' },
  mutate: ['src/core/design/**/*.ts', 'src/core/evaluate/**/*.ts', 'src/core/linalg/**/*.ts', '!src/**/*.d.ts'],
  // Per-test coverage: each mutant runs only the tests that reach it.
  coverageAnalysis: 'perTest',
  // Two cores are shared with other work.
  concurrency: 2,
  // Added to the measured test time before a mutant counts as timed out (an infinite loop).
  timeoutMS: 5_000,
  reporters: ['clear-text', 'progress', 'html'],
  htmlReporter: { fileName: 'reports/mutation/index.html' },
  tempDirName: '.stryker-tmp',
  cleanTempDir: 'always',
};
