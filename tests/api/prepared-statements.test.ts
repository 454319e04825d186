// SQLite connections keep their prepared statements by SQL (server/db/knex.ts): the same SQL gets
// the same statement, a kept statement sees a schema a migration changed under it, the least
// recently used goes past the limit, and better-sqlite3's own calls (pragma, transaction) still work.
import { mkdtempSync, rmSync } from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import Database from 'better-sqlite3';
import { afterAll, describe, expect, it } from 'vitest';
import { createDb, keepPreparedStatements } from '@server/db/knex';

const dir = mkdtempSync(path.join(os.tmpdir(), 'jugline-statements-'));
afterAll(() => rmSync(dir, { recursive: true, force: true }));

function connection(size?: number) {
  const conn = new Database(':memory:');
  keepPreparedStatements(conn, size);
  conn.exec('create table t (a integer)');
  return conn;
}

describe('kept prepared statements', () => {
  it('answers the same statement for the same SQL, each run with its own bindings', () => {
    const conn = connection();
    const insert = conn.prepare('insert into t (a) values (?)');
    expect(conn.prepare('insert into t (a) values (?)')).toBe(insert);
    conn.prepare('insert into t (a) values (?)').run(1);
    conn.prepare('insert into t (a) values (?)').run(2);
    expect(conn.prepare('select a from t where a = ?').all(2)).toEqual([{ a: 2 }]);
    expect(conn.prepare('select a from t where a = ?').all(1)).toEqual([{ a: 1 }]);
    expect(conn.prepare('select a from t order by a')).not.toBe(conn.prepare('select a from t where a = ?'));
  });

  it('sees a column a migration added after the statement was kept', () => {
    const conn = connection();
    conn.prepare('insert into t (a) values (?)').run(1);
    expect(conn.prepare('select * from t').all()).toEqual([{ a: 1 }]);
    conn.exec('alter table t add column b text');
    conn.prepare('update t set b = ?').run('x');
    expect(conn.prepare('select * from t').all()).toEqual([{ a: 1, b: 'x' }]);
  });

  it('keeps at most its size, dropping the least recently used', () => {
    const conn = connection(2);
    const one = conn.prepare('select 1');
    const two = conn.prepare('select 2');
    expect(conn.prepare('select 1')).toBe(one); // now `select 2` is the oldest
    conn.prepare('select 3');
    expect(conn.prepare('select 1')).toBe(one);
    expect(conn.prepare('select 2')).not.toBe(two);
  });

  it("leaves better-sqlite3's own statements alone: pragma and transaction", () => {
    const conn = connection();
    expect(conn.pragma('user_version', { simple: true })).toBe(0);
    conn.transaction(() => conn.prepare('insert into t (a) values (?)').run(5))();
    expect(() =>
      conn.transaction(() => {
        conn.prepare('insert into t (a) values (?)').run(6);
        throw new Error('rolled back');
      })(),
    ).toThrow('rolled back');
    expect(conn.prepare('select a from t').all()).toEqual([{ a: 5 }]);
  });

  it('runs knex on a SQLite file: a failed statement does not spoil the kept one, a transaction rolls back', async () => {
    const db = createDb(path.join(dir, 'kept.sqlite'));
    try {
      const client = db.client as { acquireConnection(): Promise<Database.Database>; releaseConnection(c: Database.Database): Promise<void> };
      const conn = await client.acquireConnection();
      expect(conn.prepare('select 1')).toBe(conn.prepare('select 1')); // the pool's connection keeps them
      await client.releaseConnection(conn);
      await db.schema.createTable('u', (t) => {
        t.integer('id').primary();
        t.text('name').notNullable();
      });
      await db('u').insert({ id: 1, name: 'Ada' });
      await expect(db('u').insert({ id: 1, name: 'again' })).rejects.toThrow(/UNIQUE/);
      await db('u').insert({ id: 2, name: 'Bo' });
      await expect(
        db.transaction(async (trx) => {
          await trx('u').insert({ id: 3, name: 'Cy' });
          throw new Error('no');
        }),
      ).rejects.toThrow('no');
      expect(await db('u').orderBy('id').select('id', 'name')).toEqual([
        { id: 1, name: 'Ada' },
        { id: 2, name: 'Bo' },
      ]);
    } finally {
      await db.destroy();
    }
  });
});
