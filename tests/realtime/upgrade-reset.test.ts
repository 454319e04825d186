// A client that gives up while its upgrade is still being authenticated must not take the
// server down with it (regression: the socket had no error handler during authentication).
import type { Socket } from 'node:net';
import net from 'node:net';
import type { Knex } from 'knex';
import { afterAll, afterEach, beforeAll, describe, expect, it } from 'vitest';
import { startTestServer, type TestServer } from '../support/test-server';
import { closeAllSockets, connect, SAFETY_TIMEOUT_MS } from './ws-client';

let server: TestServer;
beforeAll(async () => {
  server = await startTestServer();
});
afterEach(() => closeAllSockets());
afterAll(() => server.close());

const within = <T>(p: Promise<T>, what: string) =>
  Promise.race([p, new Promise<never>((_r, reject) => setTimeout(() => reject(new Error(`no ${what}`)), SAFETY_TIMEOUT_MS))]);

describe('a client resetting the connection during the upgrade', () => {
  it('leaves the server running and accepting screens', async () => {
    const cookie = await server.cookieFor('barista');
    const { port } = server.server.address() as net.AddressInfo;

    // Hold the only database connection, so the session lookup of the upgrade has to wait.
    const held: Knex.Transaction = await server.db.transaction();
    let serverSide: Socket | undefined;
    const seen = new Promise<Socket>((resolve) => {
      const spy = (_req: unknown, socket: Socket) => {
        server.server.off('upgrade', spy);
        resolve(socket);
      };
      server.server.prependListener('upgrade', spy);
    });
    const client = net.connect(port, '127.0.0.1');
    client.on('error', () => {});
    try {
      await new Promise<void>((resolve) => client.once('connect', () => resolve()));
      client.write(
        'GET /ws HTTP/1.1\r\nHost: localhost\r\nUpgrade: websocket\r\nConnection: Upgrade\r\n' +
          'Sec-WebSocket-Key: dGhlIHNhbXBsZSBub25jZQ==\r\nSec-WebSocket-Version: 13\r\n' +
          `Cookie: ${cookie}\r\n\r\n`,
      );
      serverSide = await within(seen, 'upgrade on the server');
      const closed = new Promise<void>((resolve) => serverSide!.once('close', () => resolve()));
      client.resetAndDestroy(); // RST while the server is still authenticating
      await within(closed, 'close of the server side');
    } finally {
      await held.commit();
    }

    // the server is still there and still authenticates and serves screens
    const screen = await connect(server.url, cookie);
    expect(await screen.next((m) => m.type === 'hello', 'hello')).toMatchObject({ type: 'hello' });
  });
});
