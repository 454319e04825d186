// The Counter's rules: quoted waits, 86'ing an item, discounts (shift lead and up), allergens from
// the café's published list, finding today's orders, and prices only ever from the server.
import { randomUUID } from 'node:crypto';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { US_ALLERGENS } from '@/domain/allergens';
import type { MenuView, OrderView, TicketView } from '@/domain/types';
import { demoMenu, manualClock, startTestServer, type TestServer } from '../support/test-server';
import { orderBody, writeCounts, type Agent, type LineInput } from './helpers';
import { jsonOf } from '../support/rows';

const time = manualClock('2026-03-02T14:00:00.000Z'); // 09:00 in New York, the demo café's zone
let server: TestServer;
let cashier: Agent;
let lead: Agent;
let leadId: number;
let ids: Awaited<ReturnType<typeof demoMenu>>;
let menu: MenuView;

beforeAll(async () => {
  server = await startTestServer({ clock: time.clock });
  [cashier, lead] = [await server.signIn('cashier'), await server.signIn('lead')];
  leadId = (await server.db('users').where({ username: 'lead' }).first()).id;
  ids = await demoMenu(server);
  menu = (await cashier.get('/api/menu')).body;
});
afterAll(() => server.close());

/** What a line should cost, worked out here from GET /api/menu rather than by the server's code. */
function linePrice(line: LineInput): number {
  const item = menu.items.find((i) => i.id === line.menuItemId)!;
  const size = line.sizeId ? item.sizes.find((s) => s.id === line.sizeId)! : (item.sizes.find((s) => s.isDefault) ?? null);
  const milkId = line.milkId ?? (item.takesMilk ? item.defaultMilkId : null);
  const milk = menu.milks.find((m) => m.id === milkId);
  const recipeShots = size?.shots ?? item.shots;
  const extraShots = Math.max(0, (line.shots ?? recipeShots) - recipeShots);
  const mods = (line.extraIds ?? []).map((id) => menu.extras.find((m) => m.id === id)!.priceCents);
  return (size?.priceCents ?? item.priceCents!) + (milk?.upchargeCents ?? 0) + extraShots * menu.location.extraShotCents + mods.reduce((a, b) => a + b, 0);
}
const subtotalOf = (lines: LineInput[]) => lines.map(linePrice).reduce((a, b) => a + b, 0);

/**
 * Sales tax per the Streamlined Sales and Use Tax Agreement §324 (Rounding Rule, see
 * ../shared/reference/check-values.md, "Money"): carry the tax to the third decimal (tenths of a
 * cent, "mills", truncated) and round up to the next cent when that third decimal is greater
 * than four. Integers only; the rate is in thousandths of a percent (8.25 % = 8250).
 */
function ssutaTaxCents(amountCents: number, rateMilliPct: number): { cents: number; mills: number } {
  const mills = Math.floor((amountCents * rateMilliPct * 10) / 100_000);
  return { cents: Math.floor(mills / 10) + (mills % 10 > 4 ? 1 : 0), mills };
}

const place = (agent: Agent, body: object) => agent.post('/api/orders').send(body);
const maxEventId = async () => Number((await server.db('events').max({ m: 'id' }).first())?.m ?? 0);
const eventsAfter = (id: number) => server.db('events').where('id', '>', id).orderBy('id');
const menuItem = async (itemId: number) => (await cashier.get('/api/menu')).body.items.find((i: { id: number }) => i.id === itemId);

// First in the file on purpose: the quote is checked against a fresh server with an empty bar and
// no drinks made yet (so no recent pace to go by).
describe('quotedWaitSeconds', () => {
  it('with no history: (drinks ahead + drinks in the order) × 60 s ÷ baristas, stored on the order', async () => {
    // 60 s a drink per barista when there is no history: the project's stated rough rule
    // (common practice), src/domain/quote.ts.
    expect(menu.location.baristasOnBar).toBe(1);
    expect((await cashier.get('/api/tickets?view=open')).body.tickets).toEqual([]);

    const first = await place(
      cashier,
      orderBody('Ignatius Rook', [
        { menuItemId: ids.item('Latte') },
        { menuItemId: ids.item('Cappuccino') },
        { menuItemId: ids.item('Butter croissant') }, // a counter item: not made at the bar
      ]),
    );
    expect(first.status).toBe(201);
    expect(first.body.order.quotedWaitSeconds).toBe(((0 + 2) * 60) / 1);
    expect((await server.db('orders').where({ id: first.body.order.id }).first()).quoted_wait_seconds).toBe(120);

    const second = await place(cashier, orderBody('Clementine Voss', [{ menuItemId: ids.item('Espresso') }]));
    expect(second.status).toBe(201);
    expect(second.body.order.quotedWaitSeconds).toBe(((2 + 1) * 60) / 1);
    expect((await cashier.get(`/api/orders/${second.body.order.id}`)).body.order.quotedWaitSeconds).toBe(180);
  });

  it('an order with no bar drinks has nothing to wait for', async () => {
    const res = await place(cashier, orderBody('Ferdinand Lusk', [{ menuItemId: ids.item('Banana bread') }]));
    expect(res.status).toBe(201);
    expect(res.body.order.quotedWaitSeconds).toBe(0);
  });
});

