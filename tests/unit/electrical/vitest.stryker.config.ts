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
    exclude: ['tests/unit/electrical/bench-form.test.ts', 'tests/unit/electrical/bench-check-handler.test.ts'],
    environment: 'node',
    env: { FC_SCALE: '0.02' },
  },
});
