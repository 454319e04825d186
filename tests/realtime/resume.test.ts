// Done means: a screen that drops and comes back with resume { since } gets exactly what it
// missed, in order, and then carries on live — nothing lost, nothing twice.
import { afterAll, afterEach, beforeAll, describe, expect, it } from 'vitest';
import type { AnyLiveEvent } from '@/domain/types';
import type { TestServer } from '../support/test-server';
import { barLines, bumpDrink, bumpTicket, demoLines, fireOrder, loggedEvents, recallTicket, startDrink, type Agent, barScene } from './bar-actions';
import { closeAllSockets, connect, connectAndResume } from './ws-client';

let server: TestServer;
let cashier: Agent;
let barista: Agent;
let lines: Awaited<ReturnType<typeof demoLines>>;
let locationId: number;

beforeAll(async () => {
  ({ server, cashier, barista, lines, locationId } = await barScene());
});
afterEach(() => closeAllSockets());
afterAll(() => server.close());

const describeMessages = (messages: { type: string; event?: AnyLiveEvent }[]) =>
  messages.map((m) => (m.type === 'event' ? `${m.event!.type}#${m.event!.seq}` : m.type));

describe('resuming after a drop', () => {
  it('replays exactly the three missed events, in order, then carries on live', async () => {
    const cookie = await server.cookieFor('barista');
    // A screen that never drops, to compare the replay with what was sent live.
    const { client: watcher } = await connectAndResume(server.url, await server.cookieFor('lead'));

    // 1. connected and resumed; sees events up to seq S
    const { client: first } = await connectAndResume(server.url, cookie);
    await fireOrder(cashier, 'Before', [lines.espresso()]);
    const seen = await first.nextEvent('order.fired');
    const S = seen.seq;
    await watcher.nextEvent('order.fired');

    // 2. it drops
    await first.close();

    // 3. while it is away, exactly three events: an order, a start and a bump
    const order = await fireOrder(cashier, 'While away', [lines.latte(), lines.flatWhite()]);
    const [drink] = barLines(order);
    const started = await startDrink(barista, drink.id);
    const bumped = await bumpDrink(barista, drink.id);
    const missedLive = [await watcher.nextEvent('order.fired'), await watcher.nextEvent('drink.started'), await watcher.nextEvent('drink.bumped')];
    const logged = (await loggedEvents(server, locationId)).filter((e) => e.seq > S);
    expect(logged.map((e) => e.type)).toEqual(['order.fired', 'drink.started', 'drink.bumped']);

    // 4. it comes back and resumes from S
    const again = await connect(server.url, cookie);
    const hello = await again.next((m) => m.type === 'hello', 'hello');
    expect(hello).toEqual({ type: 'hello', seq: logged[2].seq });
    again.send({ type: 'resume', since: S });

    const replayed = [await again.nextEvent(), await again.nextEvent(), await again.nextEvent()];
    expect(replayed.map((e) => e.seq)).toEqual(logged.map((e) => e.seq));
    expect(replayed.map((e) => e.type)).toEqual(['order.fired', 'drink.started', 'drink.bumped']);
    for (let i = 1; i < replayed.length; i++) expect(replayed[i].seq).toBeGreaterThan(replayed[i - 1].seq);
    expect(replayed[0].seq).toBeGreaterThan(S);
    // the replay carries the same events the live screens were sent
    expect(replayed).toEqual(missedLive);
    expect(replayed[0].ticket.id).toBe(order.id);
    expect(replayed[1].ticket).toEqual(started);
    expect(replayed[2].ticket).toEqual(bumped);

    // 5. one more event afterwards: the very next thing it sees must be that one
    const afterwards = await bumpTicket(barista, order.id);
    const live = await again.nextEvent('ticket.bumped');
    expect(live.ticket).toEqual(afterwards);
    expect(live.seq).toBeGreaterThan(replayed[2].seq);
    expect(describeMessages(again.messages)).toEqual([
      'hello',
      `order.fired#${logged[0].seq}`,
      `drink.started#${logged[1].seq}`,
      `drink.bumped#${logged[2].seq}`,
      `ticket.bumped#${live.seq}`,
    ]);
  });

  it('resuming from the latest seq replays nothing and still receives live events', async () => {
    const { client, hello } = await connectAndResume(server.url, await server.cookieFor('barista'));
    const order = await fireOrder(cashier, 'Fresh', [lines.espresso()]);
    const fired = await client.nextEvent('order.fired');
    expect(fired.ticket.id).toBe(order.id);
    expect(fired.seq).toBeGreaterThan(hello.seq);
    expect(client.messages.map((m) => m.type)).toEqual(['hello', 'event']);
  });

  it('a screen that drops twice in a row misses nothing across both gaps', async () => {
    const cookie = await server.cookieFor('barista');
    const { client: a } = await connectAndResume(server.url, cookie);
    const o1 = await fireOrder(cashier, 'Gap one', [lines.espresso(), lines.flatWhite()]);
    const s1 = (await a.nextEvent('order.fired')).seq;
    await a.close();

    await startDrink(barista, barLines(o1)[0].id);
    const { client: b } = await connectAndResume(server.url, cookie, s1);
    const e2 = await b.nextEvent('drink.started');
    await b.close();

    await bumpTicket(barista, o1.id);
    await recallTicket(barista, o1.id);
    const { client: c } = await connectAndResume(server.url, cookie, e2.seq);
    const got = [await c.nextEvent(), await c.nextEvent()];
    expect(got.map((e) => e.type)).toEqual(['ticket.bumped', 'ticket.recalled']);
    expect(got[0].ticket.status).toBe('ready');
    expect(got[1].ticket.status).toBe('open');
    // the recall puts the bumped drinks back to "making"
    expect(got[1].ticket.drinks.map((d) => d.status)).toEqual(['making', 'making']);

    const logged = (await loggedEvents(server, locationId)).filter((e) => e.seq > s1).map((e) => e.seq);
    expect([e2.seq, ...got.map((e) => e.seq)]).toEqual(logged);
  });
});
