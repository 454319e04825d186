// SQL metacharacters in every search and filter: the answer is a normal 200 or 400, a search
// returns exactly the rows that really contain the text (a `%` or `_` is a character, not a
// wildcard), and the database is unchanged afterwards. The sweep over query parameters is
// generated from the route table and the query schemas, so a new GET route or query field is
// covered as soon as it exists.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { z } from 'zod';
import type { ApiRoute } from '@server/routes';
import { demoMenu, manualClock, startTestServer, type TestServer } from '../support/test-server';
import { orderBody, type Agent } from './helpers';
import { tableNames } from '@server/db/dialect';

const DAY = '2026-03-02';
const time = manualClock(`${DAY}T14:00:00.000Z`); // 09:00 in New York, the demo café's zone

/** Customer names full of SQL metacharacters, each with a look-alike a wildcard would also catch. */
const NAMES = [
  "Ann O'Neil",
  'Sam "Ace" Li',
  'Mo; Drop',
  'Dash--Two',
  '50% Off',
  'Table 50 Off', // what '50%' would match if % were a wildcard
  'Under_score',
  'Underxscore', // what 'r_s' would match if _ were a wildcard
  'Back\\slash',
  'Backslash',
  "' OR 1=1 --",
  "Robert'); DROP TABLE orders;--",
  'Zoë Ünal',
  '李小龙',
  'Plain Jane',
  'Emoji ☕ Name',
];

/** Searches: each metacharacter alone, the classic attacks, and the look-alike traps. */
const SEARCHES = [
  "'",
  '"',
  ';',
  '--',
  '%',
  '_',
  '\\',
  '%%',
  '_%',
  '\\%',
  '\\_',
  "' OR 1=1 --",
  "' OR '1'='1",
  '" OR ""="',
  "'); DROP TABLE orders;--",
  '50%',
  'r_s',
  'k\\s',
  'zoë',
  'Ünal',
  '李',
  '*',
  '[a-z]',
  'NULL',
];

/**
 * SQLite's LIKE is case-insensitive for ASCII letters only ("SQLite only understands upper/lower
 * case for ASCII characters by default", sqlite.org/lang_expr.html#like), so a search matches a
 * name containing the text with A–Z folded and nothing else changed.
 */
const asciiFold = (s: string) => s.replace(/[A-Z]/g, (c) => c.toLowerCase());
const contains = (name: string, q: string) => asciiFold(name).includes(asciiFold(q));

let server: TestServer;
let cashier: Agent;
let owner: Agent;
/** Every order of the demo café: id, date, number, name. */
let all: { id: number; business_date: string; number: number; customer_name: string }[];

beforeAll(async () => {
  server = await startTestServer({ clock: time.clock });
  cashier = await server.signIn('cashier');
  owner = await server.signIn('owner');
  const espresso = (await demoMenu(server)).item('Espresso');
  for (const name of NAMES) {
    time.advance(60_000);
    const res = await cashier.post('/api/orders').send(orderBody(name, [{ menuItemId: espresso }]));
    expect(res.status, name).toBe(201);
    expect(res.body.order.customerName).toBe(name); // stored exactly as typed
  }
  all = await server.db('orders').where({ location_id: 1 }).select('id', 'business_date', 'number', 'customer_name');
});
afterAll(() => server.close());

const ids = (rows: { id: number }[]) => rows.map((r) => r.id).sort((a, b) => a - b);
const expectedIds = (q: string, onlyToday = false) => ids(all.filter((o) => (!onlyToday || o.business_date === DAY) && contains(o.customer_name, q)));

/** Every table's rows, except the session store (each request rightly updates its own session). */
async function snapshot() {
  const out: Record<string, unknown[]> = {};
  for (const t of await tableNames(server.db)) {
    // every column but JSON ones as the sort key: a whole-row order that needs no row id
    const columns = Object.entries(await server.db(t).columnInfo()).filter(([, c]) => c.type !== 'json');
    if (t !== 'sessions')
      out[t] = await server
        .db(t)
        .select('*')
        .orderBy(columns.map(([name]) => name));
  }
  return out;
}

