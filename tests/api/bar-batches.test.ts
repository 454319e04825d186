// The bar's plan and its batch commands over HTTP: GET /api/bar/lanes (milk lanes, jug plan, shot
// plan), starting and bumping several drinks in one command, the allergy read, a lead's rush, the
// collection at pickup, and drinks that are not on an open ticket. Every command is one
// transaction; a refused one changes no row and appends no event.
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { PickupTicket } from '@/domain/pickup';
import type { TicketView } from '@/domain/types';
import { demoMenu, manualClock, startTestServer, type TestServer } from '../support/test-server';
import { groupOfItsOwn } from '../support/cafe-groups';
import { BIG_PITCHER, barTools, laneIds, laneOf, MID_PITCHER, plannedJug, SMALL_PITCHER } from './bar-helpers';
import { orderBody, type Agent } from './helpers';
import { jsonOf } from '../support/rows';

const time = manualClock('2026-03-02T14:00:00.000Z');
const nowIso = () => time.clock().toISOString();
/** Let a second pass between commands, so tickets fired one after another differ in age. */
const tick = (ms = 1000) => time.advance(ms);

let server: TestServer;
let cashier: Agent;
let barista: Agent;
let barista2: Agent;
let lead: Agent;
let ids: Awaited<ReturnType<typeof demoMenu>>;
let baristaId: number;
let barista2Id: number;
let leadId: number;
let cashierId: number;

beforeAll(async () => {
  server = await startTestServer({ clock: time.clock });
  [cashier, barista, barista2, lead] = [
    await server.signIn('cashier'),
    await server.signIn('barista'),
    await server.signIn('barista2'),
    await server.signIn('lead'),
  ];
  ids = await demoMenu(server);
  const userId = async (username: string) => (await server.db('users').where({ username }).first()).id as number;
  [baristaId, barista2Id, leadId, cashierId] = [await userId('barista'), await userId('barista2'), await userId('lead'), await userId('cashier')];
});
afterAll(() => server.close());

const { place, drinkIdsOf, drinkRow, orderRow, maxEventId, eventsAfter, expectRefused, expectCommand, expectBatch, openTickets, clearBar, barLanes } = barTools(
  {
    server: () => server,
    cashier: () => cashier,
    barista: () => barista,
    nowIso,
  },
);

