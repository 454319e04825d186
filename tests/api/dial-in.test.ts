// The dial-in log over HTTP: barista, lead and owner log test shots (a cashier gets 403); each
// answer carries the ratio and the advice; each shot takes its dose from the lot; the lot's last
// good settings follow. Advice values: common practice (see tests/unit/dial-in.test.ts).
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { BeanLotView } from '@/domain/bean-stock';
import type { DialInView } from '@/domain/beans-schemas';
import { manualClock, startTestServer, type TestServer } from '../support/test-server';
import type { Agent } from './helpers';

const time = manualClock('2026-03-02T14:00:00.000Z');

let server: TestServer;
const agents = {} as Record<'owner' | 'lead' | 'cashier' | 'barista', Agent>;
let lot: BeanLotView;

async function counts() {
  const count = async (table: string) => Number((await server.db(table).count({ n: '*' }).first())?.n);
  return { shots: await count('dial_in_shots'), usage: await count('bean_usage'), events: await count('events') };
}

beforeAll(async () => {
  server = await startTestServer({ clock: time.clock });
  for (const who of ['owner', 'lead', 'cashier', 'barista'] as const) agents[who] = await server.signIn(who);
  const res = await agents.owner.post('/api/beans/lots').send({
    name: 'Dial Test Blend',
    roaster: 'Invented Roasting',
    roastDate: '2026-02-20',
    receivedDate: '2026-02-21',
    receivedG: 1000,
    hopper: 'espresso',
    restDays: 5,
    bestUntilDays: 30,
  });
  if (res.status !== 201) throw new Error(`lot: ${res.status} ${JSON.stringify(res.body)}`);
  lot = res.body.lot;
});
afterAll(() => server.close());

const shot = (over: Record<string, unknown> = {}) => ({ lotId: lot.id, grind: '2.4', doseG: 18, yieldG: 36, timeS: 28, ...over });

describe('who may log dial-in shots', () => {
  it('a cashier gets 403 on every dial-in route and nothing is stored', async () => {
    const before = await counts();
    for (const res of [
      await agents.cashier.get('/api/dial-in'),
      await agents.cashier.get(`/api/dial-in/lots/${lot.id}/shots`),
      await agents.cashier.post('/api/dial-in/shots').send(shot()),
    ]) {
      expect(res.status).toBe(403);
      expect(res.body.error.code).toBe('forbidden');
    }
    expect(await counts()).toEqual(before);
  });

  it('barista, lead and owner read the dial-in view: the window from the house recipe and the lot in the espresso grinder', async () => {
    for (const who of ['barista', 'lead', 'owner'] as const) {
      const res = await agents[who].get('/api/dial-in');
      expect(res.status, who).toBe(200);
      const v: DialInView = res.body;
      // the demo house double is 19 g → 18–20 g (our ± 1 g); 25–30 s and 1:1.8–2.2 (common practice, ±0.2 ours)
      expect(v.recipeDoseDg).toBe(190);
      expect(v.window).toEqual({ doseMinDg: 180, doseMaxDg: 200, timeMinS: 25, timeMaxS: 30, ratioMinX10: 18, ratioMaxX10: 22 });
      expect(v.espressoLotId).toBe(lot.id);
    }
  });
});

