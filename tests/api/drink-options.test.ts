// Drink options over HTTP (src/domain/drink-options.ts): the owner marks an extra with what it
// does at the bar; a drink sold with it is stored as the bar makes it (texture, cold milk, kids'
// temperature), the Bar's jug plan follows, and a jug never mixes kids' temperature with the usual.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { demoMenu, manualClock, startTestServer, type TestServer } from '../support/test-server';
import { barTools, laneOf } from './bar-helpers';
import type { Agent } from './helpers';

const time = manualClock('2026-03-02T15:00:00.000Z');
const nowIso = () => time.clock().toISOString();

let server: TestServer;
let cashier: Agent;
let barista: Agent;
let owner: Agent;
let ids: Awaited<ReturnType<typeof demoMenu>>;

beforeAll(async () => {
  server = await startTestServer({ clock: time.clock });
  [cashier, barista, owner] = [await server.signIn('cashier'), await server.signIn('barista'), await server.signIn('owner')];
  ids = await demoMenu(server);
});
afterAll(() => server.close());

const { place, drinkIdsOf, drinkRow, expectRefused, clearBar, barLanes } = barTools({
  server: () => server,
  cashier: () => cashier,
  barista: () => barista,
  nowIso,
});

const cappuccino = (extras: string[] = []) => ({
  menuItemId: ids.item('Cappuccino'),
  milkId: ids.milk('Whole'),
  sizeId: ids.size('Cappuccino', 'Regular'),
  extraIds: extras.map(ids.extra),
});
const latte = (extras: string[] = []) => ({
  menuItemId: ids.item('Latte'),
  milkId: ids.milk('Whole'),
  sizeId: ids.size('Latte', 'Regular'),
  extraIds: extras.map(ids.extra),
});

describe('the demo options', () => {
  it('a dry cappuccino is stored with more foam and less milk than a cappuccino, at the same price', async () => {
    const [plain] = await drinkIdsOf(await place('Ada', [cappuccino()]));
    const [dry] = await drinkIdsOf(await place('Bram', [cappuccino(['Dry'])]));
    const [p, d] = [await drinkRow(plain), await drinkRow(dry)];
    expect(d.texture).toBe('foamy');
    // the demo cappuccino is already foamy: dry keeps 80 % of its milk (src/domain/drink-options.ts)
    expect(d.milk_ml).toBe(Math.round(p.milk_ml * 0.8));
    expect(d.price_cents).toBe(p.price_cents);
    await clearBar();
  });

  it('kids’ temperature gets a jug of its own, and a jug of both is refused (409) with nothing changed', async () => {
    const [usual] = await drinkIdsOf(await place('Cora', [latte()]));
    const [kids] = await drinkIdsOf(await place('Dee', [latte(['Kids’ temp'])]));
    expect((await drinkRow(kids)).kids_temp).toBeTruthy();
    const plan = laneOf((await barLanes()).lanes, 'Whole').jugPlan;
    expect(plan.map((j) => j.drinkIds)).toEqual([[usual], [kids]]);
    expect(plan.map((j) => !!j.kidsTemp)).toEqual([false, true]);
    await expectRefused(barista, '/api/jugs', { drinkIds: [usual, kids] }, 409, 'conflict', [usual, kids]);
    await clearBar();
  });
});

describe('the owner sets an extra’s effect', () => {
  it('saves it, shows it, and a drink sold afterwards follows it', async () => {
    const extraId = ids.extra('Half sweet');
    const before = (await owner.get('/api/menu-admin')).body.extras.find((e: { id: number }) => e.id === extraId);
    expect(before.barEffect).toBeNull();
    const res = await owner.put(`/api/menu-admin/extras/${extraId}`).send({ groupId: before.groupId, name: 'Half sweet', priceCents: 0, barEffect: 'wet' });
    expect(res.status, JSON.stringify(res.body)).toBe(200);
    expect(res.body.menu.extras.find((e: { id: number }) => e.id === extraId).barEffect).toBe('wet');
    const [wet] = await drinkIdsOf(await place('Eli', [latte(['Half sweet'])]));
    expect((await drinkRow(wet)).texture).toBe('flat');
    await clearBar();
  });

  it('refuses an effect it doesn’t know (400, the field named) and changes nothing', async () => {
    const extraId = ids.extra('Extra hot');
    const before = await server.db('extras').where({ id: extraId }).first();
    const res = await owner
      .put(`/api/menu-admin/extras/${extraId}`)
      .send({ groupId: before.group_id, name: 'Extra hot', priceCents: 0, barEffect: 'scalding' });
    expect(res.status).toBe(400);
    expect(res.body.error.details.map((d: { path: string }) => d.path)).toEqual(['barEffect']);
    expect(await server.db('extras').where({ id: extraId }).first()).toEqual(before);
  });
});
