/// <reference types="vitest/config" />
import { defineConfig } from 'vite';
import react from '@vitejs/plugin-react';
import tailwindcss from '@tailwindcss/vite';

export default defineConfig({
  plugins: [react(), tailwindcss()],
  // @/… is src/, @server/… is server/ (tsconfig.json's paths; tsx reads the same for the server)
  resolve: { tsconfigPaths: true },
  // manifest: the chunk table the server reads to preload a screen's chunks, and the benchmark
  // reads to weigh each screen (bench/weights.ts)
  build: { sourcemap: true, manifest: true },
  test: {
    // Fail on unhandled errors; a console.error in a test is turned into a failure in setup.
    projects: [
      {
        extends: true,
        test: {
          name: 'unit',
          environment: 'node',
          // pure functions: one module graph for all files (see server below)
          isolate: false,
          include: ['tests/unit/**/*.test.ts'],
        },
      },
      {
        extends: true,
        test: {
          name: 'components',
          environment: 'jsdom',
          include: ['tests/components/**/*.test.tsx'],
          setupFiles: ['tests/support/dom-setup.ts'],
          // a component test may start a real server, whose migrations are .ts files
          execArgv: ['--import', 'tsx'],
          hookTimeout: 30_000,
        },
      },
      {
        extends: true,
        test: {
          name: 'server',
          environment: 'node',
          // Files share one module graph per worker instead of loading the server anew for each
          // (about 40 % of this project's time went to imports). Each file starts its own servers
          // and databases, so no state passes between files that a test could see.
          isolate: false,
          include: ['tests/api/**/*.test.ts', 'tests/realtime/**/*.test.ts'],
          setupFiles: ['tests/support/server-setup.ts'],
          // knex imports .ts migrations with native import(): tsx must be loaded in the workers.
          execArgv: ['--import', 'tsx'],
          testTimeout: 20_000,
          hookTimeout: 30_000,
        },
      },
      {
        extends: true,
        test: {
          // the same server tests on PostgreSQL (`npm run test:pg`): a throwaway cluster for the
          // run, one database per test server cloned from a migrated and seeded template
          name: 'server-pg',
          environment: 'node',
          isolate: false, // as `server` above
          include: ['tests/api/**/*.test.ts', 'tests/realtime/**/*.test.ts'],
          // files whose subject is not the database: the input fuzzers (what they send is refused
          // before any SQL runs; they take a minute), load shedding (refused before any SQL),
          // settings, the error mapping, the request log
          // (a SQLite file of its own), the row types (read from SQLite's schema), SQLite's kept prepared
          // statements and the throttles' Redis counts
          exclude: [
            'tests/api/admission.test.ts',
            'tests/api/bad-input.property.test.ts',
            'tests/api/control-characters.property.test.ts',
            'tests/api/config.test.ts',
            'tests/api/domain-errors.test.ts',
            'tests/api/logging.test.ts',
            'tests/api/prepared-statements.test.ts',
            'tests/api/table-types.test.ts',
            'tests/realtime/shared-limits.test.ts',
          ],
          setupFiles: ['tests/support/server-setup.ts'],
          globalSetup: ['tests/support/pg-global-setup.ts'],
          execArgv: ['--import', 'tsx'],
          testTimeout: 20_000,
          hookTimeout: 30_000,
        },
      },
      {
        extends: true,
        test: {
          // kills and restarts the built server as a child process (`npm run test:faults`)
          name: 'faults',
          environment: 'node',
          include: ['tests/faults/**/*.test.ts'],
          execArgv: ['--import', 'tsx'],
          testTimeout: 180_000,
        },
      },
    ],
  },
});
