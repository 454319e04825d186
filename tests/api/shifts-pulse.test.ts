// Shifts and the Pulse board over HTTP: who may run them, opening a shift (its float, baristas on
// bar and wait target reach the location and the Counter's quotes), changing the bar count,
// closing it against a cash count with the report mailed to the owner, and the Pulse numbers
// worked out by hand from tickets bumped at known times.
import { demoCafeId } from '@seeds/demo-cafe';
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it, vi } from 'vitest';
import type { OutboxMail } from '@/domain/outbox';
import type { PulseView } from '@/domain/pulse';
import type { OrderView, ShiftView } from '@/domain/types';
import { demoMenu, manualClock, startTestServer, type DemoLogin, type TestServer } from '../support/test-server';
import { orderBody, type Agent, type LineInput } from './helpers';
import { jsonOf } from '../support/rows';

const MIN = 60_000;
const T0 = '2026-03-02T14:00:00.000Z'; // 09:00 in New York, the demo café's zone
const at = (minutes: number) => new Date(Date.parse(T0) + minutes * MIN).toISOString();

type Ids = Awaited<ReturnType<typeof demoMenu>>;

/** What one server's tests need: the server, its clock and a helper or two bound to it. */
function harness(time: ReturnType<typeof manualClock>) {
  const ctx = {
    server: undefined as unknown as TestServer,
    ids: undefined as unknown as Ids,
    agents: {} as Record<DemoLogin, Agent>,
    userId: {} as Record<DemoLogin, number>,
    locationId: 0,
  };
  beforeAll(async () => {
    ctx.server = await startTestServer({ clock: time.clock });
    for (const login of ['owner', 'lead', 'cashier', 'barista', 'barista2'] as DemoLogin[]) {
      ctx.agents[login] = await ctx.server.signIn(login);
      ctx.userId[login] = (await ctx.server.db('users').where({ username: login }).first('id')).id;
    }
    ctx.ids = await demoMenu(ctx.server);
    ctx.locationId = await demoCafeId(ctx.server.db);
  });
  afterAll(() => ctx.server.close());

  const maxEventId = async () => Number((await ctx.server.db('events').max({ m: 'seq' }).first())?.m ?? 0);
  return {
    ctx,
    maxEventId,
    /** Send a command; answer the response and the event rows it appended. */
    async send(agent: Agent, path: string, body: object) {
      const since = await maxEventId();
      const res = await agent.post(path).send(body);
      const events = await ctx.server.db('events').where('seq', '>', since).orderBy('seq');
      return { res, events };
    },
    /** A cash order (tendered well over the total) placed by the cashier. */
    async place(customerName: string, items: LineInput[], tenderedCents = 100_00): Promise<OrderView> {
      const res = await ctx.agents.cashier.post('/api/orders').send(orderBody(customerName, items, tenderedCents));
      if (res.status !== 201) throw new Error(`order failed: ${res.status} ${JSON.stringify(res.body)}`);
      return res.body.order;
    },
    location: () => ctx.server.db('locations').where({ id: ctx.locationId }).first(),
    orderRow: (id: number) => ctx.server.db('orders').where({ id }).first(),
    async pulse(agent: Agent = ctx.agents.lead): Promise<PulseView> {
      const res = await agent.get('/api/pulse');
      expect(res.status, JSON.stringify(res.body)).toBe(200);
      return res.body;
    },
  };
}

const OPEN_BODY = { openingFloatCents: 15000, baristasOnBar: 2, waitTargetSeconds: 240 };
const SHIFT_COMMANDS = [
  { path: '/api/shifts', body: OPEN_BODY },
  { path: '/api/shifts/current/baristas', body: { baristasOnBar: 3 } },
  { path: '/api/shifts/current/close', body: { countedCashCents: 15000 } },
];

