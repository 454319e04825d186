// Started jugs over HTTP: POST /api/jugs ("Start jug": these drinks become one stored jug with its
// pour) and POST /api/jugs/:id/bump ("Bump jug": exactly the drinks the screen showed, or 409).
// A started jug never gains a newer drink; a bump of a jug whose drinks changed is refused; a
// recall puts a drink back into the jug it was steamed in. Every command is one transaction: a
// refused one changes no row and appends no event; screens firing at once get one winner.
//
// Numbers: the demo café's pitchers and rules (tests/api/bar-helpers.ts): cold milk to just below
// the base of the spout (the fill line; docs/check-values.md, common practice), a minimum fill of
// a third of the pitcher and growth of 15/25/75 % by texture (common practice, from memory).
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { BoardSnapshot } from '@/domain/types';
import { demoMenu, manualClock, startTestServer, type TestServer } from '../support/test-server';
import { groupOfItsOwn } from '../support/cafe-groups';
import { BIG_PITCHER, barTools, laneOf, MID_PITCHER, plannedJug, SMALL_PITCHER } from './bar-helpers';
import type { Agent } from './helpers';

const time = manualClock('2026-03-02T15:00:00.000Z');
const nowIso = () => time.clock().toISOString();
const tick = (ms = 1000) => time.advance(ms);

let server: TestServer;
let cashier: Agent;
let barista: Agent;
let barista2: Agent;
let owner: Agent;
let ids: Awaited<ReturnType<typeof demoMenu>>;
let baristaId: number;
let barista2Id: number;

beforeAll(async () => {
  server = await startTestServer({ clock: time.clock });
  [cashier, barista, barista2, owner] = [
    await server.signIn('cashier'),
    await server.signIn('barista'),
    await server.signIn('barista2'),
    await server.signIn('owner'),
  ];
  ids = await demoMenu(server);
  const userId = async (username: string) => (await server.db('users').where({ username }).first()).id as number;
  [baristaId, barista2Id] = [await userId('barista'), await userId('barista2')];
});
afterAll(() => server.close());

const { place, drinkIdsOf, drinkRow, orderRow, maxEventId, eventsAfter, expectRefused, expectCommand, expectBatch, clearBar, barLanes } = barTools({
  server: () => server,
  cashier: () => cashier,
  barista: () => barista,
  nowIso,
});

const whole = (item: string, size?: string) => ({ menuItemId: ids.item(item), milkId: ids.milk('Whole'), sizeId: size ? ids.size(item, size) : undefined });
/** One ticket per drink, a second apart, so their ages differ. */
async function tickets(...lines: ReturnType<typeof whole>[]) {
  const out: number[] = [];
  for (const [i, line] of lines.entries()) {
    tick();
    out.push((await drinkIdsOf(await place(`Guest ${i + 1}`, [line])))[0]);
  }
  return out;
}
/** "Start jug": 201 { jugId, tickets } and one drink.started event per ticket. */
async function startJug(agent: Agent, drinkIds: number[], ticketIds: number[], actorId = baristaId) {
  tick();
  const { tickets: answered, body } = await expectBatch(agent, '/api/jugs', drinkIds, 'drink.started', actorId, ticketIds, {
    status: 201,
    keys: ['jugId', 'tickets'],
  });
  return { jugId: body.jugId as number, tickets: answered };
}
const bumpJug = (agent: Agent, jugId: number, drinkIds: number[], ticketIds: number[], actorId = baristaId) => {
  tick();
  return expectBatch(agent, `/api/jugs/${jugId}/bump`, drinkIds, 'drink.bumped', actorId, ticketIds);
};
const ticketOf = async (drinkId: number) => (await drinkRow(drinkId)).order_id as number;
const jugPlanOf = async () => laneOf((await barLanes()).lanes, 'Whole')?.jugPlan ?? [];
/** The started jug a drink is in, or null. */
const jugIdOf = async (drinkId: number): Promise<number | null> => (await server.db('jug_drinks').where({ order_item_id: drinkId }).first())?.jug_id ?? null;
const jugCount = async () => Number((await server.db('jugs').count({ n: '*' }).first())?.n);