describe("86'ing an item", () => {
  const path = (id: number) => `/api/menu/items/${id}/availability`;

  it('a cashier may not: 403, and the item stays on', async () => {
    const item = ids.item('Almond croissant');
    const since = await maxEventId();
    const res = await cashier.post(path(item)).send({ available: false });
    expect(res.status).toBe(403);
    expect(res.body.error.code).toBe('forbidden');
    expect(await eventsAfter(since)).toEqual([]);
    expect((await menuItem(item)).available).toBe(true);
  });

  it('a lead 86es it (one menu.availability event), orders with it are refused 409, and bringing it back restores it', async () => {
    const item = ids.item('Almond croissant');
    let since = await maxEventId();
    const off = await lead.post(path(item)).send({ available: false });
    expect(off.status, JSON.stringify(off.body)).toBe(200);
    expect(off.body).toEqual({ item: { id: item, available: false } });
    let events = await eventsAfter(since);
    expect(events.map((e) => e.type)).toEqual(['menu.availability']);
    expect(events[0].actor_id).toBe(leadId);
    expect(jsonOf(events[0].payload)).toEqual({ item: { id: item, available: false } });

    expect((await menuItem(item)).available).toBe(false);

    const before = await writeCounts(server);
    const refused = await place(cashier, orderBody('Ottilie Sandys', [{ menuItemId: ids.item('Latte') }, { menuItemId: item }]));
    expect(refused.status).toBe(409);
    expect(refused.body.error).toMatchObject({ code: 'unavailable', details: [{ path: 'items.1.menuItemId', message: expect.any(String) }] });
    expect(await writeCounts(server)).toEqual(before);

    since = await maxEventId();
    const on = await lead.post(path(item)).send({ available: true });
    expect(on.status).toBe(200);
    expect(on.body).toEqual({ item: { id: item, available: true } });
    events = await eventsAfter(since);
    expect(events.map((e) => [e.type, jsonOf(e.payload)])).toEqual([['menu.availability', { item: { id: item, available: true } }]]);
    expect((await menuItem(item)).available).toBe(true);

    const again = await place(cashier, orderBody('Ottilie Sandys', [{ menuItemId: ids.item('Latte') }, { menuItemId: item }]));
    expect(again.status).toBe(201);
  });

  it('an unknown item is 404, a body that is not { available: boolean } is 400', async () => {
    expect((await lead.post(path(999_999)).send({ available: false })).status).toBe(404);
    for (const body of [{}, { available: 'no' }, { available: 0 }]) {
      const res = await lead.post(path(ids.item('Espresso'))).send(body);
      expect(res.status).toBe(400);
      expect(res.body.error.details).toEqual([{ path: 'available', message: expect.any(String) }]);
    }
    expect((await lead.post('/api/menu/items/abc/availability').send({ available: false })).status).toBe(400);
    expect((await menuItem(ids.item('Espresso'))).available).toBe(true);
  });
});

