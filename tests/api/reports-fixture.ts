// One morning at the demo café for the Reports tests, placed through the real API: a shift (a row
// in shifts, as the shift screen would write it), cash and card orders, a lead's discount, a
// partial and a full refund, a declined card that is voided, and bumps at known times.
import { demoCafeId } from '@seeds/demo-cafe';
import { expect } from 'vitest';
import type { OrderView, TicketView } from '@/domain/types';
import { demoMenu, type manualClock, type TestServer } from '../support/test-server';
import { orderBody, type Agent, type LineInput } from './helpers';

export const DAY = '2026-03-02';
/** 09:00 in New York (EST, UTC−5) on DAY */
export const T0 = '2026-03-02T14:00:00.000Z';
/** fired → ready of the four bumped tickets, in the order they are bumped */
export const WAITS = [120, 200, 300, 400];

export interface ReportDay {
  shiftId: number;
  /** paid orders taken during the shift, in the order placed */
  inShift: OrderView[];
  /** a paid order taken after the shift closed, never bumped */
  late: OrderView;
  /** declined card, then voided: never paid */
  voided: OrderView;
  /** the tickets as the bump answers returned them */
  bumped: TicketView[];
  /** the final state of every paid order (after refunds), the shift's first */
  paid: OrderView[];
}

type Clock = ReturnType<typeof manualClock>;

export async function placeReportDay(server: TestServer, time: Clock): Promise<ReportDay> {
  const ids = await demoMenu(server);
  const [cashier, lead, barista] = [await server.signIn('cashier'), await server.signIn('lead'), await server.signIn('barista')];
  const leadId = (await server.db('users').where({ username: 'lead' }).first('id')).id;
  const locationId = await demoCafeId(server.db);
  time.set(T0);
  const [{ id: shiftId }] = await server
    .db('shifts')
    .insert({
      location_id: locationId,
      opened_at: '2026-03-02T13:00:00.000Z',
      opened_by: leadId,
      opening_float_cents: 100_00,
      baristas_on_bar: 1,
      wait_target_seconds: 240,
    })
    .returning('id');

  const place = async (who: Agent, body: object) => {
    const res = await who.post('/api/orders').send(body);
    expect(res.status, JSON.stringify(res.body)).toBe(201);
    return res.body.order as OrderView;
  };
  const cash = (name: string, items: LineInput[]) => place(cashier, orderBody(name, items));
  const card = (name: string, items: LineInput[]) => place(cashier, { ...orderBody(name, items), payment: { method: 'card', paymentMethod: 'pm_card_visa' } });

  const ada = await cash('Ada Finch', [
    { menuItemId: ids.item('Latte'), sizeId: ids.size('Latte', 'Large'), milkId: ids.milk('Oat') },
    { menuItemId: ids.item('Banana bread') },
  ]);
  const bram = await card('Bram Okafor', [{ menuItemId: ids.item('Flat white') }]);
  const cora = await place(lead, {
    ...orderBody('Cora Lind', [{ menuItemId: ids.item('Cappuccino'), milkId: ids.milk('Skim') }, { menuItemId: ids.item('Espresso') }]),
    discount: { kind: 'percent', value: 10, reason: 'Regular' },
  });
  const dev = await card('Dev Patel', [{ menuItemId: ids.item('Iced latte'), sizeId: ids.size('Iced latte', 'Large'), milkId: ids.milk('Soy') }]);
  const formula = await cash('=cmd', [{ menuItemId: ids.item('Banana bread') }]);

  const declined = await cashier
    .post('/api/orders')
    .send({ ...orderBody('Faye Norn', [{ menuItemId: ids.item('Mocha') }]), payment: { method: 'card', paymentMethod: 'pm_card_chargeDeclined' } });
  expect(declined.status).toBe(402);
  const voidRes = await lead.post(`/api/orders/${declined.body.error.details.orderId}/void`).send({ reason: 'Customer left' });
  expect(voidRes.status, JSON.stringify(voidRes.body)).toBe(200);

  // Bump the four bar tickets at known waits after they were fired (all at T0).
  const bumped: TicketView[] = [];
  for (const [i, order] of [ada, bram, cora, dev].entries()) {
    expect(order.firedAt).toBe(T0);
    time.set(new Date(Date.parse(T0) + WAITS[i] * 1000).toISOString());
    const res = await barista.post(`/api/tickets/${order.id}/bump`);
    expect(res.status, JSON.stringify(res.body)).toBe(200);
    bumped.push(res.body.ticket);
  }

  const refund = async (order: OrderView, body: object) => {
    const res = await lead.post(`/api/orders/${order.id}/refund`).send(body);
    expect(res.status, JSON.stringify(res.body)).toBe(200);
    return res.body.order as OrderView;
  };
  const adaAfter = await refund(ada, { amountCents: 150, reason: 'Cake was dry' });
  const devAfter = await refund(dev, { reason: 'Wrong milk' });
  expect(devAfter).toMatchObject({ paymentStatus: 'refunded', status: 'ready' });

  time.set('2026-03-02T14:30:00.000Z');
  await server.db('shifts').where({ id: shiftId }).update({ closed_at: time.clock().toISOString(), closed_by: leadId });
  time.set('2026-03-02T15:00:00.000Z'); // 10:00 in New York
  const late = await cash('Gus Ware', [{ menuItemId: ids.item('Long black') }, { menuItemId: ids.item('Chai latte'), milkId: ids.milk('Almond') }]);

  const voided = (await lead.get(`/api/orders/${declined.body.error.details.orderId}`)).body.order as OrderView;
  const inShift = [adaAfter, bram, cora, devAfter, formula];
  return { shiftId, inShift, late, voided, bumped, paid: [...inShift, late] };
}

/** What the report should say about a set of paid orders, summed from the API's own answers. */
export function expectedMoney(orders: OrderView[]) {
  const sum = (f: (o: OrderView) => number, list = orders) => list.reduce((a, o) => a + f(o), 0);
  const by = (m: 'cash' | 'card') => orders.filter((o) => o.payment.method === m);
  const gross = sum((o) => o.totalCents);
  const refunds = sum((o) => o.refundedCents);
  return {
    orders: orders.length,
    drinks: sum((o) => o.lines.filter((l) => l.station === 'bar').length),
    grossCents: gross,
    taxCents: sum((o) => o.taxCents),
    discountCents: sum((o) => o.discountCents),
    refundsCents: refunds,
    netCents: gross - refunds,
    paymentMix: {
      cash: { orders: by('cash').length, cents: sum((o) => o.totalCents, by('cash')) },
      card: { orders: by('card').length, cents: sum((o) => o.totalCents, by('card')) },
    },
  };
}

/** Milk, shots and coffee of the drinks the bar made, from the bump answers. */
export function expectedBar(tickets: TicketView[]) {
  const drinks = tickets.flatMap((t) => t.drinks).filter((d) => d.status === 'done');
  const milk = new Map<string, number>();
  for (const d of drinks) if (d.milk && d.milkMl > 0) milk.set(d.milk.name, (milk.get(d.milk.name) ?? 0) + d.milkMl);
  return {
    milkUsedMl: [...milk].map(([m, ml]) => ({ milk: m, ml })),
    shotsPulled: drinks.reduce((a, d) => a + d.shots, 0),
    coffeeUsedDg: drinks.reduce((a, d) => a + d.doseDg, 0),
  };
}
