// The Pickup screen faces customers. What reaches it — GET /api/pickup, the server-rendered page
// and the data embedded in it, the live socket's events, replays and snapshots — carries a
// ticket's first name, number, status and ready time (and its row id, to key it), nothing else.
// The shape follows the screen, not the role: here a lead's session runs the Pickup screen.
// Every check reads the raw text (frames, JSON, HTML) for distinctive values, so a field that
// slips through under any name is caught.
import { createRequire } from 'node:module';
import { afterAll, afterEach, beforeAll, describe, expect, it } from 'vitest';
import { MAX_REPLAY } from '@server/realtime/socket-server';
import { DEMO_STAFF } from '@seeds/demo-cafe';
import type { ServerMessage } from '@/domain/types';
import { orderBody } from '../api/helpers';
import { demoMenu, startTestServer, type TestServer } from '../support/test-server';
import { availabilityEvents, demoLocationId, loggedEvents, type Agent } from './bar-actions';
import { closeAllSockets, connect, type LiveClient } from './ws-client';

// jsdom (a WHATWG-conformant HTML parser; scripts are not run) ships no types
const { JSDOM } = createRequire(import.meta.url)('jsdom') as { JSDOM: new (html: string) => { window: { document: Document } } };

const GUEST = 'Zephyrine Brackenridge';
const GUEST_FIRST = 'Zephyrine';
const OTHER_GUEST = 'Ottoline Farrowdale';
const EMAIL = 'zb.audience@example.com';
const ALLERGY_NOTE = 'Carries an adrenaline pen, ask Marchbanks';
const ALLERGENS = ['sesame', 'peanuts'];
const NOTE = 'Extra hot for Oldcastle';

/** Nothing of these may reach the Pickup screen, in any frame, answer or page. */
const FORBIDDEN = [
  'Brackenridge',
  'Farrowdale',
  EMAIL,
  ALLERGY_NOTE,
  'Marchbanks',
  ...ALLERGENS,
  'soybeans', // what the soy latte itself contains
  NOTE,
  'Oldcastle',
  'Latte',
  ...DEMO_STAFF.map((s) => s.name), // who took, started, read, bumped; who opened the shift; who is signed in
  'Onslow',
  'Reyes',
  // fields that carry those, or money
  'allergyNote',
  'allergens',
  'contains',
  'takenBy',
  'customerName',
  'openedBy',
  'Cents',
  'price',
];
/** Words of the shape a Pickup ticket may have. */
const PICKUP_TICKET_KEYS = ['firstName', 'id', 'number', 'readyAt', 'status'];

const leaks = (text: string) => FORBIDDEN.filter((word) => text.toLowerCase().includes(word.toLowerCase()));

let server: TestServer;
let lead: Agent;
let cashier: Agent;
let barista: Agent;
let leadCookie: string;
let since: number;
let guestTicketId: number;
/** The Pickup screen's socket (a lead's session) from before the order until it is ready. */
let pickup: LiveClient;
/** A Bar screen's socket over the same time: the very values the Pickup screen must not get. */
let staff: LiveClient;

async function openSocket(cookie: string, resume: { since: number; screen?: string }) {
  const client = await connect(server.url, cookie);
  await client.next((m) => m.type === 'hello', 'hello');
  client.send({ type: 'resume', ...resume });
  return client;
}

beforeAll(async () => {
  // the screens rendered by the real SSR entry (Vite in middleware mode)
  server = await startTestServer({ pages: 'development' });
  [lead, cashier, barista] = await Promise.all([server.signIn('lead'), server.signIn('cashier'), server.signIn('barista')]);
  leadCookie = await server.cookieFor('lead');
  const m = await demoMenu(server);
  since = (await loggedEvents(server, await demoLocationId(server))).at(-1)?.seq ?? 0;

  pickup = await openSocket(leadCookie, { since, screen: 'pickup' });
  staff = await openSocket(await server.cookieFor('barista'), { since, screen: 'bar' });

  // a shift opened by the lead (its event names the lead and carries the till's float)
  expect((await lead.post('/api/shifts').send({ openingFloatCents: 150_00, baristasOnBar: 1, waitTargetSeconds: 240 })).status).toBe(201);
  // a soy latte with a note, for a guest with allergies, an allergy note and an e-mail receipt
  const latte = { menuItemId: m.item('Latte'), sizeId: m.size('Latte', 'Regular'), milkId: m.milk('Soy'), note: NOTE };
  const guest = await cashier.post('/api/orders').send({ ...orderBody(GUEST, [latte]), allergens: ALLERGENS, allergyNote: ALLERGY_NOTE, customerEmail: EMAIL });
  expect(guest.status, JSON.stringify(guest.body)).toBe(201);
  guestTicketId = guest.body.order.id;
  const drinkId = guest.body.order.lines[0].id;
  // the barista reads the allergy, starts and bumps it: ready
  for (const path of [`/api/drinks/${drinkId}/acknowledge-allergy`, `/api/drinks/${drinkId}/start`, `/api/tickets/${guestTicketId}/bump`]) {
    const res = await barista.post(path).send();
    expect(res.status, `${path}: ${JSON.stringify(res.body)}`).toBe(200);
  }
  // another guest's order stays "being made"
  const other = await cashier.post('/api/orders').send({ ...orderBody(OTHER_GUEST, [{ ...latte, note: undefined }]), allergens: ['sesame'] });
  expect(other.status).toBe(201);
  await staff.nextEvent('order.fired');
  await staff.nextEvent('order.fired');
  await pickup.next((m) => m.type === 'event' && m.event.type === 'order.fired' && m.event.ticket.id === other.body.order.id, 'the second order');
}, 60_000);
afterEach(() => closeAllSockets());
afterAll(() => server.close());