describe('GET /api/bar/lanes', () => {
  it('groups the open drinks by milk, oldest first, with a jug plan per lane and the shots still to pull', async () => {
    await clearBar();
    const oatOrder = await place('Hester Varley', [
      { menuItemId: ids.item('Latte'), milkId: ids.milk('Oat') }, // Regular: 270 ml milk
      { menuItemId: ids.item('Latte'), milkId: ids.milk('Oat') },
    ]);
    tick();
    const wholeOrder = await place('Ivo Castellan', [
      { menuItemId: ids.item('Latte'), sizeId: ids.size('Latte', 'Small') }, // 180 ml, silky
      { menuItemId: ids.item('Cappuccino') }, // Regular: 210 ml, foamy
    ]);
    tick();
    const icedOrder = await place('Jessamy Brook', [{ menuItemId: ids.item('Iced latte') }, { menuItemId: ids.item('Batch brew') }]);
    const [oat1, oat2] = await drinkIdsOf(oatOrder);
    const [smallLatte, cappuccino] = await drinkIdsOf(wholeOrder);
    const [iced, brew] = await drinkIdsOf(icedOrder);

    const body = await barLanes();
    expect(Object.keys(body).sort()).toEqual(['lanes', 'now', 'seq', 'shotPlan']);
    expect(body.seq).toBe(await maxEventId());
    expect(body.now).toBe(nowIso());

    // The menu's milk order (Whole is listed first, Oat third), then no milk.
    expect(body.lanes.map((l) => l.key)).toEqual([`milk:${ids.milk('Whole')}`, `milk:${ids.milk('Oat')}`, 'none']);
    const [whole, oat, none] = body.lanes;
    expect(whole.milk).toEqual({ id: ids.milk('Whole'), name: 'Whole', code: 'WH', sort: 0 });
    expect(oat.milk).toEqual({ id: ids.milk('Oat'), name: 'Oat', code: 'OA', sort: 2 });
    expect(none.milk).toBeNull();

    // Whole: the iced latte waits in its lane like any drink, oldest ticket first…
    expect(laneIds(whole)).toEqual([smallLatte, cappuccino, iced]);
    // …but takes cold milk from the fridge, so it is in no jug (common practice). The steamed ones:
    // 180 + 210 + 15 waste = 405 ml ≤ 520 (the largest fill line): one jug. The smallest pitcher
    // that holds 405 ml: 190 no, 330 no, 520 yes (≥ its minimum 320; foamy growth 405 × 1.75 =
    // 708.75 ≤ 950) → the 950 ml pitcher. Steamed for the foamiest (the cappuccino), poured
    // thinnest first: the silky latte, then the cappuccino (common practice).
    expect(whole.jugPlan).toEqual([plannedJug(BIG_PITCHER, 405, 15, 'foamy', [smallLatte, cappuccino])]);
    expect(whole.jugPlan.flatMap((b) => b.drinkIds)).not.toContain(iced);

    // Oat: 270 + 270 + 15 = 555 ml > 520, so the second latte starts a second jug. Each jug is
    // 270 + 15 = 285 ml: 190 is too small, 330 holds it (≥ 200; 285 × 1.25 = 356.25 ≤ 600) → the
    // 600 ml pitcher, twice.
    expect(laneIds(oat)).toEqual([oat1, oat2]);
    expect(oat.jugPlan).toEqual([plannedJug(MID_PITCHER, 285, 15, 'silky', [oat1]), plannedJug(MID_PITCHER, 285, 15, 'silky', [oat2])]);

    // Batch brew: no milk, no shots, no jug.
    expect(laneIds(none)).toEqual([brew]);
    expect(none.jugPlan).toEqual([]);

    // Shots to pull: every drink here is queued. Whole lane 3 drinks × 2 shots = 6 shots,
    // 3 × 190 dg = 570 dg (19 g a double); Oat 2 × 2 = 4 shots, 380 dg; batch brew 0.
    expect(whole.shotPlan).toEqual({ shots: 6, doseDg: 570 });
    expect(oat.shotPlan).toEqual({ shots: 4, doseDg: 380 });
    expect(none.shotPlan).toEqual({ shots: 0, doseDg: 0 });
    expect(body.shotPlan).toEqual({ shots: 10, doseDg: 950 });

    // Starting a drink takes its shots out of the shot plan (they are being pulled); a milk drink
    // started on its own is a started jug of its own, in the plan until it is bumped.
    tick();
    await expectCommand(barista, `/api/drinks/${oat1}/start`, 'drink.started', baristaId);
    const started = await barLanes();
    expect(laneOf(started.lanes, 'Oat').shotPlan).toEqual({ shots: 2, doseDg: 190 });
    expect(started.shotPlan).toEqual({ shots: 8, doseDg: 760 });
    const startedJug = (await server.db('jug_drinks').where({ order_item_id: oat1 }).first()).jug_id;
    expect(laneOf(started.lanes, 'Oat').jugPlan.map((b) => [b.jugId, b.drinkIds])).toEqual([
      [startedJug, [oat1]],
      [null, [oat2]],
    ]);
    expect(laneIds(laneOf(started.lanes, 'Oat'))).toEqual([oat1, oat2]);

    // A bumped drink leaves its lane: the Oat lane is now one latte, one jug of 285 ml.
    tick();
    await expectCommand(barista, `/api/drinks/${oat1}/bump`, 'drink.bumped', baristaId);
    const bumped = await barLanes();
    expect(laneIds(laneOf(bumped.lanes, 'Oat'))).toEqual([oat2]);
    expect(laneOf(bumped.lanes, 'Oat').jugPlan).toEqual([plannedJug(MID_PITCHER, 285, 15, 'silky', [oat2])]);
    expect(bumped.shotPlan).toEqual({ shots: 8, doseDg: 760 });
  });

  it('a lone small drink takes the smallest pitcher that holds it', async () => {
    await clearBar();
    const order = await place('Kit Marchbank', [{ menuItemId: ids.item('Flat white'), milkId: ids.milk('Soy') }]);
    const [flatWhite] = await drinkIdsOf(order);
    const soy = laneOf((await barLanes()).lanes, 'Soy');
    // 120 ml + 15 waste = 135 ≤ 190, ≥ 120, 135 × 1.15 = 155.25 ≤ 350 → the 350 ml pitcher.
    expect(soy.jugPlan).toEqual([plannedJug(SMALL_PITCHER, 135, 15, 'flat', [flatWhite])]);
  });

  it('the cashier can read it; signed out is 401', async () => {
    const res = await cashier.get('/api/bar/lanes');
    expect(res.status).toBe(200);
    expect(res.body.lanes).toEqual((await barLanes()).lanes);

    const anonymous = await request(server.url).get('/api/bar/lanes');
    expect(anonymous.status).toBe(401);
    expect(anonymous.body.error).toMatchObject({ code: 'unauthenticated' });
  });
});

