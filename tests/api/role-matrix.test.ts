// Who may call what: the matrix is generated from the routes the app mounts (server.routes)
// and the capability table in src/domain/roles.ts, so a new route is covered as soon as it exists.
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { CAPABILITIES, ROLES, type Role } from '../../src/domain/roles';
import type { ApiRoute } from '../../server/routes/define';
import { demoMenu, startTestServer, type TestServer } from '../support/test-server';
import { orderBody, writeCounts, type Agent } from './helpers';

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

const label = (r: ApiRoute) => `${r.method.toUpperCase()} /api${r.path}`;
const urlOf = (r: ApiRoute) => `/api${r.path.replace(':id', String(r.path.startsWith('/drinks/') ? drinkId : ticketId))}`;

function expected(route: ApiRoute, who: Principal): Outcome {
  if (route.capability === null) return 'allowed';
  if (who === 'signed out') return '401';
  return (CAPABILITIES[route.capability] as readonly Role[]).includes(who) ? 'allowed' : '403';
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

describe('the route list', () => {
  it('is the full API and every capability it names exists', () => {
    const labels = server.routes.map(label);
    expect(labels).toEqual(
      expect.arrayContaining([
        'POST /api/session',
        'GET /api/session',
        'DELETE /api/session',
        'GET /api/menu',
        'POST /api/orders',
        'GET /api/tickets',
        'GET /api/pickup',
        'POST /api/drinks/:id/start',
        'POST /api/drinks/:id/bump',
        'POST /api/tickets/:id/bump',
        'POST /api/tickets/:id/recall',
        'POST /api/orders/:id/receipt',
        'GET /api/outbox',
      ]),
    );
    for (const r of server.routes) {
      if (r.capability !== null) expect(Object.keys(CAPABILITIES), label(r)).toContain(r.capability);
    }
  });
});

describe('role matrix', () => {
  const principals: Principal[] = ['signed out', ...ROLES];
  for (const who of principals) {
    it(`${who}: every route answers as the capability table says`, async () => {
      const want: Record<string, Outcome | string> = {};
      const got: Record<string, Outcome | string> = {};
      for (const route of server.routes) {
        if (skip(route, who)) continue;
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
