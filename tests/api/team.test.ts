// The owner's Team screen over the real API: who may call it, invitations that arrive by real
// SMTP in the local fake's outbox and set a password once, reset links, the last-owner rule,
// deactivation (signed out everywhere, live socket closed), and who took, made and bumped a drink.
import { createHash } from 'node:crypto';
import request from 'supertest';
import { afterAll, afterEach, beforeAll, describe, expect, it } from 'vitest';
import { createApp } from '@server/app';
import { LINK_HOURS } from '@/domain/team-schemas';
import { DEMO_PASSWORD } from '@seeds/demo-cafe';
import { closeAllSockets, connect } from '../realtime/ws-client';
import { demoMenu, manualClock, startTestServer, type TestServer } from '../support/test-server';
import { orderBody, type Agent } from './helpers';
import { boolOf, jsonOf } from '../support/rows';

const time = manualClock();
let server: TestServer;
let owner: Agent;

beforeAll(async () => {
  server = await startTestServer({ clock: time.clock });
  owner = await server.signIn('owner');
});
afterEach(() => closeAllSockets());
afterAll(() => server.close());

const count = async (table: string) => Number((await server.db(table).count({ n: '*' }).first())?.n);
const userId = async (username: string) => (await server.db('users').where({ username }).first('id')).id as number;
const signInAs = (username: string, password: string) => request(server.url).post('/api/session').send({ username, password });

/** The newest caught mail to an address (the fake stores it before the SMTP hand-off finishes). */
async function mailTo(address: string): Promise<{ subject: string; text: string; html: string }> {
  const rows = await server.db('outbox').orderBy('id', 'desc').select('*');
  const row = rows.find((r) => jsonOf<string[]>(r.to_addresses).some((a) => a.includes(address)));
  if (!row) throw new Error(`no mail to ${address} in the outbox`);
  return { subject: row.subject, text: row.text_body, html: row.html_body };
}

/** The token of the welcome link in a mail, checked to point at this server. */
function tokenIn(text: string): string {
  const match = new RegExp(`${server.url.replace(/[.:/]/g, '\\$&')}/welcome/([A-Za-z0-9_-]{43})(?:\\s|$)`).exec(text);
  if (!match) throw new Error(`no welcome link in:\n${text}`);
  return match[1];
}

async function invite(name: string, username: string, email: string, role = 'barista') {
  const res = await owner.post('/api/team').send({ name, username, email, role });
  expect(res.status, JSON.stringify(res.body)).toBe(201);
  return { member: res.body.member, mailed: res.body.mailed as boolean, token: tokenIn((await mailTo(email)).text) };
}

describe('who may use the team routes', () => {
  it('every manageTeam route answers 403 to a cashier, a barista and a lead, 401 signed out, and changes nothing', async () => {
    const teamRoutes = server.routes.filter((r) => r.capability === 'manageTeam');
    expect(teamRoutes.map((r) => `${r.method.toUpperCase()} ${r.path}`).sort()).toEqual(
      ['GET /team', 'PATCH /team/:id', 'POST /team', 'POST /team/:id/link', 'PUT /team/:id/pin'].sort(),
    );
    const target = await userId('barista2');
    // bodies that would succeed for the owner, so only the guard can refuse them
    const bodies: Record<string, object> = {
      'POST /team': { name: 'Guard Test', username: 'guard-test', email: 'guard@example.com', role: 'owner' },
      'PATCH /team/:id': { role: 'owner' },
      'POST /team/:id/link': { purpose: 'reset' },
      'PUT /team/:id/pin': { pin: '9052' },
    };
    const before = { users: await count('users'), invitations: await count('invitations'), outbox: await count('outbox') };
    const hashBefore = (await server.db('users').where({ id: target }).first()).pin_hash;
    for (const who of ['cashier', 'barista', 'lead', null] as const) {
      const client = who ? await server.signIn(who) : request(server.url);
      for (const r of teamRoutes) {
        const key = `${r.method.toUpperCase()} ${r.path}`;
        const req = client[r.method](`/api${r.path.replace(':id', String(target))}`);
        const res = bodies[key] ? await req.send(bodies[key]) : await req;
        expect(res.status, `${who ?? 'signed out'} ${key}`).toBe(who ? 403 : 401);
        expect(res.body.error.code).toBe(who ? 'forbidden' : 'unauthenticated');
      }
    }
    expect({ users: await count('users'), invitations: await count('invitations'), outbox: await count('outbox') }).toEqual(before);
    const row = await server.db('users').where({ id: target }).first();
    expect({ ...row, active: boolOf(row.active) }).toMatchObject({ role: 'barista', active: true, pin_hash: hashBefore });
  });
});

