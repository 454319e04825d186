// Bean lots over HTTP: owner only; 400 with the fields to fix; freshness from the café's calendar;
// stock that a bumped drink takes from the lot in the espresso grinder and a recall gives back.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { BeanLotView } from '@/domain/bean-stock';
import type { BeansView } from '@/domain/beans-schemas';
import { demoMenu, manualClock, startTestServer, type TestServer } from '../support/test-server';
import { lotBody, orderBody, type Agent, type LineInput } from './helpers';

// 09:00 EST on Monday 2 March 2026 at the demo café (America/New_York)
const time = manualClock('2026-03-02T14:00:00.000Z');

let server: TestServer;
const agents = {} as Record<'owner' | 'lead' | 'cashier' | 'barista', Agent>;
let ids: Awaited<ReturnType<typeof demoMenu>>;

beforeAll(async () => {
  server = await startTestServer({ clock: time.clock });
  for (const who of ['owner', 'lead', 'cashier', 'barista'] as const) agents[who] = await server.signIn(who);
  ids = await demoMenu(server);
});
afterAll(() => server.close());

/** Rows of every table a bean command writes to. */
async function beanCounts() {
  const count = async (table: string) => Number((await server.db(table).count({ n: '*' }).first())?.n);
  const out: Record<string, number> = {};
  for (const t of ['bean_lots', 'bean_usage', 'dial_in_shots', 'bean_settings', 'events']) out[t] = await count(t);
  return out;
}
const lotsSnapshot = () => server.db('bean_lots').orderBy('id');

async function view(): Promise<BeansView> {
  const res = await agents.owner.get('/api/beans');
  expect(res.status).toBe(200);
  return res.body;
}
const lotIn = (v: BeansView, id: number) => v.lots.find((l) => l.id === id)!;

async function createLot(over: Record<string, unknown> = {}): Promise<BeanLotView> {
  const res = await agents.owner.post('/api/beans/lots').send(lotBody(over));
  expect(res.status, JSON.stringify(res.body)).toBe(201);
  return res.body.lot;
}

async function place(customerName: string, items: LineInput[]) {
  const res = await agents.cashier.post('/api/orders').send(orderBody(customerName, items));
  if (res.status !== 201) throw new Error(`order failed: ${res.status} ${JSON.stringify(res.body)}`);
  const drinks = await server.db('order_items').where({ order_id: res.body.order.id, station: 'bar' }).orderBy('line_no');
  return { orderId: res.body.order.id as number, drinks };
}
const usageOf = (orderItemIds: number[]) => server.db('bean_usage').whereIn('order_item_id', orderItemIds).orderBy('id');

describe('who may manage bean lots', () => {
  it('only the owner: cashier, barista and lead get 403 on every beans route, and nothing changes', async () => {
    const before = await beanCounts();
    const lots = await lotsSnapshot();
    const lotId = lots[0].id;
    for (const who of ['cashier', 'barista', 'lead'] as const) {
      const a = agents[who];
      const answers = [
        await a.get('/api/beans'),
        await a.post('/api/beans/lots').send(lotBody()),
        await a.put(`/api/beans/lots/${lotId}`).send(lotBody({ name: 'Renamed' })),
        await a.post(`/api/beans/lots/${lotId}/retire`),
        await a.put('/api/beans/settings').send({ timeMinS: 20, timeMaxS: 30, ratioMinX10: 18, ratioMaxX10: 22, lowStockG: 100 }),
      ];
      for (const res of answers) {
        expect(res.status, who).toBe(403);
        expect(res.body.error.code).toBe('forbidden');
      }
    }
    expect(await beanCounts()).toEqual(before);
    expect(await lotsSnapshot()).toEqual(lots);
  });

  it('signed out: 401', async () => {
    const res = await fetch(`${server.url}/api/beans`);
    expect(res.status).toBe(401);
  });
});

describe('the demo lots', () => {
  it('the seed has a lot in the espresso grinder, one in the decaf grinder and one on the shelf', async () => {
    const v = await view();
    expect(v.timeZone).toBe('America/New_York');
    expect(v.today).toBe('2026-03-02');
    expect(
      v.lots
        .filter((l) => !l.retiredAt)
        .map((l) => l.hopper)
        .sort(),
    ).toEqual(['decaf', 'espresso', 'shelf']);
  });
});

