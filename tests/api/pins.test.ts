// Switch person by PIN on a shared terminal, over the real API: PINs stored only as bcrypt hashes,
// weak ones refused, the switch regenerates the session (the old id signs nobody in, its live
// socket closes), wrong PINs lock a person after PIN_TRIES and an address after its limit, and
// no PIN ever reaches the request log.
import { randomBytes } from 'node:crypto';
import { mkdtempSync, rmSync } from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import bcrypt from 'bcryptjs';
import request from 'supertest';
import { afterAll, afterEach, beforeAll, describe, expect, it } from 'vitest';
import { hashPassword } from '@server/auth/passwords';
import { createLogger } from '@server/logging';
import { WRONG_PINS_PER_ADDRESS } from '@server/team/routes';
import { startServer } from '@server/server';
import { PIN_LOCK_MINUTES, PIN_TRIES } from '@/domain/team-schemas';
import { DEMO_PASSWORD, DEMO_PINS } from '@seeds/demo-cafe';
import { closeAllSockets, connect } from '../realtime/ws-client';
import { manualClock, startTestServer, type TestServer } from '../support/test-server';
import { groupOfItsOwn } from '../support/cafe-groups';
import { sessionCookieOf, setCookies, sidOf, type Agent } from './helpers';

afterEach(() => closeAllSockets());

const idOf = async (server: TestServer, username: string) => (await server.db('users').where({ username }).first('id')).id as number;

describe('PINs at rest', () => {
  let server: TestServer;
  let owner: Agent;
  beforeAll(async () => {
    server = await startTestServer();
    owner = await server.signIn('owner');
  });
  afterAll(() => server.close());

  it('are bcrypt hashes, never the PIN itself (the demo seed and one the owner sets)', async () => {
    const lead = await idOf(server, 'lead');
    expect((await owner.put(`/api/team/${lead}/pin`).send({ pin: '390715' })).status).toBe(204);
    const rows = await server.db('users').select();
    for (const row of rows) {
      const pin = row.username === 'lead' ? '390715' : DEMO_PINS[row.username as keyof typeof DEMO_PINS];
      expect(row.pin_hash).toMatch(/^\$2[aby]\$10\$/); // bcrypt, cost 10
      expect(Object.values(row)).not.toContain(pin);
      expect(JSON.stringify(row)).not.toContain(pin);
      expect(await bcrypt.compare(pin, row.pin_hash)).toBe(true);
    }
    expect((await owner.get('/api/team')).body.members.every((m: { hasPin: boolean }) => m.hasPin)).toBe(true);
    expect(JSON.stringify((await owner.get('/api/team')).body)).not.toMatch(/pin_hash|\$2[aby]\$/);
  });

  it('refuses weak or malformed PINs with a reason, changing nothing', async () => {
    const barista = await idOf(server, 'barista');
    const before = (await server.db('users').where({ id: barista }).first()).pin_hash;
    const cases: [string | number, RegExp][] = [
      ['1111', /one digit repeated/],
      ['000000', /one digit repeated/],
      ['1234', /run like 1234/],
      ['987654', /run like 1234/],
      ['1212', /repeated pattern/],
      ['123123', /repeated pattern/],
      ['123', /4 to 6 digits/],
      ['1234567', /4 to 6 digits/],
      ['12a4', /4 to 6 digits/],
      [4827, /string/i],
    ];
    for (const [pin, reason] of cases) {
      const res = await owner.put(`/api/team/${barista}/pin`).send({ pin });
      expect(res.status, String(pin)).toBe(400);
      expect(res.body.error.details).toEqual([{ path: 'pin', message: expect.stringMatching(reason) }]);
    }
    expect((await server.db('users').where({ id: barista }).first()).pin_hash).toBe(before);
    // one digit off a run is fine
    expect((await owner.put(`/api/team/${barista}/pin`).send({ pin: '1235' })).status).toBe(204);
  });

  it('can be removed by the owner, and set by the person with their own password', async () => {
    const cashier = await server.signIn('cashier');
    const id = await idOf(server, 'cashier');
    expect((await cashier.put('/api/me/pin').send({ password: 'not my password', pin: '4826' })).status).toBe(401);
    expect(await bcrypt.compare(DEMO_PINS.cashier, (await server.db('users').where({ id }).first()).pin_hash)).toBe(true);
    expect((await cashier.put('/api/me/pin').send({ password: DEMO_PASSWORD, pin: '4826' })).status).toBe(204);
    expect(await bcrypt.compare('4826', (await server.db('users').where({ id }).first()).pin_hash)).toBe(true);
    expect((await owner.put(`/api/team/${id}/pin`).send({ pin: null })).status).toBe(204);
    expect((await server.db('users').where({ id }).first()).pin_hash).toBeNull();
    const people = (await owner.get('/api/switch/people')).body.people.map((p: { name: string }) => p.name);
    expect(people).not.toContain('Priya Onslow');
  });
});

