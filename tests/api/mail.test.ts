// Mailing a receipt: the real mail client sends over real SMTP to the local fake, which stores it
// in the outbox; the Outbox lists a café's own mail only, and the guards and validation hold.
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { hashPassword } from '@server/auth/passwords';
import type { OutboxMail } from '@/domain/outbox';
import type { OrderView } from '@/domain/types';
import { demoMenu, startTestServer, type TestServer } from '../support/test-server';
import { groupOfItsOwn } from '../support/cafe-groups';
import { orderBody, type Agent } from './helpers';
import { jsonOf } from '../support/rows';

let server: TestServer;
let cashier: Agent;
let lead: Agent;
let barista: Agent;
let northCashier: Agent;
let northLead: Agent;
let northItemId: number;

/** A second café (GBP, en-GB) with a cashier, a lead and one drink, inserted as the demo seed does. */
async function insertNorthCafe(db: TestServer['db']) {
  const createdAt = new Date().toISOString();
  const [{ id: locationId }] = await db('locations')
    .insert({
      name: 'North Quay Espresso',
      group_id: await groupOfItsOwn(db, 'North Quay Espresso', createdAt),
      time_zone: 'Europe/London',
      currency: 'GBP',
      locale: 'en-GB',
      tax_mode: 'inclusive',
      tax_rate_milli_pct: 20000,
      created_at: createdAt,
    })
    .returning('id');
  const hash = await hashPassword('north-side-password');
  const { group_id } = await db('locations').where({ id: locationId }).first('group_id');
  for (const role of ['cashier', 'lead']) {
    await db('users').insert({
      location_id: locationId,
      group_id,
      username: `north-${role}`,
      name: `North ${role}`,
      role,
      password_hash: hash,
      created_at: createdAt,
    });
  }
  const [{ id: categoryId }] = await db('menu_categories').insert({ location_id: locationId, name: 'Coffee' }).returning('id');
  const [{ id: itemId }] = await db('menu_items')
    .insert({ category_id: categoryId, name: 'Cortado', station: 'bar', price_cents: 350, shots: 2 })
    .returning('id');
  return itemId as number;
}

async function northSignIn(role: 'cashier' | 'lead') {
  const agent = request.agent(server.url);
  const res = await agent.post('/api/session').send({ username: `north-${role}`, password: 'north-side-password' });
  if (res.status !== 200) throw new Error(`north sign-in failed: ${res.status}`);
  return agent;
}

async function placeOrder(agent: Agent, name: string, items: { menuItemId: number; sizeId?: number; milkId?: number }[], tendered = 20_00) {
  const res = await agent.post('/api/orders').send(orderBody(name, items, tendered));
  if (res.status !== 201) throw new Error(`order failed: ${res.status} ${JSON.stringify(res.body)}`);
  return res.body.order as OrderView;
}

/** Waits (a bounded number of short polls) for the mail to be listed; the count is not asserted on. */
async function waitForMail(agent: Agent, messageId: string): Promise<OutboxMail> {
  for (let i = 0; i < 100; i++) {
    const res = await agent.get('/api/outbox');
    expect(res.status).toBe(200);
    const found = (res.body.mails as OutboxMail[]).find((m) => m.messageId === messageId);
    if (found) return found;
    await new Promise((r) => setTimeout(r, 50));
  }
  throw new Error(`mail ${messageId} never reached the outbox`);
}

const outboxRows = async () => Number((await server.db('outbox').count({ n: '*' }).first())?.n);

beforeAll(async () => {
  server = await startTestServer();
  [cashier, lead, barista] = [await server.signIn('cashier'), await server.signIn('lead'), await server.signIn('barista')];
  northItemId = await insertNorthCafe(server.db);
  [northCashier, northLead] = [await northSignIn('cashier'), await northSignIn('lead')];
});
afterAll(() => server.close());

