// Load shedding (server/admission.ts): past its limit of API requests at once, a process answers a
// new one at once with 503 and Retry-After, keeps nothing of it, and takes it when it comes again
// with the same clientOrderId — once. Requests are held "in progress" the honest way: a real
// client sends the headers and half of its body, and the server waits for the rest.
import { request as httpRequest } from 'node:http';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { startTestServer, demoMenu, type TestServer } from '../support/test-server';
import { orderBody } from './helpers';

let server: TestServer;
let cookie: string;
let ids: Awaited<ReturnType<typeof demoMenu>>;

beforeAll(async () => {
  server = await startTestServer({ maxRequestsInFlight: 2 });
  cookie = await server.cookieFor('cashier');
  ids = await demoMenu(server);
});
const held: { abandon(): void }[] = [];
afterAll(async () => {
  for (const h of held) h.abandon(); // a failed test's held requests must not keep the server open
  await server.close();
});

interface Answer {
  status: number;
  retryAfter?: string;
  body: { order?: { id: number }; error?: { code: string } };
}

/** A POST /api/orders whose body arrives only when `finish()` is called: in progress until then. */
function heldOrder(body: object): { finish(): Promise<Answer>; abandon(): void } {
  const data = Buffer.from(JSON.stringify(body));
  const u = new URL('/api/orders', server.url);
  const req = httpRequest({
    host: u.hostname,
    port: u.port,
    path: u.pathname,
    method: 'POST',
    agent: false, // a connection of its own, never one a pool kept (or the server has since closed)
    headers: { cookie, origin: server.url, 'content-type': 'application/json', 'content-length': data.length },
  });
  const answered = new Promise<Answer>((resolve, reject) => {
    req.on('response', (res) => {
      let text = '';
      res.on('data', (c) => (text += c));
      res.on('end', () => resolve({ status: res.statusCode!, retryAfter: res.headers['retry-after'], body: JSON.parse(text) }));
    });
    req.on('error', reject);
  });
  req.write(data.subarray(0, 10));
  req.flushHeaders();
  const h = {
    finish: () => (req.end(data.subarray(10)), answered),
    // the client goes away: its answer never comes (the rejection is the expected hang-up)
    abandon: () => (answered.catch(() => {}), req.destroy()),
  };
  held.push(h);
  return h;
}

async function send(method: 'GET' | 'POST', path: string, body?: object): Promise<Answer> {
  const res = await fetch(new URL(path, server.url), {
    method,
    headers: { cookie, origin: server.url, ...(body ? { 'content-type': 'application/json' } : {}) },
    body: body ? JSON.stringify(body) : undefined,
  });
  return { status: res.status, retryAfter: res.headers.get('retry-after') ?? undefined, body: await res.json() };
}

/** The server has counted the held requests once a plain read is refused (each try is a request of its own). */
async function untilRefused(): Promise<Answer> {
  for (let i = 0; i < 500; i++) {
    const a = await send('GET', '/api/menu');
    if (a.status === 503) return a;
    await new Promise((r) => setImmediate(r));
  }
  throw new Error('the held requests were never counted');
}

const latte = (name: string) => orderBody(name, [{ menuItemId: ids.item('Latte') }], 20_00);
const ordersNamed = (name: string) => server.db('orders').where({ customer_name: name });

describe('past the limit of requests in progress', () => {
  it('answers 503 with Retry-After at once, keeps nothing, and takes the same order once when it comes again', async () => {
    const first = heldOrder(latte('Held One'));
    const second = heldOrder(latte('Held Two'));
    const refusedRead = await untilRefused();
    expect(refusedRead).toMatchObject({ status: 503, retryAfter: '2', body: { error: { code: 'unavailable' } } });

    const refusedBody = latte('Shed Sasha');
    const refused = await send('POST', '/api/orders', refusedBody);
    expect(refused).toMatchObject({ status: 503, retryAfter: '2' });
    expect(await ordersNamed('Shed Sasha')).toEqual([]);

    // the held ones were waiting for their bodies, not refused
    expect((await first.finish()).status).toBe(201);
    expect((await second.finish()).status).toBe(201);

    // as the Counter's queue does after Retry-After: the same clientOrderId, placed once
    const again = await send('POST', '/api/orders', refusedBody);
    expect(again.status).toBe(201);
    const once = await send('POST', '/api/orders', refusedBody);
    expect(once.status).toBe(200);
    expect(once.body.order!.id).toBe(again.body.order!.id);
    expect(await ordersNamed('Shed Sasha')).toHaveLength(1);
  });

  it('frees the place of a client that goes away before its answer', async () => {
    // three, so both places are taken even if the last answer of the test before is still being
    // finished on the server (seen on PostgreSQL): one of the three may be refused at once
    const gone = ['Gone One', 'Gone Two', 'Gone Three'].map((name) => heldOrder(latte(name)));
    await untilRefused();
    for (const h of gone) h.abandon();
    let answer: Answer | undefined;
    for (let i = 0; i < 500 && answer?.status !== 200; i++) {
      answer = await send('GET', '/api/menu');
      if (answer.status !== 200) await new Promise((r) => setTimeout(r, 5));
    }
    expect(answer?.status).toBe(200);
    expect(await server.db('orders').where('customer_name', 'like', 'Gone %')).toEqual([]);
  });
});

describe('when the event loop has not come round for a while', () => {
  // On SQLite a command runs start to end without yielding, so a rush never shows as requests in
  // progress at once: they wait unread while the loop works. Here one request blocks the loop as a
  // long command would, while a second one already waits in the socket buffer.
  it('refuses a request read after a stall past the limit (not one it is told to keep), and takes the next one once the loop is back', async () => {
    const express = (await import('express')).default;
    const { admission } = await import('@server/admission');
    const app = express();
    app.use(admission({ maxInFlight: 100, maxStallMs: 50, shedOnStall: (req) => req.path !== '/bump' }));
    app.get('/slow', (_req, res) => {
      const until = performance.now() + 120;
      while (performance.now() < until); // the loop is stalled for 120 ms
      res.json({ slow: true });
    });
    app.get('/quick', (_req, res) => res.json({ quick: true }));
    app.get('/bump', (_req, res) => res.json({ bump: true }));
    const listener = app.listen(0, '127.0.0.1');
    await new Promise((r) => listener.once('listening', r));
    const { port } = listener.address() as { port: number };
    try {
      const { connect } = await import('node:net');
      const socket = connect(port, '127.0.0.1');
      let text = '';
      const answered = new Promise<string>((resolve) => {
        socket.on('data', (d) => {
          text += d;
          if ((text.match(/\r\n\r\n\{[^}]*\}/g) ?? []).length === 4) resolve(text);
        });
      });
      // two requests in one write (HTTP/1.1 pipelining): the server reads the second in the same
      // round as the first, right after the first has stalled the loop
      socket.write(['/slow', '/quick', '/slow', '/bump'].map((p) => `GET ${p} HTTP/1.1\r\nHost: x\r\n\r\n`).join(''));
      const [slow, quick, , bump] = (await answered).split(/(?=HTTP\/1\.1 )/);
      socket.destroy();
      expect(slow).toMatch(/^HTTP\/1\.1 200/);
      expect(quick).toMatch(/^HTTP\/1\.1 503/);
      expect(quick).toMatch(/Retry-After: 2/i);
      expect(bump, 'a request the stall does not refuse').toMatch(/^HTTP\/1\.1 200/);
      const after = await fetch(`http://127.0.0.1:${port}/quick`);
      expect(after.status).toBe(200);
    } finally {
      await new Promise((r) => listener.close(r));
    }
  });
});
