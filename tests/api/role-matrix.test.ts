// Who may call what: every route the app mounts (server.routes), called as each role and signed
// out, must answer as the hand-written table in role-matrix.expected.md says. The table is kept
// apart from the permission table the guard reads (src/domain/roles.ts), so a wrong permission
// there fails here; a route without a row fails with a message saying how to add one.
import { readFileSync } from 'node:fs';
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { ROLES, type Role } from '@/domain/roles';
import type { ApiRoute } from '@server/routes';
import { demoMenu, startTestServer, type TestServer } from '../support/test-server';
import { orderBody, writeCounts, type Agent } from './helpers';

const TABLE_FILE = 'tests/api/role-matrix.expected.md';

let server: TestServer;
const agents = {} as Record<Role, Agent>;
let ticketId: number;
let drinkId: number;

beforeAll(async () => {
  server = await startTestServer();
  // One signed-in agent per role, created once (demo logins are named after their roles).
  for (const role of ROLES) agents[role] = await server.signIn(role);
  const menu = await demoMenu(server);
  const res = await agents.cashier
    .post('/api/orders')
    .send(orderBody('Wren Halloway', [{ menuItemId: menu.item('Latte') }, { menuItemId: menu.item('Long black') }]));
  if (res.status !== 201) throw new Error(`could not place the fixture order: ${res.status}`);
  ticketId = res.body.order.id;
  drinkId = res.body.order.lines[0].id;
});
afterAll(() => server.close());

type Principal = 'signed out' | Role;
type Outcome = '401' | '403' | 'allowed';
const PRINCIPALS: Principal[] = ['signed out', ...ROLES];

const label = (r: ApiRoute) => `${r.method.toUpperCase()} /api${r.path}`;
const urlOf = (r: ApiRoute) => `/api${r.path.replace(':id', String(r.path.startsWith('/drinks/') ? drinkId : ticketId))}`;

/** The table's rows: "METHOD /api/path" → allow/deny per principal, in the table's column order. */
function readTable(): Map<string, Record<Principal, 'allow' | 'deny'>> {
  const rows = new Map<string, Record<Principal, 'allow' | 'deny'>>();
  let columns: string[] = [];
  for (const line of readFileSync(new URL('./role-matrix.expected.md', import.meta.url), 'utf8').split('\n')) {
    if (!line.startsWith('|')) continue;
    const cells = line
      .split('|')
      .slice(1, -1)
      .map((c) => c.trim().replace(/^`|`$/g, ''));
    if (cells[0] === 'method') {
      columns = cells.slice(2);
      if (columns.join() !== PRINCIPALS.join()) throw new Error(`${TABLE_FILE}: the columns must be method | path | ${PRINCIPALS.join(' | ')}`);
      continue;
    }
    if (cells[0].startsWith('---')) continue;
    const key = `${cells[0]} ${cells[1]}`;
    if (rows.has(key)) throw new Error(`${TABLE_FILE}: ${key} has two rows`);
    const row = {} as Record<Principal, 'allow' | 'deny'>;
    PRINCIPALS.forEach((who, i) => {
      const cell = cells[i + 2];
      if (cell !== 'allow' && cell !== 'deny') throw new Error(`${TABLE_FILE}: ${key}, column "${who}" says "${cell}"; write allow or deny`);
      row[who] = cell;
    });
    rows.set(key, row);
  }
  return rows;
}
const table = readTable();

function expected(route: ApiRoute, who: Principal): Outcome {
  const cell = table.get(label(route))?.[who];
  if (cell === 'allow') return 'allowed';
  return who === 'signed out' ? '401' : '403';
}

/** Signing out a shared agent would spoil the rest of the matrix; session.test.ts covers it. */
const skip = (route: ApiRoute, who: Principal) => route.method === 'delete' && route.path === '/session' && who !== 'signed out';

