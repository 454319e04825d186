// The café group's report (GET /api/reports/group): one row per café of the owner's group, each
// exactly what that café's own range report says, the totals their sums, for the owner alone. A
// café of another group never shows. Orders are placed through the API by each café's own cashier
// and bumped by its own barista at known waits on the manual clock; both cafés take tips, and some
// customers leave one.
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { SECOND_CAFE_NAME, demoCafeId } from '@seeds/demo-cafe';
import type { GroupReportView } from '@/domain/group-report';
import type { ReportView } from '@/domain/reports';
import type { OrderView } from '@/domain/types';
import { groupOfItsOwn } from '../support/cafe-groups';
import { demoMenu, manualClock, startTestServer, type DemoLogin, type TestServer } from '../support/test-server';
import { orderBody, type Agent } from './helpers';

/** 09:00 in New York on DAY; both demo cafés keep New York time */
const DAY = '2026-03-02';
const T0 = '2026-03-02T14:00:00.000Z';
const time = manualClock(T0);
let server: TestServer;
let owner: Agent;
let home: number;
let ropewalk: number;
let outside: number;

const at = (seconds: number) => new Date(Date.parse(T0) + seconds * 1000).toISOString();

/** Cash orders of one Long black each at `cafe`, taken at T0 by its cashier (with the tip of the same place in `tips`), bumped by its barista after `waits` seconds. */
async function placeAt(
  cafe: number,
  cashierLogin: DemoLogin,
  baristaLogin: DemoLogin,
  names: string[],
  waits: number[],
  tips: number[] = [],
): Promise<OrderView[]> {
  const ids = await demoMenu(server, cafe);
  const [cashier, barista] = [await server.signIn(cashierLogin), await server.signIn(baristaLogin)];
  time.set(T0);
  const orders: OrderView[] = [];
  for (const [i, name] of names.entries()) {
    const body = orderBody(name, [{ menuItemId: ids.item('Long black'), sizeId: ids.size('Long black', 'Regular') }]);
    const res = await cashier.post('/api/orders').send(tips[i] ? { ...body, tipCents: tips[i] } : body);
    expect(res.status, JSON.stringify(res.body)).toBe(201);
    orders.push(res.body.order);
  }
  for (const [i, wait] of waits.entries()) {
    time.set(at(wait));
    const res = await barista.post(`/api/tickets/${orders[i].id}/bump`);
    expect(res.status, JSON.stringify(res.body)).toBe(200);
  }
  return orders;
}

let homeOrders: OrderView[];
let ropewalkOrders: OrderView[];

beforeAll(async () => {
  server = await startTestServer({ clock: time.clock });
  home = await demoCafeId(server.db);
  ropewalk = (await server.db('locations').where({ name: SECOND_CAFE_NAME }).first('id')).id;
  const created = '2026-03-01T00:00:00.000Z';
  [{ id: outside }] = await server
    .db('locations')
    .insert({ name: 'Saltmarsh Espresso', created_at: created, group_id: await groupOfItsOwn(server.db, 'Saltmarsh Espresso', created) })
    .returning('id');

  // the owner turns tips on at each café in turn (settings are the café in view's)
  const settingOwner = await server.signIn('owner');
  for (const cafe of [home, ropewalk]) {
    await settingOwner.post('/api/session/cafe').send({ locationId: cafe }).expect(200);
    const res = await settingOwner.put('/api/settings').send({ tipsOn: true, tipPercents: [10, 15], tipCustom: true });
    expect(res.status, JSON.stringify(res.body)).toBe(200);
  }
  homeOrders = await placeAt(home, 'cashier', 'barista', ['Ada Finch', 'Bram Okafor', 'Cora Lind'], [120, 300, 360], [40, 0, 25]);
  ropewalkOrders = await placeAt(ropewalk, 'rw-cashier', 'rw-barista', ['Wren Halloway', 'Gus Ware'], [60], [0, 60]);
  // a partial refund at the home café, so refunds and net differ from gross there
  const lead = await server.signIn('lead');
  const refund = await lead.post(`/api/orders/${homeOrders[0].id}/refund`).send({ amountCents: 50, reason: 'Short pour' });
  expect(refund.status, JSON.stringify(refund.body)).toBe(200);
  time.set('2026-03-02T15:00:00.000Z');
  owner = await server.signIn('owner');
}, 60_000);
afterAll(() => server.close());

const get = async <T>(who: Agent, path: string): Promise<T> => {
  const res = await who.get(path);
  expect(res.status, JSON.stringify(res.body)).toBe(200);
  return res.body as T;
};
const groupOf = (from = DAY, to = DAY, who = owner) => get<GroupReportView>(who, `/api/reports/group?from=${from}&to=${to}`);

/** What the group's row should be: the café's own range report, as its own lead reads it. */
const rowFrom = (cafe: { id: number; name: string }, r: ReportView) => ({
  id: cafe.id,
  name: cafe.name,
  currency: r.currency,
  locale: r.locale,
  orders: r.orders,
  drinks: r.drinks,
  grossCents: r.grossCents,
  refundsCents: r.refundsCents,
  netCents: r.netCents,
  tips: r.tips,
  waits: r.waits,
  targetSeconds: r.targetSeconds,
});

