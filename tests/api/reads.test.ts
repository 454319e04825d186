// Each read is defined once (src/reads.ts) and everything else is made from it: its GET route, the
// browser's Api (httpApi) and the server-rendering Api (serverApi). So every read is mounted once
// under its own path and capability, and the two Apis answer alike — the same data to a role that
// may make the read, the same refusal (401 signed out, 403 without the capability, 400 for a bad
// input) to one that may not.
import { afterAll, beforeAll, describe, expect, it, vi } from 'vitest';
import type { SessionUser } from '@/domain/types';
import { ApiError, PASSIVE_REQUEST_HEADER } from '@/lib/http';
import { httpApi, type Api } from '@/lib/api';
import { READ_NAMES, reads, type ReadName } from '@/reads';
import { findActiveUser } from '@server/auth/session';
import { serverApi } from '@server/reads';
import { HttpError } from '@server/errors';
import { demoMenu, manualClock, startTestServer, type DemoLogin, type TestServer } from '../support/test-server';
import { orderBody } from './helpers';

let server: TestServer;
const realFetch = globalThis.fetch;
/** Whose session the browser's requests carry; null: signed out. */
let browserAs: DemoLogin | null = null;
const cookies = {} as Record<DemoLogin, string>;
/** Every request the browser's Api made: its path and whether it was marked passive. */
const sent: { path: string; passive: boolean }[] = [];

async function userOf(login: DemoLogin): Promise<SessionUser> {
  const { id } = await server.db('users').where({ username: login }).first('id');
  return (await findActiveUser(server.db, id))!;
}

/** An answer, or a refusal: its status (loaders read it, for a 404 page), code, words and details. */
async function outcome(work: () => Promise<unknown>) {
  try {
    return { answer: JSON.parse(JSON.stringify(await work())) as unknown };
  } catch (err) {
    if (err instanceof ApiError || err instanceof HttpError) {
      return { refused: { status: err.status, code: err.code, message: err.message, details: err.details } };
    }
    throw err;
  }
}

/** One input for each read, for the demo café; filled in beforeAll. */
let inputs: { [K in ReadName]: Parameters<Api[K]> };

beforeAll(async () => {
  server = await startTestServer({ clock: manualClock().clock });
  for (const login of ['owner', 'cashier', 'barista'] as const) cookies[login] = await server.cookieFor(login);
  vi.stubGlobal('fetch', (input: string, init: RequestInit = {}) => {
    const headers = { ...(init.headers as Record<string, string>) };
    sent.push({ path: input, passive: headers[PASSIVE_REQUEST_HEADER] === '1' });
    if (browserAs) headers.cookie = cookies[browserAs];
    return realFetch(`${server.url}${input}`, { ...init, headers });
  });

  const owner = await server.signIn('owner');
  const menu = await demoMenu(server);
  const placed = await owner.post('/api/orders').send(orderBody('Wren Halloway', [{ menuItemId: menu.item('Latte') }]));
  if (placed.status !== 201) throw new Error(`could not place the fixture order: ${placed.status}`);
  let shifts = (await owner.get('/api/reports/shifts')).body;
  if (shifts.shifts.length === 0) {
    await owner.post('/api/shifts').send({ openingFloatCents: 100_00, baristasOnBar: 2, waitTargetSeconds: 300 });
    shifts = (await owner.get('/api/reports/shifts')).body;
  }
  const lots = (await owner.get('/api/beans')).body.lots;
  inputs = {
    session: [],
    menu: [],
    tickets: [{ view: 'board' }],
    barLanes: [],
    pickup: [],
    orders: [{ q: 'wren' }],
    order: [{ id: placed.body.order.id }],
    waitNow: [{ drinks: 2 }],
    pulse: [],
    outbox: [],
    reportShifts: [],
    reportShift: [{ id: shifts.shifts[0].id }],
    reportRange: [{ from: shifts.today, to: shifts.today }],
    reportDays: [{ from: shifts.today, to: shifts.today }],
    reportGroup: [{ from: shifts.today, to: shifts.today }],
    reportTickets: [{ q: 'wren', sort: 'total', dir: 'asc', page: 1, pageSize: 5 }],
    cardCheck: [{ date: shifts.today }],
    menuAdmin: [],
    team: [],
    switchPeople: [],
    // a token of the right shape that no link has: the welcome read's 404
    welcome: [{ token: 'x'.repeat(43) }],
    settings: [],
    beans: [],
    dialIn: [],
    lotShots: [{ id: lots[0].id }],
  };
}, 60_000);
afterAll(async () => {
  vi.unstubAllGlobals();
  await server?.close();
});

const call = (api: Api, name: ReadName) => (api[name] as (...args: unknown[]) => Promise<unknown>)(...inputs[name]);

