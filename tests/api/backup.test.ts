// Backup while the server runs, restore into an empty database, and the restored café has its
// orders: on SQLite (the backup API, a file copy) and on PostgreSQL (pg_dump, pg_restore), through
// the same `npm run db:backup` / `db:restore` commands an owner types.
import { execFile } from 'node:child_process';
import { randomBytes, randomUUID } from 'node:crypto';
import { writeFileSync } from 'node:fs';
import path from 'node:path';
import { promisify } from 'node:util';
import request from 'supertest';
import { afterAll, describe, expect, it } from 'vitest';
import { checkBackup, restoreDatabase } from '@server/db/backup';
import { isPostgresUrl } from '@server/db/dialect';
import { startServer } from '@server/server';
import { DEMO_PASSWORD } from '@seeds/demo-cafe';
import { createEmptyDatabase } from '../support/test-database';
import { demoMenu, startTestServer, type TestServer } from '../support/test-server';

const run = promisify(execFile);
let server: TestServer;
const closers: (() => Promise<void>)[] = [];
afterAll(async () => {
  for (const close of closers) await close();
});

/** `npm run db:<command>` as the owner would run it, against the database at `target`. */
function dbCommand(command: 'backup' | 'restore', target: string, file: string) {
  const { DATABASE_URL: _url, DATABASE_FILE: _file, ...rest } = process.env;
  const env = { ...rest, NODE_ENV: 'test', ...(isPostgresUrl(target) ? { DATABASE_URL: target } : { DATABASE_FILE: target }) };
  return run('node_modules/.bin/tsx', ['scripts/db.ts', command, file], { env });
}

describe('db:backup and db:restore', () => {
  it('backs up a live database and restores it into an empty one with every acknowledged order', async () => {
    server = await startTestServer();
    closers.push(() => server.close());
    const cashier = await server.signIn('cashier');
    const espresso = (await demoMenu(server)).item('Espresso');
    const ids: string[] = [];
    for (const name of ['Uma Fenn', 'Vic Laird']) {
      const clientOrderId = randomUUID();
      ids.push(clientOrderId);
      const res = await cashier
        .post('/api/orders')
        .send({ clientOrderId, customerName: name, items: [{ menuItemId: espresso }], payment: { method: 'cash', tenderedCents: 500 } });
      expect(res.status).toBe(201);
    }

    const backup = path.join(server.dir, 'backups', 'b.backup');
    const made = await dbCommand('backup', server.databaseTarget, backup); // the server is still running
    expect(made.stdout).toContain('(2 orders)');
    expect(made.stdout).not.toContain('postgres://'); // a URL may hold a password
    expect((await checkBackup(backup)).orders).toBe(2);

    const empty = await createEmptyDatabase(server.dir);
    closers.push(empty.drop);
    await dbCommand('restore', empty.target, backup);
    const again = await startServer(
      {
        env: 'test',
        port: 0,
        host: '127.0.0.1',
        databaseFile: isPostgresUrl(empty.target) ? path.join(server.dir, 'unused.sqlite') : empty.target,
        databaseUrl: isPostgresUrl(empty.target) ? empty.target : undefined,
        sessionSecret: randomBytes(32).toString('hex'),
        seedDemo: true,
      },
      { pages: 'none', log: () => {} },
    );
    closers.unshift(() => again.close());
    const agent = request.agent(again.url);
    await agent.post('/api/session').send({ username: 'lead', password: DEMO_PASSWORD }).expect(200);
    const { orders } = (await agent.get('/api/orders')).body as { orders: { clientOrderId: string }[] };
    expect(orders.map((o) => o.clientOrderId).sort()).toEqual([...ids].sort());
  });

  it('refuses a missing file, a file that is no backup, and a backup of the other kind — and changes nothing', async () => {
    const live = server.databaseTarget;
    await expect(restoreDatabase(path.join(server.dir, 'missing.backup'), live)).rejects.toThrow(/no such backup/);
    const junk = path.join(server.dir, 'junk.backup');
    writeFileSync(junk, 'not a database at all, just some words '.repeat(100));
    await expect(restoreDatabase(junk, live)).rejects.toThrow();
    // a backup restores only onto its own kind of database
    const other = isPostgresUrl(live) ? path.join(server.dir, 'other.sqlite') : 'postgres://nobody@127.0.0.1:1/none';
    await expect(restoreDatabase(path.join(server.dir, 'backups', 'b.backup'), other)).rejects.toThrow(/restores only onto/);
    // the live café still has its two orders
    expect(Number((await server.db('orders').count({ n: '*' }).first())!.n)).toBe(2);
  });
});
