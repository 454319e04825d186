// The "ready" mail: a customer who left an address at the Counter is mailed once when the Bar
// bumps the order's last drink, over real SMTP to the local fake, which stores it in the outbox.
// Never twice (a recall and re-bump, bumps raced from two screens, the send itself raced as a
// second process would), never without an address or with the café's setting off, and a mail
// server that is down never fails the bump.
import { createServer } from 'node:net';
import { afterAll, beforeAll, describe, expect, it, vi } from 'vitest';
import type { TicketView } from '@/domain/types';
import { mailReadyTickets } from '@server/orders/ready-mail';
import { demoMenu, startTestServer, type TestServer } from '../support/test-server';
import { orderBody, type Agent, type LineInput } from './helpers';
import { jsonOf } from '../support/rows';

let server: TestServer;
let cashier: Agent;
let barista: Agent;
let barista2: Agent;
let owner: Agent;
let menu: Awaited<ReturnType<typeof demoMenu>>;

beforeAll(async () => {
  server = await startTestServer();
  [cashier, barista, barista2, owner] = [
    await server.signIn('cashier'),
    await server.signIn('barista'),
    await server.signIn('barista2'),
    await server.signIn('owner'),
  ];
  menu = await demoMenu(server);
});
afterAll(() => server.close());

/** A cash order, with the customer's address when given; answers the order's id and number. */
async function place(agent: Agent, name: string, email: string | null, items: LineInput[] = [{ menuItemId: menu.item('Latte') }]) {
  const res = await agent.post('/api/orders').send({ ...orderBody(name, items), ...(email ? { customerEmail: email } : {}) });
  if (res.status !== 201) throw new Error(`order failed: ${res.status} ${JSON.stringify(res.body)}`);
  return { id: res.body.order.id as number, number: res.body.order.number as number };
}
const drinkIdsOf = async (s: TestServer, orderId: number): Promise<number[]> =>
  (await s.db('order_items').where({ order_id: orderId, station: 'bar' }).orderBy('line_no')).map((r) => r.id);

/** The ready mails in the outbox addressed to `email` (the receipt goes there too, and is left out). */
const readyMailsTo = async (s: TestServer, email: string) =>
  (await s.db('outbox').orderBy('id').select('to_addresses', 'subject', 'text_body', 'html_body', 'location_id')).filter(
    (m) => (jsonOf(m.to_addresses) as string[]).includes(email) && / is ready at /.test(m.subject),
  );

/** Waits (a bounded number of short polls) until `check` holds; the time taken is not asserted on. */
async function eventually(check: () => Promise<boolean>, what: string) {
  for (let i = 0; i < 200; i++) {
    if (await check()) return;
    await new Promise((r) => setTimeout(r, 25));
  }
  throw new Error(`never happened: ${what}`);
}

const readyState = async (s: TestServer, orderId: number) => (await s.db('orders').where({ id: orderId }).first('ready_mail_state')).ready_mail_state;

/**
 * A later order's ready mail has arrived and been recorded: any ready mail an earlier bump set off
 * has had its turn (each is claimed before it is sent, and the sentinel's came after).
 */
async function sentinel(name: string) {
  const email = `${name.toLowerCase()}@example.com`;
  const order = await place(cashier, name, email);
  expect((await barista.post(`/api/tickets/${order.id}/bump`)).status).toBe(200);
  await eventually(async () => (await readyState(server, order.id)) === 'sent', `the ${name} ready mail`);
  expect(await readyMailsTo(server, email)).toHaveLength(1);
}

