// Mutation testing of the compatibility check (lib/electrical) against its unit tests:
//   npm run mutation        (slow: minutes to an hour on two cores; not part of npm test)
// The vitest runner uses tests/unit/electrical/vitest.stryker.config.ts, which runs only the electrical unit
// tests and scales the fast-check runs down (FC_SCALE) so each mutant is judged in seconds. Incremental:
// a re-run only tests mutants whose code or tests changed (tmp/ is git-ignored).
/** @type {import('@stryker-mutator/api/core').PartialStrykerOptions} */
export default {
  testRunner: 'vitest',
  vitest: { configFile: 'tests/unit/electrical/vitest.stryker.config.ts', related: false },
  mutate: ['lib/electrical/**/*.ts'],
  coverageAnalysis: 'perTest',
  concurrency: Number(process.env.STRYKER_CONCURRENCY ?? 2),
  incremental: true,
  incrementalFile: 'tmp/stryker/incremental.json',
  tempDirName: 'tmp/stryker/sandbox',
  ignorePatterns: ['.next', '.next-*', '.data', 'tmp', 'bench/out', 'test-results', 'backups'],
  reporters: ['clear-text', 'progress', 'json'],
  jsonReporter: { fileName: 'tmp/stryker/mutation-report.json' },
  clearTextReporter: { allowColor: false, logTests: false, reportScoreTable: true },
  timeoutMS: 20000,
  thresholds: { high: 95, low: 90, break: null },
};
