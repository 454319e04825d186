// A resume costs the server a read of the log and, for a screen far behind, a snapshot of the
// board. However many screens ask at once and however often one screen asks, that work stays
// bounded: screens at one café and one sequence number share one snapshot and one read of the
// log; a socket that keeps asking is told `rate_limited` and closed; one sign-in holds a limited
// number of sockets and a limited number of resumes among them (a new socket brings no fresh
// ones). The work is counted in the queries the server sends its database (only a
// board snapshot reads `pitchers`; only a replay reads events' payloads), and in messages and
// closes — never in time. The server runs on a manual clock, so no limit refills during a test.
import type { Knex } from 'knex';
import request from 'supertest';
import WebSocket from 'ws';
import { afterAll, afterEach, beforeAll, describe, expect, it } from 'vitest';
import { MAX_REPLAY, MAX_SOCKETS_PER_SESSION, RESUME_BURST, RESUME_STRIKES, SESSION_RESUME_BURST, TOO_MANY_SOCKETS } from '@server/realtime/socket-server';
import { REUSE_MS } from '@server/realtime/resume-source';
import type { ServerMessage } from '@/domain/types';
import { demoMenu, manualClock, startTestServer, type DemoLogin, type TestServer } from '../support/test-server';
import { availabilityEvents, demoLines, demoLocationId, fireOrder, loggedEvents, type Agent } from './bar-actions';
import { closeAllSockets, connect, tryUpgrade, type LiveClient } from './ws-client';

const time = manualClock();
let server: TestServer;
let cashier: Agent;
let lines: Awaited<ReturnType<typeof demoLines>>;
let locationId: number;
const stops: (() => void)[] = [];

beforeAll(async () => {
  server = await startTestServer({ clock: time.clock });
  cashier = await server.signIn('cashier');
  const lead = await server.signIn('lead');
  lines = await demoLines(server);
  locationId = await demoLocationId(server);
  // a board with tickets on it, and a log longer than a replay
  for (const name of ['Ada', 'Bo', 'Cy']) await fireOrder(cashier, name, [lines.latte(), lines.flatWhite()]);
  await availabilityEvents(lead, (await demoMenu(server)).item('Banana bread'), MAX_REPLAY + 5);
}, 120_000);
afterEach(async () => {
  while (stops.length) stops.pop()!();
  await closeAllSockets();
});
afterAll(() => server.close());

