// Tips through the real API, on SQLite and (project server-pg) PostgreSQL: refused while the café
// has them off; taken on top of the total, never taxed or discounted; cash change and the card
// charge at the payment fake are on total + tip; a retried order keeps its one tip and one charge;
// a refund gives the tip back only past the order's total; the reports and the shift report show
// tips apart from net revenue and tax.
import Papa from 'papaparse';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { formatCents } from '@/domain/money';
import type { ReportView } from '@/domain/reports';
import { tipForPercent } from '@/domain/tips';
import type { OrderView } from '@/domain/types';
import { shiftReportEmail } from '@server/reports';
import { demoMenu, manualClock, startTestServer, type TestServer } from '../support/test-server';
import { orderBody, type Agent, type LineInput } from './helpers';

// The provider's documented test card 4242 4242 4242 4242 succeeds (../shared/reference/check-values.md, "Payments").
const VISA = 'pm_card_visa';

const time = manualClock('2026-03-02T14:00:00.000Z');
const TODAY = '2026-03-02'; // café-local (America/New_York) date of the clock above

let server: TestServer;
let owner: Agent;
let lead: Agent;
let cashier: Agent;
let shiftId: number;
let lines: LineInput[];

const orderRow = (id: number) => server.db('orders').where({ id }).first();
const paymentsOf = (orderId: number) => server.db('payments').where({ order_id: orderId }).orderBy('id');
const countRows = async (table: string) => Number((await server.db(table).count({ n: '*' }).first())?.n);

async function place(body: ReturnType<typeof orderBody> | Record<string, unknown>, status = 201): Promise<OrderView> {
  const res = await cashier.post('/api/orders').send(body);
  expect(res.status, JSON.stringify(res.body)).toBe(status);
  return res.body.order;
}

beforeAll(async () => {
  server = await startTestServer({ clock: time.clock });
  [owner, lead, cashier] = [await server.signIn('owner'), await server.signIn('lead'), await server.signIn('cashier')];
  const ids = await demoMenu(server);
  lines = [{ menuItemId: ids.item('Flat white') }, { menuItemId: ids.item('Banana bread') }];
  const open = await lead.post('/api/shifts').send({ openingFloatCents: 100_00, baristasOnBar: 1, waitTargetSeconds: 240 });
  expect(open.status, JSON.stringify(open.body)).toBe(201);
  shiftId = open.body.shift.id;
});
afterAll(() => server.close());

describe('tips off (the default)', () => {
  it('refuses an order with a tip: 400 on tipCents, and nothing is written', async () => {
    const before = await countRows('orders');
    const res = await cashier.post('/api/orders').send({ ...orderBody('Ada Pell', lines), tipCents: 100 });
    expect(res.status).toBe(400);
    expect(res.body.error.details).toEqual([expect.objectContaining({ path: 'tipCents' })]);
    expect(await countRows('orders')).toBe(before);
  });

  it('takes an order without one (or with a tip of 0) as before', async () => {
    const order = await place({ ...orderBody('Bo Lind', lines), tipCents: 0 });
    expect(order.tipCents).toBe(0);
  });
});

describe('the setting', () => {
  it('refuses a bad percentage or tips on with nothing to offer, naming the field', async () => {
    for (const tipPercents of [[0], [51], [10, 15, 20, 25], [15, 15], [12.5]]) {
      const res = await owner.put('/api/settings').send({ tipsOn: true, tipPercents });
      expect(res.status, JSON.stringify(tipPercents)).toBe(400);
      expect(res.body.error.details[0].path).toMatch(/^tipPercents/);
    }
    const res = await owner.put('/api/settings').send({ tipsOn: true, tipPercents: [], tipCustom: false });
    expect(res.status).toBe(400);
    expect(res.body.error.details).toEqual([expect.objectContaining({ path: 'tipPercents' })]);
    expect((await owner.get('/api/settings')).body.settings.tipsOn).toBe(false);
  });

  it('a cashier may not turn tips on', async () => {
    expect((await cashier.put('/api/settings').send({ tipsOn: true })).status).toBe(403);
  });

  it('the owner turns tips on with 10/15/20 % and a custom amount; the Counter’s menu carries it', async () => {
    const res = await owner.put('/api/settings').send({ tipsOn: true, tipPercents: [10, 15, 20], tipCustom: true });
    expect(res.status, JSON.stringify(res.body)).toBe(200);
    expect(res.body.settings).toMatchObject({ tipsOn: true, tipPercents: [10, 15, 20], tipCustom: true });
    const menu = await cashier.get('/api/menu');
    expect(menu.body.location.tips).toEqual({ on: true, percents: [10, 15, 20], custom: true });
  });
});

