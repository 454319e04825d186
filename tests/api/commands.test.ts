// Each command is defined once (src/commands.ts) and its route (server/commands.ts, with the
// handlers in the areas' folders) and the browser's sender (src/lib/commands.ts) are made from it.
// So every command is mounted once with its method, path and capability, no other JSON command is
// written by hand beside them, and the sender puts the path's values in the path, the rest in the
// body, and gets the answer with the command's status.
import { afterAll, beforeAll, describe, expect, it, vi } from 'vitest';
import { COMMAND_NAMES, commands } from '@/commands';
import { send } from '@/lib/commands';
import { ApiError } from '@/lib/http';
import { WEBHOOK_PATH } from '@server/orders/routes';
import { demoMenu, startTestServer, type TestServer } from '../support/test-server';
import { orderBody } from './helpers';

/** The routes that change something but are not commands, and why. */
const PLAIN_ROUTES = [
  // passport answers the sign-in itself, after the throttle's turn; the sign-out ends its session
  'post /session',
  'delete /session',
  // signed by the payment provider over its raw bytes, not a session's JSON
  `post ${WEBHOOK_PATH}`,
  // multipart file uploads
  'post /menu/import/preview',
  'post /menu/import',
  'post /menu/items/:id/photo',
];

let server: TestServer;
const realFetch = globalThis.fetch;
let cookie = '';
/** Every request the sender made: method, path, body as sent, and the status it was answered. */
const sent: { method: string; path: string; body: string | undefined; contentType: string | undefined; status: number }[] = [];

beforeAll(async () => {
  server = await startTestServer();
  cookie = await server.cookieFor('owner');
  vi.stubGlobal('fetch', async (input: string, init: RequestInit = {}) => {
    const headers: Record<string, string> = { ...(init.headers as Record<string, string>), cookie };
    const res = await realFetch(`${server.url}${input}`, { ...init, headers });
    sent.push({ method: init.method ?? 'GET', path: input, body: init.body as string | undefined, contentType: headers['content-type'], status: res.status });
    return res;
  });
}, 60_000);
afterAll(async () => {
  vi.unstubAllGlobals();
  await server?.close();
});

describe('the commands', () => {
  it('are each mounted as one route, with the method, path and capability of their definition', () => {
    for (const name of COMMAND_NAMES) {
      const def = commands[name];
      const mounted = server.routes.filter((r) => r.path === def.path && r.method === def.method);
      expect(mounted, name).toHaveLength(1);
      expect(mounted[0].capability, name).toBe(def.capability);
    }
  });

  it('are every route that changes something but sign-in and sign-out, the webhook and the uploads', () => {
    const defined = new Set(COMMAND_NAMES.map((name) => `${commands[name].method} ${commands[name].path}`));
    const others = server.routes.filter((r) => r.method !== 'get' && !defined.has(`${r.method} ${r.path}`)).map((r) => `${r.method} ${r.path}`);
    expect(others.sort()).toEqual([...PLAIN_ROUTES].sort());
  });
});

describe('the browser’s sender', () => {
  it('fills the path from the input, sends the rest as the body, and answers with the command’s status', async () => {
    const menu = await demoMenu(server);
    const order = orderBody('Wren Halloway', [{ menuItemId: menu.item('Latte') }]);
    const barista = (await server.db('users').where({ username: 'barista' }).first('id')).id as number;
    const lot = (await (await server.signIn('owner')).get('/api/beans')).body.lots[0].id as number;
    sent.length = 0;

    const placed = await send.placeOrder(order);
    const again = await send.placeOrder(order);
    expect(again.order.id).toBe(placed.order.id);
    await send.refundOrder({ id: placed.order.id, reason: 'Customer left' });
    await expect(send.setPin({ id: barista, pin: '9052' })).resolves.toBeUndefined();
    await expect(send.retireLot({ id: lot })).resolves.toMatchObject({ lot: { id: lot } });
    await expect(send.acceptLink({ token: 'a/b', password: 'correct horse battery', confirm: 'correct horse battery' })).rejects.toBeInstanceOf(ApiError);

    expect(sent).toEqual([
      { method: 'POST', path: '/api/orders', body: JSON.stringify(order), contentType: 'application/json', status: 201 },
      // the same clientOrderId: the order the server already has
      { method: 'POST', path: '/api/orders', body: JSON.stringify(order), contentType: 'application/json', status: 200 },
      { method: 'POST', path: `/api/orders/${placed.order.id}/refund`, body: '{"reason":"Customer left"}', contentType: 'application/json', status: 200 },
      { method: 'PUT', path: `/api/team/${barista}/pin`, body: '{"pin":"9052"}', contentType: 'application/json', status: 204 },
      // no body schema: nothing sent
      { method: 'POST', path: `/api/beans/lots/${lot}/retire`, body: undefined, contentType: undefined, status: 200 },
      // a path value is escaped; this token has the wrong shape
      {
        method: 'POST',
        path: '/api/welcome/a%2Fb',
        body: '{"password":"correct horse battery","confirm":"correct horse battery"}',
        contentType: 'application/json',
        status: 400,
      },
    ]);
  });
});