describe('the searches return exactly the rows that contain the text', () => {
  it('the seeded names are all there, so every expectation below is against real rows', () => {
    for (const name of NAMES) expect(all.map((o) => o.customer_name)).toContain(name);
    // the traps are set: each look-alike exists and a wildcard reading would catch it
    expect(expectedIds('%').length).toBeLessThan(all.length);
    expect(expectedIds('_').length).toBeLessThan(all.length);
  });

  it.each(SEARCHES)('GET /api/orders?q=%s', async (q) => {
    const before = await snapshot();
    const res = await cashier.get('/api/orders').query({ q });
    expect(res.status).toBe(200);
    expect(ids(res.body.orders)).toEqual(expectedIds(q, true));
    expect(await snapshot()).toEqual(before);
  });

  it.each(SEARCHES)('GET /api/reports/tickets?q=%s (with each sort and direction)', async (q) => {
    const before = await snapshot();
    for (const sort of ['number', 'createdAt', 'wait', 'total', 'customer']) {
      for (const dir of ['asc', 'desc']) {
        const res = await owner.get('/api/reports/tickets').query({ q, sort, dir, pageSize: 200, from: DAY, to: DAY, status: 'open' });
        expect(res.status, `${sort} ${dir}`).toBe(200);
        expect(ids(res.body.rows), `${sort} ${dir}`).toEqual(expectedIds(q, true));
        expect(res.body.total).toBe(expectedIds(q, true).length);
      }
    }
    expect(await snapshot()).toEqual(before);
  });

  it.each(SEARCHES)('GET /api/reports/tickets.csv?q=%s', async (q) => {
    const res = await owner.get('/api/reports/tickets.csv').query({ q });
    expect(res.status).toBe(200);
    // one row per ticket after the header (RFC 4180 records end in CRLF; names here have no line breaks)
    const records = res.text.split('\r\n').filter(Boolean);
    expect(records.length - 1).toBe(expectedIds(q).length);
  });

  it('the ticket number search still works beside the name search', async () => {
    const mine = all.find((o) => o.customer_name === '50% Off')!;
    const res = await owner.get('/api/reports/tickets').query({ q: `#${mine.number}`, from: DAY, to: DAY });
    expect(res.status).toBe(200);
    expect(ids(res.body.rows)).toContain(mine.id);
  });
});

describe('filters that take only known values', () => {
  const bad = ["' OR 1=1 --", '"; DROP TABLE orders;--', '%', 'open OR 1=1', "2026-03-02' OR '1'='1", 'createdAt; DROP TABLE orders'];

  it.each(['status', 'sort', 'dir', 'from', 'to', 'page', 'pageSize'])('/api/reports/tickets?%s=… answers 400 naming the field', async (field) => {
    const before = await snapshot();
    for (const value of bad) {
      const res = await owner.get('/api/reports/tickets').query({ [field]: value });
      expect(res.status, value).toBe(400);
      expect(res.body.error.code).toBe('validation_failed');
      expect(res.body.error.details.map((d: { path: string }) => d.path)).toContain(`query.${field}`);
    }
    expect(await snapshot()).toEqual(before);
  });
});

// ---------------------------------------------------------------- generated from the route table

/** Every field of every query schema the app's modules export (names ending in "Query"). */
function queryFields(): string[] {
  const modules = import.meta.glob('../../src/domain/*schemas.ts', { eager: true }) as Record<string, Record<string, unknown>>;
  const fields = new Set<string>();
  for (const mod of Object.values(modules)) {
    for (const [name, value] of Object.entries(mod)) {
      if (/Query$/.test(name) && value instanceof z.ZodObject) for (const f of Object.keys(value.shape)) fields.add(f);
    }
  }
  return [...fields].sort();
}

const PAYLOADS = ["'", '"', ';', '--', '%', '_', '\\', "' OR 1=1 --", '1; DROP TABLE orders', '%27%20OR%201%3D1', 'Zoë 李 \u0000'];
const label = (r: ApiRoute) => `GET /api${r.path}`;

describe('every GET route, every query field, every metacharacter', () => {
  it('knows the query fields it sweeps', () => {
    expect(queryFields()).toEqual(expect.arrayContaining(['q', 'status', 'sort', 'dir', 'from', 'to', 'page', 'pageSize', 'limit']));
  });

  it('answers 200, 400 or 404, never 5xx, and the database is unchanged', async () => {
    const routes = server.routes.filter((r) => r.method === 'get');
    expect(routes.length).toBeGreaterThan(5);
    const someOrder = all[0].id;
    const before = await snapshot();
    for (const r of routes) {
      const url = `/api${r.path.replace(':id', String(someOrder))}`;
      for (const field of queryFields()) {
        for (const value of PAYLOADS) {
          const res = await owner.get(url).query({ [field]: value });
          expect([200, 400, 404], `${label(r)}?${field}=${value} → ${res.status} ${res.text.slice(0, 200)}`).toContain(res.status);
          if (res.status !== 200) expect(res.body.error?.code, `${label(r)}?${field}=${value}`).toMatch(/validation_failed|not_found/);
        }
      }
    }
    expect(await snapshot()).toEqual(before);
  }, 180_000);

  it('an :id made of metacharacters is a 400 or a 404, never a 5xx', async () => {
    const before = await snapshot();
    for (const r of server.routes.filter((r) => r.path.includes(':id'))) {
      for (const value of PAYLOADS) {
        const res = await owner[r.method](`/api${r.path.replace(':id', encodeURIComponent(value))}`).send({});
        expect([400, 404], `${r.method.toUpperCase()} /api${r.path} with :id=${value} → ${res.status}`).toContain(res.status);
      }
    }
    expect(await snapshot()).toEqual(before);
  }, 120_000);
});