/** Every ticket object inside a Pickup payload, wherever it sits. */
function ticketsIn(message: ServerMessage): Record<string, unknown>[] {
  if (message.type === 'event') return 'ticket' in message.event ? [message.event.ticket as unknown as Record<string, unknown>] : [];
  if (message.type === 'snapshot') return message.snapshot.tickets as unknown as Record<string, unknown>[];
  return [];
}

describe('the checks themselves', () => {
  it('find every distinctive value in what a Bar screen was sent', () => {
    const text = staff.frames.join('\n');
    for (const word of [GUEST, ALLERGY_NOTE, ...ALLERGENS, 'soybeans', NOTE, 'Latte', 'Jonah Reyes', 'Priya Onslow', 'Theo Brand', 'Cents']) {
      expect(text, word).toContain(word);
    }
  });
});

describe('the live socket of a Pickup screen (a lead signed in)', () => {
  it('carries first name, number, status and ready time in its events, and nothing else', () => {
    const events = pickup.messages.filter((m) => m.type === 'event');
    // the same events as the Bar screen, in the same order: only their contents are smaller
    expect(events.map((m) => m.type === 'event' && m.event.seq)).toEqual(staff.events().map((e) => e.seq));
    expect(leaks(pickup.frames.join('\n'))).toEqual([]);
    const tickets = events.flatMap(ticketsIn);
    expect(tickets.length).toBeGreaterThan(0);
    for (const t of tickets) expect(Object.keys(t).sort()).toEqual(PICKUP_TICKET_KEYS);
    const ready = tickets.filter((t) => t.id === guestTicketId).at(-1)!;
    expect(ready).toMatchObject({ firstName: GUEST_FIRST, status: 'ready', readyAt: expect.any(String) });
  });

  it('gets a replay in the same shape', async () => {
    const again = await openSocket(leadCookie, { since, screen: 'pickup' });
    const last = staff.events().at(-1)!.seq;
    await again.next((m) => m.type === 'event' && m.event.seq === last, 'the replay to the last event');
    expect(leaks(again.frames.join('\n'))).toEqual([]);
    for (const t of again.messages.flatMap(ticketsIn)) expect(Object.keys(t).sort()).toEqual(PICKUP_TICKET_KEYS);
  });

  it(`gets a snapshot in the same shape when more than ${MAX_REPLAY} events behind`, async () => {
    const m = await demoMenu(server);
    await availabilityEvents(lead, m.item('Banana bread'), MAX_REPLAY + 1);
    const far = await openSocket(leadCookie, { since, screen: 'pickup' });
    const message = await far.next((x) => x.type === 'snapshot', 'a snapshot');
    expect(leaks(far.frames.join('\n'))).toEqual([]);
    const tickets = ticketsIn(message);
    for (const t of tickets) expect(Object.keys(t).sort()).toEqual(PICKUP_TICKET_KEYS);
    expect(tickets.map((t) => t.firstName).sort()).toEqual(['Ottoline', GUEST_FIRST]);
    // a Bar screen as far behind still gets the full board (the check would see the leak)
    const bar = await openSocket(await server.cookieFor('barista'), { since, screen: 'bar' });
    await bar.next((x) => x.type === 'snapshot', 'a snapshot');
    expect(leaks(bar.frames.join('\n'))).toContain(ALLERGY_NOTE);
  }, 90_000); // the log is filled through the API, one request per event
});

describe('GET /api/pickup', () => {
  it('answers first name, number, status and ready time only', async () => {
    const res = await lead.get('/api/pickup');
    expect(res.status).toBe(200);
    expect(leaks(res.text)).toEqual([]);
    expect(res.body.tickets.map((t: { firstName: string }) => t.firstName).sort()).toEqual(['Ottoline', GUEST_FIRST]);
    for (const t of res.body.tickets) expect(Object.keys(t).sort()).toEqual(PICKUP_TICKET_KEYS);
  });
});

describe('the server-rendered Pickup page', () => {
  it('shows the first names, and neither its HTML nor its embedded data carry anything more', async () => {
    const res = await lead.get('/pickup');
    expect(res.status).toBe(200);
    expect(leaks(res.text)).toEqual([]);
    const document = new JSDOM(res.text).window.document;
    const names = [...document.querySelectorAll('[data-testid="pickup-name"] > span:first-child')].map((span) => span.textContent);
    expect(names.sort()).toEqual(['Ottoline', GUEST_FIRST]);
    const state = JSON.parse(document.getElementById('app-state')!.textContent!);
    expect(JSON.stringify(state)).toContain(GUEST_FIRST);
  });
});
