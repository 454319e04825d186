// npm run db:history: an invented stretch of service written through Knex into an empty database
// (SQLite, or PostgreSQL on that leg). Two weeks around the 2026 change to daylight time (US:
// Sunday 8 March), generated twice with one seed.
import { spawnSync } from 'node:child_process';
import { mkdtempSync, rmSync } from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { fileURLToPath } from 'node:url';
import type { Knex } from 'knex';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { dialectOf, rawRows, secondsBetweenSql } from '@server/db/dialect';
import { createDb } from '@server/db/knex';
import { createEmptyDatabase } from '../support/test-database';
import type { Row } from '@server/db/tables';
import { generateHistory, HistoryRefused } from '@scripts/history';
import type { HistorySummary } from '@scripts/history/generate';

// Monday 16 March 2026, 13:00 in New York: yesterday is Sunday the 15th, so 14 days run Mon 2 – Sun 15.
const NOW = new Date('2026-03-16T17:00:00.000Z');
const SEED = 20260316;

let dir: string;
let fileA: string;
let fileB: string;
let first: HistorySummary;
let second: HistorySummary;
let db: Knex;
let other: Knex;
const drops: (() => Promise<void>)[] = [];

beforeAll(async () => {
  dir = mkdtempSync(path.join(os.tmpdir(), 'jugline-history-'));
  const [a, b] = [await createEmptyDatabase(dir), await createEmptyDatabase(dir)];
  drops.push(a.drop, b.drop);
  [fileA, fileB] = [a.target, b.target];
  first = await generateHistory({ file: fileA, days: 14, seed: SEED, now: NOW, passwordCost: 4 });
  second = await generateHistory({ file: fileB, days: 14, seed: SEED, now: NOW, passwordCost: 4 });
  db = createDb(fileA);
  other = createDb(fileB);
});
afterAll(async () => {
  await db?.destroy();
  await other?.destroy();
  for (const drop of drops) await drop();
  rmSync(dir, { recursive: true, force: true });
});

// PostgreSQL answers COUNT and SUM (bigint, numeric) as text; the checks compare numbers
const numeric = /^-?\d+(\.\d+)?$/;
const numbers = (row: Record<string, unknown>) =>
  Object.fromEntries(Object.entries(row).map(([k, v]) => [k, typeof v === 'string' && numeric.test(v) ? Number(v) : v]));
const allOf = async <T>(from: Knex, sql: string, ...params: unknown[]) =>
  rawRows<Record<string, unknown>>(await from.raw(sql, params as Knex.RawBinding[])).map(numbers) as T[];
const all = <T>(sql: string, ...params: unknown[]) => allOf<T>(db, sql, ...params);
const one = async <T>(sql: string, ...params: unknown[]) => (await all<T>(sql, ...params))[0];
const seconds = (from: string, to: string) => secondsBetweenSql(dialectOf(db), from, to);
const weekdayOf = (date: string) => new Date(`${date}T12:00:00Z`).getUTCDay();

/**
 * Sales tax per the Streamlined Sales and Use Tax Agreement §324 (Rounding Rule): carry the tax to
 * the third decimal place (tenths of a cent, truncated) and round up to the next cent when that
 * third decimal is greater than four, i.e. half up. Integers only; rate in thousandths of a percent.
 */
function ssutaTaxCents(amountCents: number, rateMilliPct: number): number {
  const mills = Math.floor((amountCents * rateMilliPct * 10) / 100_000);
  return Math.floor(mills / 10) + (mills % 10 > 4 ? 1 : 0);
}

