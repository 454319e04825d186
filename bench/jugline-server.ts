// The Jugline server as production runs it (the built screens, NODE_ENV=production, request logs
// at info), in a process of its own that the bench forks, with the probe on its IPC channel.
// Env: BENCH_PORT, BENCH_DATABASE_FILE or BENCH_DATABASE_URL (PostgreSQL: migrated and seeded at
// start, as on SQLite), JUGLINE_DIST (read by server/ssr/pages.ts); BENCH_REDIS_URL and
// BENCH_SESSION_SECRET for a process of a group (bench/group.ts).
import { loadConfig } from '@server/config';
import { startServer } from '@server/server';
import { serveProbe } from './probe';

const config = loadConfig({
  NODE_ENV: 'production',
  PORT: process.env.BENCH_PORT ?? '4326',
  HOST: '127.0.0.1',
  DATABASE_FILE: process.env.BENCH_DATABASE_FILE,
  DATABASE_URL: process.env.BENCH_DATABASE_URL,
  // one process of a group (bench/group.ts): live events through Redis, one cookie secret for all
  REDIS_URL: process.env.BENCH_REDIS_URL,
  SESSION_SECRET: process.env.BENCH_SESSION_SECRET,
  MIGRATE_ON_START: 'true',
  SEED_DEMO: 'true',
  LOG_LEVEL: process.env.BENCH_LOG_LEVEL ?? 'info',
});
const running = await startServer(config, { pages: 'production', log: () => {} });
serveProbe(() => running.close());
process.send?.({ ready: running.url });
