// Session timeouts, measured on the server (OWASP Session Management Cheat Sheet: idle timeout
// 15–30 min for a low-risk app, absolute timeout 4–8 h for a working day — values confirmed on
// copies, see check-values.md). Every authenticated HTTP request counts as activity; the live
// socket's heartbeat keeps a session alive only for a wall screen (Pickup, or the Bar) that the
// role may open. The session clock is a manual one: no waiting, no timed assertions.
import { randomBytes } from 'node:crypto';
import { mkdtempSync, rmSync } from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import request from 'supertest';
import WebSocket from 'ws';
import { afterAll, afterEach, beforeAll, describe, expect, it } from 'vitest';
import { DEMO_PASSWORD } from '@seeds/demo-cafe';
import { DEFAULT_IDLE_MINUTES, SESSION_COOKIE, SESSION_MAX_AGE_MS } from '@server/auth/session';
import { ConfigError, loadConfig } from '@server/config';
import { SESSION_ENDED, WALL_SCREENS } from '@server/realtime/socket-server';
import { startServer } from '@server/server';
import type { ScreenId } from '@/domain/screens';
import { PASSIVE_REQUEST_HEADER, screenAt } from '@/lib/live-socket';
import { manualClock, startTestServer, type DemoLogin, type TestServer } from '../support/test-server';
import { closeAllSockets, connect, tryUpgrade, type LiveClient } from '../realtime/ws-client';
import { setCookies, sidOf } from './helpers';

const MIN = 60_000;
const IDLE = DEFAULT_IDLE_MINUTES * MIN;
const SECOND = 1_000;

let server: TestServer;
const time = manualClock('2026-03-02T14:00:00.000Z');
beforeAll(async () => {
  // one manual clock for both: the socket's rate limit refills on the café clock, so it moves too
  server = await startTestServer({ clock: time.clock, sessionClock: time.clock });
});
afterEach(() => closeAllSockets());
afterAll(() => server.close());

/** A fresh sign-in: its cookie header and its session id. */
async function signIn(login: DemoLogin) {
  const res = await request(server.url).post('/api/session').send({ username: login, password: DEMO_PASSWORD });
  expect(res.status).toBe(200);
  const setCookie = setCookies(res).find((c) => c.startsWith(`${SESSION_COOKIE}=`))!;
  return { cookie: setCookie.split(';')[0], sid: sidOf(setCookie), setCookie };
}
const menu = (cookie: string) => request(server.url).get('/api/menu').set('Cookie', cookie);
const whoAmI = (cookie: string) => request(server.url).get('/api/session').set('Cookie', cookie);
const stored = async (sid: string) => (await server.db('sessions').where({ sid }).first('sid')) !== undefined;

function expectSignedOut(res: request.Response) {
  expect(res.status).toBe(401);
  expect(res.body).toEqual({ error: { code: 'unauthenticated', message: expect.any(String) } });
}

/** Opens the live socket as the given screen (what src/lib/live-socket.ts sends on open). */
async function openScreen(cookie: string, screen?: ScreenId): Promise<LiveClient> {
  const client = await connect(server.url, cookie);
  const hello = (await client.next((m) => m.type === 'hello', 'hello')) as { seq: number };
  client.send({ type: 'resume', since: hello.seq, ...(screen ? { screen } : {}) });
  return client;
}

/** Resolves with the close code once the server closes the socket. */
const closeCode = (client: LiveClient) =>
  new Promise<number>((resolve) => {
    if (client.socket.readyState === WebSocket.CLOSED) throw new Error('already closed');
    client.socket.once('close', (code) => resolve(code));
  });

async function ping(client: LiveClient) {
  client.send({ type: 'ping' });
  await client.next((m) => m.type === 'pong', 'pong');
}

