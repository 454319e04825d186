// Taking an order: priced by the server, stored once per client order id, numbered per day.
import { randomUUID } from 'node:crypto';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { MenuView } from '@/domain/types';
import { demoMenu, manualClock, startTestServer, type TestServer } from '../support/test-server';
import { orderBody, writeCounts, type Agent, type LineInput } from './helpers';
import { jsonOf } from '../support/rows';

const time = manualClock('2026-03-02T14:00:00.000Z'); // 09:00 in New York, the demo café's zone
let server: TestServer;
let cashier: Agent;
let ids: Awaited<ReturnType<typeof demoMenu>>;
let menu: MenuView;

beforeAll(async () => {
  server = await startTestServer({ clock: time.clock });
  cashier = await server.signIn('cashier');
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

/**
 * Sales tax per the Streamlined Sales and Use Tax Agreement §324 (Rounding Rule): the tax is
 * carried to the third decimal place (here: tenths of a cent, "mills", truncated) and rounded up
 * to the next cent whenever that third decimal is greater than four. Integers only.
 * The rate is in thousandths of a percent (8.25 % = 8250), so cents × rate / 100 000 is the tax in cents.
 */
function ssutaTaxCents(amountCents: number, rateMilliPct: number): { cents: number; mills: number } {
  const mills = Math.floor((amountCents * rateMilliPct * 10) / 100_000);
  return { cents: Math.floor(mills / 10) + (mills % 10 > 4 ? 1 : 0), mills };
}

async function place(name: string, items: LineInput[], tendered = 100_00, clientOrderId = randomUUID()) {
  return cashier.post('/api/orders').send({ ...orderBody(name, items, tendered), clientOrderId });
}

describe('a priced order', () => {
  // Three drinks, two with milk (oat and coconut), and a counter item. Chosen so the subtotal is
  // 26.00 and the tax at 8.25 % is exactly 214.5 cents: half-up gives 215 where half-even or
  // truncation would give 214.
  const items = (): LineInput[] => [
    {
      menuItemId: ids.item('Latte'),
      sizeId: ids.size('Latte', 'Large'),
      milkId: ids.milk('Oat'),
      shots: 3,
      extraIds: [ids.extra('Vanilla syrup'), ids.extra('Extra hot')],
    },
    {
      menuItemId: ids.item('Mocha'),
      sizeId: ids.size('Mocha', 'Large'),
      milkId: ids.milk('Coconut'),
      extraIds: [ids.extra('Caramel syrup')],
    },
    { menuItemId: ids.item('Long black'), shots: 5, extraIds: [ids.extra('Hazelnut syrup')] },
    { menuItemId: ids.item('Bottled water') },
  ];

  it('answers 201 with the order, its lines and totals computed from menu prices', async () => {
    const lines = items();
    const expectedLines = lines.map(linePrice);
    const subtotal = expectedLines.reduce((a, b) => a + b, 0);
    expect(menu.location.taxMode).toBe('exclusive');
    const tax = ssutaTaxCents(subtotal, menu.location.taxRateMilliPct);
    expect(tax.mills % 10).toBe(5); // the case where the rounding rule decides the cent
    const total = subtotal + tax.cents;

    const body = orderBody('Rosalind Featherstone', lines, 50_00);
    const before = await writeCounts(server);
    const res = await cashier.post('/api/orders').send(body);

    expect(res.status).toBe(201);
    expect(Object.keys(res.body)).toEqual(['order']);
    const { order } = res.body;
    expect(order).toMatchObject({
      id: expect.any(Number),
      number: expect.any(Number),
      clientOrderId: body.clientOrderId,
      customerName: 'Rosalind Featherstone',
      status: 'open',
      subtotalCents: subtotal,
      discountCents: 0,
      taxCents: tax.cents,
      totalCents: total,
      changeCents: 50_00 - total,
      payment: { method: 'cash', tenderedCents: 50_00, changeCents: 50_00 - total },
      firedAt: '2026-03-02T14:00:00.000Z',
    });
    expect(order.lines.map((l: { priceCents: number }) => l.priceCents)).toEqual(expectedLines);
    expect(order.lines.map((l: { itemName: string }) => l.itemName)).toEqual(['Latte', 'Mocha', 'Long black', 'Bottled water']);
    expect(order.lines[0]).toMatchObject({ sizeName: 'Large', milkName: 'Oat', shots: 3, extras: ['Vanilla syrup', 'Extra hot'], station: 'bar' });
    expect(order.lines[2]).toMatchObject({ milkName: null, shots: 5, station: 'bar' });
    expect(order.lines[3]).toMatchObject({ station: 'counter', sizeName: null, milkName: null });

    // Stored as answered: one order, four lines, one order.fired event.
    expect(await writeCounts(server)).toEqual({
      orders: before.orders + 1,
      order_items: before.order_items + 4,
      events: before.events + 1,
    });
    const row = await server.db('orders').where({ id: order.id }).first();
    expect(row).toMatchObject({ subtotal_cents: subtotal, tax_cents: tax.cents, total_cents: total, change_cents: 50_00 - total });
    const stored = await server.db('order_items').where({ order_id: order.id }).orderBy('line_no');
    expect(stored.map((s) => [s.station, s.status])).toEqual([
      ['bar', 'queued'],
      ['bar', 'queued'],
      ['bar', 'queued'],
      ['counter', 'done'],
    ]);
  });

  it('ignores any price the client makes up', async () => {
    const honest = await place('Ambrose Kettleby', [{ menuItemId: ids.item('Espresso') }]);
    const cheeky = await cashier.post('/api/orders').send({
      ...orderBody('Ambrose Kettleby', [{ menuItemId: ids.item('Espresso'), priceCents: 1 } as LineInput], 100_00),
      subtotalCents: 1,
      totalCents: 1,
    });
    expect(cheeky.status).toBe(201);
    expect(cheeky.body.order.totalCents).toBe(honest.body.order.totalCents);
    expect(cheeky.body.order.lines[0].priceCents).toBe(linePrice({ menuItemId: ids.item('Espresso') }));
  });

  it('keeps the extras of a line sent under their old name (a Counter page loaded before the rename)', async () => {
    const [latte] = items();
    const { extraIds, ...rest } = latte;
    const res = await place('Ottilie Brandt', [{ ...rest, modifierIds: extraIds } as LineInput]);
    expect(res.status).toBe(201);
    expect(res.body.order.lines[0]).toMatchObject({ extras: ['Vanilla syrup', 'Extra hot'], priceCents: linePrice(latte) });
  });

  it('accepts cash of exactly the total, with no change', async () => {
    const lines = [{ menuItemId: ids.item('Latte') }];
    const subtotal = linePrice(lines[0]);
    const total = subtotal + ssutaTaxCents(subtotal, menu.location.taxRateMilliPct).cents;
    const res = await place('Imogen Tarrant', lines, total);
    expect(res.status).toBe(201);
    expect(res.body.order).toMatchObject({ totalCents: total, changeCents: 0 });
  });
});

describe('idempotent replay', () => {
  const firedEvents = async (orderId: number) =>
    (await server.db('events').where({ type: 'order.fired' }).select('payload')).filter((e) => jsonOf(e.payload).ticket.id === orderId).length;

  it('answers a replay of the same clientOrderId with 200 and the identical order, stored once', async () => {
    const clientOrderId = randomUUID();
    const lines = [{ menuItemId: ids.item('Flat white'), milkId: ids.milk('Soy') }, { menuItemId: ids.item('Banana bread') }];
    const first = await place('Leopold Ashcombe', lines, 20_00, clientOrderId);
    expect(first.status).toBe(201);
    const after = await writeCounts(server);

    const replay = await place('Leopold Ashcombe', lines, 20_00, clientOrderId);
    expect(replay.status).toBe(200);
    expect(replay.body).toEqual(first.body);
    expect(await writeCounts(server)).toEqual(after);
    expect(Number((await server.db('orders').where({ client_order_id: clientOrderId }).count({ n: '*' }).first())?.n)).toBe(1);
    expect(await firedEvents(first.body.order.id)).toBe(1);
  });

  it('stores one order when the same clientOrderId is sent twice at once', async () => {
    const clientOrderId = randomUUID();
    const lines = [{ menuItemId: ids.item('Cappuccino'), milkId: ids.milk('Almond') }];
    const before = await writeCounts(server);
    const [a, b] = await Promise.all([place('Perpetua Gill', lines, 20_00, clientOrderId), place('Perpetua Gill', lines, 20_00, clientOrderId)]);
    expect([a.status, b.status].sort()).toEqual([200, 201]);
    expect(a.body).toEqual(b.body);
    expect(a.body.order.clientOrderId).toBe(clientOrderId);
    expect(await writeCounts(server)).toEqual({
      orders: before.orders + 1,
      order_items: before.order_items + 1,
      events: before.events + 1,
    });
    expect(await firedEvents(a.body.order.id)).toBe(1);
  });
});

describe('order numbers', () => {
  it('go 1, 2, 3 within a business day and start again on the next one (café time zone)', async () => {
    const espresso = [{ menuItemId: ids.item('Espresso') }];
    time.set('2026-03-03T14:00:00.000Z'); // a new day: 09:00 New York
    const numbers = [];
    for (const name of ['Ottilie Brack', 'Cyprian Dove', 'Marisol Penhale']) {
      const res = await place(name, espresso);
      expect(res.status).toBe(201);
      numbers.push(res.body.order.number);
    }
    expect(numbers).toEqual([1, 2, 3]);

    time.set('2026-03-04T04:30:00.000Z'); // 23:30 on 3 March in New York: still the same day
    expect((await place('Benedikt Sorrel', espresso)).body.order.number).toBe(4);

    time.set('2026-03-04T05:30:00.000Z'); // 00:30 on 4 March in New York
    expect((await place('Henrietta Moss', espresso)).body.order.number).toBe(1);
    time.set('2026-03-02T14:00:00.000Z');
  });
});

describe("an 86'd item", () => {
  it('is refused with 409 unavailable and nothing is stored', async () => {
    const croissant = ids.item('Almond croissant');
    // 86'd as the lead does it (the menu a process keeps moves with the command's event)
    const lead = await server.signIn('lead');
    const set = (available: boolean) => lead.post(`/api/menu/items/${croissant}/availability`).send({ available });
    expect((await set(false)).status).toBe(200);
    try {
      const before = await writeCounts(server);
      const res = await place('Fenella Brightwater', [{ menuItemId: ids.item('Latte') }, { menuItemId: croissant }]);
      expect(res.status).toBe(409);
      expect(res.body).toEqual({
        error: {
          code: 'unavailable',
          message: expect.any(String),
          details: [{ path: 'items.1.menuItemId', message: expect.any(String) }],
        },
      });
      expect(await writeCounts(server)).toEqual(before);
    } finally {
      expect((await set(true)).status).toBe(200);
    }
  });
});

describe('an order of counter items only', () => {
  it("is 'collected' at once and never reaches the bar's open tickets", async () => {
    const res = await place('Barnaby Quince', [{ menuItemId: ids.item('Butter croissant') }, { menuItemId: ids.item('Bottled water') }]);
    expect(res.status).toBe(201);
    expect(res.body.order.status).toBe('collected');
    const row = await server.db('orders').where({ id: res.body.order.id }).first();
    expect(row.collected_at).toBe(row.fired_at);

    const open = await cashier.get('/api/tickets?view=open');
    expect(open.status).toBe(200);
    const openIds = open.body.tickets.map((t: { id: number }) => t.id);
    expect(openIds.length).toBeGreaterThan(0); // the bar orders above are there
    expect(openIds).not.toContain(res.body.order.id);
    const board = await cashier.get('/api/tickets?view=board');
    expect(board.body.tickets.map((t: { id: number }) => t.id)).not.toContain(res.body.order.id);
  });
});