describe('POST /api/drinks/start and /api/drinks/bump (batches)', () => {
  it('starts and bumps drinks across tickets in one command each: one event per ticket', async () => {
    const a = await place('Leontine Farrow', [{ menuItemId: ids.item('Latte') }, { menuItemId: ids.item('Cappuccino') }, { menuItemId: ids.item('Espresso') }]);
    const b = await place('Magnus Ebbing', [{ menuItemId: ids.item('Latte') }]);
    const [aLatte, aCappuccino, aEspresso] = await drinkIdsOf(a);
    const [bLatte] = await drinkIdsOf(b);

    tick();
    const startedAt = nowIso();
    const { tickets: started } = await expectBatch(barista, '/api/drinks/start', [aLatte, bLatte, aCappuccino], 'drink.started', baristaId, [a, b]);
    expect(started.get(a)!.drinks.map((d) => [d.id, d.status, d.startedAt])).toEqual([
      [aLatte, 'making', startedAt],
      [aCappuccino, 'making', startedAt],
      [aEspresso, 'queued', null],
    ]);
    expect(started.get(b)!.drinks.map((d) => [d.id, d.status, d.startedAt])).toEqual([[bLatte, 'making', startedAt]]);

    // Starting a drink already being made is refused, and so is the rest of that batch.
    tick();
    await expectRefused(barista, '/api/drinks/start', { drinkIds: [aEspresso, aLatte] }, 409, 'conflict', [aEspresso, aLatte]);

    // Bump the two lattes (a jug of two) in one command: ticket A still has drinks, B is ready.
    tick();
    const doneAt = nowIso();
    const { tickets: bumped } = await expectBatch(barista, '/api/drinks/bump', [aLatte, bLatte], 'drink.bumped', baristaId, [a, b]);
    expect(bumped.get(a)).toMatchObject({ status: 'open', readyAt: null });
    expect(bumped.get(a)!.drinks.map((d) => [d.id, d.status])).toEqual([
      [aLatte, 'done'],
      [aCappuccino, 'making'],
      [aEspresso, 'queued'],
    ]);
    expect(bumped.get(b)).toMatchObject({ status: 'ready', readyAt: doneAt });
    expect(await drinkRow(aLatte)).toMatchObject({ status: 'done', done_at: doneAt, done_by: baristaId, started_at: startedAt });
    expect(await drinkRow(bLatte)).toMatchObject({ status: 'done', done_at: doneAt, done_by: baristaId });
    // One command: both drinks share one bump number.
    expect((await drinkRow(aLatte)).bump_seq).toBe((await drinkRow(bLatte)).bump_seq);

    // Bumping the rest of A in one batch finishes it; a drink never started gets its start time.
    tick();
    const { tickets: finished } = await expectBatch(barista2, '/api/drinks/bump', [aCappuccino, aEspresso], 'drink.bumped', barista2Id, [a]);
    expect(finished.get(a)).toMatchObject({ status: 'ready', readyAt: nowIso() });
    expect(await orderRow(a)).toMatchObject({ status: 'ready', ready_at: nowIso() });
    expect(await drinkRow(aEspresso)).toMatchObject({ status: 'done', started_at: nowIso(), done_at: nowIso(), done_by: barista2Id });
    expect((await openTickets()).map((t) => t.id)).not.toContain(a);
  });

  it('an unknown drink or one of another café is 404, and nothing changes', async () => {
    const order = await place('Nerys Holloway', [{ menuItemId: ids.item('Flat white') }, { menuItemId: ids.item('Mocha') }]);
    const [flatWhite, mocha] = await drinkIdsOf(order);
    const elsewhere = await insertOtherCafeDrink();

    for (const path of ['/api/drinks/start', '/api/drinks/bump']) {
      tick();
      await expectRefused(barista, path, { drinkIds: [flatWhite, 999_999] }, 404, 'not_found', [flatWhite, mocha]);
      await expectRefused(barista, path, { drinkIds: [flatWhite, mocha, elsewhere] }, 404, 'not_found', [flatWhite, mocha, elsewhere]);
      await expectRefused(barista, path, { drinkIds: [elsewhere] }, 404, 'not_found', [elsewhere]);
    }
    // A counter item is not a drink either.
    const croissantOrder = await place('Nerys Holloway', [{ menuItemId: ids.item('Butter croissant') }, { menuItemId: ids.item('Espresso') }]);
    const croissant = (await server.db('order_items').where({ order_id: croissantOrder, station: 'counter' }).first()).id;
    const [espresso] = await drinkIdsOf(croissantOrder);
    await expectRefused(barista, '/api/drinks/bump', { drinkIds: [espresso, croissant] }, 404, 'not_found', [espresso, croissant]);

    expect(await drinkRow(flatWhite)).toMatchObject({ status: 'queued', started_at: null, done_at: null });
    expect(await drinkRow(elsewhere)).toMatchObject({ status: 'queued', started_at: null, done_at: null });
  });

  it('a drink already done in the list is 409 and the others stay as they were (all or nothing)', async () => {
    const a = await place('Osric Pennant', [{ menuItemId: ids.item('Latte') }, { menuItemId: ids.item('Cappuccino') }]);
    const b = await place('Petra Linwood', [{ menuItemId: ids.item('Long black') }]);
    const [latte, cappuccino] = await drinkIdsOf(a);
    const [longBlack] = await drinkIdsOf(b);
    tick();
    await expectCommand(barista, `/api/drinks/${cappuccino}/start`, 'drink.started', baristaId);
    tick();
    await expectCommand(barista, `/api/drinks/${latte}/bump`, 'drink.bumped', baristaId);

    tick();
    await expectRefused(barista, '/api/drinks/bump', { drinkIds: [cappuccino, longBlack, latte] }, 409, 'conflict', [latte, cappuccino, longBlack]);
    await expectRefused(barista, '/api/drinks/start', { drinkIds: [longBlack, latte] }, 409, 'conflict', [latte, longBlack]);
    expect(await drinkRow(cappuccino)).toMatchObject({ status: 'making', done_at: null, done_by: null, bump_seq: null });
    expect(await drinkRow(longBlack)).toMatchObject({ status: 'queued', started_at: null, done_at: null, bump_seq: null });
    expect(await orderRow(a)).toMatchObject({ status: 'open', ready_at: null });
    expect(await orderRow(b)).toMatchObject({ status: 'open', ready_at: null });
  });

  it('refuses a list naming a drink twice or none (400), and a cashier (403)', async () => {
    const order = await place('Quentin Ashby', [{ menuItemId: ids.item('Espresso') }, { menuItemId: ids.item('Latte') }]);
    const [espresso, latte] = await drinkIdsOf(order);
    for (const path of ['/api/drinks/start', '/api/drinks/bump']) {
      const twice = await expectRefused(barista, path, { drinkIds: [espresso, latte, espresso] }, 400, 'validation_failed', [espresso, latte]);
      expect(twice.details).toEqual([{ path: 'drinkIds', message: expect.any(String) }]);
      const none = await expectRefused(barista, path, { drinkIds: [] }, 400, 'validation_failed', [espresso, latte]);
      expect(none.details).toEqual([{ path: 'drinkIds', message: expect.any(String) }]);
      await expectRefused(barista, path, {}, 400, 'validation_failed', [espresso, latte]);
      await expectRefused(cashier, path, { drinkIds: [espresso] }, 403, 'forbidden', [espresso, latte]);
    }
  });

  it('two baristas bumping overlapping batches at once: one 200, one 409, each drink done once', async () => {
    // Each ticket keeps a drink outside both batches, so both stay open whichever batch wins and
    // the loser is refused for the drink already bumped, not for a ticket gone ready.
    const a = await place('Rosalind Thorne', [{ menuItemId: ids.item('Latte') }, { menuItemId: ids.item('Flat white') }, { menuItemId: ids.item('Espresso') }]);
    const b = await place('Silas Merrow', [{ menuItemId: ids.item('Cappuccino') }, { menuItemId: ids.item('Long black') }]);
    const [x, y, aRest] = await drinkIdsOf(a);
    const [z, bRest] = await drinkIdsOf(b);
    tick();
    const since = await maxEventId();
    // Both batches name y.
    const [one, two] = await Promise.all([
      barista.post('/api/drinks/bump').send({ drinkIds: [x, y] }),
      barista2.post('/api/drinks/bump').send({ drinkIds: [y, z] }),
    ]);

    expect([one.status, two.status].sort()).toEqual([200, 409]);
    const firstWon = one.status === 200;
    const [winner, loser] = firstWon ? [one, two] : [two, one];
    expect(loser.body.error).toMatchObject({ code: 'conflict', message: expect.stringMatching(/already bumped/) });
    const [winnerId, won, lost] = firstWon ? [baristaId, [x, y], z] : [barista2Id, [y, z], x];

    for (const id of won) expect(await drinkRow(id)).toMatchObject({ status: 'done', done_by: winnerId, done_at: nowIso() });
    // The loser's other drink was not touched.
    for (const id of [lost, aRest, bRest]) expect(await drinkRow(id)).toMatchObject({ status: 'queued', started_at: null, done_at: null, done_by: null });
    expect(await orderRow(a)).toMatchObject({ status: 'open' });
    expect(await orderRow(b)).toMatchObject({ status: 'open' });

    const events = await eventsAfter(since);
    const expectedTickets = firstWon ? [a] : [a, b];
    expect(events.map((e) => e.type)).toEqual(expectedTickets.map(() => 'drink.bumped'));
    expect(events.every((e) => e.actor_id === winnerId)).toBe(true);
    expect(events.map((e) => jsonOf(e.payload).ticket.id).sort()).toEqual([...expectedTickets].sort());
    expect((winner.body.tickets as TicketView[]).map((t) => t.id).sort()).toEqual([...expectedTickets].sort());
  });

  it("a recall after a batch bump undoes that ticket's drinks from the batch, not the other ticket's", async () => {
    const a = await place('Tamsin Oakley', [{ menuItemId: ids.item('Latte') }, { menuItemId: ids.item('Mocha') }]);
    const b = await place('Ulric Penhale', [{ menuItemId: ids.item('Chai latte') }]);
    const [latte, mocha] = await drinkIdsOf(a);
    const [chai] = await drinkIdsOf(b);
    tick();
    await expectBatch(barista, '/api/drinks/bump', [latte, mocha, chai], 'drink.bumped', baristaId, [a, b]);
    const bumpedAt = nowIso();
    expect(await orderRow(a)).toMatchObject({ status: 'ready', ready_at: bumpedAt });
    expect(await orderRow(b)).toMatchObject({ status: 'ready', ready_at: bumpedAt });

    tick();
    const recalled = await expectCommand(barista, `/api/tickets/${a}/recall`, 'ticket.recalled', baristaId);
    expect(recalled).toMatchObject({ status: 'open', readyAt: null });
    expect(recalled.drinks.map((d) => [d.id, d.status, d.doneAt])).toEqual([
      [latte, 'making', null],
      [mocha, 'making', null],
    ]);
    // B, bumped by the same command, is still done and ready.
    expect(await orderRow(b)).toMatchObject({ status: 'ready', ready_at: bumpedAt });
    expect(await drinkRow(chai)).toMatchObject({ status: 'done', done_at: bumpedAt, done_by: baristaId });
    // Nothing older on A to recall.
    tick();
    await expectRefused(barista, `/api/tickets/${a}/recall`, undefined, 409, 'conflict', [latte, mocha]);
  });
});

