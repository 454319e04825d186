// ESLint (flat config): the TypeScript and React rules most projects run, plus the import
// boundaries this codebase keeps: pure domain code imports nothing impure, and a feature folder
// does not reach into another feature's files (shared reads live in src/queries, shared UI in
// src/components).
import js from '@eslint/js';
import reactHooks from 'eslint-plugin-react-hooks';
import globals from 'globals';
import tseslint from 'typescript-eslint';

export default tseslint.config(
  { ignores: ['dist/', 'node_modules/', 'test-results/', 'playwright-report/', 'data/'] },
  js.configs.recommended,
  ...tseslint.configs.recommended,
  {
    languageOptions: { globals: { ...globals.browser, ...globals.node } },
    rules: {
      '@typescript-eslint/no-unused-vars': ['error', { argsIgnorePattern: '^_', varsIgnorePattern: '^_', caughtErrors: 'none' }],
    },
  },
  {
    // Database rows are still read as `Record<string, any>` on the server (typed table rows are the
    // next step); a warning each, capped by --max-warnings in `npm run lint` so no new one lands.
    files: ['server/**/*.ts', 'bench/**/*.ts', 'tests/**/*.ts'],
    rules: { '@typescript-eslint/no-explicit-any': 'warn' },
  },
  {
    files: ['src/**/*.{ts,tsx}'],
    plugins: { 'react-hooks': reactHooks },
    rules: {
      'react-hooks/rules-of-hooks': 'error',
      'react-hooks/exhaustive-deps': 'error',
    },
  },
  {
    files: ['src/domain/**/*.ts'],
    rules: {
      'no-restricted-imports': [
        'error',
        {
          patterns: [
            { regex: '^(\\.\\./|@/|@server/|@seeds/|@scripts/)', message: 'src/domain is pure: import only other domain modules (./x) and plain libraries.' },
            { regex: '^(react|react-dom|react-router|@tanstack/.*|knex|express|ws|node:.*)$', message: 'src/domain is pure: no UI, I/O or server library.' },
          ],
        },
      ],
    },
  },
  {
    files: ['src/features/**/*.{ts,tsx}'],
    rules: {
      'no-restricted-imports': [
        'error',
        // a feature's own files import each other as ./x; anything under @/features/ is another feature's
        {
          patterns: [
            {
              regex: '^(@/features/|\\.\\./(?!\\.)[^/]+/)',
              message: 'A feature does not import another feature: move what both need to src/queries, src/lib or src/components.',
            },
          ],
        },
      ],
    },
  },
  {
    files: ['src/components/**/*.{ts,tsx}'],
    rules: {
      'no-restricted-imports': ['error', { patterns: [{ regex: '/features/', message: 'Shared components do not depend on features.' }] }],
    },
  },
  {
    // a service refuses in the café's terms (server/domain-errors.ts); only the HTTP layer picks statuses
    files: ['server/{orders,payments,tickets,menu,beans,shifts,reports,team,settings,mail}/**/*.ts'],
    ignores: ['server/*/routes.ts', 'server/*/*-routes.ts'],
    rules: {
      'no-restricted-imports': [
        'error',
        {
          patterns: [
            {
              group: ['**/errors'],
              importNames: ['HttpError'],
              message: 'Services throw DomainError (server/domain-errors.ts); the error handler picks the status.',
            },
          ],
        },
      ],
    },
  },
);