describe('the reads', () => {
  it('are each mounted as one GET route, with the path and capability of their definition', () => {
    for (const name of READ_NAMES) {
      const mounted = server.routes.filter((r) => r.method === 'get' && r.path === reads[name].path);
      expect(mounted, name).toHaveLength(1);
      expect(mounted[0].capability, name).toBe(reads[name].capability);
    }
  });

  it('are every GET route but the CSV downloads: no read is written by hand beside them', () => {
    const paths = new Set<string>(READ_NAMES.map((name) => reads[name].path));
    const others = server.routes.filter((r) => r.method === 'get' && !paths.has(r.path)).map((r) => r.path);
    expect(others.length).toBeGreaterThan(0);
    for (const path of others) expect(path, 'a GET route that is not a read').toMatch(/\.csv$/);
  });
});

describe('the server-rendering Api', () => {
  it('refuses a signed-out caller with 401 and a role without the capability with 403, as the routes do', async () => {
    await expect(serverApi(server.deps, undefined).reportShifts()).rejects.toMatchObject({ status: 401, code: 'unauthenticated' });
    const cashier = serverApi(server.deps, await userOf('cashier'));
    await expect(cashier.reportShifts()).rejects.toMatchObject({ status: 403, code: 'forbidden', message: "Your role (cashier) can't do this" });
    await expect(cashier.team()).rejects.toMatchObject({ status: 403, code: 'forbidden' });
    await expect(cashier.menu()).resolves.toMatchObject({ items: expect.any(Array) });
    // open to everyone: no user needed
    await expect(serverApi(server.deps, undefined).session()).resolves.toEqual({ user: null, cafe: null, groupCafes: [] });
  });

  it('checks the input with the read’s schema: 400 with the field named', async () => {
    const owner = serverApi(server.deps, await userOf('owner'));
    await expect(owner.reportTickets({ page: 0 })).rejects.toMatchObject({ status: 400, code: 'validation_failed', details: [{ path: 'query.page' }] });
    await expect(owner.order({ id: -1 })).rejects.toMatchObject({ status: 400, code: 'validation_failed', details: [{ path: 'params.id' }] });
  });

  it('refuses with the status HTTP would answer, which the loaders read (a 404 is the not-found page)', async () => {
    const owner = serverApi(server.deps, await userOf('owner'));
    await expect(owner.order({ id: 2_000_000_000 })).rejects.toMatchObject({ status: 404, code: 'not_found' });
    await expect(owner.reportShift({ id: 2_000_000_000 })).rejects.toMatchObject({ status: 404, code: 'not_found' });
    await expect(owner.welcome({ token: 'x'.repeat(43) })).rejects.toMatchObject({ status: 404, code: 'not_found' });
  });
});

describe('the browser’s Api and the server-rendering Api', () => {
  const sides = async (login: DemoLogin | null, name: ReadName) => {
    browserAs = login;
    const overHttp = await outcome(() => call(httpApi, name));
    const onServer = await outcome(async () => call(serverApi(server.deps, login ? await userOf(login) : undefined), name));
    return { overHttp, onServer };
  };

  for (const login of ['owner', 'cashier', 'barista', null] as const) {
    it(`answer every read alike, ${login ? `as the ${login}` : 'signed out'}`, async () => {
      for (const name of READ_NAMES) {
        const { overHttp, onServer } = await sides(login, name);
        expect(onServer, name).toEqual(overHttp);
        // the owner may make every read: each is answered (the made-up welcome token is a 404)
        if (login === 'owner') expect(Object.keys(overHttp), name).toEqual([name === 'welcome' ? 'refused' : 'answer']);
      }
    });
  }

  it('the browser’s reads go to their paths, the background ones marked passive', async () => {
    browserAs = 'owner';
    sent.length = 0;
    await httpApi.order({ id: 12 }).catch(() => undefined);
    await httpApi.reportTickets({ q: 'wren', status: undefined, sort: 'total', dir: 'asc', page: 2, pageSize: 5 });
    await httpApi.tickets({ view: 'board' });
    await httpApi.waitNow({ drinks: 3 });
    await httpApi.outbox();
    await httpApi.welcome({ token: 'a/b' }).catch(() => undefined);
    expect(sent).toEqual([
      { path: '/api/orders/12', passive: false },
      { path: '/api/reports/tickets?q=wren&sort=total&dir=asc&page=2&pageSize=5', passive: false },
      { path: '/api/tickets?view=board', passive: false },
      { path: '/api/wait-now?drinks=3', passive: true },
      { path: '/api/outbox', passive: true },
      { path: '/api/welcome/a%2Fb', passive: false },
    ]);
  });
});