describe('shifts', () => {
  const time = manualClock(T0);
  const nowIso = () => time.clock().toISOString();
  const h = harness(time);
  const { ctx } = h;
  const drink = (name: string): LineInput => ({ menuItemId: ctx.ids.item(name) });

  /** Filled in as the shift runs; the close test checks the till against these. */
  let shift: ShiftView;
  let beforeShift: OrderView;
  const inShift: OrderView[] = [];
  const refunds: { order: OrderView; amountCents: number }[] = [];
  /** What the drawer should hold, worked out from the orders' own answers. */
  let expectedCash: number;

  describe('who may run a shift and read the Pulse', () => {
    it('GET /api/pulse: 401 signed out, 403 for a cashier or a barista, 200 for a lead and the owner', async () => {
      const signedOut = await request(ctx.server.url).get('/api/pulse');
      expect(signedOut.status).toBe(401);
      expect(signedOut.body.error.code).toBe('unauthenticated');
      for (const login of ['cashier', 'barista'] as const) {
        const res = await ctx.agents[login].get('/api/pulse');
        expect(res.status, login).toBe(403);
        expect(res.body.error.code).toBe('forbidden');
      }
      for (const login of ['lead', 'owner'] as const) {
        const res = await ctx.agents[login].get('/api/pulse');
        expect(res.status, login).toBe(200);
        expect(res.body).toMatchObject({ now: nowIso(), targetSeconds: 240, shift: null, expectedCashCents: null });
      }
    });

    it('the three shift commands: 401 signed out, 403 for a cashier or a barista, and nothing is written', async () => {
      const before = await h.maxEventId();
      for (const { path, body } of SHIFT_COMMANDS) {
        const signedOut = await request(ctx.server.url).post(path).send(body);
        expect(signedOut.status, path).toBe(401);
        expect(signedOut.body.error.code).toBe('unauthenticated');
        for (const login of ['cashier', 'barista'] as const) {
          const res = await ctx.agents[login].post(path).send(body);
          expect(res.status, `${login} ${path}`).toBe(403);
          expect(res.body.error.code).toBe('forbidden');
        }
      }
      expect(await h.maxEventId()).toBe(before);
      expect(Number((await ctx.server.db('shifts').count({ n: '*' }).first())?.n)).toBe(0);
    });

    it('a lead and the owner get past the guard (an empty body then fails validation, 400)', async () => {
      for (const { path } of SHIFT_COMMANDS) {
        for (const login of ['lead', 'owner'] as const) {
          const res = await ctx.agents[login].post(path).send({});
          expect(res.status, `${login} ${path}`).toBe(400);
          expect(res.body.error.code).toBe('validation_failed');
        }
      }
    });
  });

  describe('opening a shift', () => {
    it('with no shift open, changing the baristas or closing is 409', async () => {
      for (const { path, body } of SHIFT_COMMANDS.slice(1)) {
        const { res, events } = await h.send(ctx.agents.lead, path, body);
        expect(res.status, path).toBe(409);
        expect(res.body.error.code).toBe('conflict');
        expect(events).toEqual([]);
      }
    });

    it('before a shift, an order has no shift and is quoted for the one barista the café starts with', async () => {
      expect(await h.location()).toMatchObject({ baristas_on_bar: 1, wait_target_seconds: 240 });
      beforeShift = await h.place('Odalys Fenwick', [drink('Latte')]);
      // nothing ahead, no make history: (0 + 1) × 60 s / 1 barista
      expect(beforeShift.quotedWaitSeconds).toBe(60);
      expect((await h.orderRow(beforeShift.id)).shift_id).toBeNull();
    });

    it('POST /api/shifts as the lead: 201 { shift }, one shift.changed event, and the location follows', async () => {
      time.advance(MIN);
      const { res, events } = await h.send(ctx.agents.lead, '/api/shifts', OPEN_BODY);
      expect(res.status, JSON.stringify(res.body)).toBe(201);
      expect(Object.keys(res.body)).toEqual(['shift']);
      shift = res.body.shift;
      expect(shift).toEqual({
        id: expect.any(Number),
        openedAt: nowIso(),
        openedBy: 'Theo Brand',
        openingFloatCents: 15000,
        baristasOnBar: 2,
        waitTargetSeconds: 240,
        closedAt: null,
        closedBy: null,
        expectedCashCents: null,
        countedCashCents: null,
        closeNote: null,
      });
      expect(events).toHaveLength(1);
      expect(events[0]).toMatchObject({ type: 'shift.changed', actor_id: ctx.userId.lead, created_at: nowIso(), location_id: ctx.locationId });
      expect(jsonOf(events[0].payload)).toEqual({ shift });

      expect(await ctx.server.db('shifts').where({ id: shift.id }).first()).toMatchObject({
        location_id: ctx.locationId,
        opened_by: ctx.userId.lead,
        opening_float_cents: 15000,
        baristas_on_bar: 2,
        wait_target_seconds: 240,
        closed_at: null,
      });
      expect(await h.location()).toMatchObject({ baristas_on_bar: 2, wait_target_seconds: 240 });

      const pulse = await h.pulse();
      expect(pulse.shift).toEqual(shift);
      expect(pulse.windows[3].label).toBe('This shift');
      expect(pulse.staffing.inputs.baristas).toBe(2);
    });

    it('a second open is 409 and writes nothing', async () => {
      const { res, events } = await h.send(ctx.agents.owner, '/api/shifts', { ...OPEN_BODY, baristasOnBar: 4 });
      expect(res.status).toBe(409);
      expect(res.body.error.code).toBe('conflict');
      expect(events).toEqual([]);
      expect(Number((await ctx.server.db('shifts').count({ n: '*' }).first())?.n)).toBe(1);
      expect(await h.location()).toMatchObject({ baristas_on_bar: 2 });
    });

    it.each([
      { what: 'no baristas on bar', body: { ...OPEN_BODY, baristasOnBar: 0 }, paths: ['baristasOnBar'] },
      { what: 'a negative float', body: { ...OPEN_BODY, openingFloatCents: -100 }, paths: ['openingFloatCents'] },
      { what: 'a float in dollars, not cents', body: { ...OPEN_BODY, openingFloatCents: 150.5 }, paths: ['openingFloatCents'] },
      { what: 'a target under a minute', body: { ...OPEN_BODY, waitTargetSeconds: 30 }, paths: ['waitTargetSeconds'] },
      { what: 'missing fields', body: { baristasOnBar: 2 }, paths: ['openingFloatCents', 'waitTargetSeconds'] },
    ])('an open with $what is 400 with details', async ({ body, paths }) => {
      // (a shift is open, but validation answers first)
      const { res, events } = await h.send(ctx.agents.lead, '/api/shifts', body);
      expect(res.status).toBe(400);
      expect(res.body.error.code).toBe('validation_failed');
      expect(res.body.error.details.map((d: { path: string }) => d.path).sort()).toEqual(paths);
      for (const d of res.body.error.details) expect(d.message).toEqual(expect.any(String));
      expect(events).toEqual([]);
    });

    it('orders placed while it is open carry its id, and are quoted for its 2 baristas', async () => {
      time.advance(MIN);
      const order = await h.place('Ambrose Kettleby', [drink('Flat white'), drink('Cappuccino'), drink('Espresso')]);
      inShift.push(order);
      // Odalys's latte is still ahead: (1 + 3) × 60 s / 2 baristas
      expect(order.quotedWaitSeconds).toBe(120);
      expect((await h.orderRow(order.id)).shift_id).toBe(shift.id);
    });
  });

  describe('baristas on bar', () => {
    it('POST /api/shifts/current/baristas: 200 { shift }, one event; the location, the Pulse and the quotes follow', async () => {
      time.advance(MIN);
      const { res, events } = await h.send(ctx.agents.lead, '/api/shifts/current/baristas', { baristasOnBar: 3 });
      expect(res.status, JSON.stringify(res.body)).toBe(200);
      expect(res.body).toEqual({ shift: { ...shift, baristasOnBar: 3 } });
      shift = res.body.shift;
      expect(events.map((e) => e.type)).toEqual(['shift.changed']);
      expect(events[0]).toMatchObject({ actor_id: ctx.userId.lead, created_at: nowIso() });
      expect(jsonOf(events[0].payload)).toEqual({ shift });
      expect(await ctx.server.db('shifts').where({ id: shift.id }).first()).toMatchObject({ baristas_on_bar: 3 });
      expect(await h.location()).toMatchObject({ baristas_on_bar: 3 });

      const pulse = await h.pulse();
      expect(pulse.staffing.inputs.baristas).toBe(3);
      expect(pulse.shift).toEqual(shift);

      const order = await h.place('Temperance Oldcastle', [drink('Mocha')]);
      inShift.push(order);
      // four drinks ahead, one in the order, three baristas: 5 × 60 s / 3
      expect(order.quotedWaitSeconds).toBe(100);
    });

    it('a bad count is 400 and changes nothing', async () => {
      for (const body of [{ baristasOnBar: 0 }, { baristasOnBar: 2.5 }, { baristasOnBar: '3' }, {}]) {
        const { res, events } = await h.send(ctx.agents.lead, '/api/shifts/current/baristas', body);
        expect(res.status, JSON.stringify(body)).toBe(400);
        expect(res.body.error).toMatchObject({ code: 'validation_failed', details: [{ path: 'baristasOnBar', message: expect.any(String) }] });
        expect(events).toEqual([]);
      }
      expect(await h.location()).toMatchObject({ baristas_on_bar: 3 });
    });
  });

  describe('closing a shift', () => {
    it('the till expects the float plus the cash taken (the totals, not what was tendered) less cash refunded', async () => {
      time.advance(MIN);
      // cash, paid with a $50 note for a few dollars of coffee
      const cash = await h.place('Henrietta Lusk', [drink('Latte'), { menuItemId: ctx.ids.item('Butter croissant') }], 50_00);
      expect(cash.payment).toMatchObject({ method: 'cash', tenderedCents: 50_00 });
      expect(cash.payment.tenderedCents! - cash.totalCents).toBe(cash.changeCents);
      expect(cash.changeCents).toBeGreaterThan(0);
      inShift.push(cash);
      // counter items only: collected at the till, still cash in the drawer
      inShift.push(await h.place('Ignatius Farrow', [{ menuItemId: ctx.ids.item('Banana bread') }], 20_00));

      // card: money that never enters the drawer
      const cardRes = await ctx.agents.cashier.post('/api/orders').send({
        ...orderBody('Wilhelmina Gaunt', [drink('Iced latte')]),
        payment: { method: 'card', paymentMethod: 'pm_card_visa' },
      });
      expect(cardRes.status, JSON.stringify(cardRes.body)).toBe(201);
      const card: OrderView = cardRes.body.order;
      expect(card).toMatchObject({ paymentStatus: 'paid', payment: { method: 'card' } });
      inShift.push(card);

      // a cash refund by the lead comes out of the drawer; a card refund does not
      time.advance(MIN);
      for (const [order, amountCents, reason] of [
        [cash, 150, 'Croissant was stale'],
        [card, 100, 'Syrup left out'],
      ] as const) {
        const res = await ctx.agents.lead.post(`/api/orders/${order.id}/refund`).send({ amountCents, reason });
        expect(res.status, JSON.stringify(res.body)).toBe(200);
        expect(res.body.order).toMatchObject({ refundedCents: amountCents, paymentStatus: 'paid' });
        refunds.push({ order: res.body.order, amountCents });
      }

      for (const o of inShift) expect((await h.orderRow(o.id)).shift_id, o.customerName).toBe(shift.id);
      const cashTaken = inShift.filter((o) => o.payment.method === 'cash').reduce((sum, o) => sum + o.totalCents, 0);
      const cashRefunded = refunds.filter((r) => r.order.payment.method === 'cash').reduce((sum, r) => sum + r.amountCents, 0);
      expect(cashRefunded).toBe(150);
      expectedCash = 15000 + cashTaken - cashRefunded;

      // the Pulse shows the same figure while the shift runs
      expect((await h.pulse()).expectedCashCents).toBe(expectedCash);
    });

    it('POST /api/shifts/current/close: 200 { shift, mailed: true } with the expected and counted cash; again is 409', async () => {
      const warn = vi.spyOn(console, 'warn');
      time.advance(30 * MIN);
      const expected = expectedCash;
      const counted = expected - 125; // a dollar and a quarter short

      // tickets are still at the bar: the first try is refused with their count, nothing written
      const refused = await h.send(ctx.agents.lead, '/api/shifts/current/close', { countedCashCents: counted });
      expect(refused.res.status).toBe(409);
      expect(refused.res.body.error.code).toBe('open_tickets');
      expect(refused.events).toEqual([]);
      const { res, events } = await h.send(ctx.agents.lead, '/api/shifts/current/close', {
        countedCashCents: counted,
        note: '  A dollar twenty-five short; checked twice  ',
        confirmOpenTickets: true,
      });
      expect(res.status, JSON.stringify(res.body)).toBe(200);
      // a mail problem is logged as a warning and answered mailed: false
      expect(warn.mock.calls).toEqual([]);
      expect(res.body).toEqual({
        shift: {
          ...shift,
          closedAt: nowIso(),
          closedBy: 'Theo Brand',
          expectedCashCents: expected,
          countedCashCents: counted,
          closeNote: 'A dollar twenty-five short; checked twice',
        },
        mailed: true,
      });
      expect(events.map((e) => e.type)).toEqual(['shift.changed']);
      expect(jsonOf(events[0].payload)).toEqual({ shift: res.body.shift });
      expect(await ctx.server.db('shifts').where({ id: shift.id }).first()).toMatchObject({
        closed_at: nowIso(),
        closed_by: ctx.userId.lead,
        expected_cash_cents: expected,
        counted_cash_cents: counted,
      });

      const again = await h.send(ctx.agents.lead, '/api/shifts/current/close', { countedCashCents: counted, confirmOpenTickets: true });
      expect(again.res.status).toBe(409);
      expect(again.res.body.error.code).toBe('conflict');
      expect(again.events).toEqual([]);
      expect((await h.send(ctx.agents.lead, '/api/shifts/current/baristas', { baristasOnBar: 2 })).res.status).toBe(409);

      const pulse = await h.pulse();
      expect(pulse).toMatchObject({ shift: null, expectedCashCents: null });
      expect(pulse.windows[3].label).toBe('Today');
    });

    it('a close with a bad count is 400 (checked on a closed shift: validation answers first)', async () => {
      for (const [body, path] of [
        [{ countedCashCents: -1 }, 'countedCashCents'],
        [{}, 'countedCashCents'],
        [{ countedCashCents: 100, note: 'x'.repeat(201) }, 'note'],
      ] as const) {
        const res = await ctx.agents.lead.post('/api/shifts/current/close').send(body);
        expect(res.status).toBe(400);
        expect(res.body.error).toMatchObject({ code: 'validation_failed', details: [{ path, message: expect.any(String) }] });
      }
    });

    it("the shift report reaches the owner's outbox", async () => {
      const owner = (await ctx.server.db('users').where({ username: 'owner' }).first('email')).email;
      // net = gross (every order of the shift, cash and card) less every refund
      const net = inShift.reduce((s, o) => s + o.totalCents, 0) - refunds.reduce((s, r) => s + r.amountCents, 0);
      let mail: OutboxMail | undefined;
      for (let i = 0; i < 100 && !mail; i++) {
        const res = await ctx.agents.owner.get('/api/outbox');
        expect(res.status).toBe(200);
        mail = (res.body.mails as OutboxMail[]).find((m) => /shift/i.test(m.subject));
        if (!mail) await new Promise((r) => setTimeout(r, 50));
      }
      if (!mail) throw new Error('the shift report never reached the outbox');
      expect(mail.to).toEqual([owner]);
      expect(mail.subject).toBe(`Harbour & Hearth Coffee: shift 2026-03-02, net $${(net / 100).toFixed(2)}`);
      expect(mail.text).toMatch(/^Shift report — Harbour & Hearth Coffee\n/);
      expect(mail.text).toContain(`Orders: ${inShift.length}\n`);
      expect(mail.html).toContain('Shift report');
    });

    it('an order placed after the close has no shift; a new shift brings its own target to the bar and the quotes', async () => {
      time.advance(MIN);
      const late = await h.place('Cosmo Pettigrew', [drink('Long black')]);
      expect((await h.orderRow(late.id)).shift_id).toBeNull();

      // the owner may open one too
      const res = await ctx.agents.owner.post('/api/shifts').send({ openingFloatCents: 0, baristasOnBar: 1, waitTargetSeconds: 300 });
      expect(res.status, JSON.stringify(res.body)).toBe(201);
      expect(res.body.shift).toMatchObject({ openedBy: 'Mara Quill', waitTargetSeconds: 300, baristasOnBar: 1 });
      expect(res.body.shift.id).not.toBe(shift.id);
      expect(await h.location()).toMatchObject({ baristas_on_bar: 1, wait_target_seconds: 300 });
      expect((await ctx.agents.barista.get('/api/tickets')).body.location.waitTargetSeconds).toBe(300);
      const pulse = await h.pulse();
      expect(pulse.targetSeconds).toBe(300);
      expect(pulse.expectedCashCents).toBe(0);

      const next = await h.place('Marisol Penhallow', [drink('Espresso')]);
      expect((await h.orderRow(next.id)).shift_id).toBe(res.body.shift.id);
      // drinks still to make on open tickets: Odalys 1, Ambrose 3, Temperance 1, Henrietta 1, the
      // card's iced latte 1 (partial refunds keep a ticket at the bar), Cosmo 1 = 8; plus this one,
      // for the new shift's 1 barista
      expect(next.quotedWaitSeconds).toBe(540);
    });
  });
});

