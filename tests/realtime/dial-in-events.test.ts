// A dial-in shot reaches every open Bar over the live socket, so its "on the grinder" line shows a
// new good shot without waiting for a refetch; the Pickup screen, which faces customers, is only
// moved along the log. Real sockets against a real server.
import { afterAll, afterEach, beforeAll, describe, expect, it } from 'vitest';
import type { TestServer } from '../support/test-server';
import { loggedEvents, barScene, type Agent } from './bar-actions';
import { closeAllSockets, connect, connectAndResume } from './ws-client';

let server: TestServer;
let barista: Agent;
let locationId: number;

beforeAll(async () => {
  ({ server, barista, locationId } = await barScene());
});
afterEach(() => closeAllSockets());
afterAll(() => server.close());

describe('a dial-in shot', () => {
  it('appends beans.changed, which a Bar screen receives live and a Pickup screen only as a step in the log', async () => {
    const bar = await connectAndResume(server.url, await server.cookieFor('barista'));
    const pickup = await connect(server.url, await server.cookieFor('cashier'));
    const hello = await pickup.next((m) => m.type === 'hello', 'hello');
    pickup.send({ type: 'resume', since: hello.type === 'hello' ? hello.seq : 0, screen: 'pickup' });
    const { espressoLotId } = (await barista.get('/api/dial-in')).body;
    // 18 g → 36 g in 28 s: 1:2.0 inside the café's 25–30 s window (common practice), a good shot
    const res = await barista.post('/api/dial-in/shots').send({ lotId: espressoLotId, grind: '2.3', doseG: 18, yieldG: 36, timeS: 28 });
    expect(res.status, JSON.stringify(res.body)).toBe(201);
    expect(res.body.advice.good).toBe(true);

    const logged = (await loggedEvents(server, locationId)).at(-1)!;
    expect(logged.type).toBe('beans.changed');
    const got = await bar.client.next((m) => m.type === 'event' && m.event.type === 'beans.changed', 'beans.changed');
    expect(got).toEqual({ type: 'event', event: { seq: logged.seq, type: 'beans.changed', at: expect.any(String) } });
    const seen = await pickup.next((m) => m.type === 'event' && m.event.seq === logged.seq, 'the same seq on Pickup');
    expect(seen).toEqual({ type: 'event', event: { seq: logged.seq, type: 'beans.changed', at: expect.any(String) } });
  });
});
