// Reports day by day (GET /api/reports/days and days.csv): a row per café-local date of the range,
// each exactly what the range report of that date alone answers, dates without orders as zeros,
// the total exactly the whole range's report. Orders are placed through the API on three dates
// (the Reports fixture's morning, a card-and-cash morning two days later, and today, which is
// never stored) and bumped at known waits on the manual clock. Tips are on from 4 March: a cash
// and a card tip each on 4 March and today, and the 4 March card order refunded past its total, so
// part of its tip went back.
import Papa from 'papaparse';
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { MAX_REPORT_DAYS, type DayFigures, type ReportDaysView } from '@/domain/report-days';
import type { ReportView } from '@/domain/reports';
import type { OrderView } from '@/domain/types';
import { demoMenu, manualClock, startTestServer, type TestServer } from '../support/test-server';
import { orderBody, type Agent } from './helpers';
import { T0, placeReportDay, type ReportDay } from './reports-fixture';

const time = manualClock(T0);
let server: TestServer;
let lead: Agent;
let day: ReportDay;
/** 4 March: two orders (cash, card), both bumped; 5 March (today): three, one bumped. Tips below. */
let fourth: OrderView[];
let today: OrderView[];
const FROM = '2026-03-01';
const TO = '2026-03-05';
const DATES = ['2026-03-01', '2026-03-02', '2026-03-03', '2026-03-04', '2026-03-05'];

/** Orders of one Latte each taken at `t0` (09:00 in New York), the first `waits.length` bumped after those seconds. */
async function placeAt(t0: string, orders: { name: string; card?: boolean; tip?: number }[], waits: number[]): Promise<OrderView[]> {
  const ids = await demoMenu(server);
  const [cashier, barista] = [await server.signIn('cashier'), await server.signIn('barista')];
  time.set(t0);
  const placed: OrderView[] = [];
  for (const { name, card, tip } of orders) {
    const body = { ...orderBody(name, [{ menuItemId: ids.item('Latte') }, { menuItemId: ids.item('Banana bread') }]), ...(tip ? { tipCents: tip } : {}) };
    const res = await cashier.post('/api/orders').send(card ? { ...body, payment: { method: 'card', paymentMethod: 'pm_card_visa' } } : body);
    expect(res.status, JSON.stringify(res.body)).toBe(201);
    placed.push(res.body.order);
  }
  for (const [i, wait] of waits.entries()) {
    time.set(new Date(Date.parse(t0) + wait * 1000).toISOString());
    const res = await barista.post(`/api/tickets/${placed[i].id}/bump`);
    expect(res.status, JSON.stringify(res.body)).toBe(200);
  }
  return placed;
}

beforeAll(async () => {
  server = await startTestServer({ clock: time.clock });
  day = await placeReportDay(server, time);
  const tipsOn = await (await server.signIn('owner')).put('/api/settings').send({ tipsOn: true, tipPercents: [10, 15, 20], tipCustom: true });
  expect(tipsOn.status, JSON.stringify(tipsOn.body)).toBe(200);
  fourth = await placeAt(
    '2026-03-04T14:00:00.000Z',
    [
      { name: 'Hana Moss', tip: 50 },
      { name: 'Ivo Tarr', card: true, tip: 120 },
    ],
    [90, 360],
  );
  today = await placeAt('2026-03-05T14:00:00.000Z', [{ name: 'Jun Abara', tip: 30 }, { name: 'Kit Lowe', card: true, tip: 75 }, { name: 'Lia Brook' }], [150]);
  time.set('2026-03-05T16:00:00.000Z'); // 11:00 in New York on 5 March: the other dates are past
  lead = await server.signIn('lead');
  // 40 cents past Ivo's total: the order's money back, and 40 of his 120 cents of tip
  const refund = await lead.post(`/api/orders/${fourth[1].id}/refund`).send({ amountCents: fourth[1].totalCents + 40, reason: 'Spilt on the counter' });
  expect(refund.status, JSON.stringify(refund.body)).toBe(200);
}, 60_000);
afterAll(() => server.close());

const get = async <T>(path: string, who: Agent = lead): Promise<T> => {
  const res = await who.get(path);
  expect(res.status, JSON.stringify(res.body)).toBe(200);
  return res.body as T;
};
const daysOf = (from = FROM, to = TO) => get<ReportDaysView>(`/api/reports/days?from=${from}&to=${to}`);
const rangeOf = (from: string, to: string) => get<ReportView>(`/api/reports/range?from=${from}&to=${to}`);

