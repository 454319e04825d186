// Reports: who may read them, and that a shift's and a day's numbers are exactly the sums of the
// orders placed here (money from the order answers, milk and shots from the bump answers, waits
// set to the second with the manual clock).
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { formatCents } from '@/domain/money';
import type { ReportView } from '@/domain/reports';
import { PERCENTILE_METHOD } from '@/domain/stats';
import { shiftReportEmail } from '@server/reports';
import { manualClock, startTestServer, type TestServer } from '../support/test-server';
import { groupOfItsOwn } from '../support/cafe-groups';
import { orderBody, type Agent } from './helpers';
import { DAY, T0, expectedBar, expectedMoney, placeReportDay, type ReportDay } from './reports-fixture';

const time = manualClock(T0);
let server: TestServer;
let lead: Agent;
let day: ReportDay;

beforeAll(async () => {
  server = await startTestServer({ clock: time.clock });
  day = await placeReportDay(server, time);
  lead = await server.signIn('lead');
});
afterAll(() => server.close());

const byMilk = (list: { milk: string; ml: number }[]) => [...list].sort((a, b) => a.milk.localeCompare(b.milk));
const get = async (path: string, who: Agent = lead) => {
  const res = await who.get(path);
  expect(res.status, JSON.stringify(res.body)).toBe(200);
  return res.body;
};

describe('access', () => {
  const reportUrl = (path: string) => `/api${path.replace(':id', String(day.shiftId))}${/^\/reports\/(range|days)/.test(path) ? `?from=${DAY}&to=${DAY}` : ''}`;

  it('every reports route: 401 signed out, 403 for a cashier or a barista, 200 for a lead or the owner', async () => {
    // the card check's "settle" (POST, refundOrders) is covered in card-reconciliation.test.ts
    // the group's report is the owner's alone (switchCafe): group-report.test.ts
    const routes = server.routes.filter((r) => r.path.startsWith('/reports') && r.path !== '/reports/group' && r.method === 'get');
    expect(routes.map((r) => r.path).sort()).toEqual(
      [
        '/reports/cards',
        '/reports/days',
        '/reports/days.csv',
        '/reports/range',
        '/reports/range.csv',
        '/reports/shift/:id',
        '/reports/shift/:id.csv',
        '/reports/shifts',
        '/reports/tickets',
        '/reports/tickets.csv',
      ].sort(),
    );
    const agents = { cashier: await server.signIn('cashier'), barista: await server.signIn('barista'), owner: await server.signIn('owner') };
    for (const r of routes) {
      const url = reportUrl(r.path);
      expect(r.capability, r.path).toBe('viewReports');
      const out = await request(server.url).get(url);
      expect([out.status, out.body.error?.code], url).toEqual([401, 'unauthenticated']);
      for (const who of [agents.cashier, agents.barista]) {
        const res = await who.get(url);
        expect([res.status, res.body.error?.code], url).toEqual([403, 'forbidden']);
      }
      for (const who of [lead, agents.owner]) expect((await who.get(url)).status, url).toBe(200);
    }
  });
});

describe('GET /api/reports/shifts', () => {
  it("lists the café's shifts and its date today", async () => {
    expect(await get('/api/reports/shifts')).toEqual({
      today: DAY,
      timeZone: 'America/New_York',
      shifts: [{ id: day.shiftId, openedAt: '2026-03-02T13:00:00.000Z', closedAt: '2026-03-02T14:30:00.000Z' }],
    });
  });
});