describe('switching person', () => {
  const time = manualClock();
  let server: TestServer;
  beforeAll(async () => {
    server = await startTestServer({ clock: time.clock });
  });
  afterAll(() => server.close());

  it('lists the active people of this café with a PIN, other than whoever is signed in', async () => {
    const cashier = await server.signIn('cashier');
    const res = await cashier.get('/api/switch/people');
    expect(res.status).toBe(200);
    expect(res.body.people).toEqual([
      { id: await idOf(server, 'barista2'), name: 'Ines Calder', role: 'barista' },
      { id: await idOf(server, 'barista'), name: 'Jonah Reyes', role: 'barista' },
      { id: await idOf(server, 'owner'), name: 'Mara Quill', role: 'owner' },
      { id: await idOf(server, 'lead'), name: 'Theo Brand', role: 'lead' },
    ]);
  });

  it('signs the terminal in as the person under a new session id; the old id signs nobody in and its socket closes', async () => {
    const login = await request(server.url).post('/api/session').send({ username: 'cashier', password: DEMO_PASSWORD });
    const oldCookie = setCookies(login)
      .map((c) => c.split(';')[0])
      .join('; ');
    const live = await connect(server.url, oldCookie);
    await live.next((m) => m.type === 'hello', 'hello');
    const closed = new Promise<number>((resolve) => live.socket.once('close', (code) => resolve(code)));

    const barista = await idOf(server, 'barista');
    const res = await request(server.url).post('/api/session/switch').set('Cookie', oldCookie).send({ userId: barista, pin: DEMO_PINS.barista });
    expect(res.status).toBe(200);
    expect(res.body.user).toEqual({ id: barista, name: 'Jonah Reyes', role: 'barista' });
    const newCookie = setCookies(res)
      .map((c) => c.split(';')[0])
      .join('; ');
    expect(sidOf(sessionCookieOf(res))).not.toBe(sidOf(sessionCookieOf(login)));

    // 4409: the screen reconnects on the new session instead of going to sign-in
    expect(await closed).toBe(4409);
    expect((await request(server.url).get('/api/session').set('Cookie', oldCookie)).body.user).toBeNull();
    expect((await request(server.url).get('/api/session').set('Cookie', newCookie)).body.user).toMatchObject({ id: barista });
    const again = await connect(server.url, newCookie);
    expect(await again.next((m) => m.type === 'hello', 'hello')).toMatchObject({ type: 'hello' });
  });

  it('is refused signed out (401), to oneself (409), and to nobody switchable (404): inactive, no PIN, another café', async () => {
    const lead = await idOf(server, 'lead');
    const signedOut = await request(server.url).post('/api/session/switch').send({ userId: lead, pin: DEMO_PINS.lead });
    expect(signedOut.status).toBe(401);

    const cashier = await server.signIn('cashier');
    expect((await cashier.post('/api/session/switch').send({ userId: await idOf(server, 'cashier'), pin: DEMO_PINS.cashier })).status).toBe(409);

    const otherGroup = await groupOfItsOwn(server.db, 'North Quay Espresso', time.clock().toISOString());
    const [{ id: otherCafe }] = await server
      .db('locations')
      .insert({ name: 'North Quay Espresso', created_at: time.clock().toISOString(), group_id: otherGroup })
      .returning('id');
    const [{ id: stranger }] = await server
      .db('users')
      .insert({
        location_id: otherCafe,
        group_id: otherGroup,
        username: 'north-lead',
        name: 'North Lead',
        role: 'lead',
        password_hash: await hashPassword('x-x-x-x-x-x'),
        pin_hash: await hashPassword('5830'),
        created_at: time.clock().toISOString(),
      })
      .returning('id');
    expect((await cashier.post('/api/session/switch').send({ userId: stranger, pin: '5830' })).status).toBe(404);

    await server.db('users').where({ username: 'barista2' }).update({ active: false });
    expect((await cashier.post('/api/session/switch').send({ userId: await idOf(server, 'barista2'), pin: DEMO_PINS.barista2 })).status).toBe(404);
    await server.db('users').where({ username: 'barista2' }).update({ active: true });

    expect((await cashier.get('/api/session')).body.user).toMatchObject({ name: 'Priya Onslow' });
  });

  it(`locks a person's PIN after ${PIN_TRIES} wrong ones, for ${PIN_LOCK_MINUTES} minutes on the clock`, async () => {
    const terminal = await server.signIn('cashier');
    const lead = await idOf(server, 'lead');
    const wrong = DEMO_PINS.lead === '2468' ? '2469' : '2468';
    for (let i = 1; i < PIN_TRIES; i++) {
      const res = await terminal.post('/api/session/switch').send({ userId: lead, pin: wrong });
      expect(res.status).toBe(401);
      expect(res.body.error.details).toEqual({ triesLeft: PIN_TRIES - i });
    }
    const fifth = await terminal.post('/api/session/switch').send({ userId: lead, pin: wrong });
    expect(fifth.status).toBe(429);
    const until = time.clock().getTime() + PIN_LOCK_MINUTES * 60_000;
    expect(fifth.body.error.details).toEqual({ retryAt: new Date(until).toISOString() });
    expect(fifth.body.error.message).toMatch(/Too many wrong PINs for Theo\. Their PIN works again at .+ \(in 5 minutes\)/);
    expect(fifth.headers['retry-after']).toBe(String(PIN_LOCK_MINUTES * 60));

    // locked: even the right PIN is refused, and the terminal stays who it was
    const right = await terminal.post('/api/session/switch').send({ userId: lead, pin: DEMO_PINS.lead });
    expect(right.status).toBe(429);
    expect((await terminal.get('/api/session')).body.user).toMatchObject({ name: 'Priya Onslow' });
    // the lock is the person's, not the terminal's: someone else can still switch in
    const other = await server.signIn('cashier');
    expect((await other.post('/api/session/switch').send({ userId: await idOf(server, 'barista2'), pin: DEMO_PINS.barista2 })).status).toBe(200);

    time.advance(PIN_LOCK_MINUTES * 60_000 - 1000);
    expect((await terminal.post('/api/session/switch').send({ userId: lead, pin: DEMO_PINS.lead })).status).toBe(429);
    time.advance(1000);
    const after = await terminal.post('/api/session/switch').send({ userId: lead, pin: DEMO_PINS.lead });
    expect(after.status).toBe(200);
    expect(after.body.user.name).toBe('Theo Brand');
    expect(await server.db('users').where({ id: lead }).first('pin_failures', 'pin_locked_until')).toEqual({ pin_failures: 0, pin_locked_until: null });
  });

  it('counts parallel wrong tries before checking them, so no more than the limit are ever checked', async () => {
    const terminal = await server.signIn('lead');
    const owner = await idOf(server, 'owner');
    const tries = await Promise.all(Array.from({ length: PIN_TRIES + 3 }, () => terminal.post('/api/session/switch').send({ userId: owner, pin: '5831' })));
    const statuses = tries.map((r) => r.status);
    expect(statuses.filter((s) => s === 401).length).toBeLessThanOrEqual(PIN_TRIES - 1);
    expect(statuses.filter((s) => s === 429).length).toBeGreaterThanOrEqual(4);
    expect(statuses.every((s) => s === 401 || s === 429)).toBe(true);
    expect((await terminal.post('/api/session/switch').send({ userId: owner, pin: DEMO_PINS.owner })).status).toBe(429);
    time.advance(PIN_LOCK_MINUTES * 60_000);
  });
});

