// A real Jugline server for one test file: its own freshly migrated database with the demo café
// (a SQLite file, or a PostgreSQL database on the `server-pg` leg: test-database.ts), a real HTTP server on loopback, and signed-in supertest agents per role.
import { randomBytes } from 'node:crypto';
import { mkdtempSync, rmSync } from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import request from 'supertest';
import type { Config } from '@server/config';
import { startServer, type RunningServer } from '@server/server';
import type { SignInPacing } from '@server/auth/routes';
import type { Clock } from '@server/deps';
import { DEMO_PASSWORD, DEMO_SIGN_INS, demoCafeId } from '@seeds/demo-cafe';
import { createTestDatabase } from './test-database';

export type DemoLogin = (typeof DEMO_SIGN_INS)[number]['username'];

export interface TestServer extends RunningServer {
  dir: string;
  config: Config;
  /** Where its data is: the SQLite file, or the postgres:// URL on the PostgreSQL leg. */
  databaseTarget: string;
  /** A supertest agent with its own cookie jar, signed in as the demo person. */
  signIn(login: DemoLogin): Promise<ReturnType<typeof request.agent>>;
  /** The session cookie header for that person (for WebSocket clients). */
  cookieFor(login: DemoLogin): Promise<string>;
}

/** A clock the test moves by hand. */
export function manualClock(startIso = '2026-03-02T14:00:00.000Z') {
  let now = Date.parse(startIso);
  const clock: Clock = () => new Date(now);
  return { clock, advance: (ms: number) => (now += ms), set: (iso: string) => (now = Date.parse(iso)) };
}

/** `pages: 'development'` renders the screens through Vite in middleware mode (slower to start). */
export async function startTestServer(
  opts: {
    clock?: Clock;
    sessionClock?: Clock;
    pages?: 'none' | 'development';
    dbBusyTimeoutMs?: number;
    signInPacing?: SignInPacing;
    /** a real SMTP server instead of the local fake */
    smtpUrl?: string;
    /** live events through this Redis (several processes) instead of the in-process hub */
    redisUrl?: string;
    /** a second process of the same café: that server's database and session secret */
    sharing?: TestServer;
    /** load shedding (server/admission.ts); unset: no limit */
    maxRequestsInFlight?: number;
  } = {},
): Promise<TestServer> {
  const dir = opts.sharing?.dir ?? mkdtempSync(path.join(os.tmpdir(), 'jugline-test-'));
  // the first server of a database owns it (and drops it); one sharing it leaves it alone
  const database = opts.sharing ? { databaseUrl: opts.sharing.config.databaseUrl, drop: async () => {} } : await createTestDatabase();
  const config: Config = {
    env: 'test',
    port: 0,
    host: '127.0.0.1',
    databaseFile: opts.sharing?.config.databaseFile ?? path.join(dir, 'jugline.sqlite'),
    databaseUrl: database.databaseUrl,
    sessionSecret: opts.sharing?.config.sessionSecret ?? randomBytes(32).toString('hex'),
    seedDemo: true,
    dbBusyTimeoutMs: opts.dbBusyTimeoutMs,
    smtpUrl: opts.smtpUrl,
    redisUrl: opts.redisUrl,
    maxRequestsInFlight: opts.maxRequestsInFlight,
  };
  const running = await startServer(config, {
    pages: opts.pages ?? 'none',
    clock: opts.clock,
    sessionClock: opts.sessionClock,
    signInPacing: opts.signInPacing,
    log: () => {},
  });

  async function signIn(login: DemoLogin) {
    const agent = request.agent(running.url);
    const res = await agent.post('/api/session').send({ username: login, password: DEMO_PASSWORD });
    if (res.status !== 200) throw new Error(`sign-in as ${login} failed: ${res.status}`);
    return agent;
  }

  async function cookieFor(login: DemoLogin) {
    const res = await request(running.url).post('/api/session').send({ username: login, password: DEMO_PASSWORD });
    const cookies = ([] as string[]).concat(res.headers['set-cookie'] ?? []);
    return cookies.map((c) => c.split(';')[0]).join('; ');
  }

  return {
    ...running,
    dir,
    config,
    databaseTarget: database.databaseUrl ?? config.databaseFile,
    signIn,
    cookieFor,
    close: async () => {
      await running.close();
      await database.drop();
      if (!opts.sharing) rmSync(dir, { recursive: true, force: true });
    },
  };
}

/** Ids the demo seed gives its menu (the demo café's unless another café is named), looked up by name so tests don't hard-code them. */
export async function demoMenu(server: TestServer, locationId?: number) {
  const cafe = locationId ?? (await demoCafeId(server.db));
  const items = await server
    .db('menu_items')
    .join('menu_categories', 'menu_categories.id', 'menu_items.category_id')
    .where('menu_categories.location_id', cafe)
    .select('menu_items.id', 'menu_items.name');
  const milks = await server.db('milk_options').where({ location_id: cafe }).select('id', 'name');
  const sizes = await server
    .db('item_sizes')
    .whereIn(
      'item_id',
      items.map((i) => i.id as number),
    )
    .select('id', 'item_id', 'name');
  const mods = await server.db('extras').where({ location_id: cafe }).select('id', 'name');
  const item = (name: string) => items.find((i) => i.name === name)!.id as number;
  return {
    item,
    milk: (name: string) => milks.find((m) => m.name === name)!.id as number,
    size: (itemName: string, sizeName: string) => sizes.find((s) => s.item_id === item(itemName) && s.name === sizeName)!.id as number,
    extra: (name: string) => mods.find((m) => m.name === name)!.id as number,
  };
}
