// The owner's live socket follows the café the session chose: a socket open at the choice is
// closed with 4412, on which every tab of the session loads its page again (a tab kept open would
// hold the other café's board and resume from the other café's sequence number), and a socket
// opened afterwards says hello at the chosen café's sequence and carries that café's events.
import request from 'supertest';
import { afterAll, afterEach, beforeAll, expect, it } from 'vitest';
import { SECOND_CAFE_NAME } from '@seeds/demo-cafe';
import { demoMenu, startTestServer, type TestServer } from '../support/test-server';
import { fireOrder, loggedEvents } from './bar-actions';
import { closeAllSockets, connect, connectAndResume } from './ws-client';

let server: TestServer;
let ropewalk: number;

beforeAll(async () => {
  server = await startTestServer();
  ropewalk = (await server.db('locations').where({ name: SECOND_CAFE_NAME }).first('id')).id;
});
afterEach(() => closeAllSockets());
afterAll(() => server.close());

it('the owner’s socket moves to the chosen café', async () => {
  const rwCashier = await server.signIn('rw-cashier');
  const ids = await demoMenu(server, ropewalk);
  const longBlack = { menuItemId: ids.item('Long black'), sizeId: ids.size('Long black', 'Regular') };
  await fireOrder(rwCashier, 'Before', [longBlack]);

  const cookie = await server.cookieFor('owner');
  const before = await connect(server.url, cookie);
  await before.next((m) => m.type === 'hello', 'hello');
  const closed = new Promise<number>((resolve) => before.socket.once('close', (code) => resolve(code)));
  await request(server.url).post('/api/session/cafe').set('Cookie', cookie).send({ locationId: ropewalk }).expect(200);
  expect(await closed).toBe(4412); // not "signed out" (4401): the page loads again on the chosen café

  const client = await connect(server.url, cookie);
  const hello = await client.next((m) => m.type === 'hello', 'hello');
  expect(hello).toEqual({ type: 'hello', seq: (await loggedEvents(server, ropewalk)).at(-1)!.seq });
  await client.close();

  const { client: owner } = await connectAndResume(server.url, cookie);
  const order = await fireOrder(rwCashier, 'After', [longBlack]);
  const fired = await owner.nextEvent('order.fired');
  expect(fired.ticket.id).toBe(order.id);
});