describe('the idle timeout over HTTP', () => {
  it(`is ${DEFAULT_IDLE_MINUTES} minutes by default, inside OWASP's 15–30 minutes`, () => {
    expect(DEFAULT_IDLE_MINUTES).toBeGreaterThanOrEqual(15);
    expect(DEFAULT_IDLE_MINUTES).toBeLessThanOrEqual(30);
  });

  it('a session still works one second before the idle limit', async () => {
    const { cookie } = await signIn('cashier');
    time.advance(IDLE - SECOND);
    expect((await menu(cookie)).status).toBe(200);
  });

  it('a session unused for the idle limit answers 401, says nobody is signed in, and is deleted', async () => {
    const { cookie, sid } = await signIn('cashier');
    expect(await stored(sid)).toBe(true);
    time.advance(IDLE);
    expectSignedOut(await menu(cookie));
    expect((await whoAmI(cookie)).body).toEqual({ user: null, cafe: null, groupCafes: [] });
    expect(await stored(sid)).toBe(false);
    // gone, not merely judged old: even a clock set back can't bring it back
    time.advance(-IDLE);
    expectSignedOut(await menu(cookie));
    time.advance(IDLE);
  });

  it('each request is activity: requests 20 minutes apart keep the session for an hour', async () => {
    const { cookie } = await signIn('lead');
    for (let i = 0; i < 3; i++) {
      time.advance(20 * MIN);
      expect((await menu(cookie)).status, `after ${(i + 1) * 20} min`).toBe(200);
    }
    time.advance(IDLE);
    expectSignedOut(await menu(cookie));
  });

  it('a screen’s passive check (the live socket asking who is signed in) is not activity', async () => {
    const { cookie } = await signIn('cashier');
    time.advance(IDLE - MIN);
    const passive = await whoAmI(cookie).set(PASSIVE_REQUEST_HEADER, '1');
    expect(passive.body.user).toMatchObject({ role: 'cashier' });
    time.advance(MIN);
    expectSignedOut(await menu(cookie));
  });

  it('the absolute limit of 8 hours holds however busy the session is', async () => {
    expect(SESSION_MAX_AGE_MS).toBe(8 * 60 * MIN); // OWASP: 4–8 h for a working day
    const { cookie } = await signIn('cashier');
    const steps = SESSION_MAX_AGE_MS / (20 * MIN); // 24 requests, 20 minutes apart
    for (let i = 1; i < steps; i++) {
      time.advance(20 * MIN);
      expect((await menu(cookie)).status, `after ${i * 20} min`).toBe(200);
    }
    time.advance(20 * MIN); // 8 h after signing in
    expectSignedOut(await menu(cookie));
  });

  it('signing in again starts both clocks afresh', async () => {
    const first = await signIn('cashier');
    time.advance(IDLE);
    expectSignedOut(await menu(first.cookie));
    const second = await signIn('cashier');
    time.advance(IDLE - SECOND);
    expect((await menu(second.cookie)).status).toBe(200);
  });
});

