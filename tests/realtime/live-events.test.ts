// Live events on a connected screen: hello → resume → events as the counter and bar act,
// message validation, and several screens seeing the same event.
import { afterAll, afterEach, beforeAll, describe, expect, it } from 'vitest';
import type { LiveEvent } from '@/domain/types';
import type { TestServer } from '../support/test-server';
import { barLines, bumpDrink, demoLines, fireOrder, loggedEvents, startDrink, type Agent, barScene } from './bar-actions';
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

const lastLogged = async () => (await loggedEvents(server, locationId)).at(-1);

describe('a signed-in barista screen', () => {
  it('says hello with the latest seq of its location', async () => {
    await fireOrder(cashier, 'Ada', [lines.espresso()]); // so the latest seq is not just 0
    const client = await connect(server.url, await server.cookieFor('barista'));
    const hello = await client.next((m) => m.type === 'hello', 'hello');
    expect(hello).toEqual({ type: 'hello', seq: (await lastLogged())!.seq });
    expect(client.messages[0]).toEqual(hello); // hello comes first
  });

  it('receives order.fired with the ticket and its bar drinks, then drink.bumped when a drink is bumped', async () => {
    const { client, hello } = await connectAndResume(server.url, await server.cookieFor('barista'));

    const order = await fireOrder(cashier, 'Grace', [lines.latte(), lines.croissant(), lines.flatWhite()]);
    const fired = await client.nextEvent('order.fired');
    expect(fired.seq).toBeGreaterThan(hello.seq);
    expect(fired.seq).toBe((await lastLogged())!.seq);
    expect(Number.isNaN(Date.parse(fired.at))).toBe(false);
    expect(fired.ticket).toMatchObject({
      id: order.id,
      number: order.number,
      customerName: 'Grace',
      status: 'open',
      firedAt: order.firedAt,
      readyAt: null,
    });
    // bar drinks only, in line order, all queued; the croissant is collected at the counter
    const bar = barLines(order);
    expect(fired.ticket.drinks.map((d) => [d.id, d.itemName, d.status])).toEqual(bar.map((l) => [l.id, l.itemName, 'queued']));
    expect(fired.ticket.drinks[0]).toMatchObject({ ticketId: order.id, sizeName: 'Regular', milk: { name: 'Oat', code: 'OA' } });

    const afterBump = await bumpDrink(barista, bar[0].id);
    const bumped = await client.nextEvent('drink.bumped');
    expect(bumped.seq).toBeGreaterThan(fired.seq);
    expect(bumped.ticket).toEqual(afterBump);
    expect(bumped.ticket.drinks.map((d) => d.status)).toEqual(['done', 'queued']);
    expect(bumped.ticket.status).toBe('open');

    // the last drink makes the ticket ready
    await bumpDrink(barista, bar[1].id);
    const last = await client.nextEvent('drink.bumped');
    expect(last.ticket.status).toBe('ready');
    expect(last.ticket.readyAt).not.toBeNull();

    expect(client.messages.map((m) => (m.type === 'event' ? m.event.type : m.type))).toEqual(['hello', 'order.fired', 'drink.bumped', 'drink.bumped']);
  });

  it('gets no events before it has sent resume', async () => {
    const client = await connect(server.url, await server.cookieFor('barista'));
    await client.next((m) => m.type === 'hello', 'hello');
    await fireOrder(cashier, 'Unseen', [lines.espresso()]);
    // The event was handed to subscribed sockets before the POST answered, so anything sent to
    // this socket would be on the wire ahead of the pong.
    client.send({ type: 'ping' });
    await client.next((m) => m.type === 'pong', 'pong');
    expect(client.messages.map((m) => m.type)).toEqual(['hello', 'pong']);
  });
});

describe('messages from the screen', () => {
  it('answers ping with pong', async () => {
    const client = await connect(server.url, await server.cookieFor('barista'));
    client.send({ type: 'ping' });
    expect(await client.next((m) => m.type === 'pong', 'pong')).toEqual({ type: 'pong' });
  });

  it.each([
    ['not JSON', 'this is not json'],
    ['an unknown type', JSON.stringify({ type: 'nope' })],
    ['a negative since', JSON.stringify({ type: 'resume', since: -1 })],
    ['a fractional since', JSON.stringify({ type: 'resume', since: 1.5 })],
    ['a since given as text', JSON.stringify({ type: 'resume', since: '3' })],
    ['a resume without since', JSON.stringify({ type: 'resume' })],
    ['no type at all', JSON.stringify({ since: 0 })],
    ['a bare JSON number', '42'],
  ])('refuses %s with validation_failed and stays open', async (_what, raw) => {
    const client = await connect(server.url, await server.cookieFor('barista'));
    await client.next((m) => m.type === 'hello', 'hello');
    client.sendRaw(raw);
    const error = await client.next((m) => m.type === 'error', 'an error');
    expect(error).toMatchObject({ type: 'error', code: 'validation_failed' });
    expect(typeof (error as { message: unknown }).message).toBe('string');

    client.send({ type: 'ping' });
    expect(await client.next((m) => m.type === 'pong', 'pong')).toEqual({ type: 'pong' });
    expect(client.socket.readyState).toBe(client.socket.OPEN);
    // a bad message did not count as a resume: still nothing but hello, error and pong
    expect(client.messages.map((m) => m.type)).toEqual(['hello', 'error', 'pong']);
  });

  it('still resumes normally after refusing bad messages', async () => {
    const client = await connect(server.url, await server.cookieFor('barista'));
    const hello = await client.next((m) => m.type === 'hello', 'hello');
    client.sendRaw('{');
    client.send({ type: 'nope' });
    client.send({ type: 'resume', since: -1 });
    await client.next((m) => m.type === 'error', 'error 1');
    await client.next((m) => m.type === 'error', 'error 2');
    await client.next((m) => m.type === 'error', 'error 3');
    client.send({ type: 'resume', since: (hello as { seq: number }).seq });

    const order = await fireOrder(cashier, 'After errors', [lines.espresso()]);
    const fired = await client.nextEvent('order.fired');
    expect(fired.ticket.id).toBe(order.id);
  });
});

describe('several screens', () => {
  it('barista and lead both receive the same event with the same seq', async () => {
    const { client: bar } = await connectAndResume(server.url, await server.cookieFor('barista'));
    const { client: lead } = await connectAndResume(server.url, await server.cookieFor('lead'));

    const order = await fireOrder(cashier, 'Both', [lines.flatWhite()]);
    const [a, b] = await Promise.all([bar.nextEvent('order.fired'), lead.nextEvent('order.fired')]);
    expect(a.ticket.id).toBe(order.id);
    expect(b).toEqual(a);

    await startDrink(barista, barLines(order)[0].id);
    const [c, d]: LiveEvent[] = await Promise.all([bar.nextEvent('drink.started'), lead.nextEvent('drink.started')]);
    expect(d).toEqual(c);
    expect(c.seq).toBeGreaterThan(a.seq);
    expect(c.ticket.drinks[0].status).toBe('making');
    expect(bar.events()).toEqual(lead.events());
  });

  it('a screen that closes stops being a peer; the others keep receiving', async () => {
    const { client: stays } = await connectAndResume(server.url, await server.cookieFor('barista'));
    const { client: leaves } = await connectAndResume(server.url, await server.cookieFor('lead'));
    await leaves.close();
    const order = await fireOrder(cashier, 'Still here', [lines.espresso()]);
    expect((await stays.nextEvent('order.fired')).ticket.id).toBe(order.id);
  });
});