describe('an invitation', () => {
  it('is mailed with a one-time link that sets the password, signs the person in, and is refused the second time', async () => {
    const { member, mailed, token } = await invite('Ana Lindqvist', 'Ana.L', 'ana@example.com');
    expect(mailed).toBe(true);
    // the sign-in name is stored as typed rules say: trimmed and lower case
    expect(member).toMatchObject({ name: 'Ana Lindqvist', username: 'ana.l', role: 'barista', active: true, awaitingPassword: true, hasPin: false });
    expect(member.link).toMatchObject({ purpose: 'invite', expired: false, sentAt: expect.any(String) });
    // 72 hours from the (manual) clock's now
    expect(Date.parse(member.link.expiresAt) - time.clock().getTime()).toBe(LINK_HOURS * 3600_000);

    const mail = await mailTo('ana@example.com');
    expect(mail.subject).toBe('Your Jugline sign-in at Harbour & Hearth Coffee');
    expect(mail.text).toContain('Your sign-in name: ana.l');
    expect(mail.text).toContain('Mara Quill added you');
    // 32 random bytes in base64url; only the SHA-256 of it is kept
    expect(Buffer.from(token, 'base64url')).toHaveLength(32);
    const row = await server.db('invitations').where({ user_id: member.id }).first();
    expect(row.token_hash).toBe(createHash('sha256').update(token).digest('hex'));
    expect(JSON.stringify(await server.db('invitations').select())).not.toContain(token);

    // before the link is used, no password at all works
    expect((await signInAs('ana.l', DEMO_PASSWORD)).status).toBe(401);

    const anon = request.agent(server.url);
    const view = await anon.get(`/api/welcome/${token}`);
    expect(view.status).toBe(200);
    expect(view.body).toEqual({ name: 'Ana Lindqvist', username: 'ana.l', purpose: 'invite', locationName: 'Harbour & Hearth Coffee' });

    const mismatch = await anon.post(`/api/welcome/${token}`).send({ password: 'steamed oat milk', confirm: 'steamed oat mil' });
    expect(mismatch.status).toBe(400);
    expect(mismatch.body.error.details).toEqual([{ path: 'confirm', message: expect.any(String) }]);
    const short = await anon.post(`/api/welcome/${token}`).send({ password: 'short', confirm: 'short' });
    expect(short.status).toBe(400);
    expect(short.body.error.details[0].path).toBe('password');
    // 25 characters, but '€' is 3 bytes in UTF-8 (RFC 3629): 75 bytes, past bcrypt's 72
    const long = '€'.repeat(25);
    expect((await anon.post(`/api/welcome/${token}`).send({ password: long, confirm: long })).status).toBe(400);

    const set = await anon.post(`/api/welcome/${token}`).send({ password: 'steamed oat milk', confirm: 'steamed oat milk' });
    expect(set.status).toBe(200);
    expect(set.body.user).toEqual({ id: member.id, name: 'Ana Lindqvist', role: 'barista' });
    expect((await anon.get('/api/session')).body.user).toMatchObject({ id: member.id });
    expect((await signInAs('ana.l', 'steamed oat milk')).status).toBe(200);

    // used once: the same answer as an unknown link, and the password stays as set
    const again = await request(server.url).post(`/api/welcome/${token}`).send({ password: 'someone else now', confirm: 'someone else now' });
    expect(again.status).toBe(404);
    const unknown = await request(server.url).get(`/api/welcome/${'A'.repeat(43)}`);
    expect((await request(server.url).get(`/api/welcome/${token}`)).body).toEqual(unknown.body);
    expect((await signInAs('ana.l', 'steamed oat milk')).status).toBe(200);
    expect((await signInAs('ana.l', 'someone else now')).status).toBe(401);
    const after = (await owner.get('/api/team')).body.members.find((m: { id: number }) => m.id === member.id);
    expect(after).toMatchObject({ awaitingPassword: false, link: null });
  });

  it("is listed in the Outbox to the owner only, so a lead cannot open someone else's account", async () => {
    await invite('Olu Brandt', 'olu.b', 'olu@example.com');
    const subjectsFor = async (agent: typeof owner) => {
      const res = await agent.get('/api/outbox');
      expect(res.status).toBe(200);
      return (res.body.mails as { to: string[] }[]).filter((m) => m.to.includes('olu@example.com'));
    };
    expect(await subjectsFor(owner)).toHaveLength(1);
    expect(await subjectsFor(await server.signIn('lead'))).toHaveLength(0);
  });

  it('is void once a newer one is sent', async () => {
    const first = await invite('Ben Okafor', 'ben', 'ben@example.com', 'cashier');
    const resent = await owner.post(`/api/team/${first.member.id}/link`).send({ purpose: 'invite' });
    expect(resent.status).toBe(202);
    expect(resent.body).toEqual({ purpose: 'invite', to: 'ben@example.com' });
    const second = tokenIn((await mailTo('ben@example.com')).text);
    expect(second).not.toBe(first.token);
    expect((await request(server.url).get(`/api/welcome/${first.token}`)).status).toBe(404);
    expect((await request(server.url).post(`/api/welcome/${first.token}`).send({ password: 'a long password', confirm: 'a long password' })).status).toBe(404);
    expect((await request(server.url).get(`/api/welcome/${second}`)).status).toBe(200);
  });

  it('used from eight tabs at once: one sets the password, the rest answer 404, and it is used once', async () => {
    const { member, token } = await invite('Cy Marlow', 'cy.m', 'cy.m@example.com', 'cashier');
    const body = (i: number) => ({ password: `tab ${i} long password`, confirm: `tab ${i} long password` });
    const res = await Promise.all(Array.from({ length: 8 }, (_, i) => request(server.url).post(`/api/welcome/${token}`).send(body(i))));
    expect(res.map((r) => r.status).sort()).toEqual([200, 404, 404, 404, 404, 404, 404, 404]);
    const used = await server.db('invitations').where({ user_id: member.id }).whereNotNull('used_at').count({ n: '*' }).first();
    expect(Number(used?.n)).toBe(1);
    // the password set is the winner's
    const winner = res.findIndex((r) => r.status === 200);
    expect((await signInAs('cy.m', body(winner).password)).status).toBe(200);
  });

  it('sent four times at once: exactly one link stays open', async () => {
    const { member } = await invite('Dara Wynn', 'dara.w', 'dara.w@example.com', 'cashier');
    const res = await Promise.all(Array.from({ length: 4 }, () => owner.post(`/api/team/${member.id}/link`).send({ purpose: 'invite' })));
    expect(res.map((r) => r.status)).toEqual([202, 202, 202, 202]);
    const open = await server.db('invitations').where({ user_id: member.id }).whereNull('used_at').whereNull('voided_at').count({ n: '*' }).first();
    expect(Number(open?.n)).toBe(1);
  });

  it('expires after 72 hours on the clock', async () => {
    const { token, member } = await invite('Cleo Marsh', 'cleo', 'cleo@example.com');
    time.advance(LINK_HOURS * 3600_000 - 60_000);
    expect((await request(server.url).get(`/api/welcome/${token}`)).status).toBe(200);
    time.advance(60_000); // exactly 72 h: no longer valid
    const view = await request(server.url).get(`/api/welcome/${token}`);
    expect(view.status).toBe(404);
    const set = await request(server.url).post(`/api/welcome/${token}`).send({ password: 'too late for this', confirm: 'too late for this' });
    expect(set.status).toBe(404);
    expect(set.body.error.message).toMatch(/can't be used/);
    expect(boolOf((await server.db('users').where({ id: member.id }).first()).awaiting_password)).toBe(true);
    const listed = (await owner.get('/api/team')).body.members.find((m: { id: number }) => m.id === member.id);
    expect(listed.link).toMatchObject({ expired: true });
  });

  it('refuses a taken sign-in name, a bad e-mail and unknown fields, adding nobody', async () => {
    const before = { users: await count('users'), invitations: await count('invitations') };
    const taken = await owner.post('/api/team').send({ name: 'Another Jonah', username: 'BARISTA', email: 'j2@example.com', role: 'barista' });
    expect(taken.status).toBe(409);
    const bad = await owner.post('/api/team').send({ name: 'X', username: 'x y', email: 'nope', role: 'boss' });
    expect(bad.status).toBe(400);
    expect(bad.body.error.details.map((d: { path: string }) => d.path).sort()).toEqual(['email', 'role', 'username']);
    expect((await owner.patch(`/api/team/${await userId('lead')}`).send({})).status).toBe(400);
    expect((await owner.patch(`/api/team/${await userId('lead')}`).send({ password_hash: 'x' })).status).toBe(400);
    expect((await owner.patch('/api/team/999999').send({ role: 'lead' })).status).toBe(404);
    expect({ users: await count('users'), invitations: await count('invitations') }).toEqual(before);
  });

  it('answers 503 and adds nobody where no mail service is set up', async () => {
    const { app } = createApp({ db: server.db, config: { sessionSecret: 'a-secret-for-this-test-only', env: 'test' }, clock: time.clock });
    const agent = request.agent(app);
    expect((await agent.post('/api/session').send({ username: 'owner', password: DEMO_PASSWORD })).status).toBe(200);
    const before = await count('users');
    const res = await agent.post('/api/team').send({ name: 'Dee Post', username: 'dee', email: 'dee@example.com', role: 'cashier' });
    expect(res.status).toBe(503);
    expect(res.body.error.code).toBe('unavailable');
    expect(await count('users')).toBe(before);
  });
});

describe('a reset link', () => {
  it('needs an e-mail address, keeps the old password until the new one is set, then ends the other sessions', async () => {
    const id = await userId('cashier');
    const noEmail = await owner.post(`/api/team/${id}/link`).send({ purpose: 'reset' });
    expect(noEmail.status).toBe(409);
    expect((await owner.patch(`/api/team/${id}`).send({ email: 'priya@example.com' })).status).toBe(200);

    const elsewhere = await server.signIn('cashier'); // the cashier signed in on another terminal
    const sent = await owner.post(`/api/team/${id}/link`).send({ purpose: 'reset' });
    expect(sent.status).toBe(202);
    expect(sent.body).toEqual({ purpose: 'reset', to: 'priya@example.com' });
    const mail = await mailTo('priya@example.com');
    expect(mail.subject).toBe('Choose a new Jugline password for Harbour & Hearth Coffee');
    expect(mail.text).toContain('Your current password keeps working until you choose a new one');
    const token = tokenIn(mail.text);
    expect((await signInAs('cashier', DEMO_PASSWORD)).status).toBe(200);

    const view = await request(server.url).get(`/api/welcome/${token}`);
    expect(view.body).toMatchObject({ purpose: 'reset', username: 'cashier' });
    const set = await request(server.url).post(`/api/welcome/${token}`).send({ password: 'flat white forever', confirm: 'flat white forever' });
    expect(set.status).toBe(200);
    expect((await signInAs('cashier', DEMO_PASSWORD)).status).toBe(401);
    expect((await signInAs('cashier', 'flat white forever')).status).toBe(200);
    expect((await elsewhere.get('/api/session')).body.user).toBeNull();
  });
});

describe('the last active owner', () => {
  it("can't be demoted or deactivated (409, nothing changes); with a second owner, can", async () => {
    const ownerId = await userId('owner');
    for (const body of [{ role: 'lead' }, { active: false }, { role: 'cashier', active: false }]) {
      const res = await owner.patch(`/api/team/${ownerId}`).send(body);
      expect(res.status, JSON.stringify(body)).toBe(409);
      expect(res.body.error.message).toMatch(/only active owner/);
    }
    const stored = await server.db('users').where({ id: ownerId }).first('role', 'active');
    expect({ role: stored.role, active: boolOf(stored.active) }).toEqual({ role: 'owner', active: true });

    // an inactive owner does not count as the second one
    const ben = await userId('ben');
    expect((await owner.patch(`/api/team/${ben}`).send({ role: 'owner', active: false })).status).toBe(200);
    expect((await owner.patch(`/api/team/${ownerId}`).send({ role: 'lead' })).status).toBe(409);
    // an active one does: then either owner may step down, but not both
    expect((await owner.patch(`/api/team/${ben}`).send({ active: true })).status).toBe(200);
    expect((await owner.patch(`/api/team/${ben}`).send({ role: 'cashier' })).status).toBe(200);
    expect((await owner.patch(`/api/team/${ben}`).send({ role: 'owner' })).status).toBe(200);
    expect((await owner.patch(`/api/team/${ben}`).send({ active: false })).status).toBe(200);
    expect((await owner.patch(`/api/team/${ownerId}`).send({ active: false })).status).toBe(409);
  });
});

describe('deactivating a person', () => {
  it('signs them out everywhere, closes their live socket, and stops sign-in until reactivated', async () => {
    const id = await userId('barista2');
    const cookie = await server.cookieFor('barista2');
    const agent = await server.signIn('barista2');
    const live = await connect(server.url, cookie);
    await live.next((m) => m.type === 'hello', 'hello');
    const closed = new Promise<number>((resolve) => live.socket.once('close', (code) => resolve(code)));

    const res = await owner.patch(`/api/team/${id}`).send({ active: false });
    expect(res.status).toBe(200);
    expect(res.body.member).toMatchObject({ active: false });
    expect(await closed).toBe(4401);
    expect((await agent.get('/api/session')).body.user).toBeNull();
    expect((await request(server.url).get('/api/session').set('Cookie', cookie)).body.user).toBeNull();
    const rows = await server.db('sessions').select('sess');
    expect(rows.filter((r) => jsonOf(r.sess).passport?.user === id)).toEqual([]);
    expect((await signInAs('barista2', DEMO_PASSWORD)).status).toBe(401);

    expect((await owner.patch(`/api/team/${id}`).send({ active: true })).status).toBe(200);
    expect((await signInAs('barista2', DEMO_PASSWORD)).status).toBe(200);
  });

  it('voids their open link, so it cannot bring them back', async () => {
    const { member, token } = await invite('Dara Voss', 'dara', 'dara@example.com');
    expect((await owner.patch(`/api/team/${member.id}`).send({ active: false })).status).toBe(200);
    expect((await owner.patch(`/api/team/${member.id}`).send({ active: true })).status).toBe(200);
    expect((await request(server.url).get(`/api/welcome/${token}`)).status).toBe(404);
  });
});

describe('who did what on a ticket', () => {
  it('names who took the order, who started each drink and who bumped it', async () => {
    const menu = await demoMenu(server);
    const placed = await owner.post('/api/orders').send(orderBody('Wes Penn', [{ menuItemId: menu.item('Latte') }, { menuItemId: menu.item('Espresso') }]));
    expect(placed.status).toBe(201);
    const [latte, espresso] = placed.body.order.lines.map((l: { id: number }) => l.id);
    const jonah = await server.signIn('barista');
    const ines = await server.signIn('barista2');
    expect((await jonah.post(`/api/drinks/${latte}/start`)).status).toBe(200);
    const bumped = await ines.post(`/api/drinks/${latte}/bump`);
    expect(bumped.status).toBe(200);
    const ticket = bumped.body.ticket;
    expect(ticket.takenBy).toBe('Mara Quill');
    const byId = new Map(ticket.drinks.map((d: { id: number }) => [d.id, d]));
    expect(byId.get(latte)).toMatchObject({ startedBy: 'Jonah Reyes', doneBy: 'Ines Calder', status: 'done' });
    expect(byId.get(espresso)).toMatchObject({ startedBy: null, doneBy: null, status: 'queued' });
    expect(await server.db('order_items').where({ id: latte }).first('started_by', 'done_by')).toEqual({
      started_by: await userId('barista'),
      done_by: await userId('barista2'),
    });
    // the board the Bar reads carries the same names
    const board = await jonah.get('/api/tickets?view=board');
    const onBoard = board.body.tickets.find((t: { id: number }) => t.id === ticket.id);
    expect(onBoard.takenBy).toBe('Mara Quill');
  });
});
