// createApp(deps): the Express app without listen(), so tests drive it in-process.
import { EventEmitter } from 'node:events';
import path from 'node:path';
import express, { type RequestHandler } from 'express';
import type { Knex } from 'knex';
import { createPassport, createSessionMiddleware } from './auth/session';
import type { Config } from './config';
import { migrationConfig } from './db/knex';
import { HttpError, errorHandler } from './errors';
import { requestLogger } from './logging';
import { admission } from './admission';
import { sameOriginOnly, securityHeaders } from './security';
import type { Logger } from 'pino';
import { createInProcessHub, type Hub } from './realtime/hub';
import { mountRoutes, type ApiRoute } from './routes';
import { beanCommands } from './beans/routes';
import { commandRoutes } from './commands';
import { mailCommands } from './mail/routes';
import { menuAdminCommands } from './menu/admin-routes';
import { itemPhotoCommands, menuImportRoutes } from './menu/import-routes';
import { settingsCommands } from './settings/routes';
import { teamCommands } from './team/routes';
import { menuCommands } from './menu/routes';
import { orderCommands, orderRoutes, WEBHOOK_PATH } from './orders/routes';
import { readRoutes } from './reads';
import { reportCommands, reportRoutes } from './reports/routes';
import { shiftCommands } from './shifts/routes';
import { sessionRoutes, type SignInPacing } from './auth/routes';
import { processLimits, type Limits } from './auth/shared-limits';
import { ticketCommands } from './tickets/routes';
import type { Clock, Deps } from './deps';
import { PHOTO_FOLDER } from './menu/item-photos';
import type { Mailer } from './mail/outbox';
import type { PaymentGateway } from './payments/gateway';
import type { PageRenderer } from './ssr/pages';

export interface AppOptions {
  db: Knex;
  config: Pick<Config, 'sessionSecret' | 'env'> & Partial<Pick<Config, 'sessionIdleMinutes' | 'trustProxy' | 'maxRequestsInFlight' | 'maxLoopStallMs'>>;
  clock?: Clock;
  hub?: Hub;
  /** Sign-outs and person switches; several processes share them through Redis (redis-hub.ts). */
  sessions?: EventEmitter;
  /** Server-side rendering of the screens; left out by API-only tests. */
  pages?: PageRenderer;
  sessionCleanupIntervalMs?: number;
  /** The clock session timeouts are measured on; real time unless a test moves it. */
  sessionClock?: Clock;
  /** Outgoing mail (receipts); without it the mail routes are not mounted. */
  mailer?: Mailer;
  /** Card payments; without it orders take cash only. */
  payments?: PaymentGateway;
  /** Request logs; left out, nothing is logged per request. */
  logger?: Logger;
  /** Uploaded item photos (config.ts mediaDirOf); left out: data/media. */
  mediaDir?: string;
  /** The clock and pause of sign-in pacing; real time unless a test passes virtual ones. */
  signInPacing?: SignInPacing;
  /** Where the throttles count; several processes share Redis (shared-limits.ts). Left out: this process. */
  limits?: Limits;
}

export interface App {
  app: express.Express;
  deps: Deps;
  sessionMiddleware: RequestHandler;
  passport: ReturnType<typeof createPassport>;
  routes: ApiRoute[];
}

