// Counter and bar actions through the real HTTP API, for the realtime tests.
import { randomUUID } from 'node:crypto';
import type request from 'supertest';
import type { OrderView, TicketView } from '@/domain/types';
import { demoMenu, startTestServer, type TestServer } from '../support/test-server';

export type Agent = ReturnType<typeof request.agent>;

export interface Line {
  menuItemId: number;
  sizeId?: number;
  milkId?: number;
}

/** POST /api/orders with cash covering any total; asserts it was created. */
export async function fireOrder(agent: Agent, customerName: string, items: Line[]): Promise<OrderView> {
  const res = await agent.post('/api/orders').send({ clientOrderId: randomUUID(), customerName, items, payment: { method: 'cash', tenderedCents: 100_00 } });
  if (res.status !== 201) throw new Error(`order for ${customerName} failed: ${res.status} ${JSON.stringify(res.body)}`);
  return res.body.order as OrderView;
}

/** The bar drinks of an order (their ids are the drink ids the bar commands take). */
export const barLines = (order: OrderView) => order.lines.filter((l) => l.station === 'bar');

async function command(agent: Agent, path: string): Promise<TicketView> {
  const res = await agent.post(path).send();
  if (res.status !== 200) throw new Error(`POST ${path} failed: ${res.status} ${JSON.stringify(res.body)}`);
  return res.body.ticket as TicketView;
}

export const startDrink = (agent: Agent, drinkId: number) => command(agent, `/api/drinks/${drinkId}/start`);
export const bumpDrink = (agent: Agent, drinkId: number) => command(agent, `/api/drinks/${drinkId}/bump`);
export const bumpTicket = (agent: Agent, ticketId: number) => command(agent, `/api/tickets/${ticketId}/bump`);
export const recallTicket = (agent: Agent, ticketId: number) => command(agent, `/api/tickets/${ticketId}/recall`);

/** A couple of ready-made demo lines. */
export async function demoLines(server: TestServer) {
  const m = await demoMenu(server);
  return {
    latte: (): Line => ({ menuItemId: m.item('Latte'), sizeId: m.size('Latte', 'Regular'), milkId: m.milk('Oat') }),
    flatWhite: (): Line => ({ menuItemId: m.item('Flat white') }),
    espresso: (): Line => ({ menuItemId: m.item('Espresso') }),
    croissant: (): Line => ({ menuItemId: m.item('Butter croissant') }),
  };
}

/** The events table for one location, as the socket would replay it. */
export async function loggedEvents(server: TestServer, locationId: number) {
  const rows = await server.db('events').where({ location_id: locationId }).orderBy('seq').select('seq', 'type');
  return rows.map((r) => ({ seq: r.seq as number, type: r.type as string }));
}

export async function demoLocationId(server: TestServer): Promise<number> {
  const row = await server.db('users').where({ username: 'barista' }).first('location_id');
  return row.location_id as number;
}

/** A fresh server with a cashier and a barista signed in, the demo menu's lines and the café's id. */
export async function barScene() {
  const server = await startTestServer();
  return {
    server,
    cashier: await server.signIn('cashier'),
    barista: await server.signIn('barista'),
    lines: await demoLines(server),
    locationId: await demoLocationId(server),
  };
}

/**
 * `n` events through the API, cheaply: a lead 86es an item and puts it back, over and over
 * (each is one `menu.availability` event). For logs longer than a replay.
 */
export async function availabilityEvents(lead: Agent, itemId: number, n: number) {
  for (let i = 0; i < n; i++) {
    const res = await lead.post(`/api/menu/items/${itemId}/availability`).send({ available: i % 2 === 1 });
    if (res.status !== 200) throw new Error(`86 toggle failed: ${res.status} ${JSON.stringify(res.body)}`);
  }
}
