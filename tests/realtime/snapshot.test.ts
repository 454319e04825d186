// A screen more than MAX_REPLAY events behind gets one snapshot of the board instead of a replay.
import { afterAll, afterEach, beforeAll, describe, expect, it } from 'vitest';
import { MAX_REPLAY } from '@server/realtime/socket-server';
import type { BoardSnapshot, ServerMessage } from '@/domain/types';
import type { TestServer } from '../support/test-server';
import { barLines, bumpDrink, bumpTicket, demoLines, fireOrder, loggedEvents, startDrink, type Agent, barScene } from './bar-actions';
import { closeAllSockets, connectAndResume } from './ws-client';

let server: TestServer;
let cashier: Agent;
let barista: Agent;
let lines: Awaited<ReturnType<typeof demoLines>>;
let locationId: number;
let barOrders: number;

const ORDERS = MAX_REPLAY + 6;

beforeAll(async () => {
  ({ server, cashier, barista, lines, locationId } = await barScene());

  // Real events through the API: a few hundred small orders, some of them moved along the bar.
  const orders = [];
  for (let i = 0; i < ORDERS; i++) {
    const items = i % 3 === 0 ? [lines.croissant()] : i % 3 === 1 ? [lines.espresso()] : [lines.latte(), lines.flatWhite()];
    orders.push(await fireOrder(cashier, `Guest ${i + 1}`, items));
  }
  barOrders = orders.filter((o) => barLines(o).length > 0).length;
  const mixed = orders.filter((o) => barLines(o).length === 2).slice(-3);
  await startDrink(barista, barLines(mixed[0])[0].id); // one drink making
  await bumpDrink(barista, barLines(mixed[1])[0].id); // one drink done, ticket still open
  await bumpTicket(barista, mixed[2].id); // one ticket ready
  expect(await loggedEvents(server, locationId)).toHaveLength(ORDERS + 3);
}, 120_000);
afterEach(() => closeAllSockets());
afterAll(() => server.close());

const logged = async () => (await loggedEvents(server, locationId)).map((e) => e.seq);

const board = async (): Promise<BoardSnapshot> => {
  const res = await barista.get('/api/tickets?view=board');
  expect(res.status).toBe(200);
  return res.body;
};

describe('too far behind', () => {
  it('resume from 0 gets one snapshot whose seq is the latest and whose tickets are the board', async () => {
    const { client, hello } = await connectAndResume(server.url, await server.cookieFor('barista'), 0);
    const message = await client.next((m) => m.type !== 'hello', 'the answer to resume');
    expect(message.type).toBe('snapshot');
    const { snapshot } = message as Extract<ServerMessage, { type: 'snapshot' }>;

    const expected = await board();
    expect(snapshot.seq).toBe((await logged()).at(-1));
    expect(snapshot.seq).toBe(hello.seq);
    expect(snapshot.seq).toBe(expected.seq);
    expect(snapshot.tickets).toEqual(expected.tickets);
    expect(snapshot.location).toEqual(expected.location);
    expect(Number.isNaN(Date.parse(snapshot.now))).toBe(false);
    // the board is what is open or freshly ready: not the counter-only orders, which were collected
    expect(snapshot.tickets.length).toBe(barOrders);
    expect(snapshot.tickets.filter((t) => t.status === 'ready')).toHaveLength(1);
    expect(snapshot.tickets.every((t) => t.status !== 'collected')).toBe(true);

    // then live events continue from the snapshot's seq, with nothing replayed in between
    const open = snapshot.tickets.find((t) => t.status === 'open' && t.drinks.some((d) => d.status === 'queued'))!;
    const afterSnapshot = await startDrink(barista, open.drinks.find((d) => d.status === 'queued')!.id);
    const live = await client.nextEvent('drink.started');
    expect(live.ticket).toEqual(afterSnapshot);
    expect(live.seq).toBeGreaterThan(snapshot.seq);
    expect(client.messages.map((m) => m.type)).toEqual(['hello', 'snapshot', 'event']);
  });

  it(`exactly ${MAX_REPLAY} missed events are still replayed one by one`, async () => {
    const seqs = await logged();
    const since = seqs[seqs.length - MAX_REPLAY - 1];
    const { client } = await connectAndResume(server.url, await server.cookieFor('barista'), since);
    const replayed = [];
    for (let i = 0; i < MAX_REPLAY; i++) replayed.push((await client.nextEvent()).seq);
    expect(replayed).toEqual(seqs.slice(-MAX_REPLAY));
    expect(client.messages.some((m) => m.type === 'snapshot')).toBe(false);
  });

  it(`${MAX_REPLAY + 1} missed events get a snapshot`, async () => {
    const seqs = await logged();
    const since = seqs[seqs.length - MAX_REPLAY - 2];
    const { client } = await connectAndResume(server.url, await server.cookieFor('barista'), since);
    const message = await client.next((m) => m.type !== 'hello', 'the answer to resume');
    expect(message.type).toBe('snapshot');
    const { snapshot } = message as Extract<ServerMessage, { type: 'snapshot' }>;
    expect(snapshot.seq).toBe(seqs.at(-1));
    expect(snapshot.tickets).toEqual((await board()).tickets);
  });
});
