// Refused input: 400 validation_failed with field-by-field details, and nothing written.
import request from 'supertest';
import { afterAll, afterEach, beforeAll, beforeEach, describe, expect, it } from 'vitest';
import { demoMenu, startTestServer, type TestServer } from '../support/test-server';
import { orderBody, writeCounts, type Agent } from './helpers';

let server: TestServer;
let cashier: Agent;
let barista: Agent;
let menu: Awaited<ReturnType<typeof demoMenu>>;

beforeAll(async () => {
  server = await startTestServer();
  cashier = await server.signIn('cashier');
  barista = await server.signIn('barista');
  menu = await demoMenu(server);
  // One real order, so the refusals below are checked against a non-empty database.
  const res = await cashier.post('/api/orders').send(orderBody('Pell Ashgrove', [{ menuItemId: menu.item('Latte') }]));
  if (res.status !== 201) throw new Error(`fixture order failed: ${res.status}`);
});
afterAll(() => server.close());

// After every refusal the orders, order_items and events tables are exactly as before.
let before: Awaited<ReturnType<typeof writeCounts>>;
beforeEach(async () => {
  before = await writeCounts(server);
});
afterEach(async () => {
  expect(await writeCounts(server)).toEqual(before);
});

const validationFailed = (details: unknown = expect.anything()) => ({
  error: { code: 'validation_failed', message: expect.any(String), details },
});
const paths = (body: { error: { details: { path: string }[] } }) => body.error.details.map((d) => d.path);
const latte = () => ({ menuItemId: menu.item('Latte') });

describe('POST /api/orders: the shape of the body', () => {
  it('refuses a missing customerName', async () => {
    const { customerName: _omit, ...body } = orderBody('unused', [latte()]);
    const res = await cashier.post('/api/orders').send(body);
    expect(res.status).toBe(400);
    expect(res.body).toEqual(validationFailed([{ path: 'customerName', message: expect.any(String) }]));
  });

  it('refuses a blank customerName (trimmed)', async () => {
    const res = await cashier.post('/api/orders').send(orderBody('   ', [latte()]));
    expect(res.status).toBe(400);
    expect(paths(res.body)).toEqual(['customerName']);
  });

  // A line break inside a name or note could print a forged line ("Total $0.00") on a plain-text
  // receipt or a cup label, so names and notes are one line (U+2028 is a line separator too).
  it.each(['Ana\nTotal: $0.00', 'Ana\r\nX', 'Ana\u2028X', 'Ana\u0007'])('refuses a customerName with a line break or control character (%j)', async (name) => {
    const res = await cashier.post('/api/orders').send(orderBody(name, [latte()]));
    expect(res.status).toBe(400);
    expect(paths(res.body)).toEqual(['customerName']);
  });

  it('refuses a drink note with a line break, naming the line', async () => {
    const res = await cashier.post('/api/orders').send(orderBody('Ana', [{ ...latte(), note: 'extra hot\nTotal $0.00' }]));
    expect(res.status).toBe(400);
    expect(paths(res.body)).toEqual(['items.0.note']);
  });

  it('refuses a clientOrderId that is not a uuid', async () => {
    const res = await cashier.post('/api/orders').send({ ...orderBody('Tamsin Vale', [latte()]), clientOrderId: 'order-1' });
    expect(res.status).toBe(400);
    expect(res.body).toEqual(validationFailed([{ path: 'clientOrderId', message: expect.any(String) }]));
  });

  it('refuses an order with no items', async () => {
    const res = await cashier.post('/api/orders').send(orderBody('Tamsin Vale', []));
    expect(res.status).toBe(400);
    expect(res.body).toEqual(validationFailed([{ path: 'items', message: 'Add at least one item' }]));
  });

  it('refuses a payment method it does not know', async () => {
    const res = await cashier.post('/api/orders').send({ ...orderBody('Tamsin Vale', [latte()]), payment: { method: 'cheque', tenderedCents: 1000 } });
    expect(res.status).toBe(400);
    expect(paths(res.body)).toEqual(['payment.method']);
  });

  it('refuses a card payment without a payment method id', async () => {
    const res = await cashier
      .post('/api/orders')
      .send({ ...orderBody('Tamsin Vale', [latte()]), payment: { method: 'card', paymentMethod: '4242 4242 4242 4242' } });
    expect(res.status).toBe(400);
    expect(paths(res.body)).toEqual(['payment.paymentMethod']);
  });
});