/** A second café with one bar drink on an open ticket, inserted straight into the database. */
async function insertOtherCafeDrink(): Promise<number> {
  const db = server.db;
  const at = nowIso();
  const [{ id: locationId }] = await db('locations')
    .insert({
      name: 'North Quay Espresso',
      group_id: await groupOfItsOwn(db, 'North Quay Espresso', at),
      time_zone: 'Europe/London',
      currency: 'GBP',
      locale: 'en-GB',
      tax_mode: 'inclusive',
      tax_rate_milli_pct: 20000,
      created_at: at,
    })
    .returning('id');
  const [{ id: categoryId }] = await db('menu_categories').insert({ location_id: locationId, name: 'Coffee' }).returning('id');
  const [{ id: itemId }] = await db('menu_items')
    .insert({ category_id: categoryId, name: 'Cortado', station: 'bar', price_cents: 350, shots: 2 })
    .returning('id');
  const [{ id: orderId }] = await db('orders')
    .insert({
      location_id: locationId,
      client_order_id: 'b0a7c2d4-7d1e-4a59-9a43-0f2c4f8e1a11',
      business_date: '2026-03-02',
      number: 1,
      customer_name: 'Wren Calloway',
      status: 'open',
      payment_status: 'paid',
      subtotal_cents: 350,
      tax_cents: 0,
      total_cents: 350,
      payment_method: 'cash',
      created_at: at,
      fired_at: at,
    })
    .returning('id');
  const [{ id: drinkId }] = await db('order_items')
    .insert({
      order_id: orderId,
      menu_item_id: itemId,
      line_no: 1,
      item_name: 'Cortado',
      station: 'bar',
      shots: 2,
      price_cents: 350,
      dose_dg: 190,
      status: 'queued',
    })
    .returning('id');
  return drinkId;
}