describe('discounts', () => {
  // A mocha and a butter croissant: 10.05, so 10 % is 100.5 cents. Half up gives 101; half-even
  // and truncation would give 100. The taxed 9.04 then gives 74.58 cents of tax (74.5 in mills)
  // → 75. The tax must be on the discounted amount.
  const mochaAndCroissant = (): LineInput[] => [{ menuItemId: ids.item('Mocha') }, { menuItemId: ids.item('Butter croissant') }];

  it('a cashier may not give one: 403, nothing stored', async () => {
    const before = await writeCounts(server);
    const res = await place(cashier, { ...orderBody('Aldous Penn', mochaAndCroissant()), discount: { kind: 'percent', value: 10, reason: 'Regular' } });
    expect(res.status).toBe(403);
    expect(res.body.error.code).toBe('forbidden');
    expect(await writeCounts(server)).toEqual(before);
  });

  it('a lead gives 10 %: rounded half up, tax on the discounted amount', async () => {
    const lines = mochaAndCroissant();
    const subtotal = subtotalOf(lines);
    expect((subtotal * 10) % 100).toBe(50); // half a cent: the case the rounding rule decides
    const discount = Math.floor((subtotal * 10 + 50) / 100); // half up, integers only
    const tax = ssutaTaxCents(subtotal - discount, menu.location.taxRateMilliPct);
    expect(tax.mills % 10).toBe(5);

    const res = await place(lead, { ...orderBody('Aldous Penn', lines), discount: { kind: 'percent', value: 10, reason: 'Regular' } });
    expect(res.status, JSON.stringify(res.body)).toBe(201);
    expect(res.body.order).toMatchObject({
      subtotalCents: subtotal,
      discountCents: discount,
      discountReason: 'Regular',
      taxCents: tax.cents,
      totalCents: subtotal - discount + tax.cents,
      changeCents: 100_00 - (subtotal - discount + tax.cents),
    });
    expect(await server.db('orders').where({ id: res.body.order.id }).first()).toMatchObject({
      discount_cents: discount,
      discount_reason: 'Regular',
      tax_cents: tax.cents,
    });
  });

  it('a lead gives a fixed amount off; the tax is on what is left', async () => {
    const lines: LineInput[] = [{ menuItemId: ids.item('Long black') }, { menuItemId: ids.item('Latte') }, { menuItemId: ids.item('Bottled water') }];
    const subtotal = subtotalOf(lines);
    const value = subtotal - 10_00; // leaves 10.00: 82.5 cents of tax → 83 (half-even would give 82)
    const tax = ssutaTaxCents(10_00, menu.location.taxRateMilliPct);
    expect(tax).toEqual({ cents: 83, mills: 825 });

    const res = await place(lead, { ...orderBody('Marigold Tench', lines), discount: { kind: 'amount', value, reason: 'Spilt the first one' } });
    expect(res.status, JSON.stringify(res.body)).toBe(201);
    expect(res.body.order).toMatchObject({
      subtotalCents: subtotal,
      discountCents: value,
      taxCents: 83,
      totalCents: 10_00 + 83,
      discountReason: 'Spilt the first one',
    });
  });

  it('needs a reason: 400 on discount.reason, nothing stored', async () => {
    const before = await writeCounts(server);
    for (const discount of [
      { kind: 'percent', value: 10 },
      { kind: 'percent', value: 10, reason: 'no' },
    ]) {
      const res = await place(lead, { ...orderBody('Aldous Penn', mochaAndCroissant()), discount });
      expect(res.status).toBe(400);
      expect(res.body.error).toMatchObject({ code: 'validation_failed', details: [{ path: 'discount.reason', message: expect.any(String) }] });
    }
    expect(await writeCounts(server)).toEqual(before);
  });
});

describe('allergens', () => {
  it("refuses one that is not on the café's list (the US nine: FALCPA + FASTER Act) with 400 on its index", async () => {
    // The US list, see ../shared/reference/check-values.md ("Allergens"): milk, eggs, fish,
    // crustacean shellfish, tree nuts, peanuts, wheat, soybeans (FALCPA 2004) and sesame (FASTER Act 2021).
    expect(menu.location.allergenList).toBe('US');
    const before = await writeCounts(server);
    for (const [allergens, index] of [
      [['gluten'], 0], // an EU-style term, not a US major allergen
      [['milk', 'celery'], 1], // celery is on the EU list only
      [['mustard'], 0],
      [['coconut'], 0], // no longer a tree nut for the FDA (January 2025)
    ] as const) {
      const res = await place(cashier, { ...orderBody('Quentin Harrow', [{ menuItemId: ids.item('Latte') }]), allergens });
      expect(res.status).toBe(400);
      expect(res.body.error).toMatchObject({ code: 'validation_failed', details: [{ path: `allergens.${index}`, message: expect.any(String) }] });
    }
    expect(await writeCounts(server)).toEqual(before);
  });

  it('accepts all nine US major allergens', async () => {
    const nine = ['milk', 'eggs', 'fish', 'crustacean shellfish', 'tree nuts', 'peanuts', 'wheat', 'soybeans', 'sesame'];
    expect([...US_ALLERGENS].sort()).toEqual([...nine].sort());
    const res = await place(cashier, { ...orderBody('Quentin Harrow', [{ menuItemId: ids.item('Espresso') }]), allergens: nine });
    expect(res.status, JSON.stringify(res.body)).toBe(201);
    expect(res.body.order.allergens).toEqual(nine);
  });

  it('stores the ones named with the allergy note, and shows them on the bar ticket', async () => {
    const res = await place(cashier, {
      ...orderBody('Philomena Drax', [{ menuItemId: ids.item('Flat white'), milkId: ids.milk('Oat') }, { menuItemId: ids.item('Banana bread') }]),
      allergens: ['tree nuts', 'sesame'],
      allergyNote: 'Severe: clean the steam wand first',
    });
    expect(res.status, JSON.stringify(res.body)).toBe(201);
    const order: OrderView = res.body.order;
    expect(order).toMatchObject({ allergens: ['tree nuts', 'sesame'], allergyNote: 'Severe: clean the steam wand first' });
    const row = await server.db('orders').where({ id: order.id }).first();
    expect(jsonOf(row.allergens)).toEqual(['tree nuts', 'sesame']);

    const tickets = await cashier.get('/api/tickets');
    const ticket = tickets.body.tickets.find((t: TicketView) => t.id === order.id);
    expect(ticket).toMatchObject({ allergens: ['tree nuts', 'sesame'], allergyNote: 'Severe: clean the steam wand first' });
    expect(ticket.drinks.map((d: { itemName: string }) => d.itemName)).toEqual(['Flat white']);
  });
});