describe('the days', () => {
  it('cover the 14 café days ending yesterday, one closed shift each, opened 06:30 and closed 15:00 local', async () => {
    expect(first).toMatchObject({ days: 14, skippedDays: 0, firstDate: '2026-03-02', lastDate: '2026-03-15' });
    const shifts = await all<Row<'shifts'>>('SELECT * FROM shifts ORDER BY opened_at');
    expect(shifts).toHaveLength(14);
    // EST (UTC−5) before 8 March, EDT (UTC−4) from it
    expect(shifts[0]).toMatchObject({ opened_at: '2026-03-02T11:30:00.000Z', closed_at: '2026-03-02T20:00:00.000Z' });
    expect(shifts[13]).toMatchObject({ opened_at: '2026-03-15T10:30:00.000Z', closed_at: '2026-03-15T19:00:00.000Z' });
    const lead = (await one<{ id: number }>("SELECT id FROM users WHERE username = 'lead'")).id;
    for (const [i, s] of shifts.entries()) {
      const saturday = weekdayOf(`2026-03-${String(2 + i).padStart(2, '0')}`) === 6;
      expect(s).toMatchObject({ opened_by: lead, closed_by: lead, opening_float_cents: 150_00, wait_target_seconds: 240 });
      expect(s.baristas_on_bar).toBe(saturday ? 3 : 2);
      expect(Math.abs(s.counted_cash_cents! - s.expected_cash_cents!)).toBeLessThan(10); // a closed shift has both
      const cash = await one<{ taken: number; back: number }>(
        `SELECT (SELECT COALESCE(SUM(p.amount_cents), 0) FROM payments p JOIN orders o ON o.id = p.order_id
                 WHERE o.shift_id = ? AND p.method = 'cash' AND p.status = 'succeeded') AS taken,
                (SELECT COALESCE(SUM(r.amount_cents), 0) FROM refunds r JOIN orders o ON o.id = r.order_id
                 WHERE o.shift_id = ? AND o.payment_method = 'cash') AS back`,
        s.id,
        s.id,
      );
      expect(s.expected_cash_cents).toBe(150_00 + cash.taken - cash.back);
    }
  });

  it('have about 420 orders on a weekday, 560 on Saturday and 480 on Sunday, ±10 %', async () => {
    const days = await all<{ business_date: string; n: number }>('SELECT business_date, COUNT(*) AS n FROM orders GROUP BY 1 ORDER BY 1');
    expect(days).toHaveLength(14);
    for (const { business_date, n } of days) {
      const typical = { 0: 480, 6: 560 }[weekdayOf(business_date)] ?? 420;
      expect(n, business_date).toBeGreaterThanOrEqual(Math.floor(typical * 0.9));
      expect(n, business_date).toBeLessThanOrEqual(Math.ceil(typical * 1.1));
    }
  });

  it('number orders from 1 each day, in the order they were taken', async () => {
    const orders = await all<{ business_date: string; number: number }>('SELECT business_date, number FROM orders ORDER BY business_date, created_at');
    let expected = 0;
    orders.forEach((o, i) => {
      expected = i > 0 && orders[i - 1].business_date === o.business_date ? expected + 1 : 1;
      expect(o.number, `${o.business_date} #${o.number}`).toBe(expected);
    });
    expect(orders.filter((o) => o.number === 1)).toHaveLength(14);
  });

  it('write no events: the realtime log is for live screens', async () => {
    expect((await one<{ n: number }>('SELECT COUNT(*) AS n FROM events')).n).toBe(0);
  });
});

