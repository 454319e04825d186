// One drink of a paid order: its own money back (a drink refund) or made again at no charge (a
// remake). Each against a real server on a freshly migrated database (SQLite here, PostgreSQL in
// the server-pg project), and each many at once.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { OrderView, TicketView } from '@/domain/types';
import { demoMenu, manualClock, startTestServer, type TestServer } from '../support/test-server';
import { orderBody, type Agent, type LineInput } from './helpers';
import { jsonOf } from '../support/rows';

const time = manualClock('2026-03-02T14:00:00.000Z');
const nowIso = () => time.clock().toISOString();
const AT_ONCE = 8;

let server: TestServer;
let cashier: Agent;
let barista: Agent;
let lead: Agent;
let leadId: number;
let cashierId: number;
let ids: Awaited<ReturnType<typeof demoMenu>>;
/** Terminals for the many-at-once tests, signed in once (sign-ins are paced per name). */
let refunders: Agent[];
let remakers: Agent[];

beforeAll(async () => {
  server = await startTestServer({ clock: time.clock });
  [cashier, barista, lead] = [await server.signIn('cashier'), await server.signIn('barista'), await server.signIn('lead')];
  leadId = (await server.db('users').where({ username: 'lead' }).first()).id;
  cashierId = (await server.db('users').where({ username: 'cashier' }).first()).id;
  ids = await demoMenu(server);
  const [leads, owners, cashiers] = [[lead], [], []] as Agent[][];
  for (let i = 0; i < AT_ONCE / 2; i++) {
    if (i > 0) leads.push(await server.signIn('lead'));
    owners.push(await server.signIn('owner'));
    cashiers.push(await server.signIn('cashier'));
  }
  refunders = [...leads, ...owners];
  remakers = [...cashiers, ...leads];
});
afterAll(() => server.close());

// The demo café: 8.25 % tax added on top (seeds); Flat white $4.60, Espresso $3.20, Banana bread $3.95.
const FLAT_WHITE = (): LineInput => ({ menuItemId: ids.item('Flat white') });
const ESPRESSO = (): LineInput => ({ menuItemId: ids.item('Espresso') });
const BANANA_BREAD = (): LineInput => ({ menuItemId: ids.item('Banana bread') });

async function paidOrder(customerName: string, items: LineInput[]): Promise<OrderView> {
  const res = await cashier.post('/api/orders').send(orderBody(customerName, items, 50_00));
  expect(res.status, JSON.stringify(res.body)).toBe(201);
  return res.body.order;
}
const barLines = (o: OrderView) => o.lines.filter((l) => l.station === 'bar');
const orderRow = (id: number) => server.db('orders').where({ id }).first();
const itemRows = (orderId: number) => server.db('order_items').where({ order_id: orderId }).orderBy('id');
const countRows = async (table: string) => Number((await server.db(table).count({ n: '*' }).first())?.n);
const maxEventId = async () => Number((await server.db('events').max({ m: 'id' }).first())?.m ?? 0);
const eventsAfter = (id: number) => server.db('events').where('id', '>', id).orderBy('id');
async function openTicket(orderId: number): Promise<TicketView | undefined> {
  const res = await lead.get('/api/tickets?view=open');
  expect(res.status).toBe(200);
  return res.body.tickets.find((t: TicketView) => t.id === orderId);
}
async function bump(drinkId: number) {
  const res = await barista.post(`/api/drinks/${drinkId}/bump`);
  expect(res.status, JSON.stringify(res.body)).toBe(200);
}

/** Send a command and check it was refused: status and code, and not one row written. */
async function expectRefused(
  send: () => PromiseLike<{ status: number; body: { error: { code: string; details?: { path: string }[] } } }>,
  status: number,
  code: string,
  orderId: number,
) {
  const before = {
    order: await orderRow(orderId),
    items: await itemRows(orderId),
    refunds: await countRows('refunds'),
    events: await maxEventId(),
  };
  const res = await send();
  expect(res.status, JSON.stringify(res.body)).toBe(status);
  expect(res.body.error.code).toBe(code);
  expect(await orderRow(orderId)).toEqual(before.order);
  expect(await itemRows(orderId)).toEqual(before.items);
  expect(await countRows('refunds')).toBe(before.refunds);
  expect(await eventsAfter(before.events)).toEqual([]);
  return res;
}