describe('GET /api/reports/group', () => {
  it('gives each café of the group, oldest first, exactly its own range report’s figures', async () => {
    for (const [from, to] of [
      [DAY, DAY],
      ['2026-03-01', '2026-03-03'],
    ]) {
      const group = await groupOf(from, to);
      const homeReport = await get<ReportView>(await server.signIn('lead'), `/api/reports/range?from=${from}&to=${to}`);
      const ropewalkReport = await get<ReportView>(await server.signIn('rw-lead'), `/api/reports/range?from=${from}&to=${to}`);
      expect(group).toEqual({
        from,
        to,
        cafes: [rowFrom({ id: home, name: 'Harbour & Hearth Coffee' }, homeReport), rowFrom({ id: ropewalk, name: SECOND_CAFE_NAME }, ropewalkReport)],
        totals: expect.any(Object),
      });
    }
  });

  it('counts each café’s own orders: three at Harbour & Hearth, two at Ropewalk, with their waits', async () => {
    const [h, r] = (await groupOf()).cafes;
    expect([h.orders, h.drinks, r.orders, r.drinks]).toEqual([3, 3, 2, 2]);
    const sum = (orders: OrderView[]) => orders.reduce((total, o) => total + o.totalCents, 0);
    expect([h.grossCents, h.refundsCents, h.netCents]).toEqual([sum(homeOrders), 50, sum(homeOrders) - 50]);
    expect([r.grossCents, r.refundsCents, r.netCents]).toEqual([sum(ropewalkOrders), 0, sum(ropewalkOrders)]);
    // waits 120, 300 and 360 s against the 240 s target: median 300, two of three over (by hand);
    // Ropewalk bumped one of its two, 60 s
    expect(h.waits).toMatchObject({ count: 3, medianSeconds: 300, overTargetShare: 2 / 3 });
    expect(r.waits).toMatchObject({ count: 1, medianSeconds: 60, overTargetShare: 0 });
    // Ada's 0.40 (her 0.50 refund is the order's money, the tip stays) and Cora's 0.25; Gus's 0.60
    expect([h.tips, r.tips]).toEqual([
      { cents: 65, cashCents: 65, cardCents: 0 },
      { cents: 60, cashCents: 60, cardCents: 0 },
    ]);
  });

  it('totals the money and the counts of the cafés, and nothing of the waits', async () => {
    const { cafes, totals } = await groupOf();
    const sum = (pick: (c: (typeof cafes)[number]) => number) => cafes.reduce((t, c) => t + pick(c), 0);
    expect(totals).toEqual({
      currency: 'USD',
      orders: 5,
      drinks: 5,
      grossCents: sum((c) => c.grossCents),
      refundsCents: 50,
      netCents: sum((c) => c.netCents),
      // 0.65 + 0.60, by hand
      tips: { cents: 125, cashCents: 125, cardCents: 0 },
    });
    expect(totals!.netCents).toBe(totals!.grossCents - totals!.refundsCents);
  });

  it('has no totals (tips neither) once a café takes another currency', async () => {
    await server.db('locations').where({ id: ropewalk }).update({ currency: 'EUR' });
    try {
      const group = await groupOf();
      expect(group.totals).toBeNull();
      expect(group.cafes.map((c) => c.currency)).toEqual(['USD', 'EUR']);
      // each café still shows its own tips, in its own currency
      expect(group.cafes.map((c) => c.tips.cents)).toEqual([65, 60]);
    } finally {
      await server.db('locations').where({ id: ropewalk }).update({ currency: 'USD' });
    }
  });

  it('is the same whichever café the owner’s session works on', async () => {
    const before = await groupOf();
    const moved = await server.signIn('owner');
    await moved.post('/api/session/cafe').send({ locationId: ropewalk }).expect(200);
    expect(await groupOf(DAY, DAY, moved)).toEqual(before);
  });

  it('never shows a café of another group', async () => {
    const { cafes } = await groupOf();
    expect(cafes.map((c) => c.id)).toEqual([home, ropewalk]);
    expect(cafes.map((c) => c.id)).not.toContain(outside);
    expect(cafes.map((c) => c.name)).not.toContain('Saltmarsh Espresso');
  });

  it('is the owner’s alone: 403 for a lead of either café and the staff, 401 signed out', async () => {
    const url = `/api/reports/group?from=${DAY}&to=${DAY}`;
    for (const login of ['lead', 'rw-lead', 'cashier', 'barista'] as const) {
      const res = await (await server.signIn(login)).get(url);
      expect([res.status, res.body.error?.code], login).toEqual([403, 'forbidden']);
    }
    const out = await request(server.url).get(url);
    expect([out.status, out.body.error?.code]).toEqual([401, 'unauthenticated']);
  });

  it.each([
    ['from=2026-13-01&to=2026-03-02', 'query.from'],
    ['from=2026-03-02', 'query.to'],
    ['from=2026-03-03&to=2026-03-02', 'query.to'],
    ['from=yesterday&to=2026-03-02', 'query.from'],
  ])('?%s → 400 naming %s', async (query, path) => {
    const res = await owner.get(`/api/reports/group?${query}`);
    expect(res.status).toBe(400);
    expect(res.body.error).toMatchObject({ code: 'validation_failed', details: expect.arrayContaining([expect.objectContaining({ path })]) });
  });
});
