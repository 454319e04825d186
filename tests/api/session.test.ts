// Signing in and out: error shapes, what the answer reveals, the session cookie and its id.
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { DEMO_PASSWORD, DEMO_SIGN_INS } from '@seeds/demo-cafe';
import { SESSION_COOKIE } from '@server/auth/session';
import { startTestServer, type TestServer } from '../support/test-server';
import { setCookies, sidOf } from './helpers';

let server: TestServer;
beforeAll(async () => {
  server = await startTestServer();
});
afterAll(() => server.close());

const signInRaw = (body: object, cookie?: string) => {
  const req = request(server.url).post('/api/session');
  if (cookie) req.set('Cookie', cookie);
  return req.send(body);
};
const sessionCookie = (res: { headers: Record<string, unknown> }) => {
  const cookie = setCookies(res).find((c) => c.startsWith(`${SESSION_COOKIE}=`));
  if (!cookie) throw new Error('no session cookie was set');
  return cookie;
};
const cookiePair = (setCookie: string) => setCookie.split(';')[0];
const whoAmI = (cookie: string) => request(server.url).get('/api/session').set('Cookie', cookie);
const storedSids = async () => (await server.db('sessions').select('sid')).map((r) => r.sid as string);

describe('sign-in failures', () => {
  it('answers 401 unauthenticated to a wrong password', async () => {
    const res = await signInRaw({ username: 'cashier', password: 'not-the-password' });
    expect(res.status).toBe(401);
    expect(res.body).toEqual({ error: { code: 'unauthenticated', message: expect.any(String) } });
    expect(res.body.error.message.length).toBeGreaterThan(0);
  });

  it('answers an unknown user with the same 401 body as a wrong password', async () => {
    const unknown = await signInRaw({ username: 'nobody-here', password: DEMO_PASSWORD });
    const wrong = await signInRaw({ username: 'cashier', password: 'not-the-password' });
    expect(unknown.status).toBe(401);
    expect(unknown.body).toEqual({ error: { code: 'unauthenticated', message: expect.any(String) } });
    // Same message, so the answer does not tell which names exist.
    expect(unknown.body).toEqual(wrong.body);
  });

  it('sets no session cookie for a failed attempt or an anonymous GET', async () => {
    // saveUninitialized: false — nothing is stored, so there is no pre-sign-in id to plant.
    const failed = await signInRaw({ username: 'cashier', password: 'not-the-password' });
    const anonymous = await request(server.url).get('/api/session');
    expect(setCookies(failed)).toEqual([]);
    expect(setCookies(anonymous)).toEqual([]);
  });
});

describe('sign-in success', () => {
  it('answers 200 as GET /api/session does (person, café, no group list for a barista) and nothing else', async () => {
    const res = await signInRaw({ username: 'barista', password: DEMO_PASSWORD });
    expect(res.status).toBe(200);
    const row = await server.db('users').where({ username: 'barista' }).first();
    expect(res.body).toEqual({
      user: { id: row.id, name: 'Jonah Reyes', role: 'barista' },
      cafe: { id: row.location_id, name: 'Harbour & Hearth Coffee' },
      groupCafes: [],
    });
    expect(JSON.stringify(res.body)).not.toContain(row.password_hash);
    expect(JSON.stringify(res.body)).not.toMatch(/\$2[aby]\$/);
    expect(JSON.stringify(res.body).toLowerCase()).not.toContain('password');
  });

  it('sets an httpOnly, SameSite=Lax session cookie', async () => {
    const res = await signInRaw({ username: 'cashier', password: DEMO_PASSWORD });
    const cookie = sessionCookie(res);
    const attributes = cookie.split(';').map((a) => a.trim().toLowerCase());
    expect(attributes).toContain('httponly');
    expect(attributes).toContain('samesite=lax');
  });

  it('GET /api/session tells who is signed in', async () => {
    const cookie = cookiePair(sessionCookie(await signInRaw({ username: 'lead', password: DEMO_PASSWORD })));
    const res = await whoAmI(cookie);
    expect(res.status).toBe(200);
    expect(res.body).toEqual({
      user: { id: expect.any(Number), name: 'Theo Brand', role: 'lead' },
      cafe: { id: expect.any(Number), name: 'Harbour & Hearth Coffee' },
      groupCafes: [],
    });
  });
});