describe('wrong PINs from one address', () => {
  const time = manualClock();
  let server: TestServer;
  beforeAll(async () => {
    server = await startTestServer({ clock: time.clock });
  });
  afterAll(() => server.close());

  it(`are refused after ${WRONG_PINS_PER_ADDRESS}, whoever they were for; right PINs and bad bodies don't count`, async () => {
    const terminal = await server.signIn('owner');
    const people = ['lead', 'cashier', 'barista', 'barista2'];
    const ids = await Promise.all(people.map((p) => idOf(server, p)));
    // bodies zod refuses never reach the PIN check, and don't use up the address's tries
    for (let i = 0; i < 30; i++) expect((await terminal.post('/api/session/switch').send({ userId: ids[0], pin: 'x' })).status).toBe(400);
    let wrong = 0;
    while (wrong < WRONG_PINS_PER_ADDRESS) {
      const id = ids[wrong % ids.length];
      const res = await terminal.post('/api/session/switch').send({ userId: id, pin: '5831' });
      expect(res.status).toBe(401);
      wrong += 1;
      // before anyone's own lock: each person's wrong tries are forgotten after a quiet spell
      if (wrong % (ids.length * (PIN_TRIES - 1)) === 0) time.advance(16 * 60_000);
    }
    const refused = await terminal.post('/api/session/switch').send({ userId: ids[1], pin: DEMO_PINS.cashier });
    expect(refused.status).toBe(429);
    expect(refused.body.error.message).toMatch(/from this terminal/);
    expect((await terminal.get('/api/session')).body.user).toMatchObject({ name: 'Mara Quill' });
  });
});

