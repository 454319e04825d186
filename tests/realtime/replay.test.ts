// Resume from 0 on a fresh database: the whole log, in order, no duplicates.
import { afterAll, afterEach, beforeAll, describe, expect, it } from 'vitest';
import type { TicketView } from '@/domain/types';
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

describe('resume from 0', () => {
  it('on a fresh database says hello with seq 0', async () => {
    expect(await loggedEvents(server, locationId)).toEqual([]);
    const client = await connect(server.url, await server.cookieFor('barista'));
    expect(await client.next((m) => m.type === 'hello', 'hello')).toEqual({ type: 'hello', seq: 0 });
  });

  it('replays every event in order with strictly increasing, unique seqs', async () => {
    // build a history through the API; keep the ticket each command answered with
    const a = await fireOrder(cashier, 'Ana', [lines.latte(), lines.croissant()]);
    const b = await fireOrder(cashier, 'Ben', [lines.flatWhite(), lines.espresso()]);
    await fireOrder(cashier, 'Cy', [lines.croissant()]); // counter only: still fired, as collected
    const answered: TicketView[] = [
      await startDrink(barista, barLines(a)[0].id),
      await bumpDrink(barista, barLines(a)[0].id),
      await bumpTicket(barista, b.id),
      await recallTicket(barista, b.id),
    ];
    const logged = await loggedEvents(server, locationId);
    expect(logged.map((e) => e.type)).toEqual([
      'order.fired',
      'order.fired',
      'order.fired',
      'drink.started',
      'drink.bumped',
      'ticket.bumped',
      'ticket.recalled',
    ]);

    const { client, hello } = await connectAndResume(server.url, await server.cookieFor('lead'), 0);
    expect(hello.seq).toBe(logged.at(-1)!.seq);
    const replayed = [];
    for (let i = 0; i < logged.length; i++) replayed.push(await client.nextEvent());

    const seqs = replayed.map((e) => e.seq);
    expect(seqs).toEqual(logged.map((e) => e.seq));
    expect(new Set(seqs).size).toBe(seqs.length);
    for (let i = 1; i < seqs.length; i++) expect(seqs[i]).toBeGreaterThan(seqs[i - 1]);
    expect(seqs[0]).toBeGreaterThan(0);
    expect(replayed.map((e) => e.type)).toEqual(logged.map((e) => e.type));

    // each replayed event carries the ticket as it was at that moment
    expect(replayed.slice(0, 3).map((e) => e.ticket.customerName)).toEqual(['Ana', 'Ben', 'Cy']);
    expect(replayed[2].ticket).toMatchObject({ status: 'collected', drinks: [] });
    expect(replayed[0].ticket.drinks.map((d) => d.status)).toEqual(['queued']);
    expect(replayed.slice(3).map((e) => e.ticket)).toEqual(answered);

    // nothing after the log until the next live event
    const marker = await bumpDrink(barista, barLines(b)[1].id); // recalled to "making"; now done
    const live = await client.nextEvent('drink.bumped');
    expect(live.ticket).toEqual(marker);
    expect(client.messages.map((m) => (m.type === 'event' ? m.event.seq : m.type))).toEqual(['hello', ...seqs, live.seq]);
  });

  it('a second resume on the same socket replays again from the new since, without duplicating live events', async () => {
    const logged = await loggedEvents(server, locationId);
    const { client } = await connectAndResume(server.url, await server.cookieFor('barista'), logged.at(-2)!.seq);
    const only = await client.nextEvent();
    expect(only.seq).toBe(logged.at(-1)!.seq);
    // the screen asks again from further back (e.g. its local state was lost)
    client.send({ type: 'resume', since: logged.at(-3)!.seq });
    const again = [await client.nextEvent(), await client.nextEvent()];
    expect(again.map((e) => e.seq)).toEqual(logged.slice(-2).map((e) => e.seq));

    const order = await fireOrder(cashier, 'Dee', [lines.espresso()]);
    const live = await client.nextEvent('order.fired');
    expect(live.ticket.id).toBe(order.id);
    expect(client.events().map((e) => e.seq)).toEqual([logged.at(-1)!.seq, ...logged.slice(-2).map((e) => e.seq), live.seq]);
  });
});