describe('the live socket and the idle timeout', () => {
  it('wall screens are Pickup and the Bar only, and the browser names each from its path', () => {
    expect([...WALL_SCREENS].sort()).toEqual(['bar', 'pickup']);
    // src/lib/live-socket.ts sends `screen` from the page's path in its resume message
    expect(screenAt('/pickup')).toBe('pickup');
    expect(screenAt('/bar')).toBe('bar');
    expect(screenAt('/counter')).toBe('counter');
    expect(screenAt('/receipts/12')).toBeUndefined();
  });

  it('a Counter left alone is closed with 4401 at its next heartbeat, and its session is over', async () => {
    const { cookie, sid } = await signIn('cashier');
    const counter = await openScreen(cookie, 'counter');
    await ping(counter);
    time.advance(IDLE - SECOND);
    await ping(counter); // the Counter's heartbeat is not activity…
    time.advance(SECOND);
    const closed = closeCode(counter);
    counter.send({ type: 'ping' }); // …so the idle limit is counted from the sign-in
    expect(await closed).toBe(SESSION_ENDED);
    expect(await stored(sid)).toBe(false);
    expectSignedOut(await menu(cookie));
    expect(await tryUpgrade(server.url, { Cookie: cookie })).toEqual({ opened: false, status: 401 });
  });

  it('the HTTP request that finds a session timed out closes that session’s sockets too', async () => {
    const { cookie } = await signIn('cashier');
    const counter = await openScreen(cookie, 'counter');
    await ping(counter);
    time.advance(IDLE);
    const other = await signIn('cashier'); // signed in just now: good for another 30 minutes
    const bystander = await openScreen(other.cookie, 'counter');
    await ping(bystander);
    const closed = closeCode(counter);
    expectSignedOut(await menu(cookie));
    expect(await closed).toBe(SESSION_ENDED);
    await ping(bystander); // only the timed-out session's socket was closed
    expect(bystander.socket.readyState).toBe(WebSocket.OPEN);
  });

  it('the heartbeat sweep closes a timed-out socket that never sends anything', async () => {
    const { cookie } = await signIn('lead');
    const silent = await connect(server.url, cookie);
    await silent.next((m) => m.type === 'hello', 'hello');
    await server.sockets.sweep();
    expect(silent.socket.readyState).toBe(WebSocket.OPEN); // still good: the sweep leaves it alone
    time.advance(IDLE);
    const closed = closeCode(silent);
    await server.sockets.sweep();
    expect(await closed).toBe(SESSION_ENDED);
  });

  it('a socket whose session row vanished unannounced is closed at the second look, not the first', async () => {
    const { cookie, sid } = await signIn('barista');
    const bar = await openScreen(cookie, 'bar');
    await ping(bar);
    await server.db('sessions').where({ sid }).delete(); // no 'signed-out' told, unlike every real path
    await ping(bar); // the first miss may be a person switching right now: still answered
    expect(bar.socket.readyState).toBe(WebSocket.OPEN);
    const closed = closeCode(bar);
    await server.sockets.sweep();
    expect(await closed).toBe(SESSION_ENDED);
  });

  it('opening the live socket is not activity', async () => {
    const { cookie } = await signIn('cashier');
    time.advance(IDLE - MIN);
    const counter = await openScreen(cookie, 'counter');
    await ping(counter);
    time.advance(MIN);
    expectSignedOut(await menu(cookie));
  });

  it.each([
    ['pickup', 'cashier'],
    ['pickup', 'barista'],
    ['bar', 'barista'],
    ['bar', 'lead'],
  ] as const)('a %s screen of a %s stays signed in for hours on its heartbeat alone', async (screen, login) => {
    const { cookie, sid } = await signIn(login);
    const wall = await openScreen(cookie, screen);
    for (let i = 0; i < 18; i++) {
      time.advance(10 * MIN); // 3 hours in all, with no HTTP request
      await ping(wall);
    }
    expect(wall.socket.readyState).toBe(WebSocket.OPEN);
    expect(await stored(sid)).toBe(true);
    expect((await whoAmI(cookie).set(PASSIVE_REQUEST_HEADER, '1')).body.user).toMatchObject({ role: login });
  });

  it('a wall screen still signs out at the absolute limit', async () => {
    const { cookie } = await signIn('barista');
    const bar = await openScreen(cookie, 'bar');
    const beats = SESSION_MAX_AGE_MS / (10 * MIN);
    for (let i = 1; i < beats; i++) {
      time.advance(10 * MIN);
      await ping(bar);
    }
    time.advance(10 * MIN); // 8 h after signing in
    const closed = closeCode(bar);
    bar.send({ type: 'ping' });
    expect(await closed).toBe(SESSION_ENDED);
    expectSignedOut(await menu(cookie));
  });

  it.each([
    ['pulse', 'lead', 'not a wall screen'],
    ['counter', 'owner', 'not a wall screen'],
    ['bar', 'cashier', 'a screen the cashier may not open'],
    [undefined, 'barista', 'no screen named'],
  ] as const)('a socket for %s as %s (%s) does not keep the session alive', async (screen, login, _why) => {
    const { cookie } = await signIn(login);
    const client = await openScreen(cookie, screen);
    time.advance(IDLE - MIN);
    await ping(client);
    time.advance(MIN);
    const closed = closeCode(client);
    client.send({ type: 'ping' });
    expect(await closed).toBe(SESSION_ENDED);
  });

  it('a screen name the server does not know is refused by the message schema', async () => {
    const { cookie } = await signIn('barista');
    const client = await connect(server.url, cookie);
    await client.next((m) => m.type === 'hello', 'hello');
    client.send({ type: 'resume', since: 0, screen: 'wallboard' });
    expect(await client.next((m) => m.type === 'error', 'error')).toMatchObject({ type: 'error', code: 'validation_failed' });
  });
});

describe('the session cookie', () => {
  const attributes = (setCookie: string) => setCookie.split(';').map((a) => a.trim().toLowerCase());

  it('is HttpOnly, SameSite=Lax, for the whole site, and expires with the 8-hour day', async () => {
    const res = await request(server.url).post('/api/session').send({ username: 'cashier', password: DEMO_PASSWORD });
    const setCookie = setCookies(res).find((c) => c.startsWith(`${SESSION_COOKIE}=`))!;
    const attrs = attributes(setCookie);
    expect(attrs).toContain('httponly');
    expect(attrs).toContain('samesite=lax');
    expect(attrs).toContain('path=/');
    // Expires is written by express-session on the real clock; the response's Date is the same clock
    const expires = Date.parse(setCookie.match(/Expires=([^;]+)/i)![1]);
    const sent = Date.parse(res.headers.date as string);
    expect(Math.abs(expires - sent - SESSION_MAX_AGE_MS)).toBeLessThanOrEqual(2 * SECOND);
  });

  it('is Secure behind a TLS proxy on this host (X-Forwarded-Proto: https), and not on plain http', async () => {
    const tls = await request(server.url).post('/api/session').set('X-Forwarded-Proto', 'https').send({ username: 'cashier', password: DEMO_PASSWORD });
    const plain = await request(server.url).post('/api/session').send({ username: 'cashier', password: DEMO_PASSWORD });
    const cookieOf = (res: request.Response) => setCookies(res).find((c) => c.startsWith(`${SESSION_COOKIE}=`))!;
    expect(attributes(cookieOf(tls))).toContain('secure');
    // a café LAN may serve over plain http; a Secure cookie would never come back there
    expect(attributes(cookieOf(plain))).not.toContain('secure');
  });
});

