// The receipt is part of the order: an order that carries the customer's e-mail is mailed its
// receipt by the server once it is paid, whichever way it arrived (at once, or later as one of
// the Counter's offline orders), exactly once however often the same client order id is sent.
// The mail goes over real SMTP to the local fake, which stores it in the outbox table. A mail
// server that is down never fails the order.
import { createServer } from 'node:net';
import { afterAll, beforeAll, describe, expect, it, vi } from 'vitest';
import { demoMenu, startTestServer, type TestServer } from '../support/test-server';
import { orderBody, type Agent } from './helpers';
import { jsonOf } from '../support/rows';

let server: TestServer;
let cashier: Agent;
let menu: Awaited<ReturnType<typeof demoMenu>>;

beforeAll(async () => {
  server = await startTestServer();
  cashier = await server.signIn('cashier');
  menu = await demoMenu(server);
});
afterAll(() => server.close());

const withEmail = (name: string, email: string) => ({ ...orderBody(name, [{ menuItemId: menu.item('Latte') }]), customerEmail: email });

/** Mail in the outbox addressed to `email`. */
const mailsTo = async (db: TestServer['db'], email: string) =>
  (await db('outbox').select('to_addresses', 'subject', 'text_body')).filter((m) => (jsonOf(m.to_addresses) as string[]).includes(email));

/** Waits (a bounded number of short polls) until `check` holds; the time taken is not asserted on. */
async function eventually(check: () => Promise<boolean>, what: string) {
  for (let i = 0; i < 200; i++) {
    if (await check()) return;
    await new Promise((r) => setTimeout(r, 25));
  }
  throw new Error(`never happened: ${what}`);
}

/** A later order's mail has arrived: any mail an earlier request set off has had its turn. */
async function sentinelMail(name: string) {
  const email = `${name.toLowerCase()}@example.com`;
  expect((await cashier.post('/api/orders').send(withEmail(name, email))).status).toBe(201);
  await eventually(async () => (await mailsTo(server.db, email)).length === 1, `the ${name} receipt`);
}

describe('POST /api/orders with customerEmail', () => {
  it('mails exactly one receipt with the order number and total; a replay of the same client order id mails none', async () => {
    const body = withEmail('Ada Quay', 'ada.quay@example.com');
    const first = await cashier.post('/api/orders').send(body);
    expect(first.status).toBe(201);
    const order = first.body.order;
    expect(order.customerEmail).toBe('ada.quay@example.com');

    await eventually(async () => (await mailsTo(server.db, 'ada.quay@example.com')).length > 0, 'the receipt');
    const [mail] = await mailsTo(server.db, 'ada.quay@example.com');
    expect(mail.subject).toContain(`#${order.number}`);
    // the total written out here rather than by the app's own formatter
    expect(mail.text_body).toContain(`Total: $${(order.totalCents / 100).toFixed(2)}`);
    // the fake stores the mail before the client hears it was taken: the order says so a moment later
    await eventually(
      async () => (await server.db('orders').where({ id: order.id }).first('receipt_mail_state')).receipt_mail_state === 'sent',
      'sent recorded',
    );

    const replay = await cashier.post('/api/orders').send(body);
    expect(replay.status).toBe(200);
    expect(replay.body.order.id).toBe(order.id);
    await sentinelMail('Sentinel');
    expect(await mailsTo(server.db, 'ada.quay@example.com')).toHaveLength(1);
  });

  it('mails once when the same order is sent many times at once', async () => {
    const body = withEmail('Bo Harbour', 'bo.harbour@example.com');
    const answers = await Promise.all(Array.from({ length: 6 }, () => cashier.post('/api/orders').send(body)));
    expect(answers.map((a) => a.status).sort()).toEqual([200, 200, 200, 200, 200, 201]);
    await eventually(async () => (await mailsTo(server.db, 'bo.harbour@example.com')).length > 0, 'the receipt');
    await sentinelMail('Sentinel2');
    expect(await mailsTo(server.db, 'bo.harbour@example.com')).toHaveLength(1);
  });

  it('mails nothing for an order without an e-mail, and refuses a bad address with 400 before anything is stored', async () => {
    const before = Number((await server.db('outbox').count({ n: '*' }).first())?.n);
    const orders = Number((await server.db('orders').count({ n: '*' }).first())?.n);
    const bad = await cashier.post('/api/orders').send(withEmail('Cy', 'not-an-address'));
    expect(bad.status).toBe(400);
    expect(bad.body.error.details).toEqual([{ path: 'customerEmail', message: expect.any(String) }]);
    expect(Number((await server.db('orders').count({ n: '*' }).first())?.n)).toBe(orders);
    const plain = await cashier.post('/api/orders').send(orderBody('Cy', [{ menuItemId: menu.item('Espresso') }]));
    expect(plain.status).toBe(201);
    await sentinelMail('Sentinel3');
    expect(Number((await server.db('outbox').count({ n: '*' }).first())?.n)).toBe(before + 1); // the sentinel's only
    expect(await server.db('orders').where({ id: plain.body.order.id }).first('receipt_mail_state')).toEqual({ receipt_mail_state: null });
  });
});

describe('a mail server that is down', () => {
  let down: TestServer;
  beforeAll(async () => {
    // a port that was free a moment ago and has nothing listening: every connection is refused
    const port = await new Promise<number>((resolve) => {
      const probe = createServer().listen(0, '127.0.0.1', () => {
        const { port } = probe.address() as { port: number };
        probe.close(() => resolve(port));
      });
    });
    down = await startTestServer({ smtpUrl: `smtp://127.0.0.1:${port}` });
  });
  afterAll(() => down.close());

  it('takes the order all the same, records that its receipt was not mailed, and says so in the log', async () => {
    const warn = vi.spyOn(console, 'warn').mockImplementation(() => {});
    const agent = await down.signIn('cashier');
    const res = await agent.post('/api/orders').send(withEmail('Di Quay', 'di.quay@example.com'));
    expect(res.status).toBe(201);
    const id = res.body.order.id;
    await eventually(async () => (await down.db('orders').where({ id }).first('receipt_mail_state')).receipt_mail_state === 'failed', 'the failure recorded');
    const row = await down.db('orders').where({ id }).first('receipt_mail_error', 'status');
    expect(row.receipt_mail_error).toMatch(/ECONNREFUSED|connect/i);
    expect(row.status).toBe('open'); // on the bar as any paid order
    expect(warn).toHaveBeenCalledWith(expect.stringContaining(`order ${id}`));
    expect(String(warn.mock.calls.flat())).not.toContain('di.quay@example.com'); // no customer address in the log
  });
});
