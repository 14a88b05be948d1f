import path from 'node:path';
import { defineConfig } from 'vitest/config';

// Used only by mutation testing (scripts/stryker.config.mjs): the electrical unit tests, with the
// property tests' run counts scaled down so that each mutant is judged quickly.
const root = path.resolve(__dirname, '../../..');
export default defineConfig({
  root,
  resolve: { alias: { '@': root } },
  test: {
    include: ['tests/unit/electrical/**/*.test.ts'],
    // The form and handler tests belong to the page; the property tests and the ranking's random shelves
    // are left out by default because on a shared two-core machine they dominate each mutant's run
    // (MUTATION_ALL_TESTS=1 puts them back).
    exclude: [
      'tests/unit/electrical/bench-form.test.ts',
      'tests/unit/electrical/bench-check-handler.test.ts',
      ...(process.env.MUTATION_ALL_TESTS === '1' ? [] : ['tests/unit/electrical/properties.test.ts']),
    ],
    environment: 'node',
    env: { FC_SCALE: '0.02' },
    // One module graph for all the files: re-importing zod and the check for every file and every mutant
    // costs more than the tests themselves (Stryker switches mutants at run time, so sharing is safe).
    isolate: false,
    fileParallelism: false,
  },
});
