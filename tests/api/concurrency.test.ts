// Commands fired many at once, from several signed-in terminals, with the exact outcome checked.
// On SQLite the one connection runs them one after another; on PostgreSQL (`npm run test:pg`)
// they really interleave under its default isolation, read committed, so each read-then-write
// must lock, write conditionally or lean on a unique constraint (409, never 500).
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Knex } from 'knex';
import { dialectOf } from '@server/db/dialect';
import { createDb } from '@server/db/knex';
import { demoMenu, manualClock, startTestServer, type TestServer } from '../support/test-server';
import { orderBody, type Agent } from './helpers';

const time = manualClock('2026-03-02T14:00:00.000Z');
const AT_ONCE = 20;
let server: TestServer;
let ids: Awaited<ReturnType<typeof demoMenu>>;
let cashiers: Agent[];
let lead: Agent;

beforeAll(async () => {
  server = await startTestServer({ clock: time.clock });
  ids = await demoMenu(server);
  // several terminals, each its own session
  cashiers = await Promise.all([server.signIn('cashier'), server.signIn('cashier'), server.signIn('lead'), server.signIn('owner')]);
  lead = await server.signIn('lead');
});
afterAll(() => server.close());

/** A session of this database waits for a lock (PostgreSQL's own view of its sessions). */
async function waitingForLock(db: Knex): Promise<boolean> {
  const row = await db('pg_stat_activity').where({ wait_event_type: 'Lock' }).andWhereRaw('datname = current_database()').count({ n: '*' }).first();
  return Number(row?.n) > 0;
}

const terminal = (i: number) => cashiers[i % cashiers.length];
const statuses = (res: { status: number }[]) => res.map((r) => r.status).sort((a, b) => a - b);

describe('orders taken at once', () => {
  it(`${AT_ONCE} at once: all 201, numbered one after another without a gap or a repeat`, async () => {
    const before = await server.db('orders').select('number', 'business_date');
    const res = await Promise.all(
      Array.from({ length: AT_ONCE }, (_, i) =>
        terminal(i)
          .post('/api/orders')
          .send(orderBody(`Guest ${i}`, [{ menuItemId: ids.item('Espresso') }])),
      ),
    );
    expect(statuses(res), JSON.stringify(res.find((r) => r.status !== 201)?.body)).toEqual(Array(AT_ONCE).fill(201));
    const day = (await server.db('orders').where({ id: res[0].body.order.id }).first('business_date')).business_date as string;
    const last = Math.max(0, ...before.filter((o) => o.business_date === day).map((o) => o.number));
    const numbers = res.map((r) => r.body.order.number as number).sort((a, b) => a - b);
    expect(numbers).toEqual(Array.from({ length: AT_ONCE }, (_, i) => last + 1 + i));
  });
});

describe('drinks of one ticket bumped at once', () => {
  it('each bump gets its own bump number, so a recall undoes only the last one', async () => {
    const drinks = ['Latte', 'Cappuccino', 'Flat white', 'Espresso', 'Long black', 'Mocha'];
    const placed = await terminal(0)
      .post('/api/orders')
      .send(
        orderBody(
          'Ines Vale',
          drinks.map((d) => ({ menuItemId: ids.item(d) })),
        ),
      );
    expect(placed.status).toBe(201);
    const orderId = placed.body.order.id as number;
    const drinkIds = (await server.db('order_items').where({ order_id: orderId, station: 'bar' }).pluck('id')) as number[];
    expect(drinkIds).toHaveLength(drinks.length);
    const baristas = await Promise.all(drinkIds.map(() => server.signIn('barista')));

    const res = await Promise.all(drinkIds.map((id, i) => baristas[i].post(`/api/drinks/${id}/bump`)));
    expect(statuses(res), JSON.stringify(res.find((r) => r.status !== 200)?.body)).toEqual(Array(drinks.length).fill(200));
    const seqs = (await server.db('order_items').whereIn('id', drinkIds).pluck('bump_seq')).map(Number);
    expect(new Set(seqs).size).toBe(drinks.length);

    const recall = await baristas[0].post(`/api/tickets/${orderId}/recall`);
    expect(recall.status, JSON.stringify(recall.body)).toBe(200);
    const back = Number((await server.db('order_items').whereIn('id', drinkIds).whereNot({ status: 'done' }).count({ n: '*' }).first())?.n);
    expect(back).toBe(1);
  });
});