describe('the ready mail', () => {
  it('is sent once the last drink is bumped, not before: the number, the name, the drinks, from the café', async () => {
    const email = 'maud.gallant@example.com';
    const order = await place(cashier, 'Maud Gallant', email, [
      { menuItemId: menu.item('Latte') },
      { menuItemId: menu.item('Espresso') },
      { menuItemId: menu.item('Espresso') },
    ]);
    const [latte, ...espressos] = await drinkIdsOf(server, order.id);
    expect((await barista.post(`/api/drinks/${latte}/bump`)).status).toBe(200);
    await sentinel('Sentinel');
    expect(await readyMailsTo(server, email)).toEqual([]); // two drinks still on the bar
    expect(await readyState(server, order.id)).toBeNull();

    const last = await barista.post('/api/drinks/bump').send({ drinkIds: espressos });
    expect(last.status).toBe(200);
    expect((last.body.tickets as TicketView[])[0].status).toBe('ready');
    await eventually(async () => (await readyState(server, order.id)) === 'sent', 'sent recorded');
    const [mail, ...more] = await readyMailsTo(server, email);
    expect(more).toEqual([]);
    expect(mail.subject).toBe(`Your order #${order.number} is ready at Harbour & Hearth Coffee`);
    expect(mail.text_body).toContain(`Order #${order.number} is ready, Maud!`);
    expect(mail.text_body).toContain(`Ask for #${order.number}, Maud Gallant,`);
    expect(mail.text_body).toContain('1 × Latte');
    expect(mail.text_body).toContain('2 × Espresso'); // the same drink twice is one line
    expect(mail.text_body).toContain('left your address for the receipt'); // why they get it
    expect(mail.html_body).toContain(`<strong>#${order.number}</strong> is ready, Maud!`);
    expect(mail.html_body).toContain('2 × Espresso');
    // listed in the café's Outbox, as the receipts are
    const cafe = (await server.db('orders').where({ id: order.id }).first('location_id')).location_id;
    expect(mail.location_id).toBe(cafe);
    const outbox = (await owner.get('/api/outbox').expect(200)).body.mails as { subject: string }[];
    expect(outbox.map((m) => m.subject)).toContain(mail.subject);
  });

  it('is sent when the last drinks go out in one jug bump, once for each order in the jug', async () => {
    const [a, b] = ['jug.one@example.com', 'jug.two@example.com'];
    const flatWhite = [{ menuItemId: menu.item('Flat white') }];
    const first = await place(cashier, 'Jug One', a, flatWhite);
    const second = await place(cashier, 'Jug Two', b, flatWhite);
    const drinkIds = [...(await drinkIdsOf(server, first.id)), ...(await drinkIdsOf(server, second.id))];
    const started = await barista.post('/api/jugs').send({ drinkIds });
    expect(started.status, JSON.stringify(started.body)).toBe(201);
    expect((await barista.post(`/api/jugs/${started.body.jugId}/bump`).send({ drinkIds })).status).toBe(200);
    for (const o of [first, second]) await eventually(async () => (await readyState(server, o.id)) === 'sent', `order ${o.number}'s ready mail`);
    expect((await readyMailsTo(server, a)).map((m) => m.subject)).toEqual([`Your order #${first.number} is ready at Harbour & Hearth Coffee`]);
    expect((await readyMailsTo(server, b)).map((m) => m.subject)).toEqual([`Your order #${second.number} is ready at Harbour & Hearth Coffee`]);
  });

  it('is not sent for an order without an address', async () => {
    const order = await place(cashier, 'Cy Nomail', null);
    expect((await barista.post(`/api/tickets/${order.id}/bump`)).status).toBe(200);
    await sentinel('Sentinel2');
    expect(await readyState(server, order.id)).toBeNull();
    const subjects = (await server.db('outbox').pluck('subject')) as string[];
    expect(subjects.filter((s) => s.startsWith(`Your order #${order.number} `))).toEqual([]);
  });

  it('is not sent while the café has it turned off in Settings; turned on again, the next order gets one', async () => {
    await owner.put('/api/settings').send({ readyMail: false }).expect(200);
    const email = 'off.switch@example.com';
    const order = await place(cashier, 'Bo Off', email);
    expect((await barista.post(`/api/tickets/${order.id}/bump`)).status).toBe(200);
    await owner.put('/api/settings').send({ readyMail: true }).expect(200);
    await sentinel('Sentinel3');
    expect(await readyMailsTo(server, email)).toEqual([]);
    expect(await readyState(server, order.id)).toBeNull();
  });

  it('is not sent twice when the ticket is recalled and bumped again', async () => {
    const email = 'wren.recall@example.com';
    const order = await place(cashier, 'Wren Recall', email);
    expect((await barista.post(`/api/tickets/${order.id}/bump`)).status).toBe(200);
    await eventually(async () => (await readyState(server, order.id)) === 'sent', 'the first ready mail');
    expect((await barista.post(`/api/tickets/${order.id}/recall`)).status).toBe(200);
    expect((await server.db('orders').where({ id: order.id }).first('status')).status).toBe('open');
    const [drink] = await drinkIdsOf(server, order.id);
    expect((await barista2.post(`/api/drinks/${drink}/bump`)).status).toBe(200);
    await sentinel('Sentinel4');
    expect(await readyMailsTo(server, email)).toHaveLength(1);
  });

  it('is sent once when both baristas bump the last drink at once, by drink and by ticket', async () => {
    const email = 'rush.race@example.com';
    const order = await place(cashier, 'Rush Race', email, [{ menuItemId: menu.item('Latte') }, { menuItemId: menu.item('Espresso') }]);
    const [first, last] = await drinkIdsOf(server, order.id);
    expect((await barista.post(`/api/drinks/${first}/bump`)).status).toBe(200);
    const answers = await Promise.all(
      Array.from({ length: 8 }, (_, i) => {
        const agent = i % 2 ? barista : barista2;
        return i % 4 < 2 ? agent.post(`/api/drinks/${last}/bump`) : agent.post(`/api/tickets/${order.id}/bump`);
      }),
    );
    // one bump wins; the others lost to it (409), or met a busy database (503) on SQLite's one writer
    expect(answers.filter((a) => a.status === 200)).toHaveLength(1);
    for (const a of answers) expect([200, 409, 503]).toContain(a.status);
    await eventually(async () => (await readyState(server, order.id)) === 'sent', 'the ready mail');
    await sentinel('Sentinel5');
    expect(await readyMailsTo(server, email)).toHaveLength(1);
  });

  it('is sent once when the send itself is set off many times at once, as retries or a second process would', async () => {
    const email = 'twice.over@example.com';
    const order = await place(cashier, 'Twice Over', email);
    const bumped = await barista.post(`/api/tickets/${order.id}/bump`);
    expect(bumped.status).toBe(200);
    const ticket = bumped.body.ticket as TicketView;
    const cafe = (await server.db('orders').where({ id: order.id }).first('location_id')).location_id;
    for (let i = 0; i < 8; i++) mailReadyTickets(server.deps, cafe, [ticket, ticket]);
    await eventually(async () => (await readyState(server, order.id)) === 'sent', 'the ready mail');
    await sentinel('Sentinel6');
    expect(await readyMailsTo(server, email)).toHaveLength(1);
  });

  it('writes what the customer typed as text in the HTML part, never as markup', async () => {
    const email = 'markup.name@example.com';
    const order = await place(cashier, '<img src=x onerror=alert(1)> <b>Bold</b>', email);
    expect((await barista.post(`/api/tickets/${order.id}/bump`)).status).toBe(200);
    await eventually(async () => (await readyState(server, order.id)) === 'sent', 'the ready mail');
    const [mail] = await readyMailsTo(server, email);
    expect(mail.html_body).not.toContain('<img');
    expect(mail.html_body).not.toContain('<b>Bold');
    expect(mail.html_body).toContain('&#60;img src=x onerror=alert(1)&#62;');
    expect(mail.html_body).toContain('&#60;b&#62;Bold&#60;/b&#62;');
    expect(mail.text_body).toContain('<b>Bold</b>'); // the plain-text part is text already
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

  it('never fails the bump: the ticket is ready, the order records the failure and the log says why, without the address; no retry', async () => {
    const warn = vi.spyOn(console, 'warn').mockImplementation(() => {});
    try {
      const [cashierDown, baristaDown] = [await down.signIn('cashier'), await down.signIn('barista')];
      const order = await place(cashierDown, 'Di Down', 'di.down@example.com');
      const res = await baristaDown.post(`/api/tickets/${order.id}/bump`);
      expect(res.status).toBe(200);
      expect(res.body.ticket.status).toBe('ready');
      await eventually(async () => (await readyState(down, order.id)) === 'failed', 'the failure recorded');
      const row = await down.db('orders').where({ id: order.id }).first('ready_mail_error', 'status');
      expect(row.ready_mail_error).toMatch(/ECONNREFUSED|connect/i);
      expect(row.status).toBe('ready');
      expect(warn).toHaveBeenCalledWith(expect.stringContaining(`ready mail of order ${order.id}`));
      expect(String(warn.mock.calls.flat())).not.toContain('di.down@example.com');
      // a recall and re-bump does not try again: the failure stays recorded
      expect((await baristaDown.post(`/api/tickets/${order.id}/recall`)).status).toBe(200);
      expect((await baristaDown.post(`/api/tickets/${order.id}/bump`)).status).toBe(200);
      expect(await readyState(down, order.id)).toBe('failed');
    } finally {
      warn.mockRestore();
    }
  });
});