describe('logging shots', () => {
  it('a fast shot: grind finer; its dose comes off the lot; no good settings yet', async () => {
    const before = await counts();
    const res = await agents.barista.post('/api/dial-in/shots').send(shot({ grind: '3.1', doseG: 18, yieldG: 40, timeS: 19 }));
    expect(res.status, JSON.stringify(res.body)).toBe(201);
    expect(res.body.advice).toMatchObject({ code: 'fast', good: false, headline: 'Ran fast: grind finer', ratioX10: 22 });
    expect(res.body.shot).toMatchObject({
      lotId: lot.id,
      grind: '3.1',
      doseDg: 180,
      yieldDg: 400,
      timeDs: 190,
      ratioX10: 22,
      advice: 'fast',
      good: false,
      tasteNote: null,
      pulledBy: 'Jonah Reyes',
      pulledAt: time.clock().toISOString(),
    });
    expect(res.body.lot).toMatchObject({ id: lot.id, usedDg: 180, remainingDg: 10_000 - 180, lastGood: null });
    // one shot, one usage row, and one live event: every open Bar reloads its grinder line
    expect(await counts()).toEqual({ shots: before.shots + 1, usage: before.usage + 1, events: before.events + 1 });
    expect(await server.db('events').orderBy('id', 'desc').first()).toMatchObject({ type: 'beans.changed', created_at: time.clock().toISOString() });
    const usage = await server.db('bean_usage').where({ shot_id: res.body.shot.id });
    expect(usage).toEqual([expect.objectContaining({ lot_id: lot.id, source: 'dial_in', dose_dg: 180, order_item_id: null })]);
  });

  it('a shot in the window: keep these settings; it becomes the lot’s last good shot', async () => {
    time.advance(90_000);
    const res = await agents.barista.post('/api/dial-in/shots').send(shot({ grind: '2.7', doseG: 18, yieldG: 36, timeS: 28, tasteNote: 'sweet, round' }));
    expect(res.status).toBe(201);
    expect(res.body.advice).toMatchObject({ code: 'good', good: true, headline: 'In the window — keep these settings', ratioX10: 20 });
    expect(res.body.lot.usedDg).toBe(360);
    expect(res.body.lot.lastGood).toMatchObject({ id: res.body.shot.id, grind: '2.7', doseDg: 180, yieldDg: 360, timeDs: 280, tasteNote: 'sweet, round' });

    const v: DialInView = (await agents.lead.get('/api/dial-in')).body;
    expect(v.lots.find((l) => l.id === lot.id)!.lastGood?.grind).toBe('2.7');
    const shots = await agents.lead.get(`/api/dial-in/lots/${lot.id}/shots`);
    expect(shots.status).toBe(200);
    expect(shots.body.shots.map((s: { grind: string; advice: string }) => [s.grind, s.advice])).toEqual([
      ['2.7', 'good'],
      ['3.1', 'fast'],
    ]);
  });

  it('a later shot that runs slow does not replace the last good settings; lead and owner log too', async () => {
    time.advance(60_000);
    const slow = await agents.lead.post('/api/dial-in/shots').send(shot({ grind: '2.2', timeS: 34.5 }));
    expect(slow.status).toBe(201);
    expect(slow.body.advice.code).toBe('slow');
    expect(slow.body.shot.pulledBy).toBe('Theo Brand');
    expect(slow.body.lot.lastGood.grind).toBe('2.7');
    time.advance(60_000);
    const dose = await agents.owner.post('/api/dial-in/shots').send(shot({ grind: '2.7', doseG: 21.5, yieldG: 43 }));
    expect(dose.body.advice).toMatchObject({ code: 'dose', headline: 'Adjust the dose first' });
    expect(dose.body.shot.doseDg).toBe(215);
  });

  it('400 with the fields to fix, 404 for a lot that is not there, 409 for a retired lot; nothing stored', async () => {
    const before = await counts();
    const bad = await agents.barista
      .post('/api/dial-in/shots')
      .send({ lotId: lot.id, grind: '  ', doseG: '18', yieldG: -1, timeS: 500, tasteNote: 'x'.repeat(141) });
    expect(bad.status).toBe(400);
    expect(bad.body.error.details.map((d: { path: string }) => d.path).sort()).toEqual(['doseG', 'grind', 'tasteNote', 'timeS', 'yieldG']);
    const missing = await agents.barista.post('/api/dial-in/shots').send({});
    expect(missing.body.error.details.map((d: { path: string }) => d.path).sort()).toEqual(['doseG', 'grind', 'lotId', 'timeS', 'yieldG']);
    expect((await agents.barista.post('/api/dial-in/shots').send(shot({ lotId: 99999 }))).status).toBe(404);
    expect((await agents.barista.get('/api/dial-in/lots/99999/shots')).status).toBe(404);
    expect((await agents.barista.get('/api/dial-in/lots/abc/shots')).status).toBe(400);

    const shelf = await agents.owner.post('/api/beans/lots').send({
      name: 'Retired Soon',
      roaster: 'Invented Roasting',
      roastDate: '2026-02-20',
      receivedDate: '2026-02-21',
      receivedG: 250,
      hopper: 'shelf',
      restDays: 5,
      bestUntilDays: 30,
    });
    await agents.owner.post(`/api/beans/lots/${shelf.body.lot.id}/retire`);
    const mid = await counts();
    const retired = await agents.barista.post('/api/dial-in/shots').send(shot({ lotId: shelf.body.lot.id }));
    expect(retired.status).toBe(409);
    expect(await counts()).toEqual(mid);
    expect(mid.shots).toBe(before.shots);
    expect(mid.usage).toBe(before.usage);
  });
});