async function outcome(route: ApiRoute, who: Principal): Promise<Outcome | string> {
  const client = who === 'signed out' ? request(server.url) : agents[who];
  // An empty JSON body: the guards run before validation, and allowed callers get a harmless 400.
  const req = client[route.method](urlOf(route));
  const res = route.method === 'get' || route.method === 'delete' ? await req : await req.send({});
  if (res.status === 401 || res.status === 403) {
    const code = res.status === 401 ? 'unauthenticated' : 'forbidden';
    if (res.body?.error?.code !== code) return `${res.status} with body ${JSON.stringify(res.body)}`;
    return String(res.status) as Outcome;
  }
  return res.status >= 500 ? `server error ${res.status}` : 'allowed';
}

describe('the expected table', () => {
  it('has a row for every route the server mounts', () => {
    const missing = server.routes.map(label).filter((l) => !table.has(l));
    const hint = (l: string) => {
      const [method, path] = l.split(' ');
      return `  | ${method} | \`${path}\` | ${PRINCIPALS.map((who) => `<allow|deny for ${who}>`).join(' | ')} |`;
    };
    expect(
      missing,
      `routes with no row in ${TABLE_FILE}; add one per route under its area, saying who may call it:\n${missing.map(hint).join('\n')}\n`,
    ).toEqual([]);
  });

  it('has no row for a route the server no longer mounts', () => {
    const mounted = new Set(server.routes.map(label));
    const stale = [...table.keys()].filter((k) => !mounted.has(k));
    expect(stale, `rows in ${TABLE_FILE} for routes that don't exist (delete them, or fix the method/path)`).toEqual([]);
  });

  it('covers the routes the Counter, Bar and Pickup cannot do without', () => {
    for (const l of ['POST /api/orders', 'GET /api/tickets', 'GET /api/pickup', 'POST /api/drinks/:id/bump', 'POST /api/tickets/:id/recall']) {
      expect(table.has(l), l).toBe(true);
    }
  });
});

describe('role matrix', () => {
  for (const who of PRINCIPALS) {
    it(`${who}: every route answers as ${TABLE_FILE} says`, async () => {
      const want: Record<string, Outcome | string> = {};
      const got: Record<string, Outcome | string> = {};
      for (const route of server.routes) {
        if (skip(route, who) || !table.has(label(route))) continue;
        want[label(route)] = expected(route, who);
        got[label(route)] = await outcome(route, who);
      }
      expect(Object.keys(got).length).toBeGreaterThan(0);
      expect(got).toEqual(want);
    });
  }
});

describe('the two refusals that matter most at the bar', () => {
  it('a cashier who bumps a drink gets 403 and the drink stays queued', async () => {
    const menu = await demoMenu(server);
    const placed = await agents.cashier.post('/api/orders').send(orderBody('Odile Marchbank', [{ menuItemId: menu.item('Cappuccino') }]));
    expect(placed.status).toBe(201);
    const freshDrink = placed.body.order.lines[0].id;

    const before = await writeCounts(server);
    const res = await agents.cashier.post(`/api/drinks/${freshDrink}/bump`);
    expect(res.status).toBe(403);
    expect(res.body).toEqual({ error: { code: 'forbidden', message: expect.any(String) } });
    expect(await writeCounts(server)).toEqual(before);
    const row = await server.db('order_items').where({ id: freshDrink }).first();
    expect(row).toMatchObject({ status: 'queued', done_at: null, done_by: null });
  });

  it('a barista who sends an order gets 403 and nothing is stored', async () => {
    const menu = await demoMenu(server);
    const before = await writeCounts(server);
    const res = await agents.barista.post('/api/orders').send(orderBody('Casimir Dunmore', [{ menuItemId: menu.item('Espresso') }]));
    expect(res.status).toBe(403);
    expect(res.body).toEqual({ error: { code: 'forbidden', message: expect.any(String) } });
    expect(await writeCounts(server)).toEqual(before);
  });
});

describe('unknown API paths', () => {
  it('answer 404 with the JSON error shape, signed in or not', async () => {
    for (const client of [request(server.url), agents.owner]) {
      const res = await client.get('/api/nope');
      expect(res.status).toBe(404);
      expect(res.headers['content-type']).toMatch(/application\/json/);
      expect(res.body).toEqual({ error: { code: 'not_found', message: expect.any(String) } });
    }
  });
});