describe('finding orders', () => {
  it("GET /api/orders?q= finds today's orders by name (any case) and by '#number'", async () => {
    const a = (await place(cashier, orderBody('Wilhelmina Quarrie', [{ menuItemId: ids.item('Espresso') }]))).body.order as OrderView;
    const b = (await place(cashier, orderBody('Bertrand Quarrie', [{ menuItemId: ids.item('Long black') }]))).body.order as OrderView;

    const byName = await cashier.get('/api/orders').query({ q: 'Wilhelmina' });
    expect(byName.status).toBe(200);
    expect(byName.body.orders.map((o: OrderView) => o.id)).toEqual([a.id]);
    expect(byName.body.orders[0]).toEqual(a);

    const bySurname = await cashier.get('/api/orders').query({ q: 'quarrie' });
    expect(bySurname.body.orders.map((o: OrderView) => o.id)).toEqual([b.id, a.id]); // newest first

    const byNumber = await cashier.get('/api/orders').query({ q: `#${b.number}` });
    expect(byNumber.status).toBe(200);
    expect(byNumber.body.orders.map((o: OrderView) => o.id)).toContain(b.id);
    expect(byNumber.body.orders.every((o: OrderView) => o.number === b.number || o.customerName.includes(`#${b.number}`))).toBe(true);

    // Tomorrow they are yesterday's orders.
    time.advance(24 * 60 * 60 * 1000);
    try {
      expect((await cashier.get('/api/orders').query({ q: 'Wilhelmina' })).body.orders).toEqual([]);
    } finally {
      time.advance(-24 * 60 * 60 * 1000);
    }
  });

  it('GET /api/orders/:id: an unknown id is 404, a non-number is 400', async () => {
    const unknown = await cashier.get('/api/orders/999999');
    expect(unknown.status).toBe(404);
    expect(unknown.body.error.code).toBe('not_found');
    const bad = await cashier.get('/api/orders/abc');
    expect(bad.status).toBe(400);
    expect(bad.body.error).toMatchObject({ code: 'validation_failed', details: [{ path: 'params.id', message: expect.any(String) }] });
  });
});

describe('prices', () => {
  it('come from the server only: prices, totals and amounts in the body are ignored', async () => {
    const lines: LineInput[] = [{ menuItemId: ids.item('Latte'), milkId: ids.milk('Oat') }, { menuItemId: ids.item('Almond croissant') }];
    const subtotal = subtotalOf(lines);
    const total = subtotal + ssutaTaxCents(subtotal, menu.location.taxRateMilliPct).cents;

    const res = await place(cashier, {
      ...orderBody(
        'Cuthbert Vale',
        lines.map((l) => ({ ...l, priceCents: 1 }) as LineInput),
        50_00,
      ),
      subtotalCents: 1,
      discountCents: 500,
      taxCents: 0,
      totalCents: 1,
      paymentStatus: 'refunded',
      status: 'ready',
      quotedWaitSeconds: 1,
    });
    expect(res.status, JSON.stringify(res.body)).toBe(201);
    expect(res.body.order).toMatchObject({ subtotalCents: subtotal, discountCents: 0, totalCents: total, paymentStatus: 'paid', status: 'open' });
    expect(res.body.order.lines.map((l: { priceCents: number }) => l.priceCents)).toEqual(lines.map(linePrice));
    expect(res.body.order.quotedWaitSeconds).not.toBe(1);

    // A card is charged the server's total, whatever amount the body names.
    // (pm_card_visa: the provider's documented test cards, see ../shared/reference/check-values.md)
    const card = await place(cashier, {
      ...orderBody('Cuthbert Vale', lines),
      clientOrderId: randomUUID(),
      totalCents: 1,
      payment: { method: 'card', paymentMethod: 'pm_card_visa', amountCents: 1 },
    });
    expect(card.status, JSON.stringify(card.body)).toBe(201);
    expect(card.body.order.totalCents).toBe(total);
    const payment = await server.db('payments').where({ order_id: card.body.order.id, status: 'succeeded' }).first();
    expect(payment.amount_cents).toBe(total);
  });
});