describe('allergies', () => {
  it('an allergy drink is not bumped until a barista acknowledges it; who and when is kept', async () => {
    const order = await place('Viola Brandt', [{ menuItemId: ids.item('Latte') }, { menuItemId: ids.item('Espresso') }], { allergens: ['peanuts'] });
    const plain = await place('Wystan Ferrier', [{ menuItemId: ids.item('Long black') }]);
    const [latte, espresso] = await drinkIdsOf(order);
    const [longBlack] = await drinkIdsOf(plain);
    const watch = [latte, espresso, longBlack];

    tick();
    const single = await expectRefused(barista, `/api/drinks/${latte}/bump`, undefined, 409, 'conflict', watch);
    expect(single.details).toEqual({ drinkId: latte });
    const ticketBump = await expectRefused(barista, `/api/tickets/${order}/bump`, undefined, 409, 'conflict', watch);
    expect([latte, espresso]).toContain(ticketBump.details?.drinkId);
    const batch = await expectRefused(barista, '/api/drinks/bump', { drinkIds: [longBlack, latte] }, 409, 'conflict', watch);
    expect(batch.details).toEqual({ drinkId: latte });
    expect(await drinkRow(longBlack)).toMatchObject({ status: 'queued', done_at: null });

    // Only bar staff acknowledge; a drink that doesn't exist is 404.
    await expectRefused(cashier, `/api/drinks/${latte}/acknowledge-allergy`, undefined, 403, 'forbidden', watch);
    await expectRefused(barista, '/api/drinks/999999/acknowledge-allergy', undefined, 404, 'not_found', watch);

    tick();
    const ackAt = nowIso();
    const acked = await expectCommand(barista, `/api/drinks/${latte}/acknowledge-allergy`, 'drink.allergy_acknowledged', baristaId);
    expect(acked.drinks.find((d) => d.id === latte)).toMatchObject({ allergyAckAt: ackAt, allergyAckBy: 'Jonah Reyes', status: 'queued' });
    // The acknowledgement is per drink: the espresso is still unread.
    expect(acked.drinks.find((d) => d.id === espresso)).toMatchObject({ allergyAckAt: null, allergyAckBy: null });
    const shown = (await openTickets()).find((t) => t.id === order)!;
    expect(shown.drinks.find((d) => d.id === latte)).toMatchObject({ allergyAckAt: ackAt, allergyAckBy: 'Jonah Reyes' });
    expect(await drinkRow(latte)).toMatchObject({ allergy_ack_at: ackAt, allergy_ack_by: baristaId });

    tick();
    await expectRefused(barista, `/api/drinks/${latte}/acknowledge-allergy`, undefined, 409, 'conflict', watch);
    await expectRefused(barista2, `/api/drinks/${latte}/acknowledge-allergy`, undefined, 409, 'conflict', watch);
    await expectRefused(barista, `/api/drinks/${longBlack}/acknowledge-allergy`, undefined, 409, 'conflict', watch);
    expect(await drinkRow(latte)).toMatchObject({ allergy_ack_at: ackAt, allergy_ack_by: baristaId });

    // The ticket bump still stops at the espresso.
    const stillUnread = await expectRefused(barista, `/api/tickets/${order}/bump`, undefined, 409, 'conflict', watch);
    expect(stillUnread.details).toEqual({ drinkId: espresso });

    tick();
    const bumped = await expectCommand(barista, `/api/drinks/${latte}/bump`, 'drink.bumped', baristaId);
    expect(bumped.drinks.map((d) => [d.id, d.status])).toEqual([
      [latte, 'done'],
      [espresso, 'queued'],
    ]);

    tick();
    await expectCommand(barista2, `/api/drinks/${espresso}/acknowledge-allergy`, 'drink.allergy_acknowledged', barista2Id);
    const espressoView = (await openTickets()).find((t) => t.id === order)!.drinks.find((d) => d.id === espresso);
    expect(espressoView).toMatchObject({ allergyAckAt: nowIso(), allergyAckBy: 'Ines Calder' });
    tick();
    const ready = await expectCommand(barista, `/api/tickets/${order}/bump`, 'ticket.bumped', baristaId);
    expect(ready).toMatchObject({ status: 'ready', readyAt: nowIso() });
  });

  it("an allergy in the customer's own words counts too", async () => {
    const order = await place('Xanthe Corliss', [{ menuItemId: ids.item('Flat white') }], { allergyNote: 'no nuts please' });
    const other = await place('Yorick Dale', [{ menuItemId: ids.item('Espresso') }]);
    const [flatWhite] = await drinkIdsOf(order);
    const [espresso] = await drinkIdsOf(other);
    const watch = [flatWhite, espresso];

    tick();
    expect((await expectRefused(barista, `/api/drinks/${flatWhite}/bump`, undefined, 409, 'conflict', watch)).details).toEqual({ drinkId: flatWhite });
    expect((await expectRefused(barista, `/api/tickets/${order}/bump`, undefined, 409, 'conflict', watch)).details).toEqual({ drinkId: flatWhite });
    const batch = await expectRefused(barista, '/api/drinks/bump', { drinkIds: [espresso, flatWhite] }, 409, 'conflict', watch);
    expect(batch.details).toEqual({ drinkId: flatWhite });

    // Starting is allowed before the read: only the bump is held back.
    await expectBatch(barista, '/api/drinks/start', [flatWhite], 'drink.started', baristaId, [order]);

    tick();
    const acked = await expectCommand(barista, `/api/drinks/${flatWhite}/acknowledge-allergy`, 'drink.allergy_acknowledged', baristaId);
    expect(acked).toMatchObject({ allergens: [], allergyNote: 'no nuts please' });
    expect(acked.drinks[0]).toMatchObject({ allergyAckAt: nowIso(), allergyAckBy: 'Jonah Reyes' });

    tick();
    const { tickets: bumped } = await expectBatch(barista, '/api/drinks/bump', [espresso, flatWhite], 'drink.bumped', baristaId, [order, other]);
    expect(bumped.get(order)).toMatchObject({ status: 'ready' });
    expect(bumped.get(other)).toMatchObject({ status: 'ready' });
  });
});