describe('the reported sequence', () => {
  it('a started jug keeps its flat white when a cappuccino arrives, and "Bump jug" bumps only it', async () => {
    const [flatWhite] = await tickets(whole('Flat white'));
    const fwTicket = await ticketOf(flatWhite);
    // Flat white: 120 ml + 15 waste = 135 ≤ 190, ≥ 120, 135 × 1.15 = 155.25 ≤ 350 → 350 ml pitcher.
    const shown = plannedJug(SMALL_PITCHER, 135, 15, 'flat', [flatWhite]);
    expect(await jugPlanOf()).toEqual([shown]);

    const { jugId, tickets: started } = await startJug(barista, [flatWhite], [fwTicket]);
    const pour = { pitcher: SMALL_PITCHER, coldMl: 135, wasteMl: 15, steamFor: 'flat', fits: true };
    expect(started.get(fwTicket)!.drinks[0]).toMatchObject({ status: 'making', startedAt: nowIso(), startedBy: 'Jonah Reyes', jug: { id: jugId, ...pour } });
    expect(await server.db('jugs').where({ id: jugId }).first()).toMatchObject({
      capacity_ml: 350,
      fill_line_ml: 190,
      min_fill_ml: 120,
      cold_ml: 135,
      waste_ml: 15,
      steam_for: 'flat',
      started_at: nowIso(),
      started_by: baristaId,
    });
    expect(await drinkRow(flatWhite)).toMatchObject({ status: 'making', started_by: baristaId });
    expect(await jugIdOf(flatWhite)).toBe(jugId);

    // A cappuccino arrives: 210 + 15 = 225 > 190; ≥ 200, ≤ 330, 225 × 1.75 = 393.75 ≤ 600 → 600 ml.
    const [cappuccino] = await tickets(whole('Cappuccino'));
    expect(await jugPlanOf()).toEqual([{ ...shown, jugId }, plannedJug(MID_PITCHER, 225, 15, 'foamy', [cappuccino])]);

    await bumpJug(barista, jugId, [flatWhite], [fwTicket]);
    expect(await drinkRow(flatWhite)).toMatchObject({ status: 'done', done_by: baristaId });
    expect(await drinkRow(cappuccino)).toMatchObject({ status: 'queued', started_at: null, done_at: null });
    expect(await jugIdOf(cappuccino)).toBeNull();
    expect(await orderRow(fwTicket)).toMatchObject({ status: 'ready' });
    expect((await jugPlanOf()).map((j) => [j.jugId, j.drinkIds])).toEqual([[null, [cappuccino]]]);
  });
});