/** Counts the queries the server sends its database whose SQL matches, from now until the test ends. */
function countQueries(db: Knex, pattern: RegExp): () => number {
  let n = 0;
  const listener = (q: { sql: string }) => {
    if (pattern.test(q.sql)) n += 1;
  };
  db.on('query', listener);
  stops.push(() => db.off('query', listener));
  return () => n;
}
// Knex quotes names with backticks on SQLite and double quotes on PostgreSQL.
/** One board snapshot reads the café's pitchers; nothing else the socket does reads them. */
const snapshotsBuilt = () => countQueries(server.db, /from [`"]pitchers[`"]/);
/** One replay reads the missed events with their payloads. */
const replaysRead = () => countQueries(server.db, /[`"]payload[`"].* from [`"]events[`"]/);

async function screen(cookie: string): Promise<LiveClient> {
  const client = await connect(server.url, cookie);
  await client.next((m) => m.type === 'hello', 'hello');
  return client;
}

async function screens(logins: DemoLogin[], perSession: number): Promise<LiveClient[]> {
  const out: LiveClient[] = [];
  for (const login of logins) {
    const cookie = await server.cookieFor(login);
    for (let i = 0; i < perSession; i++) out.push(await screen(cookie));
  }
  return out;
}

function closeCode(client: LiveClient): Promise<number> {
  if (client.socket.readyState === WebSocket.CLOSED) return Promise.resolve(-1);
  return new Promise((resolve) => client.socket.once('close', (code) => resolve(code)));
}

const snapshotsOf = (client: LiveClient) => client.messages.filter((m) => m.type === 'snapshot');
const sendIfOpen = (client: LiveClient, message: unknown) => client.socket.readyState === WebSocket.OPEN && client.send(message);

describe('resumes share their work', () => {
  it('twelve screens resuming at once from far behind get one snapshot, built once', async () => {
    const clients = await screens(['lead', 'barista', 'cashier'], 4);
    const built = snapshotsBuilt();
    for (const c of clients) c.send({ type: 'resume', since: 0 });
    const answers = await Promise.all(clients.map((c) => c.next((m) => m.type !== 'hello', 'the answer to resume')));
    expect(built()).toBe(1);
    const [first] = answers;
    expect(first.type).toBe('snapshot');
    for (const a of answers) expect(a).toEqual(first);
    const { snapshot } = first as Extract<ServerMessage, { type: 'snapshot' }>;
    expect(snapshot.seq).toBe((await loggedEvents(server, locationId)).at(-1)!.seq);
    expect(snapshot.tickets.map((t) => t.customerName)).toEqual(['Ada', 'Bo', 'Cy']);

    // a moment later, nothing new logged: the same snapshot again, stamped with the time it is sent
    // (screens set their clock by it)
    time.advance(REUSE_MS / 2);
    const later = await screen(await server.cookieFor('lead'));
    later.send({ type: 'resume', since: 0 });
    const again = (await later.next((m) => m.type === 'snapshot', 'a snapshot')) as Extract<ServerMessage, { type: 'snapshot' }>;
    expect(built()).toBe(1);
    expect(again.snapshot).toEqual({ ...snapshot, now: time.clock().toISOString() });
    expect(again.snapshot.now).not.toBe(snapshot.now);
  });

  it('twelve screens missing the same twenty events read them from the log once', async () => {
    const logged = await loggedEvents(server, locationId);
    const since = logged.at(-21)!.seq;
    const clients = await screens(['lead', 'barista', 'cashier'], 4);
    const read = replaysRead();
    for (const c of clients) c.send({ type: 'resume', since });
    for (const c of clients) await c.next((m) => m.type === 'event' && m.event.seq === logged.at(-1)!.seq, 'the last missed event');
    expect(read()).toBe(1);
    for (const c of clients) expect(c.events().map((e) => e.seq)).toEqual(logged.slice(-20).map((e) => e.seq));
  });
});

describe('the limits', () => {
  it(`a socket that keeps asking is answered at most ${RESUME_BURST} times, told rate_limited, then closed (1008)`, async () => {
    const client = await screen(await server.cookieFor('barista'));
    const closed = closeCode(client);
    const built = snapshotsBuilt();
    for (let i = 0; i < 40; i++) client.send({ type: 'resume', since: 0 });
    expect(await closed).toBe(1008);
    // (the close may come before the answer to its first resume: asking while an answer is on its
    // way is asking too often)
    expect(snapshotsOf(client).length).toBeLessThanOrEqual(RESUME_BURST);
    // the board has not changed since the last test: the snapshot it got was the one already built
    expect(built()).toBeLessThanOrEqual(1);
    const errors = client.messages.filter((m) => m.type === 'error');
    expect(errors[0]).toEqual({ type: 'error', code: 'rate_limited', message: expect.any(String) });
    expect(errors.length).toBeLessThanOrEqual(RESUME_STRIKES);
  });

  it(`a sign-in holds ${MAX_SOCKETS_PER_SESSION} sockets: a new one beyond closes the oldest (${TOO_MANY_SOCKETS}); other sign-ins keep theirs`, async () => {
    const bystander = await screen(await server.cookieFor('cashier'));
    const cookie = await server.cookieFor('barista');
    const mine: LiveClient[] = [];
    const codes: Promise<number>[] = [];
    for (let i = 0; i < MAX_SOCKETS_PER_SESSION + 2; i++) {
      const client = await screen(cookie);
      mine.push(client);
      codes.push(closeCode(client));
    }
    expect(await codes[0]).toBe(TOO_MANY_SOCKETS);
    expect(await codes[1]).toBe(TOO_MANY_SOCKETS);
    expect(mine.slice(2).every((c) => c.socket.readyState === WebSocket.OPEN)).toBe(true);
    expect(server.sockets.peers()).toBe(MAX_SOCKETS_PER_SESSION + 1);
    // the newest socket works: it resumes and hears pongs
    const newest = mine.at(-1)!;
    newest.send({ type: 'resume', since: (await loggedEvents(server, locationId)).at(-1)!.seq });
    newest.send({ type: 'ping' });
    await newest.next((m) => m.type === 'pong', 'pong');
    bystander.send({ type: 'ping' });
    await bystander.next((m) => m.type === 'pong', 'pong');
  });

  it(`a sign-in's sockets share ${SESSION_RESUME_BURST} resumes: then a resume closes its socket (1013) and a new socket is refused (429)`, async () => {
    const cookie = await server.cookieFor('owner');
    const clients = [];
    for (let i = 0; i < MAX_SOCKETS_PER_SESSION; i++) clients.push(await screen(cookie));
    const outcomes: (string | number)[] = [];
    // one resume at a time, each answered before the next: no socket asks too often on its own
    for (let round = 0; round < 3; round++) {
      for (const client of clients) {
        if (client.socket.readyState !== WebSocket.OPEN) continue;
        const closed = closeCode(client);
        client.send({ type: 'resume', since: 0 });
        const answered = await client
          .next((m) => m.type === 'snapshot', 'a snapshot')
          .then(
            () => 'snapshot',
            () => null, // closed instead
          );
        outcomes.push(answered ?? (await closed));
      }
    }
    expect(outcomes).toEqual([...Array(SESSION_RESUME_BURST).fill('snapshot'), ...Array(3 * MAX_SOCKETS_PER_SESSION - SESSION_RESUME_BURST).fill(1013)]);
    // a screen reconnecting now is turned away before its socket opens
    expect(await tryUpgrade(server.url, { Cookie: cookie })).toEqual({ opened: false, status: 429 });
    // another sign-in is not affected
    const other = await screen(await server.cookieFor('owner'));
    other.send({ type: 'resume', since: 0 });
    await other.next((m) => m.type === 'snapshot', 'a snapshot');
  });

  it('a storm of resumes from one sign-in: another screen is answered, the storm is cut off, and the work stays bounded', async () => {
    const storm = await screens(['barista2'], MAX_SOCKETS_PER_SESSION + 4);
    const closes = storm.map(closeCode);
    const bystander = await screen(await server.cookieFor('lead'));
    const built = snapshotsBuilt();
    const read = replaysRead();
    const logged = await loggedEvents(server, locationId);
    const middle = logged.at(-50)!.seq; // 49 events behind
    for (let round = 0; round < 30; round++) {
      for (const c of storm) sendIfOpen(c, { type: 'resume', since: round % 2 ? 0 : middle });
    }
    bystander.send({ type: 'resume', since: 0 });
    const answer = await bystander.next((m) => m.type !== 'hello', 'the bystander’s snapshot');
    expect(answer.type).toBe('snapshot');
    expect((await request(server.url).get('/healthz')).status).toBe(200);

    const codes = await Promise.all(closes);
    // every storming socket is closed: the oldest to make room, the rest for asking too often
    // (1008), or once the sign-in's own resumes ran out (1013)
    expect(codes.filter((c) => c === TOO_MANY_SOCKETS || c === -1)).toHaveLength(4);
    expect(codes.filter((c) => c === 1008 || c === 1013)).toHaveLength(MAX_SOCKETS_PER_SESSION);
    // 360 resumes were sent; each open socket was answered at most its burst
    const answered = storm.reduce((n, c) => n + snapshotsOf(c).length + c.events().length / 49, 0);
    expect(answered).toBeLessThanOrEqual((MAX_SOCKETS_PER_SESSION + 4) * RESUME_BURST);
    // one snapshot (already built at this seq) and one read of the fifty missed events, shared
    expect(built()).toBeLessThanOrEqual(1);
    expect(read()).toBeLessThanOrEqual(1);

    // the bystander carries on live
    const order = await fireOrder(cashier, 'After the storm', [lines.espresso()]);
    const fired = await bystander.nextEvent('order.fired');
    expect(fired.ticket.id).toBe(order.id);
    expect(bystander.messages.filter((m) => m.type === 'error')).toEqual([]);
  });
});
