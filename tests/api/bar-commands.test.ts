// The bar's commands over HTTP: start, bump a drink, bump a ticket, recall. Each one is a
// transaction that appends exactly one event; a refused one appends none.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { PickupTicket } from '@/domain/pickup';
import type { TicketView } from '@/domain/types';
import { demoMenu, manualClock, startTestServer, type TestServer } from '../support/test-server';
import { orderBody, type Agent, type LineInput } from './helpers';
import { jsonOf } from '../support/rows';

const time = manualClock('2026-03-02T14:00:00.000Z');
const nowIso = () => time.clock().toISOString();
/**
 * Let a second pass between commands, as it would at a real bar. (A recall finds the last bump
 * by done_at, so two bumps of one ticket in the same millisecond could not be told apart.)
 */
const tick = (ms = 1000) => time.advance(ms);

let server: TestServer;
let cashier: Agent;
let barista: Agent;
let barista2: Agent;
let ids: Awaited<ReturnType<typeof demoMenu>>;
let baristaId: number;
let barista2Id: number;

beforeAll(async () => {
  server = await startTestServer({ clock: time.clock });
  [cashier, barista, barista2] = [await server.signIn('cashier'), await server.signIn('barista'), await server.signIn('barista2')];
  ids = await demoMenu(server);
  baristaId = (await server.db('users').where({ username: 'barista' }).first()).id;
  barista2Id = (await server.db('users').where({ username: 'barista2' }).first()).id;
});
afterAll(() => server.close());

async function place(customerName: string, items: LineInput[]): Promise<number> {
  const res = await cashier.post('/api/orders').send(orderBody(customerName, items));
  if (res.status !== 201) throw new Error(`order failed: ${res.status} ${JSON.stringify(res.body)}`);
  return res.body.order.id;
}
const drinkRows = (orderId: number) => server.db('order_items').where({ order_id: orderId, station: 'bar' }).orderBy('line_no');
const orderRow = (orderId: number) => server.db('orders').where({ id: orderId }).first();
const maxEventId = async () => Number((await server.db('events').max({ m: 'id' }).first())?.m ?? 0);

/** Send one command and return the answer together with the event rows it appended. */
async function send(agent: Agent, path: string) {
  const since = await maxEventId();
  const res = await agent.post(path);
  const events = await server.db('events').where('id', '>', since).orderBy('id');
  return { res, events };
}

/** A successful command: 200 { ticket }, and exactly one event of `type` carrying that ticket. */
async function expectCommand(agent: Agent, path: string, type: string, actorId = baristaId): Promise<TicketView> {
  const { res, events } = await send(agent, path);
  expect(res.status, JSON.stringify(res.body)).toBe(200);
  expect(events.map((e) => e.type)).toEqual([type]);
  expect(events[0]).toMatchObject({ actor_id: actorId, created_at: nowIso() });
  expect(jsonOf(events[0].payload).ticket).toEqual(res.body.ticket);
  return res.body.ticket;
}

/** A refused command: the status and code, and no event at all. */
async function expectRefused(agent: Agent, path: string, status: number, code: string) {
  const { res, events } = await send(agent, path);
  expect(res.status).toBe(status);
  expect(res.body).toEqual({ error: { code, message: expect.any(String) } });
  expect(events).toEqual([]);
}

const ticketIds = (body: { tickets: TicketView[] }) => body.tickets.map((t) => t.id);

