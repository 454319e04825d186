// Web security: cross-site requests refused (CSRF by a strict Origin check), security headers,
// and the health endpoints. Sign-in throttling: sign-in-throttle.test.ts.
import { randomUUID } from 'node:crypto';
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { demoMenu, startTestServer, type TestServer } from '../support/test-server';

let server: TestServer;
let cashier: Awaited<ReturnType<TestServer['signIn']>>;
let espresso: number;
beforeAll(async () => {
  server = await startTestServer();
  cashier = await server.signIn('cashier');
  espresso = (await demoMenu(server)).item('Espresso');
});
afterAll(() => server.close());

const order = () => ({
  clientOrderId: randomUUID(),
  customerName: 'Tova Reyne',
  items: [{ menuItemId: espresso }],
  payment: { method: 'cash', tenderedCents: 1000 },
});
const count = async (table: string) => Number((await server.db(table).count<{ n: number }>({ n: '*' }).first())?.n);

describe('cross-site requests', () => {
  it('refuses a state-changing call from another site’s page, and stores nothing', async () => {
    const before = await count('orders');
    const res = await cashier.post('/api/orders').set('Origin', 'http://evil.example').send(order());
    expect(res.status).toBe(403);
    expect(res.body.error.code).toBe('forbidden');
    const bySite = await cashier.post('/api/orders').set('Sec-Fetch-Site', 'cross-site').send(order());
    expect(bySite.status).toBe(403);
    expect(await count('orders')).toBe(before);
  });

  it('accepts the same call from our own page', async () => {
    const host = new URL(server.url).host;
    const res = await cashier.post('/api/orders').set('Origin', `http://${host}`).set('Sec-Fetch-Site', 'same-origin').send(order());
    expect(res.status).toBe(201);
  });

  it('leaves reads alone and lets the payment provider’s webhook through to its signature check', async () => {
    expect((await cashier.get('/api/menu').set('Origin', 'http://evil.example')).status).toBe(200);
    const hook = await request(server.url).post('/api/webhooks/payments').set('Origin', 'http://evil.example').send({ x: 1 });
    expect(hook.status).toBe(400); // refused by the signature, not by the origin rule
  });
});

describe('headers and health', () => {
  it('sends the usual security headers and no server banner', async () => {
    const res = await request(server.url).get('/api/session');
    expect(res.headers['x-content-type-options']).toBe('nosniff');
    expect(res.headers['x-frame-options']).toBe('SAMEORIGIN');
    expect(res.headers['x-powered-by']).toBeUndefined();
  });
  it('answers /healthz and /readyz', async () => {
    expect((await request(server.url).get('/healthz')).body).toEqual({ ok: true });
    expect((await request(server.url).get('/readyz')).body).toEqual({ ok: true });
  });
});
