import next from 'eslint-config-next';
import nextTs from 'eslint-config-next/typescript';

// The house's layers, enforced with ESLint's built-in rules (see DEVELOPERS.md, "Layout").
const METHODS = '/^(GET|POST|PUT|PATCH|DELETE|HEAD|OPTIONS)$/';
const ROUTE_FILES = ['app/api/**/route.ts', 'app/api/**/route.*.ts'];

const noFakesOrBench = [
  { group: ['@/fakes', '@/fakes/*', '**/fakes/*'], message: 'fakes/ are separate processes; app and lib code never import them.' },
  { group: ['@/bench', '@/bench/*', '**/bench/*'], message: 'bench/ measures the app from outside; app and lib code never import it.' },
];

const config = [
  ...next,
  ...nextTs,
  { ignores: ['.next/**', '.next-*/**', 'node_modules/**', '.data/**', 'tmp/**', 'next-env.d.ts', 'bench/out/**'] },
  {
    rules: {
      '@typescript-eslint/no-unused-vars': ['error', { argsIgnorePattern: '^_', varsIgnorePattern: '^_' }],
    },
  },
  // Every environment variable is read through lib/env.ts.
  {
    files: ['app/**/*.{ts,tsx}', 'lib/**/*.{ts,tsx}', 'components/**/*.{ts,tsx}', 'db/index.ts', 'db/connect.ts', 'proxy.ts', 'instrumentation.ts'],
    ignores: ['lib/env.ts'],
    rules: {
      'no-restricted-properties': [
        'error',
        { object: 'process', property: 'env', message: 'Read settings through lib/env.ts (env() or rawEnv()).' },
      ],
    },
  },
  // lib/electrical is pure maths: it imports nothing of ours (zod and its own files only).
  {
    files: ['lib/electrical/**/*.{ts,tsx}'],
    rules: {
      'no-restricted-imports': [
        'error',
        { patterns: [{ group: ['@/*', '../*'], message: 'lib/electrical imports nothing of ours outside itself.' }] },
      ],
    },
  },
  // Components never import the database; domain words come from lib/domain.ts.
  {
    files: ['components/**/*.{ts,tsx}'],
    rules: {
      'no-restricted-imports': [
        'error',
        {
          patterns: [
            { group: ['@/db', '@/db/*', '**/db/*'], message: 'Components never import db/ (types: lib/domain.ts).' },
            ...noFakesOrBench,
          ],
        },
      ],
    },
  },
  // Nothing in lib/ imports app/; neither imports fakes/ or bench/.
  {
    files: ['lib/**/*.{ts,tsx}'],
    ignores: ['lib/electrical/**'],
    rules: {
      'no-restricted-imports': [
        'error',
        {
          patterns: [
            { group: ['@/app', '@/app/*', '**/app/*'], message: 'lib/ never imports app/.' },
            ...noFakesOrBench,
          ],
        },
      ],
    },
  },
  {
    files: ['app/**/*.{ts,tsx}'],
    ignores: ROUTE_FILES,
    rules: { 'no-restricted-imports': ['error', { patterns: noFakesOrBench }] },
  },
  // Route handlers: every exported method is a route() declaration (lib/http/route.ts), which alone does
  // the origin check, the session, params, body and errors; handlers hold no SQL.
  {
    files: ROUTE_FILES,
    rules: {
      'no-restricted-imports': [
        'error',
        {
          paths: [
            { name: '@/lib/auth/guard', message: 'The route declaration resolves the caller: use `who`.' },
            { name: '@/lib/http/respond', message: 'The route declaration parses and answers: use route().' },
          ],
          patterns: noFakesOrBench,
        },
      ],
      'no-restricted-syntax': [
        'error',
        {
          selector: `ExportNamedDeclaration > VariableDeclaration > VariableDeclarator[id.name=${METHODS}]:not([init.callee.name='route'])`,
          message: 'Declare every route handler with route() from lib/http/route.ts.',
        },
        {
          selector: `ExportNamedDeclaration > FunctionDeclaration[id.name=${METHODS}]`,
          message: 'Declare every route handler with route() from lib/http/route.ts.',
        },
        {
          selector: `ExportSpecifier[exported.name=${METHODS}]`,
          message: 'Declare every route handler with route() from lib/http/route.ts.',
        },
        {
          selector: "CallExpression[callee.property.name=/^(selectFrom|insertInto|updateTable|deleteFrom|transaction|with|executeQuery)$/]",
          message: 'No SQL in route handlers: call a service in lib/.',
        },
        {
          selector: "TaggedTemplateExpression[tag.name='sql']",
          message: 'No SQL in route handlers: call a service in lib/.',
        },
      ],
    },
  },
];
export default config;