describe('the orders', () => {
  it('total exactly what the Counter would charge: lines, discount, tax half up (SSUTA §324)', async () => {
    const rate = await one<{ tax_rate_milli_pct: number; tax_mode: string }>('SELECT tax_rate_milli_pct, tax_mode FROM locations');
    expect(rate).toEqual({ tax_rate_milli_pct: 8250, tax_mode: 'exclusive' });
    const orders = await all<Record<string, number>>(
      `SELECT o.id, o.subtotal_cents, o.discount_cents, o.tax_cents, o.total_cents, SUM(i.price_cents) AS lines, COUNT(i.id) AS items
       FROM orders o JOIN order_items i ON i.order_id = o.id GROUP BY o.id`,
    );
    expect(orders).toHaveLength(first.orders);
    for (const o of orders) {
      const taxable = o.lines - o.discount_cents;
      const tax = ssutaTaxCents(taxable, rate.tax_rate_milli_pct);
      expect([o.subtotal_cents, o.tax_cents, o.total_cents], `order ${o.id}`).toEqual([o.lines, tax, taxable + tax]);
      expect(o.items).toBeGreaterThanOrEqual(1);
      expect(o.items).toBeLessThanOrEqual(3);
    }
    const discounted = orders.filter((o) => o.discount_cents > 0).length / orders.length;
    expect(discounted).toBeGreaterThan(0.03);
    expect(discounted).toBeLessThan(0.07);
  });

  it('are paid once each, about 65 % by card, cash with its change', async () => {
    type Paid = Pick<Row<'orders'>, 'total_cents' | 'payment_method'> &
      Pick<Row<'payments'>, 'method' | 'status' | 'amount_cents' | 'tendered_cents' | 'change_cents' | 'provider_id'> & {
        o_tendered: number | null;
        o_change: number | null;
      };
    const rows = await all<Paid>(
      `SELECT o.total_cents, o.payment_method, o.tendered_cents AS o_tendered, o.change_cents AS o_change, p.method,
              p.status, p.amount_cents, p.tendered_cents, p.change_cents, p.provider_id
       FROM orders o JOIN payments p ON p.order_id = o.id`,
    );
    expect(rows).toHaveLength(first.orders);
    for (const r of rows) {
      expect(r.status).toBe('succeeded');
      expect(r.method).toBe(r.payment_method);
      expect(r.amount_cents).toBe(r.total_cents);
      if (r.method === 'card') {
        expect(r.provider_id).toMatch(/^pi_hist_\w+$/);
        expect([r.tendered_cents, r.o_tendered]).toEqual([null, null]);
      } else {
        expect(r.tendered_cents).toBeGreaterThanOrEqual(r.total_cents);
        expect([r.o_tendered, r.change_cents, r.o_change]).toEqual([r.tendered_cents, r.tendered_cents! - r.total_cents, r.change_cents]);
      }
    }
    const card = rows.filter((r) => r.method === 'card').length / rows.length;
    expect(card).toBeGreaterThan(0.6);
    expect(card).toBeLessThan(0.7);
  });

  it('are all collected, fired when taken, ready when their last drink was done', async () => {
    const { n: bad } = await one<{ n: number }>(
      `SELECT COUNT(*) AS n FROM orders o
       WHERE o.status <> 'collected' OR o.fired_at <> o.created_at OR o.collected_at < o.ready_at
          OR o.ready_at <> COALESCE((SELECT MAX(done_at) FROM order_items i WHERE i.order_id = o.id AND i.station = 'bar'), o.created_at)`,
    );
    expect(bad).toBe(0);
    const baristas = (
      await all<{ id: number }>("SELECT id FROM users WHERE role = 'barista' AND location_id = (SELECT location_id FROM users WHERE username = 'lead')")
    ).map((u) => u.id);
    const makers = (await all<{ done_by: number }>("SELECT DISTINCT done_by FROM order_items WHERE station = 'bar'")).map((r) => r.done_by);
    expect(makers.sort()).toEqual(baristas.sort());
    const make = await one<{ lo: number; hi: number }>(
      `SELECT MIN(${seconds('started_at', 'done_at')}) AS lo, MAX(${seconds('started_at', 'done_at')}) AS hi
       FROM order_items WHERE station = 'bar'`,
    );
    expect(make.lo).toBeGreaterThanOrEqual(39.9);
    expect(make.hi).toBeLessThanOrEqual(120.1);
  });

  it('mostly wait under the 4-minute target, with a tail over it at the rushes', async () => {
    const waits = await all<{ s: number; rush: number }>(
      `SELECT ${seconds('fired_at', 'ready_at')} AS s,
              (created_at BETWEEN business_date || 'T11:15' AND business_date || 'T12:45') AS rush
       FROM orders WHERE ready_at <> fired_at AND business_date >= '2026-03-08'`, // EDT: the 07:15–08:45 rush is 11:15–12:45Z
    );
    const over = (list: typeof waits) => list.filter((w) => w.s > 240).length / list.length;
    expect(over(waits)).toBeLessThan(0.15);
    expect(over(waits.filter((w) => w.rush))).toBeGreaterThan(over(waits.filter((w) => !w.rush)));
    expect(waits.filter((w) => !w.rush && w.s > 240).length / waits.length).toBeLessThan(0.02);
  });
});