describe('SESSION_IDLE_MINUTES', () => {
  const dir = mkdtempSync(path.join(os.tmpdir(), 'jugline-idle-'));
  afterAll(() => rmSync(dir, { recursive: true, force: true }));
  const file = path.join(dir, 'cafe.sqlite');

  it('is 30 when unset', () => {
    expect(loadConfig({ DATABASE_FILE: file }).sessionIdleMinutes).toBe(30);
  });

  it.each(['0', '481', 'half an hour', '7.5', '-5'])('refuses %o and names the variable', (value) => {
    expect(() => loadConfig({ DATABASE_FILE: file, SESSION_IDLE_MINUTES: value })).toThrow(ConfigError);
    expect(() => loadConfig({ DATABASE_FILE: file, SESSION_IDLE_MINUTES: value })).toThrow(/SESSION_IDLE_MINUTES/);
  });

  /** A server of its own with SESSION_IDLE_MINUTES set, on a manual clock for both clocks. */
  async function withIdleMinutes(
    value: string,
    run: (s: { url: string; clock: ReturnType<typeof manualClock>; signIn(login: DemoLogin): Promise<string> }) => Promise<void>,
  ) {
    const config = loadConfig({
      DATABASE_FILE: file,
      SESSION_IDLE_MINUTES: value,
      SESSION_SECRET: randomBytes(32).toString('hex'),
      NODE_ENV: 'test',
      PORT: '0',
    });
    expect(config.sessionIdleMinutes).toBe(Number(value));
    const clock = manualClock();
    const running = await startServer(config, { pages: 'none', clock: clock.clock, sessionClock: clock.clock, log: () => {} });
    const signIn = async (login: DemoLogin) => {
      const res = await request(running.url).post('/api/session').send({ username: login, password: DEMO_PASSWORD });
      return setCookies(res)
        .map((c) => c.split(';')[0])
        .join('; ');
    };
    try {
      await run({ url: running.url, clock, signIn });
    } finally {
      await running.close();
    }
  }

  it('sets the idle timeout the server enforces', async () => {
    await withIdleMinutes('15', async ({ url, clock, signIn }) => {
      const a = await signIn('cashier');
      const b = await signIn('cashier');
      clock.advance(15 * MIN - SECOND);
      expect((await request(url).get('/api/menu').set('Cookie', a)).status).toBe(200);
      clock.advance(SECOND);
      expect((await request(url).get('/api/menu').set('Cookie', b)).status).toBe(401);
    });
  });

  // The shortest setting allowed: activity is written at most once per a tenth of the idle limit,
  // never once a minute flat, or a person active every 30 s would be out after 60 s.
  it('at 1 minute keeps a person active every 30 s signed in for 5 minutes, and signs out after 61 idle seconds', async () => {
    await withIdleMinutes('1', async ({ url, clock, signIn }) => {
      const cookie = await signIn('cashier');
      for (let s = 30; s <= 300; s += 30) {
        clock.advance(30 * SECOND);
        expect((await request(url).get('/api/menu').set('Cookie', cookie)).status, `after ${s} s`).toBe(200);
      }
      clock.advance(61 * SECOND);
      expect((await request(url).get('/api/menu').set('Cookie', cookie)).status).toBe(401);
    });
  });

  it('at 1 minute keeps a Bar screen signed in on a heartbeat every 30 s', async () => {
    await withIdleMinutes('1', async ({ url, clock, signIn }) => {
      const cookie = await signIn('barista');
      const bar = await connect(url, cookie);
      const hello = (await bar.next((m) => m.type === 'hello', 'hello')) as { seq: number };
      bar.send({ type: 'resume', since: hello.seq, screen: 'bar' });
      for (let s = 30; s <= 300; s += 30) {
        clock.advance(30 * SECOND);
        await ping(bar);
      }
      expect(bar.socket.readyState).toBe(WebSocket.OPEN);
      expect((await request(url).get('/api/session').set('Cookie', cookie).set(PASSIVE_REQUEST_HEADER, '1')).body.user).toMatchObject({ role: 'barista' });
    });
  });
});
