// Sign-in names are unique within a group of cafés (migration 20261203120000): another group may
// use the same name, adding a person never says which names another group has, and at sign-in
// the password tells apart people of different groups who share a name.
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { DEMO_PASSWORD } from '@seeds/demo-cafe';
import { hashPassword } from '@server/auth/passwords';
import { groupOfItsOwn } from '../support/cafe-groups';
import { startTestServer, type TestServer } from '../support/test-server';

let server: TestServer;
/** The other group's café, with an owner ("saltowner") and a cashier named "cashier" like the demo's. */
let saltmarsh: number;
const SALT_PASSWORD = 'saltmarsh-own-password';

beforeAll(async () => {
  server = await startTestServer();
  const at = '2026-03-01T00:00:00.000Z';
  const group = await groupOfItsOwn(server.db, 'Saltmarsh Espresso', at);
  [{ id: saltmarsh }] = await server.db('locations').insert({ name: 'Saltmarsh Espresso', created_at: at, group_id: group }).returning('id');
  const hash = await hashPassword(SALT_PASSWORD);
  await server.db('users').insert(
    (['owner', 'cashier'] as const).map((role) => ({
      location_id: saltmarsh,
      group_id: group,
      username: role === 'owner' ? 'saltowner' : 'cashier',
      name: `Salt ${role}`,
      role,
      password_hash: hash,
      created_at: at,
    })),
  );
});
afterAll(() => server.close());

async function signInAs(username: string, password: string) {
  const agent = request.agent(server.url);
  const res = await agent.post('/api/session').send({ username, password });
  return { agent, res };
}

const person = (username: string) => ({ name: `Person ${username}`, username, email: `${username}@example.com`, role: 'barista' });

describe('adding a person', () => {
  it('takes a name another group uses, and refuses one of the own group, case aside', async () => {
    const { agent: salt } = await signInAs('saltowner', SALT_PASSWORD);
    // "barista" and "lead" are the demo group's: Saltmarsh may use them, and learns nothing of them
    expect((await salt.post('/api/team').send(person('barista'))).status).toBe(201);
    const again = await salt.post('/api/team').send(person('BARISTA'));
    expect(again.status).toBe(409);
    expect(again.body.error.details).toEqual([{ path: 'username', message: 'Taken: choose another' }]);
    // the demo owner's own group still refuses its own names
    const owner = await server.signIn('owner');
    expect((await owner.post('/api/team').send(person('cashier'))).status).toBe(409);
    const ids = await server.db('users').where({ username: 'barista' }).orderBy('id').pluck('location_id');
    expect(ids).toEqual([expect.any(Number), saltmarsh]);
  });

  it('two owners of one group adding the same name at once: one person, the rest 409', async () => {
    const [a, b] = [await server.signIn('owner'), await server.signIn('owner')];
    const answers = await Promise.all(Array.from({ length: 8 }, (_, i) => (i % 2 ? a : b).post('/api/team').send(person('wren'))));
    expect(answers.map((r) => r.status).sort()).toEqual([201, 409, 409, 409, 409, 409, 409, 409]);
    expect(await server.db('users').where({ username: 'wren' }).pluck('username')).toEqual(['wren']);
  });
});

describe('signing in with a name two groups use', () => {
  it('the password tells the people apart', async () => {
    const demo = await signInAs('cashier', DEMO_PASSWORD);
    expect(demo.res.status).toBe(200);
    expect(demo.res.body.cafe.name).toBe('Harbour & Hearth Coffee');
    const salt = await signInAs('cashier', SALT_PASSWORD);
    expect(salt.res.status).toBe(200);
    expect(salt.res.body).toMatchObject({ user: { name: 'Salt cashier', role: 'cashier' }, cafe: { id: saltmarsh } });
    expect((await signInAs('cashier', 'neither-of-them')).res.status).toBe(401);
  });

  it('the same name and password in two groups is refused (409), signing in nobody', async () => {
    await server
      .db('users')
      .where({ location_id: saltmarsh, username: 'cashier' })
      .update({ password_hash: await hashPassword(DEMO_PASSWORD) });
    const { agent, res } = await signInAs('cashier', DEMO_PASSWORD);
    expect(res.status).toBe(409);
    expect(res.body.error.message).toMatch(/two café groups/);
    expect((await agent.get('/api/session')).body.user).toBeNull();
    await server
      .db('users')
      .where({ location_id: saltmarsh, username: 'cashier' })
      .update({ password_hash: await hashPassword(SALT_PASSWORD) });
  });
});