describe('GET /api/tickets', () => {
  it('answers { seq, now, location, tickets } with each drink, its milk, shots and status', async () => {
    const id = await place('Anouk Pemberton', [
      { menuItemId: ids.item('Latte'), milkId: ids.milk('Oat') },
      { menuItemId: ids.item('Cappuccino') },
      { menuItemId: ids.item('Espresso'), shots: 3 },
      { menuItemId: ids.item('Butter croissant') },
    ]);
    const res = await barista.get('/api/tickets?view=open');
    expect(res.status).toBe(200);
    expect(Object.keys(res.body).sort()).toEqual(['location', 'now', 'seq', 'tickets']);
    expect(res.body.seq).toBe(await maxEventId());
    expect(res.body.now).toBe(nowIso());
    expect(res.body.location).toMatchObject({ name: 'Harbour & Hearth Coffee', waitTargetSeconds: 240, pickupTimeoutSeconds: 600 });

    const ticket = res.body.tickets.find((t: TicketView) => t.id === id);
    expect(ticket).toMatchObject({ customerName: 'Anouk Pemberton', status: 'open', readyAt: null });
    // Bar drinks only: the croissant is collected at the counter.
    expect(ticket.drinks.map((d: { itemName: string }) => d.itemName)).toEqual(['Latte', 'Cappuccino', 'Espresso']);
    expect(ticket.drinks[0]).toMatchObject({
      milk: { id: ids.milk('Oat'), name: 'Oat', code: 'OA' },
      shots: 2,
      status: 'queued',
      startedAt: null,
      doneAt: null,
    });
    expect(ticket.drinks[1]).toMatchObject({ milk: { name: 'Whole', code: 'WH' }, sizeName: 'Regular', status: 'queued' });
    expect(ticket.drinks[2]).toMatchObject({ milk: null, shots: 3, status: 'queued' });

    // No status means open.
    expect((await barista.get('/api/tickets')).body).toEqual(res.body);
  });
});

describe('starting a drink', () => {
  it('moves it from queued to making, once', async () => {
    const id = await place('Lucan Thistlewood', [{ menuItemId: ids.item('Flat white') }]);
    const [drink] = await drinkRows(id);
    tick();
    const ticket = await expectCommand(barista, `/api/drinks/${drink.id}/start`, 'drink.started');
    expect(ticket.drinks[0]).toMatchObject({ id: drink.id, status: 'making', startedAt: nowIso(), doneAt: null });
    expect(ticket.status).toBe('open');

    tick();
    await expectRefused(barista, `/api/drinks/${drink.id}/start`, 409, 'conflict');
    expect((await drinkRows(id))[0]).toMatchObject({ status: 'making', started_at: ticket.drinks[0].startedAt });
  });
});