describe('the Pulse numbers', () => {
  const time = manualClock(T0);
  const h = harness(time);
  const { ctx } = h;
  const drink = (name: string): LineInput => ({ menuItemId: ctx.ids.item(name) });

  /** Move the clock to `minutes` after T0. */
  const setMinute = (minutes: number) => time.set(at(minutes));
  const drinkIds = (order: OrderView) => order.lines.filter((l) => l.station === 'bar').map((l) => l.id);
  async function command(agent: Agent, path: string) {
    const res = await agent.post(path);
    expect(res.status, `${path}: ${JSON.stringify(res.body)}`).toBe(200);
    return res.body.ticket;
  }

  const done: OrderView[] = [];
  let open: OrderView;

  beforeAll(async () => {
    setMinute(0);
    const res = await ctx.agents.lead.post('/api/shifts').send({ openingFloatCents: 100_00, baristasOnBar: 1, waitTargetSeconds: 240 });
    if (res.status !== 201) throw new Error(`could not open the shift: ${res.status}`);
  });

  it('early on, with waits under the target, there is no alert', async () => {
    // A: fired 0:01, bumped whole by Jonah at 0:02 → 60 s
    setMinute(1);
    const a = await h.place('Ysolde Marrack', [drink('Latte'), { menuItemId: ctx.ids.item('Butter croissant') }]);
    setMinute(2);
    await command(ctx.agents.barista, `/api/tickets/${a.id}/bump`);

    // B: fired 0:03; Ines starts the flat white at 0:04; Jonah bumps both drinks at 0:05 → 120 s
    setMinute(3);
    const b = await h.place('Corentin Ashby', [drink('Flat white'), drink('Espresso')]);
    // counter items only: never a ticket at the bar
    setMinute(4);
    await h.place('Perpetua Vane', [{ menuItemId: ctx.ids.item('Almond croissant') }]);
    const [flatWhite, espresso] = drinkIds(b);
    await command(ctx.agents.barista2, `/api/drinks/${flatWhite}/start`);
    setMinute(5);
    await command(ctx.agents.barista, `/api/drinks/${flatWhite}/bump`);
    await command(ctx.agents.barista, `/api/drinks/${espresso}/bump`);

    // C: fired 0:06, started by Jonah at 0:08, bumped at 0:09 → 180 s
    setMinute(6);
    const c = await h.place('Lorcan Tiernan', [drink('Cappuccino')]);
    setMinute(8);
    await command(ctx.agents.barista, `/api/drinks/${drinkIds(c)[0]}/start`);
    setMinute(9);
    await command(ctx.agents.barista, `/api/drinks/${drinkIds(c)[0]}/bump`);
    done.push(a, b, c);

    const pulse = await h.pulse();
    expect(pulse.now).toBe(at(9));
    // [60, 120, 180]: h = 2 · 0.9 = 1.8 → 120 + 0.8 · 60 = 168, under 240
    expect(pulse.windows[1]).toMatchObject({ label: 'Last 30 min', minutes: 30 });
    expect(pulse.windows[1].waits).toMatchObject({ count: 3, medianSeconds: 120, maxSeconds: 180, overTargetShare: 0 });
    expect(pulse.windows[1].waits.p90Seconds).toBeCloseTo(168, 9);
    expect(pulse.alert).toBeNull();
    expect(pulse.open).toEqual([]);
  });

  it('later, the shift window, the open list, the buckets, quote vs actual, per barista and staffing', async () => {
    // D: fired 0:20, Ines starts at 0:22 and bumps at 0:25 → 300 s
    setMinute(20);
    const d = await h.place('Wilhelmina Sprout', [drink('Mocha')]);
    // E: fired 0:21, bumped by Jonah at 0:31 without a start → 600 s
    setMinute(21);
    const e = await h.place('Bartholomew Quince', [drink('Long black')]);
    setMinute(22);
    await command(ctx.agents.barista2, `/api/drinks/${drinkIds(d)[0]}/start`);
    setMinute(25);
    await command(ctx.agents.barista2, `/api/drinks/${drinkIds(d)[0]}/bump`);
    // F: fired 0:30, started by Ines at 0:30:30, still being made
    setMinute(30);
    open = await h.place('Philippa Drumm', [drink('Chai latte')]);
    time.advance(30_000);
    await command(ctx.agents.barista2, `/api/drinks/${drinkIds(open)[0]}/start`);
    setMinute(31);
    await command(ctx.agents.barista, `/api/tickets/${e.id}/bump`);
    done.push(d, e);

    time.advance(15_000); // 0:31:15
    const pulse = await h.pulse();
    expect(pulse.targetSeconds).toBe(240);

    // The shift: sorted [60, 120, 180, 300, 600]
    expect(pulse.windows[3]).toMatchObject({ label: 'This shift', minutes: null });
    const shiftWaits = pulse.windows[3].waits;
    expect(shiftWaits).toMatchObject({ count: 5, medianSeconds: 180, maxSeconds: 600 });
    expect(shiftWaits.meanSeconds).toBeCloseTo((60 + 120 + 180 + 300 + 600) / 5, 9); // 252
    // type 7: h = (5 − 1) · 0.9 = 3.6 → x[3] + 0.6 · (x[4] − x[3]) = 300 + 0.6 · 300 = 480
    expect(shiftWaits.p90Seconds).toBeCloseTo(480, 9);
    // strictly over 240: 300 and 600
    expect(shiftWaits.overTargetShare).toBe(2 / 5);
    // 7 bar drinks since 0:00 over 31.25 min, per 15 min: 7 / 31.25 · 15 = 3.36 → 3.4
    expect(pulse.windows[3].drinksPer15).toBe(3.4);

    // The last 30 min (ready since 0:01:15) hold all five: p90 480 is over the target
    expect(pulse.windows[1].waits.count).toBe(5);
    expect(pulse.alert).toEqual(expect.any(String));
    // durations as they are, in café words: p90 480 s is 8:00; the 240 s target is 4:00
    expect(pulse.alert).toContain('1 ticket in 10 over the last 30 min waited longer than 8:00');
    expect(pulse.alert).toContain('the target is 4:00');

    // Only Philippa's ticket is still open, 75 s old by the clock
    expect(pulse.open).toEqual([
      {
        id: open.id,
        number: open.number,
        customerName: 'Philippa Drumm',
        firedAt: at(30),
        ageSeconds: 75,
        drinks: 1,
        drinksLeft: 1,
        makers: ['Ines Calder'],
      },
    ]);

    // 15-minute slots from the shift's start; the croissant-only order is no arrival
    expect(pulse.buckets.map((b) => b.start)).toEqual([at(0), at(15), at(30)]);
    // 0:00 slot: A, B, C (4 drinks); 0:15 slot: D, E; 0:30 slot: Philippa's
    expect(pulse.buckets.map((b) => [b.arrivals, b.drinks])).toEqual([
      [3, 4],
      [2, 2],
      [1, 1],
    ]);
    // waits by the slot a ticket was fired in: [60, 120, 180] → median 120, p90 168;
    // [300, 600] → median 450, p90 300 + 0.9 · 300 = 570; the open ticket has none yet
    expect(pulse.buckets[0].medianWaitSeconds).toBe(120);
    expect(pulse.buckets[0].p90WaitSeconds).toBeCloseTo(168, 9);
    expect(pulse.buckets[1].medianWaitSeconds).toBe(450);
    expect(pulse.buckets[1].p90WaitSeconds).toBeCloseTo(570, 9);
    expect(pulse.buckets[2]).toMatchObject({ medianWaitSeconds: null, p90WaitSeconds: null });

    // Quote vs actual, from the orders' own answers
    const actual = [60, 120, 180, 300, 600];
    const quoted = done.map((o) => o.quotedWaitSeconds ?? NaN); // a missing quote fails the sums below
    expect(quoted[0]).toBe(60); // nothing ahead, one drink, one barista
    expect(pulse.quoteVsActual.count).toBe(done.length);
    expect(pulse.quoteVsActual.meanQuotedSeconds).toBeCloseTo(quoted.reduce((s, q) => s + q, 0) / 5, 9);
    expect(pulse.quoteVsActual.meanActualSeconds).toBeCloseTo(252, 9);
    expect(pulse.quoteVsActual.shareLongerThanQuoted).toBeCloseTo(actual.filter((a, i) => a > quoted[i]).length / 5, 9);

    // Who made what: whoever bumped it, with each batch's time from that barista's previous bump (or
    // its firing, if later) to its bump. Jonah: A 1 → 2 = 60 s; the flat white 3 → 5 = 120 s; the
    // espresso, bumped at the same moment, gets no time of its own (null); C 6 → 9 = 180 s; E 21 → 31
    // = 600 s → [60, 120, 180, 600], type 7 median 120 + 0.5 · 60 = 150. Ines: D 20 → 25 = 300 s.
    const byName = [...pulse.perBarista].sort((x, y) => x.name.localeCompare(y.name));
    expect(byName).toEqual([
      { name: 'Ines Calder', drinks: 1, medianMakeSeconds: 300 },
      { name: 'Jonah Reyes', drinks: 5, medianMakeSeconds: 150 },
    ]);

    // Staffing: 6 bar drinks fired since 0:01:15 (not Ysolde's latte at 0:01). The pace (Little's
    // law on the barista, docs/check-values.md): busy 0:01:15 → 0:02, 0:03 → 0:05, 0:06 → 0:09 and
    // 0:20 → 0:31 = 45 + 120 + 180 + 660 = 1005 s over the 6 drinks bumped, steadied by 5 × 60 s:
    // 1305/11 = 118.64 s a drink.
    expect(pulse.staffing.inputs).toMatchObject({ arrivals: 6, windowMinutes: 30, paceMinutes: 30, drinksTimed: 6, baristas: 1 });
    expect(pulse.staffing.inputs.meanMakeSeconds).toBeCloseTo(1305 / 11, 9);
    // M/M/1 by hand (docs/check-values.md formulas, c = 1): A = ρ = 6/1800 × 1305/11 = 87/220;
    // P(wait) = ρ; Wq = ρ·h/(1 − ρ) = 87 · 1305 / (11 · 133) = 77.61 s
    expect(pulse.staffing.now.stable).toBe(true);
    expect(pulse.staffing.now.probabilityOfWaiting).toBeCloseTo(87 / 220, 9);
    expect(pulse.staffing.now.meanWaitSeconds).toBeCloseTo((87 * 1305) / (11 * 133), 9);
    // M/M/2: P(wait) = A² / (2 + A) = (87/220)² / (527/220) = 7569/115940
    expect(pulse.staffing.withOneMore.probabilityOfWaiting).toBeCloseTo(7569 / 115940, 9);
    // a drink now: Philippa's chai ahead, 2 drinks × 118.64 s = 237 s; with 2 on bar 1 drink's time, 119 s
    expect(pulse.staffing.waitNow).toEqual({ drinksOnBar: 1, baristas: 1, seconds: 237, withOneMoreSeconds: 119 });
    expect(pulse.staffing.sentence).toMatch(/^With 1 on bar a drink waits/);
  });

  it('with the last 30 minutes quiet again, the alert goes away', async () => {
    setMinute(70);
    const pulse = await h.pulse();
    expect(pulse.windows[1].waits.count).toBe(0);
    expect(pulse.windows[1].waits.p90Seconds).toBeNull();
    expect(pulse.alert).toBeNull();
    // the shift still remembers its five
    expect(pulse.windows[3].waits.count).toBe(5);
    expect(pulse.open.map((o) => [o.id, o.ageSeconds])).toEqual([[open.id, 40 * 60]]);
    expect(pulse.buckets.map((b) => b.start)).toEqual([at(0), at(15), at(30), at(45), at(60)]);
  });

  it('40 drinks in 10 minutes for one barista at a drink a minute: unstable, no mean wait, add a barista', async () => {
    // three hours on: the morning's tickets are out of the last 30 min and the last hour
    const rush: OrderView[] = [];
    for (let i = 0; i < 10; i++) {
      setMinute(180 + i);
      rush.push(
        await h.place(`Rushing Regular ${String.fromCharCode(65 + i)}. Ormsby`, [
          drink('Latte'),
          drink('Cappuccino'),
          drink('Flat white'),
          drink('Long black'),
        ]),
      );
    }
    // an order refunded in full before it is made leaves the bar: its drinks are no demand
    setMinute(185);
    const mistaken = await h.place('Eustace Wrangham', [drink('Mocha'), drink('Mocha')]);
    const refund = await ctx.agents.lead.post(`/api/orders/${mistaken.id}/refund`).send({ reason: 'Rang up twice' });
    expect(refund.status, JSON.stringify(refund.body)).toBe(200);
    expect(refund.body.order).toMatchObject({ status: 'void', paymentStatus: 'refunded' });

    // one drink bumped a minute from 3:01 to 3:10 sets the pace: the barista busy all along
    const first = rush.flatMap(drinkIds).slice(0, 10);
    for (const [k, id] of first.entries()) {
      setMinute(181 + k);
      await command(ctx.agents.barista, `/api/drinks/${id}/bump`);
    }

    const pulse = await h.pulse();
    expect(pulse.open.map((o) => o.id)).not.toContain(mistaken.id);
    // 0:00, 0:15, … 3:00: the 3:00 slot holds the ten rush tickets and their 40 drinks, not the refunded two
    expect(pulse.buckets.at(-1)).toMatchObject({ start: at(180), arrivals: 10, drinks: 40 });
    // hand-worked: busy 3:00 → 3:10 = 600 s over 10 drinks, steadied by 5 × 60 s → 900/15 = 60 s
    expect(pulse.staffing.inputs).toEqual({ arrivals: 40, windowMinutes: 30, paceMinutes: 30, drinksTimed: 10, meanMakeSeconds: 60, baristas: 1 });
    // offered load 4/3 ≥ 1 barista: the queue grows
    expect(pulse.staffing.now).toEqual({ stable: false, probabilityOfWaiting: 1, meanWaitSeconds: null });
    // with two it keeps up, and the wait is a real number
    expect(pulse.staffing.withOneMore.stable).toBe(true);
    expect(pulse.staffing.withOneMore.meanWaitSeconds).toEqual(expect.any(Number));
    expect(pulse.staffing.withOneMore.meanWaitSeconds!).toBeGreaterThan(0);
    expect(pulse.staffing.sentence).toMatch(
      /^The bar can't keep up: 40 drinks came in over the last 30 min, and 1 barista at 1:00 a drink makes at most 30 in that time, so the queue keeps growing\. Add a barista: with 2/,
    );
  });
});