describe('POST /api/jugs', () => {
  it('refuses drinks that cannot be one jug, and changes nothing', async () => {
    await clearBar();
    const [latte, bigLatte1, bigLatte2] = await tickets(whole('Latte'), whole('Latte', 'Large'), whole('Latte', 'Large'));
    tick();
    const mixed = await place('Ines Oduya', [{ menuItemId: ids.item('Espresso') }, { menuItemId: ids.item('Latte'), milkId: ids.milk('Oat') }]);
    const [espresso, oatLatte] = await drinkIdsOf(mixed);
    const watch = [latte, bigLatte1, bigLatte2, espresso, oatLatte];
    const refused = (drinkIds: number[], status = 409, code = 'conflict', agent = barista) =>
      expectRefused(agent, '/api/jugs', { drinkIds }, status, code, watch);

    expect((await refused([latte, espresso])).details).toEqual({ drinkId: espresso }); // no steamed milk
    expect((await refused([latte, oatLatte])).details).toEqual({ drinkId: oatLatte }); // one milk a jug
    // 360 + 360 + 15 = 735 ml > 520, the largest fill line.
    expect((await refused([bigLatte1, bigLatte2])).message).toMatch(/more milk than any pitcher/i);
    await refused([latte, 999_999], 404, 'not_found');
    await refused([latte, latte], 400, 'validation_failed');
    await refused([], 400, 'validation_failed');
    await refused([latte], 403, 'forbidden', cashier);
    expect(await jugCount()).toBe(1);

    // Started once; then neither it nor a list holding it starts again.
    const { jugId } = await startJug(barista, [latte], [await ticketOf(latte)]);
    expect((await refused([latte])).details).toEqual({ drinkId: latte });
    expect((await refused([bigLatte1, latte])).details).toEqual({ drinkId: latte });
    expect(await jugIdOf(latte)).toBe(jugId);
    expect(await drinkRow(bigLatte1)).toMatchObject({ status: 'queued' });
    expect(await jugIdOf(bigLatte1)).toBeNull();
  });

  it("follows the café's settings: drinks per jug, a pitcher's minimum fill, growth by texture", async () => {
    await clearBar();
    const pitchers = (await owner.get('/api/settings').expect(200)).body.pitchers as { id: number; capacityMl: number }[];
    const small = pitchers.find((p) => p.capacityMl === 350)!;
    await owner.put('/api/settings').send({ jugMaxDrinks: 2, expansionFoamyPct: 150 }).expect(200);
    await owner.put(`/api/settings/pitchers/${small.id}`).send({ capacityMl: 350, fillLineMl: 190, minFillMl: 150 }).expect(200);
    try {
      const [a, b, c] = await tickets(whole('Flat white'), whole('Flat white'), whole('Flat white'));
      tick();
      const [cap] = await drinkIdsOf(
        await place('Oona Vell', [{ menuItemId: ids.item('Cappuccino'), sizeId: ids.size('Cappuccino', 'Small'), milkId: ids.milk('Oat') }]),
      );
      const { lanes } = await barLanes();
      const summary = (milk: string) => laneOf(lanes, milk).jugPlan.map((j) => [j.drinkIds, j.pitcher.capacityMl, j.coldMl, j.wasteMl]);
      // At most 2 a jug: 120 + 120 + 15 = 255 > 190 → 600 ml (≥ 200). The third alone: 135 ml,
      // filled to the 350 ml pitcher's new minimum 150 (waste 30).
      expect(summary('Whole')).toEqual([
        [[a, b], 600, 255, 15],
        [[c], 350, 150, 30],
      ]);
      // The small oat cappuccino: 140 + 15 = 155 ≤ 190, but with foamy growth of 150 % 155 × 2.5 =
      // 387.5 > 350 → the 600 ml pitcher at its minimum 200 (200 × 2.5 = 500 ≤ 600), waste 60.
      expect(summary('Oat')).toEqual([[[cap], 600, 200, 60]]);
      await expectRefused(barista, '/api/jugs', { drinkIds: [a, b, c] }, 409, 'conflict', [a, b, c]);
    } finally {
      await owner.put('/api/settings').send({ jugMaxDrinks: 4, expansionFoamyPct: 75 }).expect(200);
      await owner.put(`/api/settings/pitchers/${small.id}`).send({ capacityMl: 350, fillLineMl: 190, minFillMl: 120 }).expect(200);
    }
  });

  it('two bar screens starting the same jug at once: one 201, the others 409, one jug stored', async () => {
    await clearBar();
    const [a, b, c] = await tickets(whole('Flat white'), whole('Flat white'), whole('Flat white'));
    const jugsBefore = await jugCount();
    const since = await maxEventId();
    tick();
    // Eight requests, each naming two of the three drinks: any two overlap, so one wins.
    const pairs = [
      [a, b],
      [b, c],
      [a, c],
      [a, b],
      [b, c],
      [a, c],
      [a, b],
      [b, c],
    ];
    const answers = await Promise.all(pairs.map((drinkIds, i) => (i % 2 ? barista2 : barista).post('/api/jugs').send({ drinkIds })));
    expect(answers.map((r) => r.status).sort()).toEqual([201, 409, 409, 409, 409, 409, 409, 409]);
    const won = answers.findIndex((r) => r.status === 201);
    for (const r of answers.filter((x) => x.status === 409)) expect(r.body.error.code).toBe('conflict');
    expect(await jugCount()).toBe(jugsBefore + 1);
    const jugId = answers[won].body.jugId;
    const winner = pairs[won];
    for (const id of [a, b, c]) {
      expect(await drinkRow(id)).toMatchObject({ status: winner.includes(id) ? 'making' : 'queued' });
      expect(await jugIdOf(id)).toBe(winner.includes(id) ? jugId : null);
    }
    expect((await eventsAfter(since)).map((e) => e.type)).toEqual(['drink.started', 'drink.started']);
    expect((await eventsAfter(since)).every((e) => e.actor_id === (won % 2 ? barista2Id : baristaId))).toBe(true);
  });

  it('"Start" on one milk drink starts a jug of its own; on an espresso, none', async () => {
    await clearBar();
    tick();
    const order = await place('Pia Lund', [whole('Latte'), { menuItemId: ids.item('Espresso') }]);
    const [latte, espresso] = await drinkIdsOf(order);
    tick();
    const ticket = await expectCommand(barista, `/api/drinks/${latte}/start`, 'drink.started', baristaId);
    // 270 + 15 = 285 > 190; ≤ 330, ≥ 200, 285 × 1.25 = 356.25 ≤ 600 → 600 ml pitcher.
    const jug = ticket.drinks[0].jug!;
    expect(jug).toEqual({ id: expect.any(Number), pitcher: MID_PITCHER, coldMl: 285, wasteMl: 15, steamFor: 'silky', fits: true });
    tick();
    const after = await expectCommand(barista, `/api/drinks/${espresso}/start`, 'drink.started', baristaId);
    expect(after.drinks[1]).toMatchObject({ status: 'making', jug: null });
    expect((await jugPlanOf()).map((j) => [j.jugId, j.drinkIds])).toEqual([[jug.id, [latte]]]);
  });
});