describe('POST /api/tickets/:id/rush', () => {
  it('a lead rushes a ticket once; a barista may not', async () => {
    const order = await place('Zinnia Hartwell', [{ menuItemId: ids.item('Espresso') }]);
    const [espresso] = await drinkIdsOf(order);
    tick();
    await expectRefused(barista, `/api/tickets/${order}/rush`, undefined, 403, 'forbidden', [espresso]);
    expect(await orderRow(order)).toMatchObject({ rushed_at: null });

    tick();
    const rushed = await expectCommand(lead, `/api/tickets/${order}/rush`, 'ticket.rushed', leadId);
    expect(rushed).toMatchObject({ id: order, status: 'open', rushedAt: nowIso() });
    expect(await orderRow(order)).toMatchObject({ rushed_at: nowIso() });
    const rushedAt = nowIso();

    tick();
    await expectRefused(lead, `/api/tickets/${order}/rush`, undefined, 409, 'conflict', [espresso]);
    expect(await orderRow(order)).toMatchObject({ rushed_at: rushedAt });
    await expectRefused(lead, '/api/tickets/999999/rush', undefined, 404, 'not_found');
  });

  it('a rushed newer ticket goes first in its lane and leads the jug plan', async () => {
    await clearBar();
    const older = await place('Ambrose Tell', [{ menuItemId: ids.item('Latte'), sizeId: ids.size('Latte', 'Small'), milkId: ids.milk('Oat') }]);
    tick();
    const newer = await place('Bettany Crewe', [
      { menuItemId: ids.item('Latte'), sizeId: ids.size('Latte', 'Small'), milkId: ids.milk('Oat') },
      { menuItemId: ids.item('Espresso') },
    ]);
    const [oldLatte] = await drinkIdsOf(older);
    const [newLatte, newEspresso] = await drinkIdsOf(newer);

    // Two small oat lattes: 180 + 180 + 15 = 375 ml ≤ 520 → one jug, in the 950 ml pitcher
    // (330 is too small; 375 ≥ 320, 375 × 1.25 ≤ 950), poured oldest first as both are silky.
    const before = laneOf((await barLanes()).lanes, 'Oat');
    expect(laneIds(before)).toEqual([oldLatte, newLatte]);
    expect(before.jugPlan).toEqual([plannedJug(BIG_PITCHER, 375, 15, 'silky', [oldLatte, newLatte])]);

    tick();
    await expectCommand(lead, `/api/tickets/${newer}/rush`, 'ticket.rushed', leadId);
    const after = await barLanes();
    const oat = laneOf(after.lanes, 'Oat');
    expect(laneIds(oat)).toEqual([newLatte, oldLatte]);
    expect(oat.drinks[0]).toMatchObject({ id: newLatte, rushedAt: nowIso() });
    expect(oat.jugPlan).toEqual([plannedJug(BIG_PITCHER, 375, 15, 'silky', [newLatte, oldLatte])]);
    // The rush holds in every lane the ticket has drinks in.
    expect(laneIds(after.lanes.find((l) => l.key === 'none')!)).toEqual([newEspresso]);

    // A rushed ticket that is made is off the bar; rushing a ready ticket is refused.
    tick();
    await expectCommand(barista, `/api/tickets/${older}/bump`, 'ticket.bumped', baristaId);
    expect(await orderRow(older)).toMatchObject({ status: 'ready' });
    await expectRefused(lead, `/api/tickets/${older}/rush`, undefined, 409, 'conflict', [oldLatte]);
    expect(await orderRow(older)).toMatchObject({ rushed_at: null });
  });
});

