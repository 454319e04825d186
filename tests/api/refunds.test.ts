// Giving money back and voiding orders: only a shift lead (or the owner) may; a full refund of an
// order still at the bar takes it off the bar; a void is for an order that was never paid.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { OrderView, TicketView } from '@/domain/types';
import { demoMenu, manualClock, startTestServer, type TestServer } from '../support/test-server';
import { orderBody, type Agent, type LineInput } from './helpers';
import { jsonOf } from '../support/rows';

// The provider's documented test cards, see ../shared/reference/check-values.md ("Payments"):
// 4242 4242 4242 4242 succeeds, 4000 0000 0000 0002 is declined.
const VISA = 'pm_card_visa';
const DECLINED = 'pm_card_chargeDeclined';

const time = manualClock('2026-03-02T14:00:00.000Z');
const nowIso = () => time.clock().toISOString();

let server: TestServer;
let cashier: Agent;
let lead: Agent;
let leadId: number;
let ids: Awaited<ReturnType<typeof demoMenu>>;

beforeAll(async () => {
  server = await startTestServer({ clock: time.clock });
  [cashier, lead] = [await server.signIn('cashier'), await server.signIn('lead')];
  leadId = (await server.db('users').where({ username: 'lead' }).first()).id;
  ids = await demoMenu(server);
});
afterAll(() => server.close());

const drinks = (): LineInput[] => [{ menuItemId: ids.item('Flat white') }, { menuItemId: ids.item('Banana bread') }];

async function cardOrder(customerName: string, paymentMethod = VISA, items = drinks()) {
  const body = { ...orderBody(customerName, items), payment: { method: 'card' as const, paymentMethod } };
  const res = await cashier.post('/api/orders').send(body);
  return { body, res };
}
async function paidCardOrder(customerName: string): Promise<OrderView> {
  const { res } = await cardOrder(customerName);
  expect(res.status, JSON.stringify(res.body)).toBe(201);
  return res.body.order;
}
async function paidCashOrder(customerName: string, items = drinks()): Promise<OrderView> {
  const res = await cashier.post('/api/orders').send(orderBody(customerName, items, 50_00));
  expect(res.status, JSON.stringify(res.body)).toBe(201);
  return res.body.order;
}
async function declinedOrder(customerName: string) {
  const { body, res } = await cardOrder(customerName, DECLINED);
  expect(res.status).toBe(402);
  const order: OrderView = (await cashier.get(`/api/orders/${res.body.error.details.orderId}`)).body.order;
  return { body, order };
}

const orderRow = (id: number) => server.db('orders').where({ id }).first();
const refundRows = (orderId: number) => server.db('refunds').where({ order_id: orderId }).orderBy('id');
const countRows = async (table: string) => Number((await server.db(table).count({ n: '*' }).first())?.n);
const maxEventId = async () => Number((await server.db('events').max({ m: 'id' }).first())?.m ?? 0);
const eventsAfter = (id: number) => server.db('events').where('id', '>', id).orderBy('id');
async function openTicketIds(): Promise<number[]> {
  const res = await lead.get('/api/tickets?view=open');
  expect(res.status).toBe(200);
  return res.body.tickets.map((t: TicketView) => t.id);
}

/** Send a command and check it was refused: the status and code, and not one row written. */
async function expectRefused(
  send: () => PromiseLike<{ status: number; body: { error: { code: string; message: string; details?: { path: string; message: string }[] } } }>,
  status: number,
  code: string,
  orderId: number,
) {
  const before = { order: await orderRow(orderId), refunds: await countRows('refunds'), payments: await countRows('payments'), seq: await maxEventId() };
  const res = await send();
  expect(res.status, JSON.stringify(res.body)).toBe(status);
  expect(res.body.error.code).toBe(code);
  expect(await orderRow(orderId)).toEqual(before.order);
  expect(await countRows('refunds')).toBe(before.refunds);
  expect(await countRows('payments')).toBe(before.payments);
  expect(await eventsAfter(before.seq)).toEqual([]);
  return res;
}