describe('adding and editing a lot', () => {
  it('adds a lot: days since roast in café days, state, stock; filling the espresso grinder moves the old lot to the shelf', async () => {
    const old = (await view()).lots.find((l) => l.hopper === 'espresso')!;
    const since = Number((await server.db('events').max({ m: 'seq' }).first())?.m);
    const lot = await createLot();
    // 20 February → 2 March 2026: 8 days left in February + 2 = 10 days; 5 ≤ 10 ≤ 30 → best (common practice)
    expect(lot).toMatchObject({
      name: 'Test Espresso Lot',
      hopper: 'espresso',
      daysSinceRoast: 10,
      freshness: 'best',
      receivedG: 2000,
      usedDg: 0,
      remainingDg: 20_000,
      stock: 'ok',
      runsOut: { basis: 'none' },
      lastGood: null,
      retiredAt: null,
    });
    const v = await view();
    expect(lotIn(v, old.id).hopper).toBe('shelf');
    expect(v.lots.filter((l) => l.hopper === 'espresso' && !l.retiredAt).map((l) => l.id)).toEqual([lot.id]);
    // one menu.changed event, so open Bars reload what is on the grinder
    const events = await server.db('events').where('seq', '>', since);
    expect(events.map((e) => e.type)).toEqual(['menu.changed']);
  });

  it('freshness by the café’s date: at 04:30Z on 3 March it is still 2 March in New York', async () => {
    const lot = await createLot({ name: 'Resting Lot', roastDate: '2026-02-26', receivedDate: '2026-02-27', hopper: 'shelf' });
    expect(lot).toMatchObject({ daysSinceRoast: 4, freshness: 'resting' }); // 26 Feb → 2 Mar: 4 days, under 5
    time.set('2026-03-03T04:30:00.000Z'); // 23:30 EST on 2 March
    expect(lotIn(await view(), lot.id).daysSinceRoast).toBe(4);
    time.set('2026-03-03T05:00:00.000Z'); // midnight in New York: day 5, best
    expect(lotIn(await view(), lot.id)).toMatchObject({ daysSinceRoast: 5, freshness: 'best' });
    time.set('2026-03-02T14:00:00.000Z');
  });

  it('400 with the fields to fix, and nothing stored', async () => {
    const before = await beanCounts();
    const cases: [Record<string, unknown>, string[]][] = [
      [{ name: '', roaster: undefined }, ['name', 'roaster']],
      [{ roastDate: '2026-02-30' }, ['roastDate']],
      [{ receivedDate: '2026-02-19' }, ['receivedDate']], // before the roast
      [{ receivedG: 0, hopper: 'grinder 3' }, ['hopper', 'receivedG']],
      [{ restDays: 10, bestUntilDays: 10 }, ['bestUntilDays']],
      [{ receivedG: 12.5 }, ['receivedG']],
      [{ roastDate: '2026-03-03', receivedDate: '2026-03-03' }, ['receivedDate', 'roastDate']], // the café's tomorrow
    ];
    for (const [over, paths] of cases) {
      const res = await agents.owner.post('/api/beans/lots').send(lotBody(over));
      expect(res.status, JSON.stringify(over)).toBe(400);
      expect(res.body.error.code).toBe('validation_failed');
      expect(res.body.error.details.map((d: { path: string }) => d.path).sort(), JSON.stringify(over)).toEqual(paths);
    }
    expect(await beanCounts()).toEqual(before);
  });

  it('edits a lot; 404 for a lot that is not there; a retired lot is 409 and stays as it was', async () => {
    const lot = await createLot({ name: 'To Edit', hopper: 'shelf' });
    const res = await agents.owner.put(`/api/beans/lots/${lot.id}`).send(lotBody({ name: 'Edited', hopper: 'shelf', restDays: 7, bestUntilDays: 21 }));
    expect(res.status).toBe(200);
    expect(res.body.lot).toMatchObject({ id: lot.id, name: 'Edited', restDays: 7, bestUntilDays: 21, freshness: 'best' });
    expect((await agents.owner.put('/api/beans/lots/99999').send(lotBody())).status).toBe(404);
    expect((await agents.owner.post('/api/beans/lots/99999/retire')).status).toBe(404);

    const retired = await agents.owner.post(`/api/beans/lots/${lot.id}/retire`);
    expect(retired.status).toBe(200);
    expect(retired.body.lot.retiredAt).toBe(time.clock().toISOString());
    const before = await beanCounts();
    const row = await server.db('bean_lots').where({ id: lot.id }).first();
    expect((await agents.owner.post(`/api/beans/lots/${lot.id}/retire`)).status).toBe(409);
    const edit = await agents.owner.put(`/api/beans/lots/${lot.id}`).send(lotBody({ name: 'Back again' }));
    expect(edit.status).toBe(409);
    expect(edit.body.error.code).toBe('conflict');
    expect(await beanCounts()).toEqual(before);
    expect(await server.db('bean_lots').where({ id: lot.id }).first()).toEqual(row);
    // retired lots are listed last
    expect((await view()).lots.at(-1)!.retiredAt).not.toBeNull();
  });
});