describe('POST /api/orders/:id/receipt', () => {
  it('mails the receipt over SMTP into the outbox, with the order number and the total', async () => {
    const ids = await demoMenu(server);
    const order = await placeOrder(cashier, 'Ada Lovelace', [
      { menuItemId: ids.item('Latte'), sizeId: ids.size('Latte', 'Large'), milkId: ids.milk('Oat') },
      { menuItemId: ids.item('Butter croissant') },
    ]);

    const res = await cashier.post(`/api/orders/${order.id}/receipt`).send({ email: 'ada@example.com' });
    expect(res.status).toBe(202);
    expect(res.body).toEqual({ sent: true, messageId: expect.stringMatching(/^<.+@.+>$/) });

    const mail = await waitForMail(lead, res.body.messageId);
    // the total written out here rather than by the app's own formatter
    const total = `$${(order.totalCents / 100).toFixed(2)}`;
    const change = `$${((20_00 - order.totalCents) / 100).toFixed(2)}`;
    expect(mail.to).toEqual(['ada@example.com']);
    expect(mail.from).toContain('Harbour & Hearth Coffee');
    expect(mail.from).toContain('<receipts@jugline.local>');
    expect(mail.subject).toContain(`#${order.number}`);
    expect(mail.text).toContain(`Total: ${total}`);
    expect(mail.text).toContain(`change ${change}`);
    expect(mail.text).toContain('Thank you, Ada!');
    expect(mail.text).toMatch(/Latte — \$\d+\.\d\d\n {2}Large · Oat milk · 2 shots/);
    expect(mail.html).toContain('Harbour &#38; Hearth Coffee');

    const row = await server.db('outbox').where({ message_id: res.body.messageId }).first();
    expect({ subject: row.subject, to: jsonOf(row.to_addresses) }).toEqual({ subject: mail.subject, to: ['ada@example.com'] });
  });

  it('refuses a badly formed address with 400 on the email field and sends nothing', async () => {
    const ids = await demoMenu(server);
    const order = await placeOrder(cashier, 'Bo', [{ menuItemId: ids.item('Espresso') }]);
    const before = await outboxRows();
    for (const email of ['not-an-address', '', 'a@b@c.com']) {
      const res = await cashier.post(`/api/orders/${order.id}/receipt`).send({ email });
      expect(res.status).toBe(400);
      expect(res.body.error.code).toBe('validation_failed');
      expect(res.body.error.details).toEqual([{ path: 'email', message: expect.any(String) }]);
    }
    expect(await outboxRows()).toBe(before);
  });

  it("answers 404 for another café's order and for one that does not exist", async () => {
    const north = await placeOrder(northCashier, 'Nia', [{ menuItemId: northItemId }], 5_00);
    const before = await outboxRows();
    for (const id of [north.id, 999_999]) {
      const res = await cashier.post(`/api/orders/${id}/receipt`).send({ email: 'someone@example.com' });
      expect(res.status).toBe(404);
      expect(res.body.error.code).toBe('not_found');
    }
    expect(await outboxRows()).toBe(before);
  });
});

describe('GET /api/outbox', () => {
  it("lists only the café's own mail, newest first, in its own currency", async () => {
    const north = await placeOrder(northCashier, 'Nia Quay', [{ menuItemId: northItemId }], 5_00);
    const sent = await northCashier.post(`/api/orders/${north.id}/receipt`).send({ email: 'nia@example.co.uk' });
    expect(sent.status).toBe(202);
    const mail = await waitForMail(northLead, sent.body.messageId);
    expect(mail.from).toContain('North Quay Espresso');
    expect(mail.text).toContain('Total: £3.50');

    const north2 = await placeOrder(northCashier, 'Ola', [{ menuItemId: northItemId }], 5_00);
    const second = await northCashier.post(`/api/orders/${north2.id}/receipt`).send({ email: 'ola@example.co.uk' });
    await waitForMail(northLead, second.body.messageId);
    const northList = (await northLead.get('/api/outbox')).body;
    expect(northList.mails.map((m: OutboxMail) => m.messageId)).toEqual([second.body.messageId, sent.body.messageId]);
    expect(northList).toMatchObject({ timeZone: 'Europe/London', locale: 'en-GB' });

    const demoList = (await lead.get('/api/outbox')).body.mails as OutboxMail[];
    expect(demoList.length).toBeGreaterThan(0);
    expect(demoList.every((m) => !m.from.includes('North Quay'))).toBe(true);
  });
});

describe('who may mail and read receipts', () => {
  it('a barista gets 403 on both routes and nothing is sent', async () => {
    const ids = await demoMenu(server);
    const order = await placeOrder(cashier, 'Cy', [{ menuItemId: ids.item('Espresso') }]);
    const before = await outboxRows();
    const send = await barista.post(`/api/orders/${order.id}/receipt`).send({ email: 'cy@example.com' });
    const list = await barista.get('/api/outbox');
    for (const res of [send, list]) {
      expect(res.status).toBe(403);
      expect(res.body).toEqual({ error: { code: 'forbidden', message: expect.any(String) } });
    }
    expect(await outboxRows()).toBe(before);
  });

  it('a cashier may send but not read the Outbox; signed out gets 401', async () => {
    expect((await cashier.get('/api/outbox')).status).toBe(403);
    expect((await request(server.url).get('/api/outbox')).status).toBe(401);
  });
});