describe('request logs', () => {
  const lines: string[] = [];
  const dir = mkdtempSync(path.join(os.tmpdir(), 'jugline-pin-logs-'));
  let close: (() => Promise<void>) | undefined;
  afterAll(async () => {
    await close?.();
    rmSync(dir, { recursive: true, force: true });
  });

  it('never carry a PIN, right or wrong, set or switched with', async () => {
    const logger = createLogger('info', { write: (line: string) => void lines.push(line) });
    const running = await startServer(
      { env: 'test', port: 0, host: '127.0.0.1', databaseFile: path.join(dir, 'j.sqlite'), sessionSecret: randomBytes(32).toString('hex'), seedDemo: true },
      { pages: 'none', log: () => {}, logger },
    );
    close = running.close;
    const owner = request.agent(running.url);
    await owner.post('/api/session').send({ username: 'owner', password: DEMO_PASSWORD }).expect(200);
    const lead = (await owner.get('/api/switch/people')).body.people.find((p: { name: string }) => p.name === 'Theo Brand').id;
    const newPin = '730561';
    const wrongPin = '618294';
    await owner.put(`/api/team/${lead}/pin`).send({ pin: newPin }).expect(204);
    await owner.put('/api/me/pin').send({ password: DEMO_PASSWORD, pin: '947302' }).expect(204);
    await owner.post('/api/session/switch').send({ userId: lead, pin: wrongPin }).expect(401);
    await owner.post('/api/session/switch').send({ userId: lead, pin: newPin }).expect(200);

    const requests = lines.map((l) => JSON.parse(l)).filter((e) => e.req);
    expect(requests.map((e) => e.req.path)).toEqual(expect.arrayContaining(['/api/session/switch', `/api/team/${lead}/pin`, '/api/me/pin']));
    // six-digit PINs, so a random request id or timestamp can't contain one by chance
    const log = lines.join('');
    for (const pin of [newPin, wrongPin, '947302']) {
      expect(log).not.toMatch(new RegExp(`(^|\\D)${pin}(\\D|$)`));
    }
    expect(log).not.toMatch(/"pin"/i);
  });
});
