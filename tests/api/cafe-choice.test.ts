// An owner of a group of cafés chooses which café their session works on (POST /api/session/cafe):
// only a café of their own group (any other is "not found", whether or not it exists), only for
// that session, and every request after it works on the chosen café. Everyone else stays on theirs.
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { SECOND_CAFE_NAME, demoCafeId } from '@seeds/demo-cafe';
import { groupOfItsOwn } from '../support/cafe-groups';
import { demoMenu, startTestServer, type TestServer } from '../support/test-server';
import { orderBody } from './helpers';

let server: TestServer;
let home: number;
let ropewalk: number;
let outside: number;

beforeAll(async () => {
  server = await startTestServer();
  home = await demoCafeId(server.db);
  ropewalk = (await server.db('locations').where({ name: SECOND_CAFE_NAME }).first('id')).id;
  const at = '2026-03-01T00:00:00.000Z';
  [{ id: outside }] = await server
    .db('locations')
    .insert({ name: 'Saltmarsh Espresso', created_at: at, group_id: await groupOfItsOwn(server.db, 'Saltmarsh Espresso', at) })
    .returning('id');
});
afterAll(() => server.close());

const both = () => [
  { id: home, name: 'Harbour & Hearth Coffee' },
  { id: ropewalk, name: SECOND_CAFE_NAME },
];

describe('GET /api/session', () => {
  it('names the café in view, and lists the group’s cafés for an owner only', async () => {
    const owner = await server.signIn('owner');
    expect((await owner.get('/api/session').expect(200)).body).toEqual({
      user: { id: expect.any(Number), name: 'Mara Quill', role: 'owner' },
      cafe: { id: home, name: 'Harbour & Hearth Coffee' },
      groupCafes: both(),
    });
    const rwCashier = await server.signIn('rw-cashier');
    expect((await rwCashier.get('/api/session').expect(200)).body).toMatchObject({ cafe: { id: ropewalk, name: SECOND_CAFE_NAME }, groupCafes: [] });
    expect((await request(server.url).get('/api/session').expect(200)).body).toEqual({ user: null, cafe: null, groupCafes: [] });
  });
});

describe('POST /api/session/cafe', () => {
  it('moves the owner’s session, and only it, to the chosen café of the group', async () => {
    const owner = await server.signIn('owner');
    const elsewhere = await server.signIn('owner'); // the same owner on another terminal
    expect((await owner.post('/api/session/cafe').send({ locationId: ropewalk }).expect(200)).body).toEqual({ cafe: { id: ropewalk, name: SECOND_CAFE_NAME } });
    expect((await owner.get('/api/session').expect(200)).body).toMatchObject({ cafe: { id: ropewalk }, groupCafes: both() });
    expect((await owner.get('/api/menu').expect(200)).body.location).toMatchObject({ id: ropewalk, name: SECOND_CAFE_NAME });
    expect((await elsewhere.get('/api/menu').expect(200)).body.location).toMatchObject({ id: home });

    // an order the owner takes now belongs to Ropewalk: its cashier sees it, Harbour & Hearth's does not
    const ids = await demoMenu(server, ropewalk);
    const placed = await owner
      .post('/api/orders')
      .send(orderBody('Wren', [{ menuItemId: ids.item('Long black'), sizeId: ids.size('Long black', 'Regular') }]))
      .expect(201);
    expect((await server.db('orders').where({ id: placed.body.order.id }).first('location_id')).location_id).toBe(ropewalk);
    const names = async (login: 'rw-cashier' | 'cashier') =>
      ((await (await server.signIn(login)).get('/api/orders').expect(200)).body.orders as { customerName: string }[]).map((o) => o.customerName);
    expect(await names('rw-cashier')).toContain('Wren');
    expect(await names('cashier')).not.toContain('Wren');
    // an item of the café no longer in view is refused like any unknown item
    const homeIds = await demoMenu(server, home);
    const refused = await owner
      .post('/api/orders')
      .send(orderBody('Hale', [{ menuItemId: homeIds.item('Long black'), sizeId: homeIds.size('Long black', 'Regular') }]));
    expect(refused.status).toBeGreaterThanOrEqual(400);
    expect(refused.status).toBeLessThan(500);

    // and back home
    await owner.post('/api/session/cafe').send({ locationId: home }).expect(200);
    expect((await owner.get('/api/menu').expect(200)).body.location).toMatchObject({ id: home });
  });

  it('refuses a café outside the group exactly as one that does not exist: 404', async () => {
    const owner = await server.signIn('owner');
    const other = await owner.post('/api/session/cafe').send({ locationId: outside });
    const none = await owner.post('/api/session/cafe').send({ locationId: 999_999 });
    expect(other.status).toBe(404);
    expect(other.body).toEqual(none.body);
    expect((await owner.get('/api/session').expect(200)).body.cafe).toEqual({ id: home, name: 'Harbour & Hearth Coffee' });
  });

  it('is the owner’s alone: 403 for every other role, 401 signed out, 400 for a malformed body', async () => {
    for (const login of ['lead', 'cashier', 'barista', 'rw-lead'] as const) {
      const agent = await server.signIn(login);
      expect((await agent.post('/api/session/cafe').send({ locationId: ropewalk })).status).toBe(403);
    }
    expect((await request(server.url).post('/api/session/cafe').send({ locationId: ropewalk })).status).toBe(401);
    const owner = await server.signIn('owner');
    expect((await owner.post('/api/session/cafe').send({ locationId: 'Ropewalk' })).status).toBe(400);
  });

  it('a new sign-in starts on the owner’s own café again', async () => {
    const owner = await server.signIn('owner');
    await owner.post('/api/session/cafe').send({ locationId: ropewalk }).expect(200);
    const again = await server.signIn('owner');
    expect((await again.get('/api/session').expect(200)).body.cafe).toEqual({ id: home, name: 'Harbour & Hearth Coffee' });
  });

  it('falls back to the owner’s own café once the chosen one has left the group', async () => {
    const owner = await server.signIn('owner');
    await owner.post('/api/session/cafe').send({ locationId: ropewalk }).expect(200);
    const group = (await server.db('locations').where({ id: ropewalk }).first('group_id')).group_id;
    await server
      .db('locations')
      .where({ id: ropewalk })
      .update({ group_id: await groupOfItsOwn(server.db, 'Split', '2026-03-01T00:00:00.000Z') });
    try {
      expect((await owner.get('/api/session').expect(200)).body.cafe).toEqual({ id: home, name: 'Harbour & Hearth Coffee' });
    } finally {
      await server.db('locations').where({ id: ropewalk }).update({ group_id: group });
    }
  });
});
