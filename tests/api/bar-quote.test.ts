// The Counter's quote reads the bar as SQL counts it: the drinks on the bar are counted by the
// database, and only drinks that can bear on the pace come back as rows — none fired after the
// bar's last bump, none from tickets left open long before the pace window. The answer must be
// the one the pace gives over every drink (src/domain/make-times.ts busyPace, the reference here),
// however many drinks wait: a queue nobody bumps must not make every new order read all of it.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { busyPace } from '@/domain/make-times';
import { barNow, PACE_WINDOW_MS } from '@server/orders/quotes';
import { demoMenu, manualClock, startTestServer, type TestServer } from '../support/test-server';
import { orderBody, type Agent } from './helpers';

const time = manualClock('2026-03-05T14:00:00.000Z');
let server: TestServer;
let cashier: Agent;
let barista: Agent;
let locationId: number;
let ids: Awaited<ReturnType<typeof demoMenu>>;

beforeAll(async () => {
  server = await startTestServer({ clock: time.clock });
  [cashier, barista] = await Promise.all([server.signIn('cashier'), server.signIn('barista')]);
  ids = await demoMenu(server);
});
afterAll(() => server.close());

async function lattes(name: string, count = 1): Promise<{ id: number; lines: { id: number }[] }> {
  const res = await cashier.post('/api/orders').send(orderBody(name, Array(count).fill({ menuItemId: ids.item('Latte') }), 40_00));
  expect(res.status).toBe(201);
  return res.body.order;
}
const latte = async (name: string) => (await lattes(name)).id;

/**
 * Every bar drink the quote looks at, read in full as rows: the drinks of open tickets and of
 * tickets taken in the last 50 minutes (the window and FORGOTTEN_AFTER_MS). The reference.
 */
async function everyDrink(now: Date) {
  const fromIso = new Date(now.getTime() - 50 * 60_000).toISOString();
  const rows = await server
    .db('order_items')
    .join('orders', 'orders.id', 'order_items.order_id')
    .where({ 'order_items.station': 'bar', 'orders.location_id': locationId })
    .where((w) => w.where('orders.status', 'open').orWhere('orders.created_at', '>=', fromIso))
    .whereNotNull('orders.fired_at')
    .whereNot('orders.status', 'void')
    .select(
      'orders.status as order_status',
      'orders.fired_at',
      'order_items.status',
      'order_items.done_at',
      'order_items.refunded_at',
      'order_items.remade_at',
    );
  return rows.map((r) => ({
    firedMs: Date.parse(r.remade_at ?? r.fired_at),
    doneMs: r.status === 'done' && r.done_at ? Date.parse(r.done_at) : null,
    onBar: r.order_status === 'open' && r.status !== 'done' && !r.refunded_at,
  }));
}

async function rowsRead(during: () => Promise<unknown>): Promise<number> {
  let rows = 0;
  const count = (response: unknown) => {
    if (Array.isArray(response)) rows += response.length;
    else if (Array.isArray((response as { rows?: unknown[] })?.rows)) rows += (response as { rows: unknown[] }).rows.length;
    else if (response && typeof response === 'object') rows += 1; // a first(): the row itself
  };
  server.db.on('query-response', count);
  try {
    await during();
  } finally {
    server.db.off('query-response', count);
  }
  return rows;
}

describe('the bar as the quote reads it', () => {
  it('counts a long queue nobody bumps without reading it, and paces from the drinks up to the last bump', async () => {
    const me = await server.db('users').where({ username: 'cashier' }).first('location_id');
    locationId = me.location_id;
    // a ticket of two drinks left open since early morning, one of them bumped in the rush
    const forgotten = await lattes('Forgotten Fern', 2);
    time.advance(3 * 3600_000);
    // a rush: 6 lattes a minute apart, the first 3 bumped as they are made
    const placed: number[] = [];
    for (let i = 0; i < 6; i++) {
      placed.push(await latte(`Rush ${i}`));
      time.advance(60_000);
    }
    expect((await barista.post(`/api/drinks/${forgotten.lines[0].id}/bump`)).status).toBe(200);
    for (const id of placed.slice(0, 3)) {
      time.advance(45_000);
      expect((await barista.post(`/api/tickets/${id}/bump`)).status).toBe(200);
    }
    // then, from a little later, 20 more that nobody has bumped yet
    time.advance(5_000);
    for (let i = 0; i < 20; i++) {
      await latte(`Queue ${i}`);
      time.advance(5_000);
    }

    const now = time.clock();
    const all = await everyDrink(now);
    const reference = { drinksAhead: all.filter((d) => d.onBar).length, pace: busyPace(all, 2, now.getTime() - PACE_WINDOW_MS) };
    expect(reference.drinksAhead).toBe(1 + 3 + 20);
    expect(reference.pace.drinks).toBe(4);

    let bar: Awaited<ReturnType<typeof barNow>> | undefined;
    const rows = await rowsRead(async () => (bar = await barNow(server.db, locationId, now, 2)));
    expect(bar).toEqual(reference);
    // one row of counts, the six rush drinks fired before the last bump and the forgotten drink
    // bumped in the window: not the 20 waiting, nor the forgotten one still waiting
    expect(rows).toBeLessThanOrEqual(1 + 6 + 1);
  });

  it('reads no drink at all while nothing has been bumped in the window', async () => {
    time.advance(4 * 3600_000);
    for (let i = 0; i < 5; i++) await latte(`Quiet ${i}`);
    const now = time.clock();
    const all = await everyDrink(now);
    let bar: Awaited<ReturnType<typeof barNow>> | undefined;
    const rows = await rowsRead(async () => (bar = await barNow(server.db, locationId, now, 2)));
    expect(bar).toEqual({ drinksAhead: all.filter((d) => d.onBar).length, pace: busyPace(all, 2, now.getTime() - PACE_WINDOW_MS) });
    expect(bar!.pace).toEqual({ drinks: 0, totalMs: 0 });
    expect(rows).toBe(1);
  });
});