/** What a day's row should say: the figures of that date's own range report, picked by hand. */
const figuresOf = (r: ReportView): DayFigures => ({
  orders: r.orders,
  drinks: r.drinks,
  grossCents: r.grossCents,
  taxCents: r.taxCents,
  discountCents: r.discountCents,
  refundsCents: r.refundsCents,
  netCents: r.netCents,
  tips: r.tips,
  cashCents: r.paymentMix.cash.cents,
  cardCents: r.paymentMix.card.cents,
  medianWaitSeconds: r.waits.medianSeconds,
  p90WaitSeconds: r.waits.p90Seconds,
  overTargetCount: r.overTarget.length,
  timedTickets: r.waits.count,
  shotsPulled: r.shotsPulled,
});

describe('GET /api/reports/days', () => {
  it('answers a row per date, oldest first, with the café’s currency, zone and target', async () => {
    const view = await daysOf();
    expect(view).toMatchObject({ from: FROM, to: TO, currency: 'USD', locale: 'en-US', timeZone: 'America/New_York', targetSeconds: 240 });
    expect(view.days.map((d) => d.date)).toEqual(DATES);
  });

  it('gives each date exactly what the range report of that date alone answers', async () => {
    const view = await daysOf();
    for (const row of view.days) expect(row, row.date).toEqual({ date: row.date, ...figuresOf(await rangeOf(row.date, row.date)) });
  });

  it('counts the orders placed on each date, and a date without orders is all zeros', async () => {
    const { days } = await daysOf();
    expect(days.map((d) => d.orders)).toEqual([0, day.paid.length, 0, fourth.length, today.length]);
    expect(days.map((d) => d.timedTickets)).toEqual([0, 4, 0, 2, 1]);
    // 4 March: 90 and 360 s against the 240 s target, median 225 (by hand)
    expect(days[3]).toMatchObject({ medianWaitSeconds: 225, overTargetCount: 1, cardCents: fourth[1].totalCents, cashCents: fourth[0].totalCents });
    for (const empty of [days[0], days[2]]) {
      expect(empty).toEqual({
        date: empty.date,
        orders: 0,
        drinks: 0,
        grossCents: 0,
        taxCents: 0,
        discountCents: 0,
        refundsCents: 0,
        netCents: 0,
        tips: { cents: 0, cashCents: 0, cardCents: 0 },
        cashCents: 0,
        cardCents: 0,
        medianWaitSeconds: null,
        p90WaitSeconds: null,
        overTargetCount: 0,
        timedTickets: 0,
        shotsPulled: 0,
      });
    }
  });

  it('gives each date the tips kept that day, cash and card, and totals them (by hand)', async () => {
    const { days, total } = await daysOf();
    const none = { cents: 0, cashCents: 0, cardCents: 0 };
    // 4 March: Hana's 0.50 in cash; Ivo's 1.20 by card less the 0.40 refunded past his total
    // today: Jun's 0.30 in cash, Kit's 0.75 by card; the first days had none
    expect(days.map((d) => d.tips)).toEqual([none, none, none, { cents: 130, cashCents: 50, cardCents: 80 }, { cents: 105, cashCents: 30, cardCents: 75 }]);
    expect(total.tips).toEqual({ cents: 235, cashCents: 80, cardCents: 155 });
    // never in the café's money: 4 March's refunds are Ivo's total alone, not the tip's 40 cents
    expect(days[3].refundsCents).toBe(fourth[1].totalCents);
  });

  it("totals exactly the whole range's report, and the money adds up across the rows", async () => {
    const { days, total } = await daysOf();
    const whole = await rangeOf(FROM, TO);
    // the range report lists at most 20 over-target tickets; here there are fewer, so it is the count
    expect(total).toEqual(figuresOf(whole));
    for (const k of ['orders', 'drinks', 'grossCents', 'taxCents', 'discountCents', 'refundsCents', 'netCents', 'cashCents', 'cardCents'] as const) {
      expect(
        days.reduce((a, d) => a + d[k], 0),
        k,
      ).toBe(total[k]);
    }
  });

  it('answers the same from the stored past days as worked out afresh', async () => {
    const first = await daysOf();
    // the past dates are stored now (today never is)
    expect(Number((await server.db('report_days').count({ n: '*' }).first())?.n)).toBe(4);
    await server.db('report_days').delete();
    expect(await daysOf()).toEqual(first);
    // a sub-range: the same rows for the same dates
    const part = await daysOf('2026-03-02', '2026-03-04');
    expect(part.days).toEqual(first.days.slice(1, 4));
  });

  it('is for a lead or the owner: 401 signed out, 403 for a cashier or a barista', async () => {
    for (const path of ['/api/reports/days', '/api/reports/days.csv']) {
      const url = `${path}?from=${FROM}&to=${TO}`;
      const out = await request(server.url).get(url);
      expect([out.status, out.body.error?.code], url).toEqual([401, 'unauthenticated']);
      for (const login of ['cashier', 'barista'] as const) {
        const res = await (await server.signIn(login)).get(url);
        expect([res.status, res.body.error?.code], `${login} ${url}`).toEqual([403, 'forbidden']);
      }
      expect((await (await server.signIn('owner')).get(url)).status, url).toBe(200);
    }
  });

  it.each([
    ['days', 'from=2026-13-01&to=2026-03-02', 'query.from', 'There is no such date'],
    ['days', 'from=2026-03-02', 'query.to', undefined],
    ['days', 'from=yesterday&to=2026-03-02', 'query.from', 'Use a date like 2026-03-02'],
    ['days', 'from=2026-03-03&to=2026-03-02', 'query.to', 'The range ends before it starts'],
    ['days', 'from=2025-03-01&to=2026-03-02', 'query.to', `Pick at most ${MAX_REPORT_DAYS} days`],
    ['days.csv', 'from=2025-03-01&to=2026-03-02', 'query.to', `Pick at most ${MAX_REPORT_DAYS} days`],
    ['days.csv', 'from=2026-3-2&to=2026-03-02', 'query.from', 'Use a date like 2026-03-02'],
  ])('%s?%s → 400 naming %s', async (path, query, field, message) => {
    const res = await lead.get(`/api/reports/${path}?${query}`);
    expect(res.status).toBe(400);
    const detail = message ? { path: field, message } : { path: field };
    expect(res.body.error).toMatchObject({ code: 'validation_failed', details: expect.arrayContaining([expect.objectContaining(detail)]) });
  });

  it(`takes a range of exactly ${MAX_REPORT_DAYS} days`, async () => {
    const view = await daysOf('2025-03-05', '2026-03-05');
    expect(view.days).toHaveLength(MAX_REPORT_DAYS);
    expect(view.total.orders).toBe(day.paid.length + fourth.length + today.length);
  });
});