describe('POST /api/orders/:id/refund', () => {
  it('is refused to a cashier with 403, and nothing changes', async () => {
    const order = await paidCardOrder('Winifred Holt');
    await expectRefused(() => cashier.post(`/api/orders/${order.id}/refund`).send({ reason: 'Customer changed their mind' }), 403, 'forbidden', order.id);
    expect(await countRows('refunds')).toBe(0);
    expect((await cashier.get(`/api/orders/${order.id}`)).body.order).toEqual(order);
  });

  it('a full refund of a card order still at the bar: refunded by the provider, off the bar, one event; a second refund is 409', async () => {
    const order = await paidCardOrder('Aurelio Banks');
    expect(await openTicketIds()).toContain(order.id);
    const since = await maxEventId();

    const res = await lead.post(`/api/orders/${order.id}/refund`).send({ reason: 'Wrong milk, customer left' });
    expect(res.status, JSON.stringify(res.body)).toBe(200);
    expect(res.body.order).toMatchObject({
      id: order.id,
      paymentStatus: 'refunded',
      refundedCents: order.totalCents,
      totalCents: order.totalCents,
      status: 'void',
      voidReason: 'Wrong milk, customer left',
      payment: { method: 'card', providerId: order.payment.providerId },
    });
    expect(await openTicketIds()).not.toContain(order.id);

    const payment = await server.db('payments').where({ order_id: order.id, status: 'succeeded' }).first();
    const refunds = await refundRows(order.id);
    expect(refunds).toEqual([
      expect.objectContaining({
        payment_id: payment.id,
        amount_cents: order.totalCents,
        reason: 'Wrong milk, customer left',
        created_by: leadId,
        created_at: nowIso(),
      }),
    ]);
    expect(refunds[0].provider_id).toMatch(/^re_/);

    const events = await eventsAfter(since);
    expect(events.map((e) => e.type)).toEqual(['order.refunded']);
    expect(events[0].actor_id).toBe(leadId);
    expect(jsonOf(events[0].payload).ticket).toMatchObject({ id: order.id, status: 'void' });

    await expectRefused(() => lead.post(`/api/orders/${order.id}/refund`).send({ reason: 'Again, by mistake' }), 409, 'conflict', order.id);
    expect(await refundRows(order.id)).toHaveLength(1);
  });

  it('a partial refund of a cash order keeps it paid and at the bar; more than is left is 400; the rest refunds it in full', async () => {
    const order = await paidCashOrder('Perdita Lowe');
    const res = await lead.post(`/api/orders/${order.id}/refund`).send({ amountCents: 150, reason: 'Cake was stale' });
    expect(res.status, JSON.stringify(res.body)).toBe(200);
    expect(res.body.order).toMatchObject({ paymentStatus: 'paid', refundedCents: 150, status: 'open', voidReason: null });
    expect(await openTicketIds()).toContain(order.id);
    expect(await refundRows(order.id)).toEqual([
      expect.objectContaining({ amount_cents: 150, reason: 'Cake was stale', provider_id: null, created_by: leadId }),
    ]);

    const left = order.totalCents - 150;
    const over = await expectRefused(
      () => lead.post(`/api/orders/${order.id}/refund`).send({ amountCents: left + 1, reason: 'Too much' }),
      400,
      'validation_failed',
      order.id,
    );
    expect(over.body.error.details).toEqual([{ path: 'amountCents', message: expect.stringContaining(String(left)) }]);

    const rest = await lead.post(`/api/orders/${order.id}/refund`).send({ reason: 'Customer left after all' });
    expect(rest.status).toBe(200);
    expect(rest.body.order).toMatchObject({ paymentStatus: 'refunded', refundedCents: order.totalCents, status: 'void' });
    expect((await refundRows(order.id)).map((r) => r.amount_cents)).toEqual([150, left]);
  });

  it('a partial refund of a card order goes to the provider too, and so does the rest', async () => {
    const order = await paidCardOrder('Evander Stoke');
    const part = await lead.post(`/api/orders/${order.id}/refund`).send({ amountCents: 200, reason: 'Drink was cold' });
    expect(part.status, JSON.stringify(part.body)).toBe(200);
    expect(part.body.order).toMatchObject({ paymentStatus: 'paid', refundedCents: 200, status: 'open' });
    const rest = await lead.post(`/api/orders/${order.id}/refund`).send({ reason: 'Customer left' });
    expect(rest.status, JSON.stringify(rest.body)).toBe(200);
    expect(rest.body.order).toMatchObject({ paymentStatus: 'refunded', refundedCents: order.totalCents, status: 'void' });
    const refunds = await refundRows(order.id);
    expect(refunds.map((r) => r.amount_cents)).toEqual([200, order.totalCents - 200]);
    expect(refunds.every((r) => /^re_/.test(r.provider_id))).toBe(true);
    expect(refunds[0].provider_id).not.toBe(refunds[1].provider_id);
  });

  it('two refunds of one card order at once: what the provider gave back is what is recorded', async () => {
    // Two leads at two tills refund parts of the same order at the same moment.
    const order = await paidCardOrder('Leontyne Aske');
    const [a, b] = await Promise.all([
      lead.post(`/api/orders/${order.id}/refund`).send({ amountCents: 100, reason: 'Milk was off' }),
      lead.post(`/api/orders/${order.id}/refund`).send({ amountCents: 200, reason: 'Cake was stale' }),
    ]);
    expect(
      [a.status, b.status].every((s) => s === 200 || s === 409),
      JSON.stringify([a.body, b.body]),
    ).toBe(true);
    const recorded = (await refundRows(order.id)).reduce((sum, r) => sum + r.amount_cents, 0);
    expect((await orderRow(order.id)).refunded_cents).toBe(recorded);

    // If the provider had given back more than is recorded, it would refuse this: refunding what
    // the order says is left must go through and leave the order refunded in full.
    const rest = await lead.post(`/api/orders/${order.id}/refund`).send({ reason: 'Customer left' });
    expect(rest.status, JSON.stringify(rest.body)).toBe(200);
    expect(rest.body.order).toMatchObject({ paymentStatus: 'refunded', refundedCents: order.totalCents });
  });

  it('the same refund sent twice at once (a retried request) gives the money back once', async () => {
    const order = await paidCardOrder('Barnabas Oddie');
    const send = () => lead.post(`/api/orders/${order.id}/refund`).send({ amountCents: 150, reason: 'Drink was cold' });
    const [a, b] = await Promise.all([send(), send()]);
    expect([a.status, b.status]).toContain(200);
    for (const r of [a, b]) expect([200, 409]).toContain(r.status);
    const refunds = await refundRows(order.id);
    expect(refunds.map((r) => r.amount_cents)).toEqual([150]);
    expect((await orderRow(order.id)).refunded_cents).toBe(150);
  });

  it('an order that was already collected stays collected when refunded in full', async () => {
    // Counter items only: collected as soon as it is paid.
    const order = await paidCashOrder('Philippa Crane', [{ menuItemId: ids.item('Butter croissant') }]);
    expect(order.status).toBe('collected');
    const res = await lead.post(`/api/orders/${order.id}/refund`).send({ reason: 'Dropped on the floor' });
    expect(res.status).toBe(200);
    expect(res.body.order).toMatchObject({ paymentStatus: 'refunded', status: 'collected', voidReason: null });
  });

  it('needs a reason: 400 with the field named, nothing refunded', async () => {
    const order = await paidCashOrder('Godfrey Lanes');
    for (const body of [{}, { amountCents: 100 }, { reason: 'no' }, { reason: '   ' }]) {
      const res = await expectRefused(() => lead.post(`/api/orders/${order.id}/refund`).send(body), 400, 'validation_failed', order.id);
      expect(res.body.error.details).toEqual([{ path: 'reason', message: expect.any(String) }]);
    }
    for (const amountCents of [0, -5, 1.5]) {
      const res = await expectRefused(
        () => lead.post(`/api/orders/${order.id}/refund`).send({ amountCents, reason: 'Bad amount' }),
        400,
        'validation_failed',
        order.id,
      );
      expect(res.body.error.details).toEqual([{ path: 'amountCents', message: expect.any(String) }]);
    }
  });

  it('an order never paid is not refunded (409: void it), an unknown one is 404', async () => {
    const { order } = await declinedOrder('Marlowe Finch');
    await expectRefused(() => lead.post(`/api/orders/${order.id}/refund`).send({ reason: 'Never paid' }), 409, 'conflict', order.id);
    const res = await lead.post('/api/orders/999999/refund').send({ reason: 'Nobody' });
    expect(res.status).toBe(404);
    expect(res.body.error.code).toBe('not_found');
  });
});