describe('POST /api/drinks/:id/refund', () => {
  it("gives back a drink's share of the total, names it on the refund, and an unmade drink leaves the bar live; again is 409", async () => {
    const order = await paidOrder('Odile Marsh', [FLAT_WHITE(), ESPRESSO(), BANANA_BREAD()]);
    // worked by hand: subtotal 460 + 320 + 395 = 1175; tax 8.25 % of 1175 = 96.94 → 97; total 1272
    expect(order.totalCents).toBe(1272);
    const [flatWhite, espresso] = barLines(order);
    const since = await maxEventId();

    const res = await lead.post(`/api/drinks/${flatWhite.id}/refund`).send({ reason: 'Customer could not wait' });
    expect(res.status, JSON.stringify(res.body)).toBe(200);
    // 1272 − round(1272 × 715 / 1175) = 1272 − 774 = 498 (4.60 × 1.0825 = 4.9795, by hand)
    expect(res.body.order).toMatchObject({ refundedCents: 498, paymentStatus: 'paid', status: 'open' });
    expect(res.body.order.lines.find((l: { id: number }) => l.id === flatWhite.id).refundedAt).toBe(nowIso());
    const refunds = await server.db('refunds').where({ order_id: order.id });
    expect(refunds).toEqual([
      expect.objectContaining({ amount_cents: 498, order_item_id: flatWhite.id, reason: 'Customer could not wait', created_by: leadId, provider_id: null }),
    ]);
    // off the bar: the ticket keeps only the espresso
    expect((await openTicket(order.id))!.drinks.map((d) => d.id)).toEqual([espresso.id]);
    const events = await eventsAfter(since);
    expect(events.map((e) => e.type)).toEqual(['order.refunded']);
    expect(jsonOf(events[0].payload).ticket.drinks.map((d: { id: number }) => d.id)).toEqual([espresso.id]);

    await expectRefused(() => lead.post(`/api/drinks/${flatWhite.id}/refund`).send({ reason: 'Again, by mistake' }), 409, 'conflict', order.id);

    // the espresso: what the drinks left are worth less what they are worth without it:
    // round(1272 × 715 / 1175) − round(1272 × 395 / 1175) = 774 − 428 = 346 (3.20 × 1.0825 = 3.464)
    const second = await lead.post(`/api/drinks/${espresso.id}/refund`).send({ reason: 'Customer could not wait' });
    expect(second.status, JSON.stringify(second.body)).toBe(200);
    expect(second.body.order).toMatchObject({ refundedCents: 498 + 346 });
    // nothing on the ticket was made: it leaves the bar; the banana bread is still paid for
    expect(second.body.order).toMatchObject({ status: 'void', paymentStatus: 'paid', voidReason: 'Customer could not wait' });
    expect(await openTicket(order.id)).toBeUndefined();
    // the rest (the banana bread's share, 428) is an amount refund, and then the order is refunded in full
    const rest = await lead.post(`/api/orders/${order.id}/refund`).send({ reason: 'Everything back' });
    expect(rest.status, JSON.stringify(rest.body)).toBe(200);
    expect(rest.body.order).toMatchObject({ refundedCents: 1272, paymentStatus: 'refunded' });
  });

  it('a drink already made stays on its ticket, done; refunding the last drink still to make makes the ticket ready', async () => {
    const order = await paidOrder('Basil Quarry', [FLAT_WHITE(), FLAT_WHITE()]);
    const [made, waiting] = barLines(order);
    await bump(made.id);
    const res = await lead.post(`/api/drinks/${waiting.id}/refund`).send({ reason: 'Only wanted one' });
    expect(res.status, JSON.stringify(res.body)).toBe(200);
    expect(res.body.order.status).toBe('ready');
    const row = await orderRow(order.id);
    expect(row.ready_at).toBe(nowIso());
    const madeRefund = await lead.post(`/api/drinks/${made.id}/refund`).send({ reason: 'Did not like it' });
    expect(madeRefund.status, JSON.stringify(madeRefund.body)).toBe(200);
    // 2 × 460 = 920, tax 75.9 → 76, total 996: each drink half, 498, and together the whole total
    expect(madeRefund.body.order).toMatchObject({ refundedCents: 996, status: 'ready' });
  });

  it('is refused: to a cashier (403), an unknown drink or a counter item (404), without a reason (400)', async () => {
    const order = await paidOrder('Tamsin Roe', [FLAT_WHITE(), BANANA_BREAD()]);
    const [drink, bread] = order.lines;
    await expectRefused(() => cashier.post(`/api/drinks/${drink.id}/refund`).send({ reason: 'Spilled it' }), 403, 'forbidden', order.id);
    await expectRefused(() => lead.post(`/api/drinks/99999999/refund`).send({ reason: 'Spilled it' }), 404, 'not_found', order.id);
    await expectRefused(() => lead.post(`/api/drinks/${bread.id}/refund`).send({ reason: 'Stale' }), 404, 'not_found', order.id);
    const bad = await expectRefused(() => lead.post(`/api/drinks/${drink.id}/refund`).send({}), 400, 'validation_failed', order.id);
    expect(bad.body.error.details!.map((d) => d.path)).toEqual(['reason']);
  });

  it('a card order: the card service gives the drink back, its refund id kept on the refunds row that names the drink', async () => {
    // the provider's documented test card that succeeds (as refunds.test.ts)
    const body = { ...orderBody('Petra Lowell', [FLAT_WHITE(), ESPRESSO()]), payment: { method: 'card' as const, paymentMethod: 'pm_card_visa' } };
    const placed = await cashier.post('/api/orders').send(body);
    expect(placed.status, JSON.stringify(placed.body)).toBe(201);
    const order = placed.body.order as OrderView;
    const [, espresso] = barLines(order);
    const res = await lead.post(`/api/drinks/${espresso.id}/refund`).send({ reason: 'Too bitter' });
    expect(res.status, JSON.stringify(res.body)).toBe(200);
    // 780 + 64 tax = 844; 844 − round(844 × 460 / 780) = 844 − 498 = 346 (by hand)
    expect(res.body.order).toMatchObject({ refundedCents: 346, paymentStatus: 'paid', status: 'open' });
    const [refund] = await server.db('refunds').where({ order_id: order.id });
    expect(refund).toMatchObject({ amount_cents: 346, order_item_id: espresso.id });
    expect(refund.provider_id).toMatch(/^re_/);
    await expectRefused(() => lead.post(`/api/drinks/${espresso.id}/refund`).send({ reason: 'Too bitter' }), 409, 'conflict', order.id);
  });

  it('an order paid in two parts: the drink comes back from the parts as refundOrder plans it, each refund naming the drink', async () => {
    const items = [FLAT_WHITE(), ESPRESSO()];
    // 780 + 64 tax = 844, paid 600 in cash and 244 by card
    const body = {
      ...orderBody('Ottilie Brack', items),
      payment: {
        method: 'split' as const,
        parts: [
          { method: 'cash' as const, amountCents: 600, tenderedCents: 600 },
          { method: 'card' as const, amountCents: 244, paymentMethod: 'pm_card_visa' },
        ],
      },
    };
    const placed = await cashier.post('/api/orders').send(body);
    expect(placed.status, JSON.stringify(placed.body)).toBe(201);
    const order = placed.body.order as OrderView;
    expect(order.totalCents).toBe(844);
    const [flatWhite] = barLines(order);
    const res = await lead.post(`/api/drinks/${flatWhite.id}/refund`).send({ reason: 'Customer could not wait' });
    expect(res.status, JSON.stringify(res.body)).toBe(200);
    expect(res.body.order).toMatchObject({ refundedCents: 498, paymentStatus: 'paid' });
    const refunds = await server.db('refunds').where({ order_id: order.id });
    expect(refunds.reduce((a, r) => a + r.amount_cents, 0)).toBe(498);
    expect(refunds.every((r) => r.order_item_id === flatWhite.id)).toBe(true);
    await expectRefused(() => lead.post(`/api/drinks/${flatWhite.id}/refund`).send({ reason: 'Again' }), 409, 'conflict', order.id);
  });

  it(`${AT_ONCE} refunds of one drink at once: one is made, the others 409, one refunds row`, async () => {
    const order = await paidOrder('Lorcan Pike', [FLAT_WHITE(), ESPRESSO()]);
    const [drink] = barLines(order);
    const res = await Promise.all(refunders.map((l) => l.post(`/api/drinks/${drink.id}/refund`).send({ reason: 'Sent twice' })));
    expect(res.map((r) => r.status).sort()).toEqual([200, ...Array(AT_ONCE - 1).fill(409)]);
    expect(await server.db('refunds').where({ order_id: order.id })).toHaveLength(1);
    expect((await orderRow(order.id)).refunded_cents).toBe(498);
  });

  it(`${AT_ONCE} refunds of one drink of a card order at once: one refund, the card given it back once`, async () => {
    const body = { ...orderBody('Greer Oakes', [FLAT_WHITE(), ESPRESSO()]), payment: { method: 'card' as const, paymentMethod: 'pm_card_visa' } };
    const placed = await cashier.post('/api/orders').send(body);
    expect(placed.status, JSON.stringify(placed.body)).toBe(201);
    const order = placed.body.order as OrderView;
    const [, espresso] = barLines(order);
    const res = await Promise.all(refunders.map((l) => l.post(`/api/drinks/${espresso.id}/refund`).send({ reason: 'Sent twice' })));
    expect(res.map((r) => r.status).sort()).toEqual([200, ...Array(AT_ONCE - 1).fill(409)]);
    expect(await server.db('refunds').where({ order_id: order.id })).toHaveLength(1);
    // the card service kept one refund of 346: the rest of the 844 charged can still be given back
    const rest = await lead.post(`/api/orders/${order.id}/refund`).send({ reason: 'Everything back' });
    expect(rest.status, JSON.stringify(rest.body)).toBe(200);
    expect(rest.body.order).toMatchObject({ refundedCents: 844, paymentStatus: 'refunded' });
  });
});