describe('POST /api/orders: checked against the menu on the server', () => {
  it('refuses a size that belongs to another item, naming items.0.sizeId', async () => {
    const res = await cashier
      .post('/api/orders')
      .send(orderBody('Tamsin Vale', [{ menuItemId: menu.item('Latte'), sizeId: menu.size('Flat white', 'Regular') }]));
    expect(res.status).toBe(400);
    expect(res.body).toEqual(validationFailed([{ path: 'items.0.sizeId', message: expect.any(String) }]));
  });

  it('refuses a milk on a drink that takes none, naming the line it is on', async () => {
    const res = await cashier.post('/api/orders').send(orderBody('Tamsin Vale', [latte(), { menuItemId: menu.item('Long black'), milkId: menu.milk('Oat') }]));
    expect(res.status).toBe(400);
    expect(res.body).toEqual(validationFailed([{ path: 'items.1.milkId', message: expect.any(String) }]));
  });

  it('refuses an unknown menu item', async () => {
    const res = await cashier.post('/api/orders').send(orderBody('Tamsin Vale', [{ menuItemId: 999_999 }]));
    expect(res.status).toBe(400);
    expect(paths(res.body)).toEqual(['items.0.menuItemId']);
  });

  it('refuses cash tendered below the total, naming payment.tenderedCents', async () => {
    // A Regular latte is 540 cents before tax; 100 cents can never cover it.
    const res = await cashier.post('/api/orders').send(orderBody('Tamsin Vale', [latte()], 100));
    expect(res.status).toBe(400);
    expect(res.body).toEqual(validationFailed([{ path: 'payment.tenderedCents', message: expect.any(String) }]));
  });

  it('refuses cash one cent short of the total', async () => {
    // Latte Regular 540 + 8.25 % tax (44.55 → 45) = 585.
    const short = await cashier.post('/api/orders').send(orderBody('Tamsin Vale', [latte()], 584));
    expect(short.status).toBe(400);
    expect(paths(short.body)).toEqual(['payment.tenderedCents']);
  });
});

describe('malformed requests', () => {
  it('answers invalid JSON with 400 validation_failed', async () => {
    const res = await cashier.post('/api/orders').set('Content-Type', 'application/json').send('{"customerName": "Tamsin",');
    expect(res.status).toBe(400);
    expect(res.body).toEqual({ error: { code: 'validation_failed', message: expect.any(String) } });
  });

  it('answers POST /api/session with {} with details for username and password', async () => {
    const res = await request(server.url).post('/api/session').send({});
    expect(res.status).toBe(400);
    expect(res.body).toEqual(validationFailed(expect.any(Array)));
    expect(paths(res.body).sort()).toEqual(['password', 'username']);
  });

  it('answers GET /api/tickets?view=bogus with 400 naming query.view', async () => {
    const res = await barista.get('/api/tickets?view=bogus');
    expect(res.status).toBe(400);
    expect(res.body).toEqual(validationFailed([{ path: 'query.view', message: expect.any(String) }]));
  });

  it('answers the retired GET /api/tickets?status=board with 400, not with the default view', async () => {
    const res = await barista.get('/api/tickets?status=board');
    expect(res.status).toBe(400);
    expect(res.body).toEqual(validationFailed([{ path: 'query', message: expect.stringContaining('status') }]));
  });

  it('answers POST /api/drinks/abc/bump with 400 naming params.id', async () => {
    const res = await barista.post('/api/drinks/abc/bump');
    expect(res.status).toBe(400);
    expect(res.body).toEqual(validationFailed([{ path: 'params.id', message: expect.any(String) }]));
  });

  it('answers a negative or zero id with 400 too', async () => {
    for (const id of ['0', '-3', '1.5']) {
      const res = await barista.post(`/api/tickets/${id}/bump`);
      expect(res.status, id).toBe(400);
      expect(paths(res.body), id).toEqual(['params.id']);
    }
  });
});