describe('POST /api/orders/:id/void', () => {
  it('voids a waiting (declined card) order for a lead with a reason; a cashier gets 403', async () => {
    const { body, order } = await declinedOrder('Seraphine Dunmore');
    await expectRefused(() => cashier.post(`/api/orders/${order.id}/void`).send({ reason: 'Customer left' }), 403, 'forbidden', order.id);
    await expectRefused(() => lead.post(`/api/orders/${order.id}/void`).send({}), 400, 'validation_failed', order.id);

    const since = await maxEventId();
    const res = await lead.post(`/api/orders/${order.id}/void`).send({ reason: 'Customer left' });
    expect(res.status, JSON.stringify(res.body)).toBe(200);
    expect(res.body.order).toMatchObject({ id: order.id, status: 'void', voidReason: 'Customer left', paymentStatus: 'unpaid', firedAt: null });
    const events = await eventsAfter(since);
    expect(events.map((e) => e.type)).toEqual(['order.voided']);
    expect(events[0].actor_id).toBe(leadId);
    expect(jsonOf(events[0].payload).ticket).toMatchObject({ id: order.id, status: 'void' });
    expect(await openTicketIds()).not.toContain(order.id);
    // the declined attempt is closed at the provider as well
    expect((await server.db('payments').where({ order_id: order.id })).map((p) => p.status)).toEqual(['canceled']);

    // A voided order can't be brought back by sending it again with a good card.
    const resend = await cashier.post('/api/orders').send({ ...body, payment: { method: 'card', paymentMethod: VISA } });
    expect(resend.status).toBe(200);
    expect(resend.body.order).toMatchObject({ id: order.id, status: 'void', paymentStatus: 'unpaid' });
    expect(await server.db('payments').where({ order_id: order.id, status: 'succeeded' })).toEqual([]);

    await expectRefused(() => lead.post(`/api/orders/${order.id}/void`).send({ reason: 'Twice' }), 409, 'conflict', order.id);
  });

  it('refuses to void a paid order (409: refund it) and an unknown one (404)', async () => {
    const order = await paidCardOrder('Crispin Yarrow');
    await expectRefused(() => lead.post(`/api/orders/${order.id}/void`).send({ reason: 'Changed mind' }), 409, 'conflict', order.id);
    const cash = await paidCashOrder('Crispin Yarrow');
    await expectRefused(() => lead.post(`/api/orders/${cash.id}/void`).send({ reason: 'Changed mind' }), 409, 'conflict', cash.id);
    const res = await lead.post('/api/orders/999999/void').send({ reason: 'Nobody' });
    expect(res.status).toBe(404);
  });
});

describe('the owner', () => {
  it('may refund too', async () => {
    const owner = await server.signIn('owner');
    const order = await paidCashOrder('Rosamund Keel');
    const res = await owner.post(`/api/orders/${order.id}/refund`).send({ amountCents: 100, reason: 'Goodwill' });
    expect(res.status).toBe(200);
    expect(res.body.order.refundedCents).toBe(100);
  });
});