describe('session id regeneration', () => {
  it('gives a new session id at sign-in even when a valid one is presented', async () => {
    const first = sessionCookie(await signInRaw({ username: 'cashier', password: DEMO_PASSWORD }));
    const second = sessionCookie(await signInRaw({ username: 'cashier', password: DEMO_PASSWORD }, cookiePair(first)));
    expect(sidOf(second)).not.toBe(sidOf(first));

    // The id presented at sign-in is not promoted: it is gone from the store and authenticates nobody.
    const sids = await storedSids();
    expect(sids).not.toContain(sidOf(first));
    expect(sids).toContain(sidOf(second));
    expect((await whoAmI(cookiePair(first))).body).toEqual({ user: null, cafe: null, groupCafes: [] });
    expect((await whoAmI(cookiePair(second))).body.user).toMatchObject({ role: 'cashier' });
  });

  it('two separate sign-ins get different session ids', async () => {
    const a = sessionCookie(await signInRaw({ username: 'owner', password: DEMO_PASSWORD }));
    const b = sessionCookie(await signInRaw({ username: 'owner', password: DEMO_PASSWORD }));
    expect(sidOf(a)).not.toBe(sidOf(b));
  });
});

describe('signing out', () => {
  it('GET /api/session signed out answers 200 { user: null }', async () => {
    const res = await request(server.url).get('/api/session');
    expect(res.status).toBe(200);
    expect(res.body).toEqual({ user: null, cafe: null, groupCafes: [] });
  });

  it('DELETE /api/session answers 204, and the old cookie no longer authenticates', async () => {
    const cookie = cookiePair(sessionCookie(await signInRaw({ username: 'cashier', password: DEMO_PASSWORD })));
    expect((await request(server.url).get('/api/menu').set('Cookie', cookie)).status).toBe(200);

    const out = await request(server.url).delete('/api/session').set('Cookie', cookie);
    expect(out.status).toBe(204);
    expect(out.text).toBe('');

    const menu = await request(server.url).get('/api/menu').set('Cookie', cookie);
    expect(menu.status).toBe(401);
    expect(menu.body).toEqual({ error: { code: 'unauthenticated', message: expect.any(String) } });
    expect((await whoAmI(cookie)).body).toEqual({ user: null, cafe: null, groupCafes: [] });
    expect(await storedSids()).not.toContain(sidOf(cookie));
  });

  it('DELETE /api/session through an agent signs that agent out', async () => {
    const agent = await server.signIn('barista');
    expect((await agent.get('/api/menu')).status).toBe(200);
    expect((await agent.delete('/api/session')).status).toBe(204);
    expect((await agent.get('/api/menu')).status).toBe(401);
  });
});

describe('stored passwords', () => {
  it('are bcrypt hashes with a cost of at least 10 (OWASP Password Storage Cheat Sheet)', async () => {
    const users = await server.db('users').select('username', 'password_hash');
    expect(users.map((u) => u.username).sort()).toEqual(DEMO_SIGN_INS.map((s) => s.username).sort());
    for (const { password_hash: hash } of users) {
      // Modular crypt format: $2b$<cost>$<22-char salt><31-char hash>, 60 characters in all.
      const match = /^\$2[ab]\$(\d{2})\$[./A-Za-z0-9]{53}$/.exec(hash);
      expect(match, hash).not.toBeNull();
      expect(Number(match![1])).toBeGreaterThanOrEqual(10);
      expect(hash).not.toContain(DEMO_PASSWORD);
    }
    // Every person has their own salt, so equal passwords give different hashes.
    expect(new Set(users.map((u) => u.password_hash)).size).toBe(users.length);
  });
});
