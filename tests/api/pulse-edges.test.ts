// Pulse, the quote and the shift report at their edges, over HTTP on a real server: a bar worked
// exactly to capacity, a few slow drinks pulling the mean make time past the median, a jug of
// lattes bumped as one batch, a shift that runs past midnight, and today's tips (the café-local
// date's, as the day's report counts them). Numbers worked by hand.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { PulseView } from '@/domain/pulse';
import type { ReportView } from '@/domain/reports';
import type { OrderView, ShiftView } from '@/domain/types';
import { demoMenu, manualClock, startTestServer, type TestServer } from '../support/test-server';
import { orderBody, type Agent, type LineInput } from './helpers';

const MIN = 60_000;

/** A fresh server on its own clock, with the lead, the cashier and a barista signed in. */
function bar(startIso: string) {
  const time = manualClock(startIso);
  const ctx = {
    server: undefined as unknown as TestServer,
    lead: {} as Agent,
    cashier: {} as Agent,
    barista: {} as Agent,
    ids: {} as Awaited<ReturnType<typeof demoMenu>>,
  };
  beforeAll(async () => {
    ctx.server = await startTestServer({ clock: time.clock });
    ctx.lead = await ctx.server.signIn('lead');
    ctx.cashier = await ctx.server.signIn('cashier');
    ctx.barista = await ctx.server.signIn('barista');
    ctx.ids = await demoMenu(ctx.server);
  });
  afterAll(() => ctx.server.close());
  const ok = async (agent: Agent, path: string, body?: object) => {
    const res = await agent.post(path).send(body);
    expect(res.status, `${path}: ${JSON.stringify(res.body)}`).toBeLessThan(300);
    return res.body;
  };
  return {
    ctx,
    /** Set the clock to `minutes` after the start. */
    setMinute: (minutes: number) => time.set(new Date(Date.parse(startIso) + minutes * MIN).toISOString()),
    openShift: (baristasOnBar: number): Promise<{ shift: ShiftView }> =>
      ok(ctx.lead, '/api/shifts', { openingFloatCents: 100_00, baristasOnBar, waitTargetSeconds: 240 }),
    async place(name: string, drinks: number, item = 'Long black'): Promise<OrderView> {
      const lines: LineInput[] = Array.from({ length: drinks }, () => ({ menuItemId: ctx.ids.item(item) }));
      return (await ok(ctx.cashier, '/api/orders', orderBody(name, lines, 500_00))).order;
    },
    drinkIds: (o: OrderView) => o.lines.filter((l) => l.station === 'bar').map((l) => l.id),
    start: (ids: number[]) => ok(ctx.barista, '/api/drinks/start', { drinkIds: ids }),
    /** A one-drink ticket fired at `minute`, started a minute later and bumped two minutes after that. */
    async madeAt(name: string, minute: number): Promise<OrderView> {
      this.setMinute(minute);
      const order = await this.place(name, 1);
      this.setMinute(minute + 1);
      await this.start(this.drinkIds(order));
      this.setMinute(minute + 3);
      await this.bump(this.drinkIds(order));
      return order;
    },
    bump: (ids: number[]) => ok(ctx.barista, '/api/drinks/bump', { drinkIds: ids }),
    async pulse(): Promise<PulseView> {
      const res = await ctx.lead.get('/api/pulse');
      expect(res.status, JSON.stringify(res.body)).toBe(200);
      return res.body;
    },
  };
}

