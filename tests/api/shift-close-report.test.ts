// Closing a shift with tickets still at the bar, and what the shift report then carries: the cash
// count (float, expected, counted, difference, note, who closed) and the tickets left open, in the
// mail and in the shift CSV, in the café's currency (a euro café here).
import Papa from 'papaparse';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { OutboxMail } from '@/domain/outbox';
import type { OrderView } from '@/domain/types';
import { demoMenu, manualClock, startTestServer, type TestServer } from '../support/test-server';
import { orderBody, type Agent } from './helpers';

const MIN = 60_000;
const T0 = '2026-03-02T14:00:00.000Z'; // 09:00 in New York, the demo café's zone
const csvRows = (text: string) => Papa.parse<string[]>(text.trim(), { skipEmptyLines: true }).data;

describe('closing a shift with tickets still open', () => {
  const time = manualClock(T0);
  let server: TestServer;
  let lead: Agent, cashier: Agent, barista: Agent, owner: Agent;
  let latte: number;
  let shiftId: number;
  const orders: OrderView[] = [];
  const shiftRow = () => server.db('shifts').where({ id: shiftId }).first();
  const eventCount = async () => Number((await server.db('events').count({ n: '*' }).first())?.n);

  beforeAll(async () => {
    server = await startTestServer({ clock: time.clock });
    [lead, cashier, barista, owner] = [
      await server.signIn('lead'),
      await server.signIn('cashier'),
      await server.signIn('barista'),
      await server.signIn('owner'),
    ];
    latte = (await demoMenu(server)).item('Latte');
    // a euro café: every cash figure must come out in its currency, never in dollars
    await server.db('locations').update({ currency: 'EUR' });
    const open = await lead.post('/api/shifts').send({ openingFloatCents: 150_00, baristasOnBar: 2, waitTargetSeconds: 240 });
    expect(open.status, JSON.stringify(open.body)).toBe(201);
    shiftId = open.body.shift.id;
    for (const name of ['Ines Moreau', 'Jory Blake', 'Kit Amsel']) {
      const res = await cashier.post('/api/orders').send(orderBody(name, [{ menuItemId: latte }], 10_00));
      expect(res.status, JSON.stringify(res.body)).toBe(201);
      orders.push(res.body.order);
      time.advance(MIN);
    }
    // the first is made; the other two are still at the bar, fired at T0+1 and T0+2
    expect((await barista.post(`/api/tickets/${orders[0].id}/bump`)).status).toBe(200);
  });
  afterAll(() => server.close());

  it('409 open_tickets with the count and the oldest wait, and nothing changes', async () => {
    time.set(new Date(Date.parse(T0) + 13 * MIN).toISOString()); // Jory's ticket fired 12 minutes ago
    const before = await eventCount();
    const res = await lead.post('/api/shifts/current/close').send({ countedCashCents: 100_00 });
    expect(res.status).toBe(409);
    expect(res.body.error).toMatchObject({ code: 'open_tickets', details: { openTickets: 2, oldestWaitSeconds: 720 } });
    expect(res.body.error.message).toMatch(/2 tickets are still open/);
    expect(await shiftRow()).toMatchObject({ closed_at: null, counted_cash_cents: null });
    expect(await eventCount()).toBe(before);
  });

  it('confirmOpenTickets must be a boolean (400)', async () => {
    const res = await lead.post('/api/shifts/current/close').send({ countedCashCents: 100_00, confirmOpenTickets: 'yes' });
    expect(res.status).toBe(400);
    expect(res.body.error.details).toEqual([{ path: 'confirmOpenTickets', message: expect.any(String) }]);
  });

  it('with confirmOpenTickets the shift closes and keeps what was left open', async () => {
    const expected = 150_00 + orders.reduce((s, o) => s + o.totalCents, 0);
    const res = await lead.post('/api/shifts/current/close').send({ countedCashCents: expected - 125, note: 'Short, counted twice', confirmOpenTickets: true });
    expect(res.status, JSON.stringify(res.body)).toBe(200);
    expect(res.body.shift).toMatchObject({ expectedCashCents: expected, countedCashCents: expected - 125, closedBy: 'Theo Brand' });
    expect(await shiftRow()).toMatchObject({ open_tickets_at_close: 2, oldest_open_wait_seconds_at_close: 720 });
  });

  it('the mailed report carries the cash count and the open tickets, in euros', async () => {
    const expected = 150_00 + orders.reduce((s, o) => s + o.totalCents, 0);
    const eur = (c: number) => new Intl.NumberFormat('en-US', { style: 'currency', currency: 'EUR' }).format(c / 100);
    let mail: OutboxMail | undefined;
    for (let i = 0; i < 100 && !mail; i++) {
      mail = ((await owner.get('/api/outbox')).body.mails as OutboxMail[]).find((m) => /shift/i.test(m.subject));
      if (!mail) await new Promise((r) => setTimeout(r, 50));
    }
    if (!mail) throw new Error('the shift report never reached the outbox');
    for (const line of [
      'Cash drawer',
      `  Float: ${eur(150_00)}`,
      `  Expected in the drawer: ${eur(expected)}`,
      `  Counted: ${eur(expected - 125)}`,
      `  Difference: ${eur(125)} short`,
      '  Note: Short, counted twice',
      '  Opened by: Theo Brand',
      '  Closed by: Theo Brand',
      '  Tickets still open at close: 2, the oldest waiting 12:00',
    ])
      expect(mail.text).toContain(`${line}\n`);
    expect(mail.text).not.toContain('$');
    expect(mail.html).toContain('Cash drawer');
    expect(mail.html).toContain(`${eur(125)} short`);
    expect(mail.html).toContain('2, the oldest waiting 12:00');
  });

  it("the shift CSV carries the same figures, in the café's currency", async () => {
    const expected = 150_00 + orders.reduce((s, o) => s + o.totalCents, 0);
    const res = await lead.get(`/api/reports/shift/${shiftId}.csv`);
    expect(res.status).toBe(200);
    const rows = csvRows(res.text);
    for (const row of [
      ['Cash drawer', '', 'float (EUR)', '150.00'],
      ['Cash drawer', '', 'expected (EUR)', (expected / 100).toFixed(2)],
      ['Cash drawer', '', 'counted (EUR)', ((expected - 125) / 100).toFixed(2)],
      ['Cash drawer', '', 'difference (EUR)', '-1.25'],
      ['Cash drawer', '', 'note', 'Short, counted twice'],
      ['Cash drawer', '', 'opened by', 'Theo Brand'],
      ['Cash drawer', '', 'closed by', 'Theo Brand'],
      ['Cash drawer', '', 'tickets still open at close', '2'],
      ['Cash drawer', '', 'oldest open ticket wait (s)', '720'],
    ])
      expect(rows).toContainEqual(row);
  });

  it('with nothing open, no confirmation is needed; the report says none were open', async () => {
    for (const o of orders.slice(1)) expect((await barista.post(`/api/tickets/${o.id}/bump`)).status).toBe(200);
    const open = await lead.post('/api/shifts').send({ openingFloatCents: 0, baristasOnBar: 1, waitTargetSeconds: 240 });
    expect(open.status).toBe(201);
    const res = await lead.post('/api/shifts/current/close').send({ countedCashCents: 0 });
    expect(res.status, JSON.stringify(res.body)).toBe(200);
    const rows = csvRows((await lead.get(`/api/reports/shift/${open.body.shift.id}.csv`)).text);
    expect(rows).toContainEqual(['Cash drawer', '', 'tickets still open at close', '0']);
    expect(rows).toContainEqual(['Cash drawer', '', 'difference (EUR)', '0']);
  });

  it('many confirmed closes at once: one closes the shift, the rest are 409', async () => {
    const open = await lead.post('/api/shifts').send({ openingFloatCents: 0, baristasOnBar: 1, waitTargetSeconds: 240 });
    expect(open.status).toBe(201);
    expect((await cashier.post('/api/orders').send(orderBody('Lux Varga', [{ menuItemId: latte }], 10_00))).status).toBe(201);
    const closes = await Promise.all(
      Array.from({ length: 8 }, () => lead.post('/api/shifts/current/close').send({ countedCashCents: 0, confirmOpenTickets: true })),
    );
    expect(closes.map((r) => r.status).sort()).toEqual([200, 409, 409, 409, 409, 409, 409, 409]);
    expect(closes.filter((r) => r.status === 409).every((r) => r.body.error.code === 'conflict')).toBe(true);
    expect(await server.db('shifts').where({ id: open.body.shift.id }).first()).toMatchObject({ open_tickets_at_close: 1 });
  });
});