describe('the dial-in window and low-stock line', () => {
  it('saves all five values; 400 when a range is upside down', async () => {
    const before = await beanCounts();
    const bad = await agents.owner.put('/api/beans/settings').send({ timeMinS: 25, timeMaxS: 30, ratioMinX10: 18, ratioMaxX10: 22, lowStockG: -1 });
    expect(bad.status).toBe(400);
    expect(bad.body.error.details.map((d: { path: string }) => d.path).sort()).toEqual(['lowStockG']);
    const flipped = await agents.owner.put('/api/beans/settings').send({ timeMinS: 30, timeMaxS: 25, ratioMinX10: 22, ratioMaxX10: 18, lowStockG: 500 });
    expect(flipped.body.error.details.map((d: { path: string }) => d.path).sort()).toEqual(['ratioMaxX10', 'timeMaxS']);
    const missing = await agents.owner.put('/api/beans/settings').send({});
    expect(missing.body.error.details.map((d: { path: string }) => d.path).sort()).toEqual(['lowStockG', 'ratioMaxX10', 'ratioMinX10', 'timeMaxS', 'timeMinS']);
    expect(await beanCounts()).toEqual(before);
    expect(await server.db('bean_settings')).toEqual([]);

    const ok = await agents.owner.put('/api/beans/settings').send({ timeMinS: 24, timeMaxS: 32, ratioMinX10: 19, ratioMaxX10: 23, lowStockG: 1500 });
    expect(ok.status).toBe(200);
    expect((await view()).settings).toEqual({ timeMinS: 24, timeMaxS: 32, ratioMinX10: 19, ratioMaxX10: 23, lowStockG: 1500 });
    const dialIn = await agents.barista.get('/api/dial-in');
    expect(dialIn.body.window).toMatchObject({ timeMinS: 24, timeMaxS: 32, ratioMinX10: 19, ratioMaxX10: 23 });
    // back to the defaults for the rest of the file
    await agents.owner.put('/api/beans/settings').send({ timeMinS: 25, timeMaxS: 30, ratioMinX10: 18, ratioMaxX10: 22, lowStockG: 500 });
  });
});

