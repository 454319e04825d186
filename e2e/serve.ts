// The server the e2e run drives: the production build, on a fresh demo database in a temp folder.
import { mkdtempSync, rmSync } from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { loadConfig } from '@server/config';
import { guardProcess } from '@server/process-guard';
import { appLogger, startServer } from '@server/server';

// E2E_DATABASE_FILE: a test that stops and restarts the server keeps its data (and sessions).
// Otherwise a folder of its own, removed when the run stops the server (playwright.config.ts asks
// with SIGTERM), so `npm test` leaves nothing in the temp folder.
const ownFolder = process.env.E2E_DATABASE_FILE ? null : mkdtempSync(path.join(os.tmpdir(), 'jugline-e2e-'));
const databaseFile = process.env.E2E_DATABASE_FILE ?? path.join(ownFolder!, 'jugline.sqlite');
// DATABASE_URL, REDIS_URL, SESSION_SECRET, MIGRATE_ON_START: one process of a group (tests/faults/cluster-kill.test.ts)
const { DATABASE_URL, REDIS_URL, SESSION_SECRET, MIGRATE_ON_START } = process.env;
const config = loadConfig({
  NODE_ENV: 'production',
  PORT: process.env.E2E_PORT ?? '4310',
  HOST: '127.0.0.1',
  DATABASE_FILE: databaseFile,
  SEED_DEMO: 'true',
  // a test machine running browsers beside the server stalls for reasons that are not a rush; an
  // order refused for that would be queued at the Counter and fail a test about something else
  MAX_LOOP_STALL_MS: '0',
  ...(DATABASE_URL ? { DATABASE_URL } : {}),
  ...(REDIS_URL ? { REDIS_URL } : {}),
  ...(SESSION_SECRET ? { SESSION_SECRET } : {}),
  ...(MIGRATE_ON_START ? { MIGRATE_ON_START } : {}),
});
const logger = appLogger(config);
guardProcess(logger);
const running = await startServer(config, { pages: 'production', logger });
console.log(`e2e server at ${running.url} on ${config.databaseFile}`);
const stop = () =>
  running.close().then(() => {
    if (ownFolder) rmSync(ownFolder, { recursive: true, force: true });
    process.exit(0);
  });
process.once('SIGTERM', stop);
process.once('SIGINT', stop);
