// Backup while the server runs, restore onto a new file, and the restored café has its orders.
import { randomUUID } from 'node:crypto';
import path from 'node:path';
import { randomBytes } from 'node:crypto';
import request from 'supertest';
import { afterAll, describe, expect, it } from 'vitest';
import { backupDatabase, checkBackup, restoreDatabase } from '../../server/db/backup';
import { startServer } from '../../server/server';
import { DEMO_PASSWORD } from '../../seeds/demo-cafe';
import { demoMenu, startTestServer, type TestServer } from '../support/test-server';

let server: TestServer;
const closers: (() => Promise<void>)[] = [];
afterAll(async () => {
  for (const close of closers) await close();
});

describe('db:backup and restore', () => {
  it('backs up a live database and restores it with every acknowledged order', async () => {
    server = await startTestServer();
    closers.push(() => server.close());
    const cashier = await server.signIn('cashier');
    const espresso = (await demoMenu(server)).item('Espresso');
    const ids: string[] = [];
    for (const name of ['Uma Fenn', 'Vic Laird']) {
      const clientOrderId = randomUUID();
      ids.push(clientOrderId);
      const res = await cashier.post('/api/orders').send({ clientOrderId, customerName: name, items: [{ menuItemId: espresso }], payment: { method: 'cash', tenderedCents: 500 } });
      expect(res.status).toBe(201);
    }

    const backup = path.join(server.dir, 'backups', 'b.sqlite');
    await backupDatabase(path.join(server.dir, 'jugline.sqlite'), backup); // the server is still running
    expect(checkBackup(backup).orders).toBe(2);

    const restored = path.join(server.dir, 'restored', 'jugline.sqlite');
    restoreDatabase(backup, restored);
    const again = await startServer(
      { env: 'test', port: 0, host: '127.0.0.1', databaseFile: restored, sessionSecret: randomBytes(32).toString('hex'), seedDemo: true },
      { pages: 'none', log: () => {} },
    );
    closers.unshift(() => again.close());
    const agent = request.agent(again.url);
    await agent.post('/api/session').send({ username: 'lead', password: DEMO_PASSWORD }).expect(200);
    const { orders } = (await agent.get('/api/orders')).body as { orders: { clientOrderId: string }[] };
    expect(orders.map((o) => o.clientOrderId).sort()).toEqual([...ids].sort());
  });

  it('refuses to restore something that is not a database', () => {
    expect(() => restoreDatabase(path.join(server.dir, 'missing.sqlite'), path.join(server.dir, 'x.sqlite'))).toThrow();
  });
});