describe('bumping a drink', () => {
  it('marks it done once; a second bump is 409 conflict', async () => {
    const id = await place('Marguerite Pollard', [{ menuItemId: ids.item('Latte') }, { menuItemId: ids.item('Long black') }]);
    const [first] = await drinkRows(id);
    tick();
    const doneAt = nowIso();
    const ticket = await expectCommand(barista, `/api/drinks/${first.id}/bump`, 'drink.bumped');
    expect(ticket.drinks[0]).toMatchObject({ status: 'done', doneAt });
    expect(ticket.drinks[1]).toMatchObject({ status: 'queued' });
    expect(ticket).toMatchObject({ status: 'open', readyAt: null }); // one drink is still to make

    tick();
    await expectRefused(barista, `/api/drinks/${first.id}/bump`, 409, 'conflict');
    expect((await drinkRows(id))[0]).toMatchObject({ status: 'done', done_at: doneAt, done_by: baristaId });
    // Starting a finished drink is refused too.
    await expectRefused(barista, `/api/drinks/${first.id}/start`, 409, 'conflict');
  });

  it('two baristas bumping the same drink at once: one 200, one 409, done once', async () => {
    const id = await place('Ottoline Grieve', [{ menuItemId: ids.item('Cappuccino') }, { menuItemId: ids.item('Mocha') }]);
    const [drink] = await drinkRows(id);
    tick();
    const since = await maxEventId();
    const [a, b] = await Promise.all([barista.post(`/api/drinks/${drink.id}/bump`), barista2.post(`/api/drinks/${drink.id}/bump`)]);

    expect([a.status, b.status].sort()).toEqual([200, 409]);
    const [winner, loser] = a.status === 200 ? [a, b] : [b, a];
    expect(loser.body).toEqual({ error: { code: 'conflict', message: expect.any(String) } });
    const events = await server.db('events').where('id', '>', since);
    expect(events.map((e) => e.type)).toEqual(['drink.bumped']);
    const row = (await drinkRows(id))[0];
    expect(row).toMatchObject({ status: 'done', done_at: nowIso(), done_by: winner === a ? baristaId : barista2Id });
    expect(events[0].actor_id).toBe(row.done_by);
  });

  it("bumping the ticket's last drink makes it ready: off the bar, on the Pickup board", async () => {
    const id = await place('Seraphina Oakenshaw', [{ menuItemId: ids.item('Iced latte') }, { menuItemId: ids.item('Batch brew') }]);
    const [one, two] = await drinkRows(id);
    tick();
    await expectCommand(barista, `/api/drinks/${one.id}/bump`, 'drink.bumped');
    expect(await orderRow(id)).toMatchObject({ status: 'open', ready_at: null });

    tick();
    const ticket = await expectCommand(barista2, `/api/drinks/${two.id}/bump`, 'drink.bumped', barista2Id);
    expect(ticket).toMatchObject({ status: 'ready', readyAt: nowIso() });
    expect(await orderRow(id)).toMatchObject({ status: 'ready', ready_at: nowIso() });

    expect(ticketIds((await barista.get('/api/tickets?view=open')).body)).not.toContain(id);
    expect(ticketIds((await barista.get('/api/tickets?view=board')).body)).toContain(id);

    const pickup = await cashier.get('/api/pickup');
    expect(pickup.status).toBe(200);
    const shown = pickup.body.tickets.find((t: PickupTicket) => t.id === id);
    expect(shown).toEqual({ id, number: ticket.number, firstName: 'Seraphina', status: 'ready', readyAt: nowIso() });
    expect(JSON.stringify(pickup.body)).not.toContain('Oakenshaw');

    // A ready ticket has nothing left to bump.
    await expectRefused(barista, `/api/tickets/${id}/bump`, 409, 'conflict');
  });
});