export function createApp(opts: AppOptions): App {
  const mediaDir = opts.mediaDir ?? path.resolve('data/media');
  const deps: Deps = {
    db: opts.db,
    clock: opts.clock ?? (() => new Date()),
    hub: opts.hub ?? createInProcessHub(),
    payments: opts.payments ?? null,
    mailer: opts.mailer ?? null,
    sessions: opts.sessions ?? new EventEmitter(),
  };
  const app = express();
  app.disable('x-powered-by');
  app.set('trust proxy', opts.config.trustProxy ?? 'loopback');
  if (opts.logger) app.use(requestLogger(opts.logger));
  app.use(securityHeaders(opts.config.env === 'production'));

  // alive, and ready: the database answers and its migrations are current
  app.get('/healthz', (_req, res) => res.json({ ok: true }));
  app.get('/readyz', async (_req, res) => {
    try {
      await opts.db.raw('select 1');
      const [, pending] = (await opts.db.migrate.list(migrationConfig)) as [unknown[], unknown[]];
      if (pending.length > 0) return res.status(503).json({ ok: false, reason: `${pending.length} migrations pending` });
      res.json({ ok: true });
    } catch {
      res.status(503).json({ ok: false, reason: 'database unavailable' });
    }
  });

  const sessionMiddleware = createSessionMiddleware(opts.db, opts.config.sessionSecret, {
    cleanupIntervalMs: opts.sessionCleanupIntervalMs,
    idleMinutes: opts.config.sessionIdleMinutes,
    clock: opts.sessionClock,
    onExpired: (sid) => deps.sessions.emit('signed-out', sid),
    logger: opts.logger,
  });
  const passport = createPassport(opts.db, opts.sessionClock);
  const limits = opts.limits ?? processLimits();
  // the plain routes: sign-in and sign-out, the payment webhook, uploads and CSV downloads
  const routes = [
    ...sessionRoutes(passport, deps, { secret: opts.config.sessionSecret, pacing: opts.signInPacing, counts: limits.signIn }),
    ...orderRoutes(deps),
    ...reportRoutes(deps),
    ...menuImportRoutes(deps, mediaDir),
  ];
  // the commands (src/commands.ts), each area's handlers from its own folder
  routes.push(
    ...commandRoutes(deps, {
      ...orderCommands,
      ...mailCommands(opts.mailer),
      ...ticketCommands,
      ...menuCommands,
      ...shiftCommands,
      ...reportCommands,
      ...menuAdminCommands,
      ...itemPhotoCommands(mediaDir),
      ...teamCommands(limits),
      ...settingsCommands,
      ...beanCommands,
    }),
  );
  // the reads (src/reads.ts) last: a download such as /reports/shift/:id.csv must be matched first
  routes.push(...readRoutes(deps));

  // first, so a request refused at a rush costs neither a body read nor a session read
  if (opts.config.maxRequestsInFlight) {
    const gate = admission({
      maxInFlight: opts.config.maxRequestsInFlight,
      maxStallMs: opts.config.maxLoopStallMs ?? 0,
      shedOnStall: (req) => req.method === 'POST' && req.path === '/orders',
    });
    app.use('/api', gate);
  }
  // The payment webhook is verified against its exact bytes, so it alone keeps a raw body.
  const json = express.json({ limit: '32kb' });
  const raw = express.raw({ type: 'application/json', limit: '256kb' });
  app.use('/api', (req, res, next) => (req.path === WEBHOOK_PATH ? raw : json)(req, res, next));
  app.use('/api', sameOriginOnly(['/api' + WEBHOOK_PATH, WEBHOOK_PATH]));
  app.use('/api', sessionMiddleware, passport.initialize(), passport.session());
  app.use('/api', mountRoutes(routes));
  app.use('/api', (req, _res, next) => next(new HttpError(404, 'not_found', `No API route ${req.method} ${req.path}`)));

  // Item photos: random names never reused, so a browser may keep them; nothing else is served here.
  app.use(`/media/${PHOTO_FOLDER}`, express.static(path.join(mediaDir, PHOTO_FOLDER), { index: false, immutable: true, maxAge: '365d' }));
  app.use('/media', (_req, res) => res.status(404).type('text/plain').send('Not found'));

  if (opts.pages) {
    app.use(opts.pages.assets);
    app.get('/{*splat}', sessionMiddleware, passport.initialize(), passport.session(), opts.pages.handler(deps));
  }
  app.use(errorHandler);
  return { app, deps, sessionMiddleware, passport, routes };
}