describe('an order with a tip', () => {
  let plain: OrderView;
  let cash: OrderView;
  let card: OrderView;

  it('is not taxed or discounted: totals as without it; cash change on total + tip', async () => {
    plain = await place(orderBody('Cy Orr', lines));
    const tip = tipForPercent(plain.totalCents, 15);
    cash = await place({ ...orderBody('Di Moss', lines, 20_00), tipCents: tip });
    expect(cash).toMatchObject({
      subtotalCents: plain.subtotalCents,
      taxCents: plain.taxCents,
      totalCents: plain.totalCents,
      tipCents: tip,
      changeCents: 20_00 - plain.totalCents - tip,
    });
    const [payment] = await paymentsOf(cash.id);
    expect(payment).toMatchObject({ method: 'cash', amount_cents: plain.totalCents + tip, change_cents: 20_00 - plain.totalCents - tip });
    expect((await orderRow(cash.id)).tip_cents).toBe(tip);
  });

  it('with a discount: the discount is on the lines, the tip untouched', async () => {
    const discount = { kind: 'percent', value: 10, reason: 'Regular customer' };
    const without = await (async () => {
      const res = await lead.post('/api/orders').send({ ...orderBody('Ed Vale', lines), discount });
      expect(res.status, JSON.stringify(res.body)).toBe(201);
      return res.body.order as OrderView;
    })();
    const res = await lead.post('/api/orders').send({ ...orderBody('Fi Rook', lines), discount, tipCents: 150 });
    expect(res.status, JSON.stringify(res.body)).toBe(201);
    expect(res.body.order).toMatchObject({ discountCents: without.discountCents, taxCents: without.taxCents, totalCents: without.totalCents, tipCents: 150 });
  });

  it('refuses cash that covers the total but not the tip (400 on the tendered field)', async () => {
    const res = await cashier.post('/api/orders').send({ ...orderBody('Gus Tam', lines, plain.totalCents), tipCents: 100 });
    expect(res.status).toBe(400);
    expect(res.body.error.details).toEqual([expect.objectContaining({ path: 'payment.tenderedCents' })]);
  });

  it('refuses a tip past the bound, a negative or a fractional one', async () => {
    for (const tipCents of [Math.max(plain.totalCents, 20_00) + 1, -1, 1.5, 1_000_01]) {
      const res = await cashier.post('/api/orders').send({ ...orderBody('Hal Iver', lines), tipCents });
      expect(res.status, String(tipCents)).toBe(400);
      expect(res.body.error.details).toEqual([expect.objectContaining({ path: 'tipCents' })]);
    }
  });

  it('by card: the fake is charged total + tip, once, however often the order is retried', async () => {
    const tip = 250; // a custom amount
    const body = { ...orderBody('Ivy Nash', lines), tipCents: tip, payment: { method: 'card', paymentMethod: VISA } };
    card = await place(body);
    expect(card).toMatchObject({ paymentStatus: 'paid', totalCents: plain.totalCents, taxCents: plain.taxCents, tipCents: tip });
    // the retry sends the same body; a retry with another tip still answers the order as taken
    const replay = await place(body, 200);
    const changed = await place({ ...body, tipCents: 999 }, 200);
    expect([replay.id, replay.tipCents, changed.id, changed.tipCents]).toEqual([card.id, tip, card.id, tip]);
    expect(Number((await server.db('orders').where({ client_order_id: body.clientOrderId }).count({ n: '*' }).first())?.n)).toBe(1);
    const payments = await paymentsOf(card.id);
    expect(payments.map((p) => [p.status, p.amount_cents])).toEqual([['succeeded', plain.totalCents + tip]]);
    const charged = server.payments
      .fake!.events()
      .filter((e) => e.type === 'payment_intent.succeeded' && e.data.object.id === card.payment.providerId)
      .map((e) => e.data.object.amount);
    expect(charged).toEqual([plain.totalCents + tip]);
  });

  describe('refunds', () => {
    it('a partial refund gives back the order first; more than total + tip is refused', async () => {
      const over = await lead.post(`/api/orders/${cash.id}/refund`).send({ amountCents: cash.totalCents + cash.tipCents + 1, reason: 'Too much' });
      expect(over.status).toBe(400);
      expect(over.body.error.details).toEqual([
        expect.objectContaining({ path: 'amountCents', message: `At most ${cash.totalCents + cash.tipCents} cents can be refunded` }),
      ]);
      const part = await lead.post(`/api/orders/${cash.id}/refund`).send({ amountCents: 100, reason: 'Cold drink' });
      expect(part.status, JSON.stringify(part.body)).toBe(200);
      expect(part.body.order).toMatchObject({ refundedCents: 100, paymentStatus: 'paid' });
    });

    it('a full refund gives the tip back too, by card through the fake', async () => {
      const res = await lead.post(`/api/orders/${card.id}/refund`).send({ reason: 'Wrong order' });
      expect(res.status, JSON.stringify(res.body)).toBe(200);
      expect(res.body.order).toMatchObject({ refundedCents: card.totalCents + card.tipCents, paymentStatus: 'refunded' });
      const rows = await server.db('refunds').where({ order_id: card.id });
      expect(rows.map((r) => r.amount_cents)).toEqual([card.totalCents + card.tipCents]);
      const again = await lead.post(`/api/orders/${card.id}/refund`).send({ reason: 'Again' });
      expect(again.status).toBe(409);
    });
  });

  describe('reports', () => {
    // Worked by hand from the orders above: the cash order's tip is kept (its partial refund of 100
    // cents is the order's money); the card order was refunded in full, tip and all.
    const expectTips = (r: ReportView) => {
      expect(r.tips).toEqual({ cents: cash.tipCents + 150, cashCents: cash.tipCents + 150, cardCents: 0 });
    };

    it('the day: tips apart, net revenue and tax the same as without them', async () => {
      const res = await lead.get(`/api/reports/range?from=${TODAY}&to=${TODAY}`);
      expect(res.status, JSON.stringify(res.body)).toBe(200);
      const r: ReportView = res.body;
      expectTips(r);
      // the same figures from the order rows without the tip
      const rows = await server.db('orders').whereIn('payment_status', ['paid', 'refunded']);
      const sum = (f: (o: Record<string, number>) => number) => rows.reduce((a, o) => a + f(o), 0);
      expect(r.grossCents).toBe(sum((o) => o.total_cents));
      expect(r.taxCents).toBe(sum((o) => o.tax_cents));
      expect(r.refundsCents).toBe(sum((o) => Math.min(o.refunded_cents, o.total_cents)));
      expect(r.netCents).toBe(r.grossCents - r.refundsCents);
      expect(r.paymentMix.cash.cents + r.paymentMix.card.cents).toBe(r.grossCents);
    });

    it('the shift report, its CSV and the drawer: the cash tips are in the drawer, the tips row says them', async () => {
      const res = await lead.get(`/api/reports/shift/${shiftId}`);
      expect(res.status).toBe(200);
      expectTips(res.body);
      // the shift report mail the owner gets at close says them on a line of their own
      const kept = formatCents(cash.tipCents + 150);
      expect(shiftReportEmail(res.body, { name: 'Harbour & Hearth Coffee' }).text).toContain(`Tips (not in net or tax): ${kept} · cash ${kept} · card $0.00`);
      const csv = Papa.parse<string[]>((await lead.get(`/api/reports/shift/${shiftId}.csv`)).text.trim(), { skipEmptyLines: true }).data;
      const tipRows = csv.filter((row) => row[0] === 'Tips');
      expect(tipRows.map((row) => row.slice(1))).toEqual([
        ['', 'total (USD)', ((cash.tipCents + 150) / 100).toFixed(2)],
        ['cash', 'kept (USD)', ((cash.tipCents + 150) / 100).toFixed(2)],
        ['card', 'kept (USD)', '0.00'],
      ]);
      const cashIn = Number((await server.db('payments').where({ method: 'cash', status: 'succeeded' }).sum({ s: 'amount_cents' }).first())?.s);
      const close = await lead.post('/api/shifts/current/close').send({ countedCashCents: 0, confirmOpenTickets: true });
      expect(close.status, JSON.stringify(close.body)).toBe(200);
      // the float, the cash taken (tips included), less the 100 cents handed back
      expect((await server.db('shifts').where({ id: shiftId }).first()).expected_cash_cents).toBe(100_00 + cashIn - 100);
    });
  });
});
