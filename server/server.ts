// Start Jugline on one HTTP server: the Express app, the screens and the live socket.
import { mkdirSync } from 'node:fs';
import { createServer, type Server } from 'node:http';
import type { AddressInfo } from 'node:net';
import type { Knex } from 'knex';
import { DEMO_PASSWORD, DEMO_SIGN_INS } from '@seeds/demo-cafe';
import { createApp } from './app';
import { databaseTarget, mediaDirOf, migratesOnStart, type Config } from './config';
import { createDb } from './db/knex';
import { migrateAndSeed, requireMigrated } from './db/migrate';
import { attachSocketServer, type SocketServer } from './realtime/socket-server';
import type { ApiRoute } from './routes';
import type { Clock, Deps } from './deps';
import { startMail } from './mail/outbox';
import { createLogger } from './logging';
import type { Logger } from 'pino';
import type { PaymentFake } from './fakes/payment-fake';
import { startPayments } from './payments/start';
import { WEBHOOK_PATH } from './orders/routes';
import type { SignInPacing } from './auth/routes';
import { developmentPages, productionPages } from './ssr/pages';
import { createRedisHub } from './realtime/redis-hub';
import { redisLimits } from './auth/shared-limits';

export interface RunningServer {
  url: string;
  server: Server;
  db: Knex;
  /** What the services receive (tests run commands through it directly). */
  deps: Deps;
  /** Every API route the app mounts (the role matrix is generated from it). */
  routes: ApiRoute[];
  sockets: SocketServer;
  /** Card payments: the secret the webhook route checks signatures against, and the local fake
   * (null with the real provider). */
  payments: { webhookSecret: string; fake: PaymentFake | null };
  close(): Promise<void>;
}

export interface StartOptions {
  clock?: Clock;
  /** The clock session timeouts are measured on (real time unless a test moves it). */
  sessionClock?: Clock;
  /** 'production' serves dist/; 'development' runs Vite in middleware mode. */
  pages?: 'production' | 'development' | 'none';
  log?: (line: string) => void;
  /** Request logs; by default JSON lines on stdout, none in tests. */
  logger?: Logger;
  /** Sign-in pacing on a virtual clock and pause (tests); real time when left out. */
  signInPacing?: SignInPacing;
}

/** The app's logger: JSON lines on stdout at LOG_LEVEL, silent in tests. */
export const appLogger = (config: Pick<Config, 'env' | 'logLevel'>): Logger => createLogger(config.env === 'test' ? 'silent' : (config.logLevel ?? 'info'));

/** Open the database; migrate and seed it when start-up is to (MIGRATE_ON_START), else check it is current. */
export async function prepareDatabase(
  config: Pick<Config, 'databaseFile' | 'databaseUrl' | 'migrateOnStart' | 'seedDemo' | 'dbBusyTimeoutMs'>,
  log = console.log,
) {
  const db = createDb(databaseTarget(config), { busyTimeoutMs: config.dbBusyTimeoutMs });
  try {
    if (!migratesOnStart(config)) await requireMigrated(db);
    else if ((await migrateAndSeed(db, { seedDemo: config.seedDemo })).seeded) log('Loaded the demo café, Harbour & Hearth Coffee.');
  } catch (err) {
    await db.destroy();
    throw err;
  }
  return db;
}

export async function startServer(config: Config, opts: StartOptions = {}): Promise<RunningServer> {
  const log = opts.log ?? console.log;
  const db = await prepareDatabase(config, log);
  const server = createServer();
  const mode = opts.pages ?? (config.env === 'production' ? 'production' : 'development');
  const pages = mode === 'none' ? undefined : mode === 'production' ? productionPages() : await developmentPages(server);
  const mediaDir = mediaDirOf(config);
  mkdirSync(mediaDir, { recursive: true });
  const mail = await startMail({ smtpUrl: config.smtpUrl, db, clock: opts.clock, log });
  const payments = await startPayments({ secretKey: config.stripeSecretKey, webhookSecret: config.stripeWebhookSecret, log, clock: opts.clock });
  // several processes: events travel through Redis; one process: the in-process hub (app.ts)
  const hub = config.redisUrl ? createRedisHub(config.redisUrl, db, (m) => console.warn(m)) : undefined;
  await hub?.ready;
  const limits = config.redisUrl ? redisLimits(config.redisUrl, (m) => console.warn(m)) : undefined;
  await limits?.ready;
  const { app, deps, sessionMiddleware, routes } = createApp({
    db,
    config,
    clock: opts.clock,
    sessionClock: opts.sessionClock,
    pages,
    mailer: mail.mailer,
    payments: payments.gateway,
    logger: opts.logger ?? appLogger(config),
    mediaDir,
    signInPacing: opts.signInPacing,
    hub,
    sessions: hub?.sessions,
    limits,
  });
  server.on('request', app);
  const sockets = attachSocketServer(server, deps, sessionMiddleware);

  await new Promise<void>((resolve, reject) => {
    server.once('error', reject);
    server.listen(config.port, config.host, () => resolve());
  });
  const { port } = server.address() as AddressInfo;
  const url = `http://${config.host.includes(':') ? `[${config.host}]` : config.host}:${port}`;
  payments.listening(url, WEBHOOK_PATH);

  let closing: Promise<void> | undefined;
  const close = () =>
    (closing ??= (async () => {
      // 1012 "service restart": screens reconnect and resume from their last seq
      await sockets.close(1012, 'server restarting');
      await new Promise<void>((resolve) => server.close(() => resolve()));
      server.closeAllConnections();
      await pages?.close();
      await mail.close();
      await payments.close();
      await hub?.close();
      await limits?.close();
      await db.destroy();
    })());
  return { url, server, db, deps, routes, sockets, payments: { webhookSecret: payments.webhookSecret, fake: payments.fake }, close };
}

export function printSignIns(url: string, log = console.log) {
  log(`Jugline is serving at ${url}`);
  log(`Demo sign-ins (password "${DEMO_PASSWORD}"): ${DEMO_SIGN_INS.map((s) => `${s.username} (${s.role})`).join(', ')}`);
  log('Before real use: set SEED_DEMO=false on a new database and give every person their own password.');
}
