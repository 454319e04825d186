// A line with a quantity: "3 × Long black" is taken as three drinks for the Bar (one cup each),
// priced as three, shown on the receipt as one line "3 × Long black"; a quantity out of bounds is
// refused with its field named and nothing stored.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { formatCents } from '@/domain/money';
import type { MenuView } from '@/domain/types';
import { receiptEmail } from '@server/orders/receipts';
import { MAX_CUPS, MAX_QUANTITY } from '@/domain/order-quantity';
import { demoMenu, manualClock, startTestServer, type TestServer } from '../support/test-server';
import { orderBody, writeCounts, type Agent } from './helpers';

const time = manualClock('2026-12-02T14:00:00.000Z');
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

describe('POST /api/orders with a quantity per line', () => {
  it('expands a line into one drink per cup, priced per cup', async () => {
    const longBlack = menu.items.find((i) => i.name === 'Long black')!;
    const oneCup = longBlack.sizes[0].priceCents;
    const body = orderBody('Office Run', [
      { menuItemId: ids.item('Long black'), quantity: 3 },
      { menuItemId: ids.item('Butter croissant'), quantity: 2 },
    ] as never);
    const before = await writeCounts(server);
    const res = await cashier.post('/api/orders').send(body);
    expect(res.status).toBe(201);
    const { order } = res.body;
    const croissant = menu.items.find((i) => i.name === 'Butter croissant')!.priceCents!;
    // 3 cups and 2 croissants, each at its menu price (worked by hand from GET /api/menu)
    expect(order.subtotalCents).toBe(3 * oneCup + 2 * croissant);
    expect(order.lines.map((l: { itemName: string }) => l.itemName)).toEqual([
      'Long black',
      'Long black',
      'Long black',
      'Butter croissant',
      'Butter croissant',
    ]);
    expect(await writeCounts(server)).toEqual({ orders: before.orders + 1, order_items: before.order_items + 5, events: before.events + 1 });

    const { tickets } = (await cashier.get('/api/tickets?view=open')).body;
    const ticket = tickets.find((t: { id: number }) => t.id === order.id);
    expect(ticket.drinks).toHaveLength(3); // one per cup for the Bar; the croissants stay at the counter

    // the receipt (the mail; the printed page groups with the same function) reads by line, not by cup
    const mail = receiptEmail(order, { name: 'Demo', currency: menu.location.currency, timeZone: menu.location.timeZone });
    expect(mail.text).toContain(`3 × Long black — ${formatCents(3 * oneCup, menu.location.currency)}`);
    expect(mail.text).toContain('2 × Butter croissant');
    expect(mail.text.match(/Long black/g)).toHaveLength(1);
  });

  it('refuses a quantity out of bounds, naming the line, and stores nothing', async () => {
    for (const quantity of [0, -1, MAX_QUANTITY + 1, 2.5]) {
      const before = await writeCounts(server);
      const res = await cashier.post('/api/orders').send(orderBody('Too Many', [{ menuItemId: ids.item('Espresso'), quantity }] as never));
      expect(res.status).toBe(400);
      expect(res.body.error.code).toBe('validation_failed');
      expect(res.body.error.details.map((d: { path: string }) => d.path)).toEqual(['items.0.quantity']);
      expect(await writeCounts(server)).toEqual(before);
    }
  });

  it(`refuses more than ${MAX_CUPS} cups in one order`, async () => {
    const before = await writeCounts(server);
    const items = Array.from({ length: 3 }, () => ({ menuItemId: ids.item('Espresso'), quantity: 40 }));
    const res = await cashier.post('/api/orders').send(orderBody('Whole Office', items as never, 10_000_00));
    expect(res.status).toBe(400);
    expect(res.body.error.details).toEqual([{ path: 'items', message: `An order holds at most ${MAX_CUPS} drinks and items` }]);
    expect(await writeCounts(server)).toEqual(before);
  });
});