describe('GET /api/reports/shift/:id', () => {
  let report: ReportView;
  beforeAll(async () => {
    report = await get(`/api/reports/shift/${day.shiftId}`);
  });

  it("money is the sum of the shift's paid orders; the late order and the voided one are left out", () => {
    expect(day.voided).toMatchObject({ status: 'void', paymentStatus: 'unpaid' });
    const want = expectedMoney(day.inShift);
    expect(want).toMatchObject({ orders: 5, drinks: 5, paymentMix: { cash: { orders: 3 }, card: { orders: 2 } } });
    expect(want.discountCents).toBeGreaterThan(0);
    expect(want.refundsCents).toBe(150 + day.inShift[3].totalCents);
    expect(report).toMatchObject(want);
    expect(report.period).toEqual({
      kind: 'shift',
      from: DAY,
      to: DAY,
      shift: {
        id: day.shiftId,
        openedAt: '2026-03-02T13:00:00.000Z',
        closedAt: '2026-03-02T14:30:00.000Z',
        waitTargetSeconds: 240,
        // the fixture closed it without a count: the drawer has a float and an expected figure only
        cash: expect.objectContaining({
          openedBy: 'Theo Brand',
          closedBy: 'Theo Brand',
          openingFloatCents: 100_00,
          countedCashCents: null,
          differenceCents: null,
        }),
      },
    });
  });

  it('milk, shots and coffee are what the bumped drinks took', () => {
    const want = expectedBar(day.bumped);
    expect(want.milkUsedMl.map((m) => m.milk).sort()).toEqual(['Oat', 'Skim', 'Soy', 'Whole']); // the flat white's default is whole
    expect(byMilk(report.milkUsedMl)).toEqual(byMilk(want.milkUsedMl));
    expect(report.shotsPulled).toBe(want.shotsPulled);
    expect(report.coffeeUsedDg).toBe(want.coffeeUsedDg);
    expect(report.shotsPulled).toBeGreaterThan(0);
  });

  it('waits: type-7 median and p90 of 120, 200, 300 and 400 s against the 240 s target', () => {
    // sorted x = [120, 200, 300, 400], n = 4; type 7: h = (n − 1)·p
    // median: h = 1.5 → 200 + 0.5·(300 − 200) = 250; p90: h = 2.7 → 300 + 0.7·(400 − 300) = 370
    expect(report.waits).toMatchObject({ count: 4, meanSeconds: 255, medianSeconds: 250, maxSeconds: 400, overTargetShare: 0.5 });
    expect(report.waits.p90Seconds).toBeCloseTo(370, 9);
    const [, , cora, dev] = day.inShift;
    expect(report.overTarget).toEqual([
      { orderId: dev.id, businessDate: DAY, number: dev.number, customerName: 'Dev Patel', waitSeconds: 400 },
      { orderId: cora.id, businessDate: DAY, number: cora.number, customerName: 'Cora Lind', waitSeconds: 300 },
    ]);
    expect(report.targetSeconds).toBe(240);
  });

  it('an unknown shift, or one of another café, is 404', async () => {
    const [{ id: otherCafe }] = await server
      .db('locations')
      .insert({ name: 'Elsewhere', created_at: T0, group_id: await groupOfItsOwn(server.db, 'Elsewhere', T0) })
      .returning('id');
    const leadId = (await server.db('users').where({ username: 'lead' }).first('id')).id;
    const [{ id: foreign }] = await server
      .db('shifts')
      .insert({ location_id: otherCafe, opened_at: T0, opened_by: leadId, opening_float_cents: 0, baristas_on_bar: 1, wait_target_seconds: 240 })
      .returning('id');
    for (const id of [foreign, 999_999]) {
      for (const path of [`/api/reports/shift/${id}`, `/api/reports/shift/${id}.csv`]) {
        const res = await lead.get(path);
        expect([res.status, res.body.error?.code], path).toEqual([404, 'not_found']);
      }
    }
  });

  it('as a mail for the owner: subject, text and escaped HTML with the same numbers', () => {
    const mail = shiftReportEmail(report, { name: 'Harbour & Hearth <Coffee>' });
    const net = formatCents(report.netCents);
    expect(mail.subject).toBe(`Harbour & Hearth <Coffee>: shift ${DAY}, net ${net}`);
    expect(mail.text).toContain(`Net (gross less refunds): ${net}`);
    expect(mail.text).toContain(`Refunds: ${formatCents(report.refundsCents)}`);
    expect(mail.text).toContain('Median wait: 4:10');
    expect(mail.text).toContain('90th percentile wait: 6:10');
    expect(mail.text).toContain(PERCENTILE_METHOD);
    expect(mail.html).toContain('Harbour &#38; Hearth &#60;Coffee&#62;');
    expect(mail.html).not.toContain('<Coffee>');
    expect(mail.html).toContain(net);
  });
});