describe('POST /api/tickets/:id/collect', () => {
  it('hands a ready ticket over once: it leaves the Pickup board and can no longer be recalled', async () => {
    const order = await place('Cosmo Ridley', [{ menuItemId: ids.item('Cappuccino') }]);
    const [cappuccino] = await drinkIdsOf(order);
    tick();
    await expectRefused(cashier, `/api/tickets/${order}/collect`, undefined, 409, 'conflict', [cappuccino]);
    expect(await orderRow(order)).toMatchObject({ status: 'open', collected_at: null });

    tick();
    await expectCommand(barista, `/api/tickets/${order}/bump`, 'ticket.bumped', baristaId);
    const pickup = await cashier.get('/api/pickup');
    expect(pickup.body.tickets.map((t: PickupTicket) => t.id)).toContain(order);

    tick();
    const collected = await expectCommand(cashier, `/api/tickets/${order}/collect`, 'ticket.collected', cashierId);
    expect(collected).toMatchObject({ id: order, status: 'collected', collectedAt: nowIso() });
    expect(await orderRow(order)).toMatchObject({ status: 'collected', collected_at: nowIso() });
    const collectedAt = nowIso();

    const after = await cashier.get('/api/pickup');
    expect(after.status).toBe(200);
    expect(after.body.tickets.map((t: PickupTicket) => t.id)).not.toContain(order);
    expect((await barista.get('/api/tickets?view=board')).body.tickets.map((t: TicketView) => t.id)).not.toContain(order);

    tick();
    await expectRefused(cashier, `/api/tickets/${order}/collect`, undefined, 409, 'conflict', [cappuccino]);
    await expectRefused(barista, `/api/tickets/${order}/recall`, undefined, 409, 'conflict', [cappuccino]);
    expect(await orderRow(order)).toMatchObject({ status: 'collected', collected_at: collectedAt });
    expect(await drinkRow(cappuccino)).toMatchObject({ status: 'done' });
    await expectRefused(cashier, '/api/tickets/999999/collect', undefined, 404, 'not_found');
  });
});

