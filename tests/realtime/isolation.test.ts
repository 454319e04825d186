// Events belong to a location: a screen at another café never sees the demo café's events,
// neither live nor in a replay, and the other way round.
import request from 'supertest';
import { afterAll, afterEach, beforeAll, describe, expect, it } from 'vitest';
import { hashPassword } from '@server/auth/passwords';
import type { TestServer } from '../support/test-server';
import { groupOfItsOwn } from '../support/cafe-groups';
import { barLines, bumpDrink, demoLines, fireOrder, loggedEvents, startDrink, type Agent, barScene } from './bar-actions';
import { closeAllSockets, connect, connectAndResume } from './ws-client';

const NORTH_LOGIN = 'north-lead';
const NORTH_PASSWORD = 'north-side-password';

let server: TestServer;
let cashier: Agent;
let barista: Agent;
let north: Agent;
let northCookie: string;
let northLocationId: number;
let northItemId: number;
let demoLocation: number;
let lines: Awaited<ReturnType<typeof demoLines>>;

/** A second café with one lead and a one-drink menu, inserted as the demo seed does. */
async function insertNorthCafe(db: TestServer['db']) {
  const createdAt = new Date().toISOString();
  const [{ id: locationId }] = await db('locations')
    .insert({
      name: 'North Quay Espresso',
      group_id: await groupOfItsOwn(db, 'North Quay Espresso', createdAt),
      time_zone: 'Europe/London',
      currency: 'GBP',
      locale: 'en-GB',
      tax_mode: 'inclusive',
      tax_rate_milli_pct: 20000,
      extra_shot_cents: 60,
      wait_target_seconds: 300,
      pickup_timeout_seconds: 600,
      allergen_list: 'EU',
      created_at: createdAt,
    })
    .returning('id');
  await db('users').insert({
    location_id: locationId,
    group_id: (await db('locations').where({ id: locationId }).first('group_id')).group_id,
    username: NORTH_LOGIN,
    name: 'Nell North',
    role: 'lead',
    password_hash: await hashPassword(NORTH_PASSWORD),
    created_at: createdAt,
  });
  const [{ id: categoryId }] = await db('menu_categories').insert({ location_id: locationId, name: 'Coffee', sort: 0 }).returning('id');
  const [{ id: itemId }] = await db('menu_items')
    .insert({
      category_id: categoryId,
      name: 'Cortado',
      station: 'bar',
      price_cents: 350,
      shots: 2,
      takes_milk: false,
      default_milk_id: null,
      texture: null,
      ingredients: JSON.stringify([]),
      sort: 0,
    })
    .returning('id');
  return { locationId: locationId as number, itemId: itemId as number };
}

async function northSignIn(): Promise<{ agent: Agent; cookie: string }> {
  const agent = request.agent(server.url);
  const res = await agent.post('/api/session').send({ username: NORTH_LOGIN, password: NORTH_PASSWORD });
  expect(res.status).toBe(200);
  const other = await request(server.url).post('/api/session').send({ username: NORTH_LOGIN, password: NORTH_PASSWORD });
  expect(other.status).toBe(200);
  const cookie = ([] as string[])
    .concat(other.headers['set-cookie'] ?? [])
    .map((c) => c.split(';')[0])
    .join('; ');
  return { agent, cookie };
}

beforeAll(async () => {
  ({ server, cashier, barista, lines, locationId: demoLocation } = await barScene());
  ({ locationId: northLocationId, itemId: northItemId } = await insertNorthCafe(server.db));
  ({ agent: north, cookie: northCookie } = await northSignIn());
  // some demo history before the north screens connect
  await fireOrder(cashier, 'Early', [lines.espresso()]);
});
afterEach(() => closeAllSockets());
afterAll(() => server.close());

describe('events per location', () => {
  it("a north screen's hello counts only north events", async () => {
    expect(await loggedEvents(server, demoLocation)).not.toEqual([]);
    const client = await connect(server.url, northCookie);
    const hello = await client.next((m) => m.type === 'hello', 'hello');
    const northLog = await loggedEvents(server, northLocationId);
    expect(hello).toEqual({ type: 'hello', seq: northLog.at(-1)?.seq ?? 0 });
  });

  it("live: neither café's screen receives the other's events", async () => {
    const { client: demo } = await connectAndResume(server.url, await server.cookieFor('barista'));
    const { client: northScreen } = await connectAndResume(server.url, northCookie);

    // a demo event: the demo screen gets it
    const demoOrder = await fireOrder(cashier, 'Demo guest', [lines.flatWhite()]);
    expect((await demo.nextEvent('order.fired')).ticket.id).toBe(demoOrder.id);

    // a north event: the north screen's first event is its own order, not the demo one
    const northOrder = await fireOrder(north, 'North guest', [{ menuItemId: northItemId }]);
    const northFired = await northScreen.nextEvent();
    expect(northFired.type).toBe('order.fired');
    expect(northFired.ticket.id).toBe(northOrder.id);
    expect(northFired.ticket.drinks.map((d) => d.itemName)).toEqual(['Cortado']);

    // another demo event: the demo screen's next event is it, with no north event in between
    await startDrink(barista, barLines(demoOrder)[0].id);
    const demoStarted = await demo.nextEvent();
    expect(demoStarted.type).toBe('drink.started');
    expect(demoStarted.ticket.id).toBe(demoOrder.id);

    // and another north event, to close the north screen's window past the demo start
    await bumpDrink(north, barLines(northOrder)[0].id);
    const northBumped = await northScreen.nextEvent();
    expect(northBumped.type).toBe('drink.bumped');

    expect(demo.events().map((e) => e.ticket.id)).toEqual([demoOrder.id, demoOrder.id]);
    expect(northScreen.events().map((e) => e.ticket.id)).toEqual([northOrder.id, northOrder.id]);
  });

  it('replay: resume from 0 replays only the location’s own events', async () => {
    const northLog = await loggedEvents(server, northLocationId);
    const demoLog = await loggedEvents(server, demoLocation);
    expect(northLog.length).toBeGreaterThan(0);
    expect(demoLog.length).toBeGreaterThan(northLog.length);

    const { client: northScreen } = await connectAndResume(server.url, northCookie, 0);
    const replayed = [];
    for (let i = 0; i < northLog.length; i++) replayed.push(await northScreen.nextEvent());
    expect(replayed.map((e) => e.seq)).toEqual(northLog.map((e) => e.seq));

    // prove nothing else was replayed: the next event it sees is a new north one
    const more = await fireOrder(north, 'North again', [{ menuItemId: northItemId }]);
    const next = await northScreen.nextEvent();
    expect(next.ticket.id).toBe(more.id);
    expect(northScreen.events().map((e) => e.seq)).toEqual([...northLog.map((e) => e.seq), next.seq]);

    // numbers are per café (the demo café has its own 1, 2, …): tell the events apart by their tickets
    const northOrders = new Set(await server.db('orders').where({ location_id: northLocationId }).pluck('id'));
    expect(northScreen.events().every((e) => northOrders.has(e.ticket.id))).toBe(true);
  });

  it('the north board (what a north snapshot is built from) has only north tickets and the north seq', async () => {
    const res = await north.get('/api/tickets?view=board');
    expect(res.status).toBe(200);
    expect(res.body.location.name).toBe('North Quay Espresso');
    expect(res.body.seq).toBe((await loggedEvents(server, northLocationId)).at(-1)!.seq);
    expect(res.body.tickets.every((t: { drinks: { itemName: string }[] }) => t.drinks.every((d) => d.itemName === 'Cortado'))).toBe(true);
  });
});