describe('POST /api/jugs/:id/bump', () => {
  it('refuses a jug whose drinks changed since the screen drew it, an unknown jug, and another café’s', async () => {
    await clearBar();
    const [flatWhite, latte] = await tickets(whole('Flat white'), whole('Latte', 'Small'));
    const [fwTicket, latteTicket] = [await ticketOf(flatWhite), await ticketOf(latte)];
    // 120 + 180 + 15 = 315 > 190; ≤ 330, ≥ 200, 315 × 1.25 = 393.75 ≤ 600 → 600 ml pitcher.
    const { jugId } = await startJug(barista, [flatWhite, latte], [fwTicket, latteTicket]);
    expect((await jugPlanOf())[0]).toMatchObject({ jugId, pitcher: MID_PITCHER, coldMl: 315, drinkIds: [flatWhite, latte] });

    // Another screen bumps the flat white on its own.
    tick();
    await expectCommand(barista2, `/api/drinks/${flatWhite}/bump`, 'drink.bumped', barista2Id);
    const watch = [flatWhite, latte];
    const path = `/api/jugs/${jugId}/bump`;
    const stale = await expectRefused(barista, path, { drinkIds: [flatWhite, latte] }, 409, 'conflict', watch);
    expect(stale.details).toEqual({ jugId, drinkIds: [latte] });
    await expectRefused(barista, path, { drinkIds: [latte, 999_999] }, 409, 'conflict', watch);
    await expectRefused(barista, path, { drinkIds: [] }, 400, 'validation_failed', watch);
    await expectRefused(cashier, path, { drinkIds: [latte] }, 403, 'forbidden', watch);
    await expectRefused(barista, '/api/jugs/999999/bump', { drinkIds: [latte] }, 404, 'not_found', watch);
    const [{ id: otherCafe }] = await server
      .db('locations')
      .insert({ name: 'Quayside Roasters', created_at: nowIso(), group_id: await groupOfItsOwn(server.db, 'Quayside Roasters', nowIso()) })
      .returning('id');
    const [{ id: theirJug }] = await server
      .db('jugs')
      .insert({
        location_id: otherCafe,
        capacity_ml: 600,
        fill_line_ml: 330,
        min_fill_ml: 200,
        cold_ml: 200,
        waste_ml: 15,
        steam_for: 'flat',
        fits: true,
        started_at: nowIso(),
      })
      .returning('id');
    await expectRefused(barista, `/api/jugs/${theirJug}/bump`, { drinkIds: [latte] }, 404, 'not_found', watch);

    // As the jug is now: the latte alone.
    await bumpJug(barista, jugId, [latte], [latteTicket]);
    expect(await drinkRow(latte)).toMatchObject({ status: 'done', done_by: baristaId });
    expect(await jugIdOf(latte)).toBe(jugId);
    expect((await expectRefused(barista, path, { drinkIds: [latte] }, 409, 'conflict', watch)).message).toMatch(/already bumped/);
  });

  it('many screens bumping one jug at once: one 200, the others 409, each drink done once', async () => {
    await clearBar();
    const [a, b] = await tickets(whole('Flat white'), whole('Flat white'));
    const ticketIds = [await ticketOf(a), await ticketOf(b)];
    const { jugId } = await startJug(barista, [a, b], ticketIds);
    const since = await maxEventId();
    tick();
    const answers = await Promise.all(
      Array.from({ length: 8 }, (_, i) => (i % 2 ? barista2 : barista).post(`/api/jugs/${jugId}/bump`).send({ drinkIds: [a, b] })),
    );
    expect(answers.map((r) => r.status).sort()).toEqual([200, 409, 409, 409, 409, 409, 409, 409]);
    const rows = [await drinkRow(a), await drinkRow(b)];
    expect(rows.map((r) => r.status)).toEqual(['done', 'done']);
    expect(rows[0].bump_seq).toBe(rows[1].bump_seq);
    expect((await eventsAfter(since)).map((e) => e.type)).toEqual(['drink.bumped', 'drink.bumped']);
    for (const id of ticketIds) expect(await orderRow(id)).toMatchObject({ status: 'ready' });
  });

  it('an allergy drink in a jug: the jug starts, but is bumped only once the allergy is read', async () => {
    await clearBar();
    tick();
    const order = await place('Ravi Stone', [whole('Flat white')], { allergens: ['peanuts'] });
    const [flatWhite] = await drinkIdsOf(order);
    const { jugId } = await startJug(barista, [flatWhite], [order]);
    const unread = await expectRefused(barista, `/api/jugs/${jugId}/bump`, { drinkIds: [flatWhite] }, 409, 'conflict', [flatWhite]);
    expect(unread.details).toEqual({ drinkId: flatWhite });
    tick();
    await expectCommand(barista, `/api/drinks/${flatWhite}/acknowledge-allergy`, 'drink.allergy_acknowledged', baristaId);
    await bumpJug(barista, jugId, [flatWhite], [order]);
  });
});

