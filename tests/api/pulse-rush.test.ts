// The morning rush the lead couldn't believe, over HTTP on a real server: 2 baristas steam jugs of
// 4 and tap "start" on each jug 12 s before bumping it. Start → bump read 3 s a drink, so the
// Counter quoted a minute with 20 drinks queued, Pulse said a drink waits seconds under measured
// waits of minutes, and a barista's median make time read 0:03. Numbers worked by hand.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { PulseView } from '@/domain/pulse';
import { quoteLabel } from '@/domain/quote';
import type { OrderView } from '@/domain/types';
import { demoMenu, manualClock, startTestServer, type TestServer } from '../support/test-server';
import { orderBody, type Agent } from './helpers';

const START = Date.parse('2026-03-02T14:00:00.000Z'); // 09:00 in New York
const time = manualClock(new Date(START).toISOString());
const at = (seconds: number) => time.set(new Date(START + seconds * 1000).toISOString());

let server: TestServer;
let lead: Agent;
let cashier: Agent;
const baristas: Agent[] = [];
let latte: number;
const queued: number[] = [];

async function ok(agent: Agent, path: string, body?: object) {
  const res = await agent.post(path).send(body);
  expect(res.status, `${path}: ${JSON.stringify(res.body)}`).toBeLessThan(300);
  return res.body;
}
const place = async (name: string): Promise<OrderView> => (await ok(cashier, '/api/orders', orderBody(name, [{ menuItemId: latte }], 500_00))).order;

beforeAll(async () => {
  server = await startTestServer({ clock: time.clock });
  lead = await server.signIn('lead');
  cashier = await server.signIn('cashier');
  baristas.push(await server.signIn('barista'), await server.signIn('barista2'));
  latte = (await demoMenu(server)).item('Latte');
  await ok(lead, '/api/shifts', { openingFloatCents: 100_00, baristasOnBar: 2, waitTargetSeconds: 240 });
  // 44 lattes, one every 11 s from 0:00 (to 7:53); from 3:00 a jug of 4 is bumped every minute,
  // the baristas taking turns, each jug started 12 s before its bump
  const events: { s: number; run: () => Promise<void> }[] = [];
  for (let i = 0; i < 44; i++) events.push({ s: i * 11, run: async () => void queued.push((await place(`Guest ${i}`)).lines[0].id) });
  for (let j = 0; j < 6; j++) {
    const who = baristas[j % 2];
    events.push({ s: 180 + 60 * j - 12, run: async () => void (await ok(who, '/api/drinks/start', { drinkIds: queued.slice(4 * j, 4 * j + 4) })) });
    events.push({ s: 180 + 60 * j, run: async () => void (await ok(who, '/api/drinks/bump', { drinkIds: queued.slice(4 * j, 4 * j + 4) })) });
  }
  events.sort((a, b) => a.s - b.s);
  for (const e of events) {
    at(e.s);
    await e.run();
  }
  at(480);
});
afterAll(() => server.close());

async function pulse(): Promise<PulseView> {
  const res = await lead.get('/api/pulse');
  expect(res.status, JSON.stringify(res.body)).toBe(200);
  return res.body;
}

describe('the wait now, for the Counter before payment', () => {
  it('refuses a count that is not a whole number of drinks (400 with the field), and needs a sign-in', async () => {
    for (const q of ['drinks=-1', 'drinks=two', 'drinks=101', 'drinks=1.5']) {
      const res = await cashier.get(`/api/wait-now?${q}`);
      expect(res.status, q).toBe(400);
      expect(res.body.error.details[0].path).toBe('query.drinks');
    }
    const none = await cashier.get('/api/wait-now');
    expect(none.status).toBe(200);
    // an order may hold 100 cups ("50 × Latte" twice), so the Counter may ask for all of them
    expect((await cashier.get('/api/wait-now?drinks=100')).status).toBe(200);
    expect((await baristas[0].get('/api/wait-now?drinks=1')).status).toBe(403);
  });
});

describe('a rush of jugs started moments before their bumps', () => {
  it('no barista’s median make time reads 0:03', async () => {
    const p = await pulse();
    // hand-worked: each barista bumps a jug of 4 every 2 min (their first after 3 min): 30 s a drink,
    // never 12 s ÷ 4 = 3 s
    expect(p.perBarista.map((b) => b.drinks)).toEqual([12, 12]);
    for (const b of p.perBarista) expect(b.medianMakeSeconds).toBe(30);
  });

  it('the next quote with 20 drinks on the bar is minutes, and agrees with Pulse’s wait now', async () => {
    // before paying: the Counter reads the wait for the drinks being ordered (GET /api/wait-now)
    const before = await cashier.get('/api/wait-now?drinks=1');
    expect(before.status, JSON.stringify(before.body)).toBe(200);
    expect(before.body.waitNow).toEqual({ drinksOnBar: 20, baristas: 2, seconds: 452 });
    const next = await place('Asking');
    // hand-worked: 44 − 24 = 20 drinks on the bar. Busy barista-time 0:00 → 8:00: 2 × 480 − 11 (one
    // latte alone for the first 11 s) = 949 s over 24 drinks, steadied by 5 × 60 s: 1249 ÷ 29 = 43.07 s;
    // (20 + 1) drinks ÷ 2 baristas × 43.07 s = 452 s. At 3 s a drink it read 32 s.
    expect(next.quotedWaitSeconds).toBe(452);
    const p = await pulse();
    expect(p.staffing.waitNow).toMatchObject({ drinksOnBar: 21, baristas: 2 });
    // the sentence says the wait now in the Counter's words (rounded up to the minute)
    expect(p.staffing.sentence).toContain(quoteLabel(p.staffing.waitNow.seconds).toLowerCase());
    expect(p.staffing.sentence).toContain('21 drinks on the bar');
  });

  it('Pulse never says a drink waits less than the tickets it just measured', async () => {
    const p = await pulse();
    const measured = p.windows[1].waits.medianSeconds!;
    // hand-worked: the 24 lattes made waited from 3:00 (the first) to 4:35: median over 3 min
    expect(measured).toBeGreaterThan(180);
    expect(p.staffing.waitNow.seconds).toBeGreaterThanOrEqual(measured);
    expect(p.staffing.sentence).not.toMatch(/under a second|\b\d s\b/);
    expect(p.staffing.inputs.meanMakeSeconds).toBeGreaterThan(30);
  });
});