describe('shifts opened at once', () => {
  it('one opens the shift; every other answers 409, never 500', async () => {
    if (await server.db('shifts').whereNull('closed_at').first('id')) {
      const closed = await lead.post('/api/shifts/current/close').send({ countedCashCents: 0, confirmOpenTickets: true });
      expect(closed.status, JSON.stringify(closed.body)).toBe(200);
    }
    const leads = await Promise.all(Array.from({ length: 8 }, () => server.signIn('lead')));
    const before = Number((await server.db('shifts').count({ n: '*' }).first())?.n);
    const res = await Promise.all(leads.map((a) => a.post('/api/shifts').send({ openingFloatCents: 15000, baristasOnBar: 2, waitTargetSeconds: 240 })));
    expect(statuses(res)).toEqual([201, ...Array(7).fill(409)]);
    expect(Number((await server.db('shifts').count({ n: '*' }).first())?.n)).toBe(before + 1);
  });
});

describe('refunds landing while the range report stores its past days', () => {
  it('a stored day is never older than its orders: the report read after the rush equals one worked out afresh', async () => {
    // last in the file: it moves the clock on to the next café day
    const orders = [];
    for (let i = 0; i < 12; i++) {
      const res = await terminal(0)
        .post('/api/orders')
        .send(orderBody(`Past ${i}`, [{ menuItemId: ids.item('Latte') }]));
      expect(res.status).toBe(201);
      orders.push(res.body.order as { id: number });
    }
    const day = (await server.db('orders').where({ id: orders[0].id }).first('business_date')).business_date as string;
    time.advance(24 * 3600_000);
    const range = () => lead.get(`/api/reports/range?from=${day}&to=${day}`);
    for (const order of orders) {
      // one refund and a few range reports at the same moment: the reports fill the day's stored
      // partial while the refund changes one of its orders
      const [refund, ...reports] = await Promise.all([
        lead.post(`/api/orders/${order.id}/refund`).send({ amountCents: 10, reason: 'Short pour' }),
        range(),
        range(),
        range(),
      ]);
      expect(refund.status, JSON.stringify(refund.body)).toBe(200);
      for (const r of reports) expect(r.status, JSON.stringify(r.body)).toBe(200);
    }
    const cached = await range();
    await server.db('report_days').delete();
    const fresh = await range();
    expect(cached.body).toEqual(fresh.body);
  });
  it('a day stored while a change to its orders is still uncommitted waits for that change', async () => {
    // A second connection changes an order of the stored day and holds its transaction open (on
    // PostgreSQL; SQLite's one writer can't have a change open beside the app's, so there the
    // change simply comes first). The report asked meanwhile must not store the day without it.
    const placed = await terminal(0)
      .post('/api/orders')
      .send(orderBody('Held Change', [{ menuItemId: ids.item('Latte') }]));
    expect(placed.status).toBe(201);
    time.advance(24 * 3600_000); // its day is past now: the report stores it
    const order = (await server.db('orders').where({ id: placed.body.order.id }).first('id', 'business_date')) as { id: number; business_date: string };
    const range = () => lead.get(`/api/reports/range?from=${order.business_date}&to=${order.business_date}`);
    await server.db('report_days').delete();
    const pg = dialectOf(server.db) === 'postgres';
    const other = createDb(server.databaseTarget);
    try {
      const writer = pg ? await other.transaction() : null;
      await (writer ?? server.db)('orders').where({ id: order.id }).increment('refunded_cents', 10);
      let settled = false;
      const report = range().then((r) => ((settled = true), r));
      // until the report has either finished or is waiting for a lock the change holds
      while (pg && !settled && !(await waitingForLock(other))) await new Promise((r) => setTimeout(r, 10));
      await writer?.commit();
      expect((await report).status).toBe(200);
    } finally {
      await other.destroy();
    }
    const cached = await range();
    await server.db('report_days').delete();
    expect(cached.body).toEqual((await range()).body);
  });
});
