// The live socket is authenticated from the session cookie at the upgrade: no valid session,
// no connection.
import request from 'supertest';
import { afterAll, afterEach, beforeAll, describe, expect, it } from 'vitest';
import { SESSION_COOKIE } from '@server/auth/session';
import { SESSION_ENDED } from '@server/realtime/socket-server';
import { DEMO_PASSWORD } from '@seeds/demo-cafe';
import { orderBody } from '../api/helpers';
import { demoMenu, startTestServer, type TestServer } from '../support/test-server';
import { closeAllSockets, connect, connectAndResume, tryUpgrade } from './ws-client';

let server: TestServer;
beforeAll(async () => {
  server = await startTestServer();
});
afterEach(() => closeAllSockets());
afterAll(() => server.close());

describe('upgrading to the live socket', () => {
  it('is refused with 401 without a cookie', async () => {
    expect(await tryUpgrade(server.url)).toEqual({ opened: false, status: 401 });
    expect(server.sockets.peers()).toBe(0);
  });

  it('is refused with 401 for a made-up session cookie', async () => {
    expect(await tryUpgrade(server.url, { Cookie: `${SESSION_COOKIE}=s%3Anot-a-session.bogus-signature` })).toEqual({
      opened: false,
      status: 401,
    });
    expect(await tryUpgrade(server.url, { Cookie: `${SESSION_COOKIE}=plainly-unsigned` })).toEqual({
      opened: false,
      status: 401,
    });
  });

  it('is refused for a real session id whose signature was tampered with', async () => {
    const cookie = await server.cookieFor('barista');
    const tampered = cookie.replace(/\.([^.;]+)$/, (_m, sig: string) => `.${sig.startsWith('A') ? 'B' : 'A'}${sig.slice(1)}`);
    expect(tampered).not.toBe(cookie);
    expect(await tryUpgrade(server.url, { Cookie: tampered })).toEqual({ opened: false, status: 401 });
  });

  it('is accepted with a signed-in cookie, and refused once that session has signed out', async () => {
    const cookie = await server.cookieFor('barista');
    // the same cookie works while signed in, so the refusal below is down to the sign-out
    const client = await connect(server.url, cookie);
    expect(await client.next((m) => m.type === 'hello', 'hello')).toMatchObject({ type: 'hello' });
    await client.close();

    const out = await request(server.url).delete('/api/session').set('Cookie', cookie);
    expect(out.status).toBe(204);
    expect(await tryUpgrade(server.url, { Cookie: cookie })).toEqual({ opened: false, status: 401 });
  });

  it('is refused for a person who has been deactivated since signing in', async () => {
    const cookie = await server.cookieFor('barista2');
    expect(await tryUpgrade(server.url, { Cookie: cookie })).toEqual({ opened: true });
    await server.db('users').where({ username: 'barista2' }).update({ active: false });
    try {
      expect(await tryUpgrade(server.url, { Cookie: cookie })).toEqual({ opened: false, status: 401 });
    } finally {
      await server.db('users').where({ username: 'barista2' }).update({ active: true });
    }
  });
});

describe('signing out and origins', () => {
  it('signing out closes that session’s live sockets, and only those', async () => {
    const signIn = await request(server.url).post('/api/session').send({ username: 'barista', password: DEMO_PASSWORD });
    const cookie = ([] as string[])
      .concat(signIn.headers['set-cookie'])
      .map((c) => c.split(';')[0])
      .join('; ');
    const other = await connect(server.url, await server.cookieFor('lead'));
    const mine = await connect(server.url, cookie);
    await mine.next((m) => m.type === 'hello');
    await other.next((m) => m.type === 'hello');
    const closed = new Promise<number>((resolve) => mine.socket.once('close', (code) => resolve(code)));
    await request(server.url).delete('/api/session').set('Cookie', cookie).expect(204);
    expect(await closed).toBe(4401);
    other.send({ type: 'ping' });
    expect((await other.next((m) => m.type === 'pong')).type).toBe('pong');
    other.socket.close();
  });

  it('signing in again on a cookie that had a session closes the old session’s sockets at once (4401), before any event', async () => {
    const cookieOf = (res: request.Response) =>
      ([] as string[])
        .concat(res.headers['set-cookie'])
        .map((c) => c.split(';')[0])
        .join('; ');
    const signIn = (username: string, cookie?: string) => {
      const req = request(server.url).post('/api/session');
      return (cookie ? req.set('Cookie', cookie) : req).send({ username, password: DEMO_PASSWORD });
    };
    const cookie = cookieOf(await signIn('barista'));
    const { client: old } = await connectAndResume(server.url, cookie);
    // whatever the old socket gets first: its close, or the event of the order placed below
    const first = new Promise<string>((resolve) => {
      old.socket.once('close', (code) => resolve(`closed ${code}`));
      old.socket.on('message', (data) => {
        if (JSON.parse(data.toString()).type === 'event') resolve('an event');
      });
    });

    // someone else signs in on the same terminal: the cookie still names the barista's session
    const again = await signIn('cashier', cookie);
    expect(again.status).toBe(200);
    const newCookie = cookieOf(again);
    expect(newCookie).not.toBe(cookie);
    const ids = await demoMenu(server);
    const placed = await request(server.url)
      .post('/api/orders')
      .set('Cookie', newCookie)
      .send(orderBody('Ada Quill', [{ menuItemId: ids.item('Long black') }]));
    expect(placed.status).toBe(201);

    expect(await first).toBe(`closed ${SESSION_ENDED}`);
    expect(old.events()).toEqual([]); // not the order, nor anything else, with its name
    expect(await tryUpgrade(server.url, { Cookie: cookie })).toEqual({ opened: false, status: 401 });
    expect(await tryUpgrade(server.url, { Cookie: newCookie })).toEqual({ opened: true });
  });

  it('refuses an upgrade from another site’s page (Origin check)', async () => {
    const cookie = await server.cookieFor('barista');
    const result = await tryUpgrade(server.url, { Cookie: cookie, Origin: 'http://evil.example' });
    expect(result).toMatchObject({ status: 403 });
    const same = await tryUpgrade(server.url, { Cookie: cookie, Origin: server.url });
    expect(same).toMatchObject({ opened: true });
  });
});