describe('staffing at the edges', () => {
  const h = bar('2026-03-02T14:00:00.000Z'); // 09:00 in New York, the demo café's zone

  it('72 drinks in 30 min at 75 s a drink with 3 on bar: the bar can’t keep up (no 2814749767106559.5 min)', async () => {
    await h.openShift(3);
    h.setMinute(10);
    const orders: OrderView[] = [];
    for (let i = 0; i < 12; i++) orders.push(await h.place(`Rush ${i}`, 6));
    // two drinks bumped, at 10:30 and 11:15: 3 baristas busy 75 s = 225 barista-s over 2 drinks,
    // steadied by 5 × 60 s → (225 + 300) ÷ 7 = 75 s a drink
    const [a, b] = h.drinkIds(orders[0]);
    h.setMinute(10.5);
    await h.bump([a]);
    h.setMinute(11.25);
    await h.bump([b]);

    h.setMinute(20);
    const p = await h.pulse();
    // hand-worked: A = 72 drinks / 1800 s × 75 s = 3 = c
    expect(p.staffing.sentence).not.toMatch(/\d{6,}/);
    expect(p.staffing.now).toEqual({ stable: false, probabilityOfWaiting: 1, meanWaitSeconds: null });
    expect(p.staffing.sentence).toMatch(/^The bar can't keep up: 72 drinks came in over the last 30 min, and 3 baristas at 1:15 a drink make at most 72/);
    expect(p.staffing.inputs).toMatchObject({ arrivals: 72, windowMinutes: 30, drinksTimed: 2, meanMakeSeconds: 75, baristas: 3 });
  });

  it('bumps 30, 40, 50, 60 and 300 s apart: the mean says 1 barista can’t keep up; the median would not', async () => {
    // the rush made at 1:40, then three hours on: it is out of every window
    h.setMinute(100);
    for (const id of (await h.ctx.server.db('orders').where('customer_name', 'like', 'Rush %').pluck('id')) as number[])
      await h.ctx.lead.post(`/api/tickets/${id}/bump`);
    h.setMinute(200);
    const set = await h.ctx.lead.post('/api/shifts/current/baristas').send({ baristasOnBar: 1 });
    expect(set.status).toBe(200);
    const orders: OrderView[] = [];
    for (let i = 0; i < 5; i++) orders.push(await h.place(`Steady ${i}`, 6));
    const ids = orders.flatMap(h.drinkIds);
    let minute = 200;
    for (const [i, seconds] of [30, 40, 50, 60, 300].entries()) {
      minute += seconds / 60;
      h.setMinute(minute);
      await h.bump([ids[i]]);
    }
    const p = await h.pulse();
    // hand-worked: 30 drinks fired in the last 30 min; the barista busy 480 s over 5 drinks (mean
    // 96 s), steadied by 5 × 60 s → (480 + 300) ÷ 10 = 78 s → A = 30/1800 × 78 = 1.3 ≥ 1 barista.
    // With the median gap, 50 s: (250 + 300) ÷ 10 = 55 s, A = 0.92 and "stable".
    expect(p.staffing.now.stable).toBe(false);
    expect(p.staffing.sentence).toMatch(/^The bar can't keep up/);
    expect(p.staffing.inputs).toMatchObject({ arrivals: 30, drinksTimed: 5, meanMakeSeconds: 78, baristas: 1 });
  });
});

describe('a jug bumped as one batch', () => {
  const h = bar('2026-03-02T14:00:00.000Z');

  it('3 lattes fired at 0:00 and bumped as one jug at 2:30 are 50 s a drink each, not 150 s', async () => {
    await h.openShift(1);
    const jug = await h.place('Jug', 3, 'Latte');
    h.setMinute(1);
    await h.start(h.drinkIds(jug));
    h.setMinute(2.5);
    await h.bump(h.drinkIds(jug));

    await h.place('Ahead', 6);
    const next = await h.place('Next', 1);
    // hand-worked: the barista busy 150 s over 3 drinks, steadied by 5 × 60 s: (150 + 300) ÷ 8 =
    // 56.25 s; 6 ahead + 1 = 7 drinks × 56.25 s ÷ 1 barista = 394 s (each latte charged the whole
    // 150 s would be (450 + 300) ÷ 8 × 7 = 656 s)
    expect(next.quotedWaitSeconds).toBe(394);

    const p = await h.pulse();
    // the batch's time shared: each latte took the bar 50 s
    expect(p.perBarista).toEqual([{ name: 'Jonah Reyes', drinks: 3, medianMakeSeconds: 50 }]);
    expect(p.staffing.inputs).toMatchObject({ drinksTimed: 3, meanMakeSeconds: 56.25 });
  });
});

describe('a shift across midnight', () => {
  // 22:00 on 2 March in New York (EST, UTC−5) is 03:00 UTC on 3 March
  const h = bar('2026-03-03T03:00:00.000Z');
  let shift: ShiftView;

  it('Pulse counts the whole shift, whatever the calendar day, and keeps yesterday’s open tickets', async () => {
    shift = (await h.openShift(1)).shift;
    await h.madeAt('Before midnight', 30); // 22:30, ready at 22:33
    h.setMinute(110); // 23:50
    const stillOpen = await h.place('Still open', 1);
    await h.madeAt('After midnight', 150); // 00:30, ready at 00:33

    h.setMinute(165); // 00:45
    const p = await h.pulse();
    const whole = p.windows.find((w) => w.label === 'This shift')!;
    // hand-worked: two tickets done in the shift, 3 min each (fired → ready)
    expect(whole.waits.count).toBe(2);
    expect(whole.waits.medianSeconds).toBe(180);
    // the 23:50 ticket is still open at 00:45: 55 min old
    expect(p.open.map((o) => [o.id, o.customerName, o.ageSeconds])).toEqual([[stillOpen.id, 'Still open', 55 * 60]]);
    // 15-minute slots from 22:00 to 00:45: 12 of them, arrivals in the 22:30, 23:45 and 00:30 slots
    expect(p.buckets).toHaveLength(12);
    expect(p.buckets.map((b) => b.arrivals)).toEqual([0, 0, 1, 0, 0, 0, 0, 1, 0, 0, 1, 0]);
    expect(p.quoteVsActual.count).toBe(2);
  });

  it('the shift report lists its hours in shift order: 22, 23, 0', async () => {
    h.setMinute(180); // 01:00
    // yesterday's ticket is still at the bar: the lead closes anyway
    const close = await h.ctx.lead.post('/api/shifts/current/close').send({ countedCashCents: 100_00, confirmOpenTickets: true });
    expect(close.status, JSON.stringify(close.body)).toBe(200);
    const res = await h.ctx.lead.get(`/api/reports/shift/${shift.id}`);
    expect(res.status).toBe(200);
    const report: ReportView = res.body;
    expect(report.hourly.map((r) => r.hour)).toEqual([22, 23, 0]);
  });
});

describe("today's tips", () => {
  const h = bar('2026-03-02T14:00:00.000Z'); // 09:00 on 2 March in New York
  const setTips = async (tipsOn: boolean) => {
    const res = await (await h.ctx.server.signIn('owner')).put('/api/settings').send({ tipsOn, tipPercents: [10, 15, 20], tipCustom: true });
    expect(res.status, JSON.stringify(res.body)).toBe(200);
  };
  const tipped = async (name: string, tipCents: number, card = false) => {
    const body = { ...orderBody(name, [{ menuItemId: h.ctx.ids.item('Long black') }]), tipCents };
    const res = await h.ctx.cashier.post('/api/orders').send(card ? { ...body, payment: { method: 'card', paymentMethod: 'pm_card_visa' } } : body);
    expect(res.status, JSON.stringify(res.body)).toBe(201);
  };

  it('a café without tips sees none; once they are on, zeros until the first', async () => {
    expect((await h.pulse()).tipsToday).toBeNull();
    await setTips(true);
    expect((await h.pulse()).tipsToday).toEqual({ cents: 0, cashCents: 0, cardCents: 0 });
    await tipped('Ama Reyes', 1_00);
    expect((await h.pulse()).tipsToday).toEqual({ cents: 1_00, cashCents: 1_00, cardCents: 0 });
  });

  it("counts today's only, cash and card apart, as the day's report does", async () => {
    h.setMinute(24 * 60); // 09:00 on 3 March: yesterday's 1.00 no longer counts
    expect((await h.pulse()).tipsToday).toEqual({ cents: 0, cashCents: 0, cardCents: 0 });
    await tipped('Bo Sayer', 80);
    await tipped('Cai Dunn', 1_50, true);
    const { tipsToday } = await h.pulse();
    // 0.80 + 1.50 = 2.30 (by hand)
    expect(tipsToday).toEqual({ cents: 2_30, cashCents: 80, cardCents: 1_50 });
    const day = await h.ctx.lead.get('/api/reports/range?from=2026-03-03&to=2026-03-03');
    expect((day.body as ReportView).tips).toEqual(tipsToday);
  });

  it("tips turned off: today's still show; the next day, nothing", async () => {
    await setTips(false);
    expect((await h.pulse()).tipsToday).toEqual({ cents: 2_30, cashCents: 80, cardCents: 1_50 });
    h.setMinute(2 * 24 * 60); // 09:00 on 4 March
    expect((await h.pulse()).tipsToday).toBeNull();
  });
});