describe('coffee used by the bar', () => {
  let espresso: BeanLotView;
  let decaf: BeanLotView;
  beforeAll(async () => {
    espresso = await createLot({ name: 'Bar Espresso', receivedG: 1000 });
    decaf = await createLot({ name: 'Bar Decaf', hopper: 'decaf', receivedG: 1000 });
  });
  const remaining = async (lot: BeanLotView) => lotIn(await view(), lot.id).remainingDg;

  it('bumping a drink takes its recipe dose from the espresso lot, in the same transaction; recall gives it back', async () => {
    const { orderId, drinks } = await place('Ottilie Frame', [{ menuItemId: ids.item('Latte') }]);
    const dose = drinks[0].dose_dg as number;
    expect(dose).toBeGreaterThan(0);
    const start = await remaining(espresso);

    const bump = await agents.barista.post(`/api/drinks/${drinks[0].id}/bump`);
    expect(bump.status).toBe(200);
    expect(await usageOf([drinks[0].id])).toEqual([
      {
        id: expect.any(Number),
        lot_id: espresso.id,
        source: 'drink',
        order_item_id: drinks[0].id,
        shot_id: null,
        dose_dg: dose,
        used_at: time.clock().toISOString(),
      },
    ]);
    expect(await remaining(espresso)).toBe(start - dose);

    time.advance(5_000);
    expect((await agents.barista.post(`/api/tickets/${orderId}/recall`)).status).toBe(200);
    expect(await usageOf([drinks[0].id])).toEqual([]);
    expect(await remaining(espresso)).toBe(start);
  });

  it('a ticket bump: each drink from its grinder (decaf extra → decaf lot); no coffee for a drink without shots', async () => {
    const { orderId, drinks } = await place('Bram Oakes', [
      { menuItemId: ids.item('Cappuccino') },
      { menuItemId: ids.item('Flat white'), extraIds: [ids.extra('Decaf')] },
      { menuItemId: ids.item('Chai latte') },
    ]);
    const [capp, decafFlat, chai] = drinks;
    expect(chai.dose_dg).toBe(0);
    const startEspresso = await remaining(espresso);
    const startDecaf = await remaining(decaf);

    time.advance(1_000);
    expect((await agents.barista.post(`/api/tickets/${orderId}/bump`)).status).toBe(200);
    const rows = await usageOf(drinks.map((d) => d.id));
    expect(rows.map((r) => [r.order_item_id, r.lot_id, r.dose_dg])).toEqual([
      [capp.id, espresso.id, capp.dose_dg],
      [decafFlat.id, decaf.id, decafFlat.dose_dg],
    ]);
    expect(await remaining(espresso)).toBe(startEspresso - capp.dose_dg);
    expect(await remaining(decaf)).toBe(startDecaf - decafFlat.dose_dg);

    time.advance(1_000);
    expect((await agents.barista.post(`/api/tickets/${orderId}/recall`)).status).toBe(200);
    expect(await usageOf(drinks.map((d) => d.id))).toEqual([]);
    expect(await remaining(espresso)).toBe(startEspresso);
    expect(await remaining(decaf)).toBe(startDecaf);
  });

  it('a batch bump records every drink; a refused bump records nothing', async () => {
    const a = await place('Cass Wren', [{ menuItemId: ids.item('Latte') }]);
    const b = await place('Dov Hale', [{ menuItemId: ids.item('Long black') }]);
    const drinkIds = [a.drinks[0].id, b.drinks[0].id];
    time.advance(1_000);
    expect((await agents.barista.post('/api/drinks/bump').send({ drinkIds })).status).toBe(200);
    expect((await usageOf(drinkIds)).map((r) => r.lot_id)).toEqual([espresso.id, espresso.id]);

    const before = await beanCounts();
    expect((await agents.barista.post('/api/drinks/bump').send({ drinkIds })).status).toBe(409); // already bumped
    expect((await agents.cashier.post(`/api/drinks/${drinkIds[0]}/bump`)).status).toBe(403);
    expect(await beanCounts()).toEqual(before);
  });

  it('runs out: a shift’s pace, then low stock under the owner’s line', async () => {
    // two doubles bumped together; half an hour later there is a pace to project
    time.advance(30 * 60_000);
    const lot = lotIn(await view(), espresso.id);
    expect(lot.runsOut.basis).toBe('shift');
    if (lot.runsOut.basis !== 'shift') return;
    expect(lot.runsOut.hoursLeft).toBeGreaterThan(0);
    expect(Date.parse(lot.runsOut.at)).toBeGreaterThan(time.clock().getTime());

    // a line of 990 g makes the lot (under 1,000 g now) low
    await agents.owner.put('/api/beans/settings').send({ timeMinS: 25, timeMaxS: 30, ratioMinX10: 18, ratioMaxX10: 22, lowStockG: 990 });
    expect(lotIn(await view(), espresso.id).stock).toBe('low');
    const pulse = await agents.lead.get('/api/pulse');
    expect(pulse.status).toBe(200);
    expect(pulse.body.beanAlerts).toEqual(
      expect.arrayContaining([
        expect.objectContaining({ lotId: espresso.id, kind: 'low', message: expect.stringContaining('Bar Espresso in the espresso grinder is low') }),
      ]),
    );
    await agents.owner.put('/api/beans/settings').send({ timeMinS: 25, timeMaxS: 30, ratioMinX10: 18, ratioMaxX10: 22, lowStockG: 500 });
  });
});
