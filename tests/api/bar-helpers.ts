// Helpers for the bar's API tests (bar-batches, bar-jugs): place orders, send bar commands, and
// check that a refused command changed no row and appended no event. The server and agents are
// read through getters, as each test file signs them in inside its beforeAll.
import { expect } from 'vitest';
import type { PlannedLane } from '@/domain/lanes';
import type { TicketView } from '@/domain/types';
import type { TestServer } from '../support/test-server';
import { orderBody, type Agent, type LineInput } from './helpers';
import { jsonOf } from '../support/rows';

export type OrderExtras = { allergens?: string[]; allergyNote?: string };

export function barTools(get: { server: () => TestServer; cashier: () => Agent; barista: () => Agent; nowIso: () => string }) {
  const db = () => get.server().db;

  /** A cash order placed by the cashier; answers its id. */
  async function place(customerName: string, items: LineInput[], extras: OrderExtras = {}): Promise<number> {
    const res = await get
      .cashier()
      .post('/api/orders')
      .send({ ...orderBody(customerName, items), ...extras });
    if (res.status !== 201) throw new Error(`order failed: ${res.status} ${JSON.stringify(res.body)}`);
    return res.body.order.id;
  }
  /** The ids of an order's bar drinks, in line order. */
  const drinkIdsOf = async (orderId: number): Promise<number[]> =>
    (await db()('order_items').where({ order_id: orderId, station: 'bar' }).orderBy('line_no')).map((r) => r.id);
  const drinkRow = (drinkId: number) => db()('order_items').where({ id: drinkId }).first();
  const orderRow = (orderId: number) => db()('orders').where({ id: orderId }).first();
  const maxEventId = async () => Number((await db()('events').max({ m: 'id' }).first())?.m ?? 0);
  const eventsAfter = (since: number) => db()('events').where('id', '>', since).orderBy('id');

  /** The rows a command could change: the drinks, the orders they are on, and the jugs. */
  async function rowsOf(drinkIds: number[]) {
    const drinks = await db()('order_items').whereIn('id', drinkIds).orderBy('id');
    const orders = await db()('orders')
      .whereIn('id', [...new Set(drinks.map((d) => d.order_id))])
      .orderBy('id');
    const jugs = await db()('jugs').orderBy('id');
    const jugDrinks = await db()('jug_drinks').orderBy('order_item_id');
    return { drinks, orders, jugs, jugDrinks };
  }

  /** POST with a JSON body; answers the response and the events the command appended. */
  async function send(agent: Agent, path: string, body?: object) {
    const since = await maxEventId();
    const res = body === undefined ? await agent.post(path) : await agent.post(path).send(body);
    return { res, events: await eventsAfter(since) };
  }

  /** A refused command: its status and code, no event, and every watched row as it was. */
  async function expectRefused(agent: Agent, path: string, body: object | undefined, status: number, code: string, watch: number[] = []) {
    const before = await rowsOf(watch);
    const { res, events } = await send(agent, path, body);
    expect(res.status, JSON.stringify(res.body)).toBe(status);
    expect(res.body.error).toMatchObject({ code, message: expect.any(String) });
    expect(events).toEqual([]);
    expect(await rowsOf(watch)).toEqual(before);
    return res.body.error as { code: string; message: string; details?: Record<string, unknown> };
  }

  /** A successful one-ticket command: 200 { ticket } and exactly one event of `type` carrying it. */
  async function expectCommand(agent: Agent, path: string, type: string, actorId: number): Promise<TicketView> {
    const { res, events } = await send(agent, path);
    expect(res.status, JSON.stringify(res.body)).toBe(200);
    expect(events.map((e) => e.type)).toEqual([type]);
    expect(events[0]).toMatchObject({ actor_id: actorId, created_at: get.nowIso() });
    expect(jsonOf(events[0].payload).ticket).toEqual(res.body.ticket);
    return res.body.ticket;
  }

  /**
   * A successful batch command: `status` with { tickets } (and whatever else `keys` names) naming
   * each affected ticket once, and exactly one event of `type` per ticket, each carrying that
   * ticket as answered.
   */
  async function expectBatch(
    agent: Agent,
    path: string,
    drinkIds: number[],
    type: string,
    actorId: number,
    ticketIds: number[],
    { status = 200, keys = ['tickets'] } = {},
  ) {
    const { res, events } = await send(agent, path, { drinkIds });
    expect(res.status, JSON.stringify(res.body)).toBe(status);
    expect(Object.keys(res.body).sort()).toEqual([...keys].sort());
    const tickets = res.body.tickets as TicketView[];
    expect(tickets.map((t) => t.id).sort((a, b) => a - b)).toEqual([...ticketIds].sort((a, b) => a - b));
    expect(events.map((e) => e.type)).toEqual(ticketIds.map(() => type));
    for (const e of events) expect(e).toMatchObject({ actor_id: actorId, created_at: get.nowIso() });
    const carried = events.map((e) => jsonOf(e.payload).ticket as TicketView);
    expect(carried.sort((a, b) => a.id - b.id)).toEqual([...tickets].sort((a, b) => a.id - b.id));
    return { tickets: new Map(tickets.map((t) => [t.id, t])), body: res.body };
  }

  async function openTickets(agent: Agent = get.barista()): Promise<TicketView[]> {
    const res = await agent.get('/api/tickets?view=open');
    expect(res.status).toBe(200);
    return res.body.tickets;
  }

  /** Finish every ticket still at the bar (reading its allergy first), so a lane test starts empty. */
  async function clearBar() {
    const barista = get.barista();
    for (const t of await openTickets()) {
      const allergy = t.allergens.length > 0 || !!t.allergyNote;
      for (const d of t.drinks) {
        if (allergy && d.status !== 'done' && !d.allergyAckAt) {
          expect((await barista.post(`/api/drinks/${d.id}/acknowledge-allergy`)).status).toBe(200);
        }
      }
      const res = await barista.post(`/api/tickets/${t.id}/bump`);
      expect(res.status, JSON.stringify(res.body)).toBe(200);
    }
    expect(await openTickets()).toEqual([]);
  }

  async function barLanes(agent: Agent = get.barista()) {
    const res = await agent.get('/api/bar/lanes');
    expect(res.status, JSON.stringify(res.body)).toBe(200);
    return res.body as { seq: number; now: string; lanes: PlannedLane[]; shotPlan: { shots: number; doseDg: number } };
  }

  return {
    place,
    drinkIdsOf,
    drinkRow,
    orderRow,
    maxEventId,
    eventsAfter,
    rowsOf,
    send,
    expectRefused,
    expectCommand,
    expectBatch,
    openTickets,
    clearBar,
    barLanes,
  };
}

export const laneOf = (lanes: PlannedLane[], milkName: string) => lanes.find((l) => l.milk?.name === milkName)!;
/** A lane's drinks in lane order (rushed first, then oldest ticket first), by id. */
export const laneIds = (lane: PlannedLane) => lane.drinks.map((d) => d.id);

// The demo café's pitchers: 350 ml (fill line 190), 600 ml (fill 330), 950 ml (fill 520), each
// with a minimum fill of a third of its capacity rounded up to 10 ml (120, 200, 320); the jug
// waste allowance is the migration's default, 15 ml; at most 4 drinks a jug; milk grows 15 % flat,
// 25 % silky, 75 % foamy (the café defaults: common practice, from memory).
export const SMALL_PITCHER = { capacityMl: 350, fillLineMl: 190, minFillMl: 120 };
export const MID_PITCHER = { capacityMl: 600, fillLineMl: 330, minFillMl: 200 };
export const BIG_PITCHER = { capacityMl: 950, fillLineMl: 520, minFillMl: 320 };

export { plannedJug } from '../support/jugs';