describe('drinks not on an open ticket', () => {
  it('a double bump lost to another screen says, in café words, that the drink was already bumped and by whom', async () => {
    // Two baristas press bump on the same card at once. The ticket's only drink: the winner's bump
    // makes it ready, so the loser's drink is no longer on an open ticket.
    const orderId = await place('Wren Halloway', [{ menuItemId: ids.item('Latte') }]);
    const [latte] = await drinkIdsOf(orderId);
    const number = (await orderRow(orderId)).number;
    tick();
    const both = await Promise.all([barista.post(`/api/drinks/${latte}/bump`), barista2.post(`/api/drinks/${latte}/bump`)]);
    expect(both.map((r) => r.status).sort()).toEqual([200, 409]);
    const lost = both.find((r) => r.status === 409)!;
    const winner = both[0].status === 200 ? 'Jonah' : 'Ines'; // barista is Jonah Reyes, barista2 Ines Calder
    expect(lost.body.error.message).toBe(`#${number} Wren was already bumped by ${winner}: it is done`);
    expect(lost.body.error.message).not.toMatch(/Drink \d+|open ticket/);
    // A ticket still at the bar: a drink bumped by someone else says so too.
    const two = await place('Yara Quill', [{ menuItemId: ids.item('Latte') }, { menuItemId: ids.item('Espresso') }]);
    const [twoLatte] = await drinkIdsOf(two);
    const twoNumber = (await orderRow(two)).number;
    tick();
    expect((await barista.post(`/api/drinks/${twoLatte}/bump`)).status).toBe(200);
    const again = await expectRefused(barista2, `/api/drinks/${twoLatte}/bump`, undefined, 409, 'conflict', [twoLatte]);
    expect(again.message).toBe(`The Latte for #${twoNumber} Yara was already bumped by Jonah`);
  });

  it("a voided order's drinks can't be started or bumped, nor its ticket bumped, rushed or collected (409)", async () => {
    const declined = await cashier.post('/api/orders').send({
      ...orderBody('Dorian Vale', [{ menuItemId: ids.item('Latte') }, { menuItemId: ids.item('Espresso') }]),
      allergens: ['peanuts'],
      payment: { method: 'card', paymentMethod: 'pm_card_chargeDeclined' },
    });
    expect(declined.status, JSON.stringify(declined.body)).toBe(402);
    const orderId: number = declined.body.error.details.orderId;
    const [latte, espresso] = await drinkIdsOf(orderId);
    expect(await orderRow(orderId)).toMatchObject({ status: 'pending', payment_status: 'unpaid' });

    // Waiting for its payment, it isn't at the bar yet.
    tick();
    await expectRefused(barista, `/api/drinks/${latte}/bump`, undefined, 409, 'conflict', [latte, espresso]);

    const voided = await lead.post(`/api/orders/${orderId}/void`).send({ reason: 'Card declined, customer left' });
    expect(voided.status, JSON.stringify(voided.body)).toBe(200);
    expect(voided.body.order).toMatchObject({ status: 'void' });

    tick();
    const watch = [latte, espresso];
    const bump = await expectRefused(barista, `/api/drinks/${latte}/bump`, undefined, 409, 'conflict', watch);
    expect(bump.message).toMatch(/^#\d+ Dorian was voided: it is not on the bar$/);
    await expectRefused(barista, `/api/drinks/${latte}/start`, undefined, 409, 'conflict', watch);
    await expectRefused(barista, '/api/drinks/bump', { drinkIds: [latte, espresso] }, 409, 'conflict', watch);
    await expectRefused(barista, '/api/drinks/start', { drinkIds: [espresso] }, 409, 'conflict', watch);
    await expectRefused(barista, `/api/tickets/${orderId}/bump`, undefined, 409, 'conflict', watch);
    await expectRefused(lead, `/api/tickets/${orderId}/rush`, undefined, 409, 'conflict', watch);
    await expectRefused(barista, `/api/tickets/${orderId}/recall`, undefined, 409, 'conflict', watch);
    await expectRefused(cashier, `/api/tickets/${orderId}/collect`, undefined, 409, 'conflict', watch);
    for (const id of watch) expect(await drinkRow(id)).toMatchObject({ status: 'queued', started_at: null, done_at: null });
    expect(await orderRow(orderId)).toMatchObject({ status: 'void', ready_at: null });

    // Nor is it in the bar's plan.
    const planned = (await barLanes()).lanes.flatMap((l) => l.drinks.map((d) => d.id));
    expect(planned).not.toContain(latte);
    expect(planned).not.toContain(espresso);
  });
});