describe('POST /api/drinks/:id/remake', () => {
  it('a collected drink comes back on the same ticket as a new queued drink at no charge, marked remake; bumping it makes the ticket ready again', async () => {
    const order = await paidOrder('Imelda Crane', [FLAT_WHITE(), ESPRESSO()]);
    const [flatWhite, espresso] = barLines(order);
    await bump(flatWhite.id);
    await bump(espresso.id);
    expect((await cashier.post(`/api/tickets/${order.id}/collect`)).status).toBe(200);
    time.advance(4 * 60_000);
    const since = await maxEventId();

    const res = await cashier.post(`/api/drinks/${flatWhite.id}/remake`).send({ reason: 'spilled', note: 'Knocked over at the pass' });
    expect(res.status, JSON.stringify(res.body)).toBe(201);
    const remade = res.body.order as OrderView;
    expect(remade).toMatchObject({ status: 'open', totalCents: order.totalCents, refundedCents: 0 });
    const remake = remade.lines.find((l) => l.remake)!;
    expect(remake).toMatchObject({
      itemName: 'Flat white',
      priceCents: 0,
      status: 'queued',
      remake: { of: flatWhite.id, reason: 'spilled', note: 'Knocked over at the pass' },
    });
    expect(remade.lines.find((l) => l.id === flatWhite.id)!.remadeAs).toBe(remake.id);
    const rows = await itemRows(order.id);
    expect(rows.at(-1)).toMatchObject({
      remake_of: flatWhite.id,
      remade_by: cashierId,
      remade_at: nowIso(),
      milk_ml: rows[0].milk_ml,
      dose_dg: rows[0].dose_dg,
      line_no: 3,
    });
    const back = await orderRow(order.id);
    expect(back).toMatchObject({ status: 'open', ready_at: null, collected_at: null, wait_seconds: null, subtotal_cents: order.subtotalCents });
    const ticket = (await openTicket(order.id))!;
    expect(ticket.drinks.find((d) => d.id === remake.id)).toMatchObject({ status: 'queued', remake: { of: flatWhite.id, reason: 'spilled' } });
    const events = await eventsAfter(since);
    expect(events.map((e) => e.type)).toEqual(['drink.remade']);
    expect(jsonOf(events[0].payload).ticket).toMatchObject({ id: order.id, status: 'open' });

    // the Pickup wall is told, in a word, that this ticket is being made again (no drink named)
    const pickupOf = async () => ((await lead.get('/api/pickup')).body.tickets as { id: number }[]).find((t) => t.id === order.id);
    expect(await pickupOf()).toEqual({ id: order.id, number: order.number, firstName: 'Imelda', status: 'open', readyAt: null, remake: true });

    time.advance(60_000);
    await bump(remake.id);
    expect(await pickupOf()).toEqual({ id: order.id, number: order.number, firstName: 'Imelda', status: 'ready', readyAt: nowIso() });
    const ready = await orderRow(order.id);
    expect(ready).toMatchObject({ status: 'ready', ready_at: nowIso() });
    // the wait runs from the order to the remake's bump: 5 minutes on the test clock
    expect(Number(ready.wait_seconds)).toBe(5 * 60);
  });

  it('is refused: a drink not made yet, twice, refunded, a remake’s refund; a barista (403); a bad reason or "other" without a note (400); unknown (404)', async () => {
    const order = await paidOrder('Rufus Vane', [FLAT_WHITE(), ESPRESSO()]);
    const [flatWhite, espresso] = barLines(order);
    await expectRefused(() => cashier.post(`/api/drinks/${flatWhite.id}/remake`).send({ reason: 'made_wrong' }), 409, 'conflict', order.id);
    await bump(flatWhite.id);
    await expectRefused(() => barista.post(`/api/drinks/${flatWhite.id}/remake`).send({ reason: 'made_wrong' }), 403, 'forbidden', order.id);
    const badReason = await expectRefused(
      () => cashier.post(`/api/drinks/${flatWhite.id}/remake`).send({ reason: 'too_slow' }),
      400,
      'validation_failed',
      order.id,
    );
    expect(badReason.body.error.details!.map((d) => d.path)).toEqual(['reason']);
    const noNote = await expectRefused(() => cashier.post(`/api/drinks/${flatWhite.id}/remake`).send({ reason: 'other' }), 400, 'validation_failed', order.id);
    expect(noNote.body.error.details!.map((d) => d.path)).toEqual(['note']);
    await expectRefused(() => cashier.post(`/api/drinks/99999999/remake`).send({ reason: 'made_wrong' }), 404, 'not_found', order.id);

    expect((await cashier.post(`/api/drinks/${flatWhite.id}/remake`).send({ reason: 'made_wrong' })).status).toBe(201);
    await expectRefused(() => cashier.post(`/api/drinks/${flatWhite.id}/remake`).send({ reason: 'made_wrong' }), 409, 'conflict', order.id);
    // a remake was not charged: nothing to refund for it
    const remakeId = (await itemRows(order.id)).at(-1).id as number;
    await expectRefused(() => lead.post(`/api/drinks/${remakeId}/refund`).send({ reason: 'Not wanted' }), 409, 'conflict', order.id);
    // a refunded drink is not made again
    await bump(espresso.id);
    expect((await lead.post(`/api/drinks/${espresso.id}/refund`).send({ reason: 'Too bitter' })).status).toBe(200);
    await expectRefused(() => cashier.post(`/api/drinks/${espresso.id}/remake`).send({ reason: 'not_right' }), 409, 'conflict', order.id);
  });

  it(`${AT_ONCE} remakes of one drink at once: one remake, the others 409`, async () => {
    const order = await paidOrder('Jolyon Ash', [FLAT_WHITE()]);
    const [drink] = barLines(order);
    await bump(drink.id);
    const res = await Promise.all(remakers.map((c) => c.post(`/api/drinks/${drink.id}/remake`).send({ reason: 'made_wrong' })));
    expect(res.map((r) => r.status).sort()).toEqual([201, ...Array(AT_ONCE - 1).fill(409)]);
    expect(await server.db('order_items').where({ remake_of: drink.id })).toHaveLength(1);
    expect((await itemRows(order.id)).length).toBe(2);
  });
});