describe('the drinks', () => {
  it('follow the milk mix: whole 46 %, oat 24 %, skim 10 %, soy 6 %, almond 8 %, none 6 %', async () => {
    const drinks = await all<{ milk: string | null; n: number }>(
      "SELECT milk_name AS milk, COUNT(*) AS n FROM order_items WHERE station = 'bar' GROUP BY milk_name",
    );
    const total = drinks.reduce((sum, d) => sum + d.n, 0);
    const share = (milk: string | null) => (100 * (drinks.find((d) => d.milk === milk)?.n ?? 0)) / total;
    const mix: [string | null, number][] = [
      ['Whole', 46],
      ['Oat', 24],
      ['Skim', 10],
      ['Soy', 6],
      ['Almond', 8],
      [null, 6],
    ];
    for (const [milk, pct] of mix) expect(Math.abs(share(milk) - pct), String(milk)).toBeLessThan(2.5);
    // no milk: espresso, long black or batch brew only
    const black = await all<{ item_name: string }>("SELECT DISTINCT item_name FROM order_items WHERE station = 'bar' AND milk_id IS NULL");
    expect(black.map((b) => b.item_name).sort()).toEqual(['Batch brew', 'Espresso', 'Long black']);
  });

  it('are mostly Regular, and about one order in five has a pastry', async () => {
    const sized = await all<{ size_name: string; n: number }>(
      "SELECT size_name, COUNT(*) AS n FROM order_items WHERE size_name IN ('Small', 'Regular', 'Large') GROUP BY 1",
    );
    const regular = sized.find((s) => s.size_name === 'Regular')!.n / sized.reduce((sum, s) => sum + s.n, 0);
    expect(regular).toBeGreaterThan(0.55);
    const { share: pastry } = await one<{ share: number }>(
      `SELECT AVG(CASE WHEN EXISTS (SELECT 1 FROM order_items i WHERE i.order_id = o.id
                          AND i.item_name IN ('Butter croissant', 'Almond croissant', 'Banana bread')) THEN 1.0 ELSE 0 END) AS share FROM orders o`,
    );
    expect(pastry).toBeGreaterThan(0.17);
    expect(pastry).toBeLessThan(0.23);
  });
});

describe('a second run', () => {
  it('with the same seed writes the same rows', async () => {
    const { seconds: _a, file: _fa, ...a } = first;
    const { seconds: _b, file: _fb, ...b } = second;
    expect(b).toEqual(a);
    for (const table of ['orders', 'order_items', 'payments', 'refunds', 'shifts']) {
      const count = async (d: Knex) => (await allOf<{ n: number }>(d, `SELECT COUNT(*) AS n FROM ${table}`))[0].n;
      expect(await count(other), table).toBe(await count(db));
    }
    const firstOrder = (d: Knex) => allOf(d, 'SELECT * FROM orders ORDER BY id LIMIT 1');
    const itsItems = (d: Knex) => allOf(d, 'SELECT * FROM order_items WHERE order_id = 1 ORDER BY line_no');
    expect(await firstOrder(other)).toEqual(await firstOrder(db));
    expect(await itsItems(other)).toEqual(await itsItems(db));
  });

  it('refuses a database that already has history (exit code 2), unless told to append', async () => {
    const before = (await one<{ n: number }>('SELECT COUNT(*) AS n FROM orders')).n;
    // the command as typed; --file names a SQLite file or a postgres:// URL
    const cli = spawnSync(process.execPath, ['--import', 'tsx', 'scripts/history.ts', '--days', '3', '--file', fileB], {
      cwd: fileURLToPath(new URL('../..', import.meta.url)),
      encoding: 'utf8',
    });
    expect(cli.status).toBe(2);
    expect(cli.stderr).toMatch(/already has \d+ orders from before today.*--append/s);
    await expect(generateHistory({ file: fileB, days: 3, seed: SEED, now: NOW })).rejects.toBeInstanceOf(HistoryRefused);

    // --append fills only the days that have nothing yet
    const appended = await generateHistory({ file: fileB, days: 16, seed: SEED, now: NOW, append: true });
    expect(appended).toMatchObject({ days: 2, skippedDays: 14, firstDate: '2026-02-28', lastDate: '2026-03-01' });
    expect((await allOf<{ n: number }>(other, 'SELECT COUNT(*) AS n FROM orders'))[0].n).toBe(before + appended.orders);
    expect((await allOf<{ n: number }>(other, 'SELECT COUNT(*) AS n FROM shifts'))[0].n).toBe(16);
  });
});