describe('GET /api/reports/range', () => {
  it('the day: every paid order of the date, by café-local hour, with the hour’s median wait', async () => {
    const report: ReportView = await get(`/api/reports/range?from=${DAY}&to=${DAY}`);
    expect(report).toMatchObject(expectedMoney(day.paid));
    expect(report.period).toEqual({ kind: 'range', from: DAY, to: DAY });
    expect(report.waits).toMatchObject({ count: 4, medianSeconds: 250 });
    const cents = (list: typeof day.paid) => list.reduce((a, o) => a + o.totalCents, 0);
    expect(report.hourly).toEqual([
      { hour: 9, orders: 5, drinks: 5, cents: cents(day.inShift), medianWaitSeconds: 250 },
      { hour: 10, orders: 1, drinks: 2, cents: day.late.totalCents, medianWaitSeconds: null },
    ]);
    expect(report.topItems[0]).toEqual({ item: 'Banana bread', count: 2, cents: 2 * 395 });
    expect(report.topItems.map((i) => i.item).sort()).toEqual([
      'Banana bread',
      'Cappuccino',
      'Chai latte',
      'Espresso',
      'Flat white',
      'Iced latte',
      'Latte',
      'Long black',
    ]);
    // the late order's drinks were never made: no more milk than the shift's
    expect(byMilk(report.milkUsedMl)).toEqual(byMilk(expectedBar(day.bumped).milkUsedMl));
  });

  it('a day with nothing sold is all zeros, with no waits', async () => {
    const report: ReportView = await get('/api/reports/range?from=2026-01-01&to=2026-01-31');
    expect(report).toMatchObject({ orders: 0, grossCents: 0, netCents: 0, hourly: [], topItems: [], milkUsedMl: [], overTarget: [] });
    expect(report.waits).toEqual({ count: 0, meanSeconds: null, medianSeconds: null, p90Seconds: null, maxSeconds: null, overTargetShare: null });
  });

  it('hours are café-local on both sides of the change to daylight saving time (8 March 2026)', async () => {
    const cashier = await server.signIn('cashier');
    const latte = (await server.db('menu_items').where({ name: 'Long black' }).first('id')).id;
    // 09:00 in New York both times: 14:00 UTC under EST (UTC−5), 13:00 UTC under EDT (UTC−4)
    for (const at of ['2026-03-07T14:00:00.000Z', '2026-03-09T13:00:00.000Z']) {
      time.set(at);
      expect((await cashier.post('/api/orders').send(orderBody('Hal Dusk', [{ menuItemId: latte }]))).status).toBe(201);
    }
    const report: ReportView = await get('/api/reports/range?from=2026-03-07&to=2026-03-09');
    expect(report.hourly).toEqual([{ hour: 9, orders: 2, drinks: 2, cents: expect.any(Number), medianWaitSeconds: null }]);
  });
});

describe('bad queries', () => {
  const cases: [string, string][] = [
    ['/api/reports/range?from=yesterday&to=2026-03-02', 'query.from'],
    ['/api/reports/range?from=2026-02-30&to=2026-03-02', 'query.from'],
    ['/api/reports/range?from=2026-03-02', 'query.to'],
    ['/api/reports/range?from=2026-03-03&to=2026-03-02', 'query.to'],
    ['/api/reports/range.csv?from=2026-3-2&to=2026-03-02', 'query.from'],
    ['/api/reports/tickets?sort=bogus', 'query.sort'],
    ['/api/reports/tickets?page=0', 'query.page'],
    ['/api/reports/tickets?pageSize=500', 'query.pageSize'],
    ['/api/reports/tickets?dir=sideways', 'query.dir'],
    ['/api/reports/tickets?status=lost', 'query.status'],
    ['/api/reports/tickets.csv?from=yesterday', 'query.from'],
    ['/api/reports/shift/abc', 'params.id'],
  ];
  it.each(cases)('%s → 400 naming %s', async (url, path) => {
    const res = await lead.get(url);
    expect(res.status).toBe(400);
    expect(res.body.error).toMatchObject({ code: 'validation_failed', details: expect.arrayContaining([expect.objectContaining({ path })]) });
  });
});