describe('bumping a ticket and recalling', () => {
  it('bumps every remaining drink with one bump, and a recall undoes exactly that bump', async () => {
    const id = await place('Caspian Wetherell', [
      { menuItemId: ids.item('Latte'), milkId: ids.milk('Oat') },
      { menuItemId: ids.item('Chai latte') },
      { menuItemId: ids.item('Espresso') },
    ]);
    const [a, b, c] = await drinkRows(id);
    tick();
    await expectCommand(barista, `/api/drinks/${a.id}/start`, 'drink.started');
    const aStartedAt = nowIso();
    tick();
    await expectCommand(barista, `/api/drinks/${c.id}/bump`, 'drink.bumped');
    const cDoneAt = nowIso();

    tick();
    const bumped = await expectCommand(barista, `/api/tickets/${id}/bump`, 'ticket.bumped');
    expect(bumped).toMatchObject({ status: 'ready', readyAt: nowIso() });
    expect(bumped.drinks.map((d) => d.status)).toEqual(['done', 'done', 'done']);
    const afterBump = await drinkRows(id);
    expect(afterBump[0]).toMatchObject({ done_at: nowIso(), started_at: aStartedAt });
    expect(afterBump[1]).toMatchObject({ done_at: nowIso(), started_at: nowIso() });
    expect(afterBump[2]).toMatchObject({ done_at: cDoneAt });
    // One bump: the two drinks it finished share one bump number, later than the drink bump's.
    expect(afterBump[0].bump_seq).toBeTruthy();
    expect(afterBump[1].bump_seq).toBe(afterBump[0].bump_seq);
    expect(afterBump[2].bump_seq).toBeLessThan(afterBump[0].bump_seq);

    tick();
    const recalled = await expectCommand(barista, `/api/tickets/${id}/recall`, 'ticket.recalled');
    expect(recalled).toMatchObject({ status: 'open', readyAt: null });
    expect(recalled.drinks.map((d) => [d.id, d.status, d.doneAt])).toEqual([
      [a.id, 'making', null],
      [b.id, 'making', null],
      [c.id, 'done', cDoneAt],
    ]);
    expect(await orderRow(id)).toMatchObject({ status: 'open', ready_at: null });
    expect(ticketIds((await barista.get('/api/tickets?view=open')).body)).toContain(id);

    // The next recall undoes the bump before it: the single espresso.
    tick();
    const again = await expectCommand(barista, `/api/tickets/${id}/recall`, 'ticket.recalled');
    expect(again.drinks.map((d) => d.status)).toEqual(['making', 'making', 'making']);

    tick();
    await expectRefused(barista, `/api/tickets/${id}/recall`, 409, 'conflict');
  });

  it('a recall undoes the last command even when two bumps land in the same millisecond', async () => {
    const id = await place('Orla Brennick', [{ menuItemId: ids.item('Latte'), milkId: ids.milk('Whole') }, { menuItemId: ids.item('Espresso') }]);
    const [latte, espresso] = await drinkRows(id);
    tick();
    // the clock does not move between these two: same done_at
    await expectCommand(barista, `/api/drinks/${espresso.id}/bump`, 'drink.bumped');
    await expectCommand(barista, `/api/tickets/${id}/bump`, 'ticket.bumped');
    tick();
    const recalled = await expectCommand(barista, `/api/tickets/${id}/recall`, 'ticket.recalled');
    expect(recalled.drinks.map((d) => [d.id, d.status])).toEqual([
      [latte.id, 'making'],
      [espresso.id, 'done'],
    ]);
  });

  it('a recall with nothing bumped is 409', async () => {
    const id = await place('Delphine Aukland', [{ menuItemId: ids.item('Long black') }]);
    tick();
    await expectRefused(barista, `/api/tickets/${id}/recall`, 409, 'conflict');
    expect(await orderRow(id)).toMatchObject({ status: 'open', ready_at: null });
  });

  it('a recall is allowed up to 5 minutes after the bump, and refused after that', async () => {
    const early = await place('Fitzroy Lamb', [{ menuItemId: ids.item('Espresso') }]);
    const late = await place('Juniper Halsey', [{ menuItemId: ids.item('Espresso') }]);
    tick();
    await expectCommand(barista, `/api/tickets/${early}/bump`, 'ticket.bumped');
    await expectCommand(barista, `/api/tickets/${late}/bump`, 'ticket.bumped');
    const bumpedAt = nowIso();

    time.advance(5 * 60 * 1000 - 1000); // 4 min 59 s later
    await expectCommand(barista, `/api/tickets/${early}/recall`, 'ticket.recalled');

    time.advance(2000); // 5 min 1 s after the bump
    await expectRefused(barista, `/api/tickets/${late}/recall`, 409, 'conflict');
    expect(await orderRow(late)).toMatchObject({ status: 'ready', ready_at: bumpedAt });
    expect((await drinkRows(late))[0]).toMatchObject({ status: 'done', done_at: bumpedAt });
  });
});

describe('unknown ids', () => {
  it('answer 404 not_found and append nothing', async () => {
    for (const path of ['/api/drinks/999999/start', '/api/drinks/999999/bump', '/api/tickets/999999/bump', '/api/tickets/999999/recall']) {
      await expectRefused(barista, path, 404, 'not_found');
    }
  });

  it('a counter item is not a drink: bumping it is 404', async () => {
    const id = await place('Rowena Stitch', [{ menuItemId: ids.item('Banana bread') }, { menuItemId: ids.item('Espresso') }]);
    const counterItem = await server.db('order_items').where({ order_id: id, station: 'counter' }).first();
    await expectRefused(barista, `/api/drinks/${counterItem.id}/bump`, 404, 'not_found');
  });
});