describe('a recall', () => {
  it('puts a drink back into the jug it was steamed in, which then bumps with it', async () => {
    await clearBar();
    const [a, b] = await tickets(whole('Flat white'), whole('Flat white'));
    const [ta, tb] = [await ticketOf(a), await ticketOf(b)];
    // 120 + 120 + 15 = 255 > 190; ≤ 330, ≥ 200 → 600 ml pitcher.
    const { jugId } = await startJug(barista, [a, b], [ta, tb]);
    await bumpJug(barista, jugId, [a, b], [ta, tb]);
    expect(await jugPlanOf()).toEqual([]);

    // Ticket A's bump was a mistake: its flat white comes back made (being made), in its jug,
    // with the pour the jug was started with.
    tick();
    const recalled = await expectCommand(barista, `/api/tickets/${ta}/recall`, 'ticket.recalled', baristaId);
    expect(recalled.drinks[0]).toMatchObject({ status: 'making', jug: { id: jugId } });
    expect(await jugPlanOf()).toEqual([{ ...plannedJug(MID_PITCHER, 255, 15, 'flat', [a]), jugId }]);
    await expectRefused(barista, `/api/jugs/${jugId}/bump`, { drinkIds: [a, b] }, 409, 'conflict', [a, b]);
    await bumpJug(barista, jugId, [a], [ta]);
  });

  it('of a drink bumped out of a jug still on the bar puts it back among the others', async () => {
    await clearBar();
    const [c, d] = await tickets(whole('Flat white'), whole('Flat white'));
    const [tc, td] = [await ticketOf(c), await ticketOf(d)];
    const { jugId } = await startJug(barista, [c, d], [tc, td]);
    tick();
    await expectCommand(barista, `/api/drinks/${c}/bump`, 'drink.bumped', baristaId);
    tick();
    await expectCommand(barista, `/api/tickets/${tc}/recall`, 'ticket.recalled', baristaId);
    expect((await jugPlanOf()).map((j) => [j.jugId, j.drinkIds])).toEqual([[jugId, [c, d]]]);
    await expectRefused(barista, `/api/jugs/${jugId}/bump`, { drinkIds: [d] }, 409, 'conflict', [c, d]);
    await bumpJug(barista, jugId, [c, d], [tc, td]);
  });

  it('of a milk drink bumped straight from the queue brings it back made, in no jug', async () => {
    await clearBar();
    const [e, f] = await tickets(whole('Flat white'), whole('Latte', 'Large'));
    tick();
    await expectCommand(barista, `/api/drinks/${e}/bump`, 'drink.bumped', baristaId);
    tick();
    const back = await expectCommand(barista, `/api/tickets/${await ticketOf(e)}/recall`, 'ticket.recalled', baristaId);
    expect(back.drinks[0]).toMatchObject({ status: 'making', jug: null });
    // Only the queued large latte is planned: 360 + 15 = 375 > 330; ≤ 520, ≥ 320 → 950 ml.
    expect(await jugPlanOf()).toEqual([plannedJug(BIG_PITCHER, 375, 15, 'silky', [f])]);
  });
});

describe('what the board carries', () => {
  it("every drink carries its jug, so a live event alone redraws another screen's plan", async () => {
    await clearBar();
    const [g] = await tickets(whole('Flat white'));
    const { jugId } = await startJug(barista2, [g], [await ticketOf(g)], barista2Id);
    const board = (await barista.get('/api/tickets?view=board').expect(200)).body as BoardSnapshot;
    expect(board.tickets.flatMap((t) => t.drinks).find((x) => x.id === g)!.jug).toEqual({
      id: jugId,
      pitcher: SMALL_PITCHER,
      coldMl: 135,
      wasteMl: 15,
      steamFor: 'flat',
      fits: true,
    });
    expect(board.location.jugRules).toEqual({
      pitchers: [SMALL_PITCHER, MID_PITCHER, BIG_PITCHER],
      wasteMl: 15,
      maxDrinks: 4,
      expansionPct: { flat: 15, silky: 25, foamy: 75 },
    });
  });
});