describe('GET /api/reports/days.csv', () => {
  it('is the JSON as a table: a header, a row per date and the total, money as decimal dollars', async () => {
    const view = await daysOf();
    const res = await lead.get(`/api/reports/days.csv?from=${FROM}&to=${TO}`);
    expect(res.status).toBe(200);
    expect(res.headers['content-type']).toBe('text/csv; charset=utf-8');
    expect(res.headers['content-disposition']).toBe(`attachment; filename="jugline-days-${FROM}_to_${TO}.csv"`);
    const rows = Papa.parse<string[]>(res.text.trim()).data;
    expect(rows[0]).toEqual([
      'Date',
      'Orders',
      'Drinks',
      'Gross (USD)',
      'Tax (USD)',
      'Discounts (USD)',
      'Refunds (USD)',
      'Net (USD)',
      'Cash (USD)',
      'Card (USD)',
      'Tips (USD)',
      'Cash tips (USD)',
      'Card tips (USD)',
      'Median wait (s)',
      'p90 wait (s)',
      'Over 240 s target',
      'Tickets timed',
      'Shots pulled',
    ]);
    const money = (c: number) => (c / 100).toFixed(2);
    const wait = (s: number | null) => (s === null ? '' : String(Math.round(s * 10) / 10));
    const expected = (date: string, f: DayFigures) => [
      date,
      String(f.orders),
      String(f.drinks),
      money(f.grossCents),
      money(f.taxCents),
      money(f.discountCents),
      money(f.refundsCents),
      money(f.netCents),
      money(f.cashCents),
      money(f.cardCents),
      money(f.tips.cents),
      money(f.tips.cashCents),
      money(f.tips.cardCents),
      wait(f.medianWaitSeconds),
      wait(f.p90WaitSeconds),
      String(f.overTargetCount),
      String(f.timedTickets),
      String(f.shotsPulled),
    ];
    expect(rows.slice(1)).toEqual([...view.days.map((d) => expected(d.date, d)), expected('Total', view.total)]);
    // every cell quoted, so a cell can never start a formula unquoted
    expect(res.text.split('\r\n').every((line) => line.startsWith('"'))).toBe(true);
  });
});