describe('remakes in the reports', () => {
  it("the day's range report and its CSV count the remakes above as waste, per reason, with the replaced drinks' coffee and milk", async () => {
    // the tests above remade three flat whites: one spilled, two made wrong
    const replaced = await server.db('order_items as r').join('order_items as w', 'w.id', 'r.remake_of').select('r.remake_reason', 'w.dose_dg', 'w.milk_ml');
    expect(replaced.map((r) => r.remake_reason).sort()).toEqual(['made_wrong', 'made_wrong', 'spilled']);
    const { dose_dg: dose, milk_ml: milk } = replaced[0];
    const res = await lead.get('/api/reports/range?from=2026-03-02&to=2026-03-02');
    expect(res.status, JSON.stringify(res.body)).toBe(200);
    expect(res.body.remakes).toEqual({
      count: 3,
      doseDg: 3 * dose,
      milkMl: 3 * milk,
      byReason: [
        { reason: 'made_wrong', count: 2, doseDg: 2 * dose, milkMl: 2 * milk },
        { reason: 'spilled', count: 1, doseDg: dose, milkMl: milk },
      ],
    });
    // a remake is not a drink sold
    const sold = await server
      .db('order_items')
      .join('orders', 'orders.id', 'order_items.order_id')
      .where('order_items.station', 'bar')
      .whereNull('order_items.remake_of')
      .count({ n: '*' })
      .first();
    expect(res.body.drinks).toBe(Number(sold?.n));
    const csv = await lead.get('/api/reports/range.csv?from=2026-03-02&to=2026-03-02');
    expect(csv.status).toBe(200);
    expect(csv.text).toContain('"Remakes","","drinks remade","3"');
    expect(csv.text).toContain('"Remakes","Made wrong","drinks remade","2"');
    expect(csv.text).toContain(`"Remakes","Made wrong","coffee wasted (g)","${(2 * dose) / 10}"`);
    expect(csv.text).toContain(`"Remakes","Spilled","milk wasted (ml)","${milk}"`);
  });
});
