// The menu a process keeps per café (server/menu/menu-cache.ts) against changes made by another
// process of the group: two servers on one database, the Counter's orders on one, the back office
// on the other. Each change must be priced or refused by the very next order on the first.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { demoCafeId } from '@seeds/demo-cafe';
import { demoMenu, startTestServer, type TestServer } from '../support/test-server';
import { orderBody, type Agent } from './helpers';

let a: TestServer;
let b: TestServer;
let cashierOnA: Agent;
let leadOnB: Agent;
let ownerOnB: Agent;
let ids: Awaited<ReturnType<typeof demoMenu>>;
let cafe: number;

beforeAll(async () => {
  a = await startTestServer();
  b = await startTestServer({ sharing: a });
  cashierOnA = await a.signIn('cashier');
  [leadOnB, ownerOnB] = [await b.signIn('lead'), await b.signIn('owner')];
  ids = await demoMenu(a);
  cafe = await demoCafeId(a.db);
});
afterAll(async () => {
  await b?.close();
  await a?.close();
});

const latte = (name: string) => orderBody(name, [{ menuItemId: ids.item('Latte') }], 20_00);
const version = async () => Number((await a.db('event_seqs').where({ location_id: cafe }).first('menu_version'))?.menu_version ?? 0);

describe('the menu kept by one process, changed through another', () => {
  it('an 86 on the other process is refused by the next order here, and taken again once back on', async () => {
    expect((await cashierOnA.post('/api/orders').send(latte('Wren Ashby'))).status).toBe(201); // kept now
    expect((await leadOnB.post(`/api/menu/items/${ids.item('Latte')}/availability`).send({ available: false })).status).toBe(200);
    const refused = await cashierOnA.post('/api/orders').send(latte('Wren Ashby'));
    expect(refused.status).toBe(409);
    expect(refused.body.error.code).toBe('unavailable');
    expect((await leadOnB.post(`/api/menu/items/${ids.item('Latte')}/availability`).send({ available: true })).status).toBe(200);
    expect((await cashierOnA.post('/api/orders').send(latte('Wren Ashby'))).status).toBe(201);
  });

  // a Latte in its default (regular) size, $5.40: at the demo's 8.25 % tax $5.85 (584.55 rounded half
  // up), at 10 % $5.94 (worked by hand)
  it('a tax rate changed on the other process prices the next order here', async () => {
    const before = await cashierOnA.post('/api/orders').send(latte('Ivo Marchetti'));
    expect(before.body.order.totalCents).toBe(585);
    expect((await ownerOnB.put('/api/settings').send({ taxRatePercent: '10' })).status).toBe(200);
    const after = await cashierOnA.post('/api/orders').send(latte('Ivo Marchetti'));
    expect(after.status).toBe(201);
    expect(after.body.order.totalCents).toBe(594);
    expect((await cashierOnA.get('/api/menu')).body.location.taxRateMilliPct).toBe(10_000);
  });

  it('the version moves with each menu change and not with an order', async () => {
    const start = await version();
    expect((await cashierOnA.post('/api/orders').send(latte('Noor Halloran'))).status).toBe(201);
    expect(await version()).toBe(start);
    expect((await leadOnB.post(`/api/menu/items/${ids.item('Mocha')}/availability`).send({ available: false })).status).toBe(200);
    expect(await version()).toBe(start + 1);
  });
});
