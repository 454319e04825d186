// Control characters in free text are refused on every route that takes text: a valid body with
// one forbidden character put anywhere in one of its text fields answers 400 validation_failed
// naming that field, and no table changes. Forbidden (src/domain/text.ts): C0 controls with
// U+0000, DEL, C1 controls, the line and paragraph separators U+2028/U+2029, the bidirectional
// embeddings, overrides and isolates (Unicode UAX #9; "Trojan Source", CVE-2021-42574), and
// unpaired surrogates. Passwords are not text to show and are left as they are.
import fc from 'fast-check';
import { afterAll, beforeAll, describe, expect, it, vi } from 'vitest';
import type { z } from 'zod';
import { beanLotBody, dialInShotBody } from '@/domain/beans-schemas';
import { categoryBody, itemBody, milkBody, extraBody, extraGroupBody } from '@/domain/menu-admin-schemas';
import { MENU_CSV_COLUMNS } from '@/domain/menu-csv';
import { closeShiftBody, createOrderBody, receiptEmailBody, refundBody, signInBody, voidBody } from '@/domain/schemas';
import { settingsBody } from '@/domain/settings-schemas';
import { newPersonBody, personPatchBody } from '@/domain/team-schemas';
import { DEMO_PASSWORD } from '@seeds/demo-cafe';
import { demoMenu, startTestServer, type TestServer } from '../support/test-server';
import { lotBody, orderBody, type Agent } from './helpers';
import { tableNames } from '@server/db/dialect';

const RUNS = 30;
vi.setConfig({ testTimeout: 300_000 });

let server: TestServer;
let owner: Agent;
let menu: Awaited<ReturnType<typeof demoMenu>>;
let TABLES: string[] = [];
const ids = { order: 0, category: 0, milk: 0, group: 0, extra: 0, item: 0, person: 0, lot: 0 };

beforeAll(async () => {
  server = await startTestServer();
  owner = await server.signIn('owner');
  menu = await demoMenu(server);
  TABLES = (await tableNames(server.db)).filter((t) => t !== 'sessions');
  const placed = await owner.post('/api/orders').send(orderBody('Ivo Marsh', [{ menuItemId: menu.item('Latte') }]));
  expect(placed.status).toBe(201);
  ids.order = placed.body.order.id;
  ids.category = (await server.db('menu_categories').first('id')).id;
  ids.milk = menu.milk('Oat');
  ids.group = (await server.db('extra_groups').first('id')).id;
  ids.extra = (await server.db('extras').first('id')).id;
  ids.item = menu.item('Latte');
  ids.person = (await server.db('users').where({ username: 'barista' }).first('id')).id;
  const lot = await owner.post('/api/beans/lots').send(lotWithNotes());
  expect(lot.status).toBe(201);
  ids.lot = lot.body.lot.id;
});
afterAll(() => server.close());

async function rowCounts() {
  const out: Record<string, number> = {};
  for (const table of TABLES) out[table] = Number((await server.db(table).count({ n: '*' }).first())?.n);
  return out;
}

const lotWithNotes = () => lotBody({ notes: 'stone fruit' });
const size = () => ({ name: '12 oz', volumeMl: 355, cup: '12 oz cup', priceCents: 520, shots: 2, doseDg: 180, yieldDg: 360, milkMl: 240, isDefault: true });
const itemBodyOf = () => ({
  categoryId: ids.category,
  name: 'Harbour Latte',
  station: 'bar',
  takesMilk: true,
  defaultMilkId: menu.milk('Whole'),
  texture: 'silky',
  ingredients: ["cow's milk"],
  extraGroupIds: [],
  sizes: [size()],
});

interface Case {
  method: 'post' | 'put' | 'patch';
  url: () => string;
  body: () => Record<string, unknown>;
  schema: z.ZodType;
  /** Dotted paths of the body's free-text fields. */
  fields: string[];
}

const CASES: Case[] = [
  { method: 'post', url: () => '/api/session', body: () => ({ username: 'owner', password: DEMO_PASSWORD }), schema: signInBody, fields: ['username'] },
  {
    method: 'post',
    url: () => '/api/orders',
    body: () => ({
      ...orderBody('Ada Quay', [{ menuItemId: menu.item('Latte'), note: 'extra hot' }]),
      allergens: ['milk'],
      allergyNote: 'no nuts at all',
      customerEmail: 'ada@example.com',
      discount: { kind: 'percent', value: 10, reason: 'staff drink' },
    }),
    schema: createOrderBody,
    fields: ['customerName', 'items.0.note', 'allergens.0', 'allergyNote', 'customerEmail', 'discount.reason'],
  },
  { method: 'post', url: () => `/api/orders/${ids.order}/refund`, body: () => ({ reason: 'spilled it' }), schema: refundBody, fields: ['reason'] },
  { method: 'post', url: () => `/api/orders/${ids.order}/void`, body: () => ({ reason: 'rang it twice' }), schema: voidBody, fields: ['reason'] },
  { method: 'post', url: () => `/api/orders/${ids.order}/receipt`, body: () => ({ email: 'ivo@example.com' }), schema: receiptEmailBody, fields: ['email'] },
  {
    method: 'post',
    url: () => '/api/shifts/current/close',
    body: () => ({ countedCashCents: 100_00, note: 'till counted twice' }),
    schema: closeShiftBody,
    fields: ['note'],
  },
  { method: 'post', url: () => '/api/menu-admin/categories', body: () => ({ name: 'Brunch' }), schema: categoryBody, fields: ['name'] },
  { method: 'put', url: () => `/api/menu-admin/categories/${ids.category}`, body: () => ({ name: 'Brunch' }), schema: categoryBody, fields: ['name'] },
  {
    method: 'post',
    url: () => '/api/menu-admin/milks',
    body: () => ({ name: 'Hazel', code: 'HZ', upchargeCents: 60, ingredients: ['hazelnut'] }),
    schema: milkBody,
    fields: ['name', 'code'],
  },
  {
    method: 'put',
    url: () => `/api/menu-admin/milks/${ids.milk}`,
    body: () => ({ name: 'Oat', code: 'OA', upchargeCents: 60, ingredients: [] }),
    schema: milkBody,
    fields: ['name', 'code'],
  },
  {
    method: 'post',
    url: () => '/api/menu-admin/extra-groups',
    body: () => ({ name: 'Sweeteners', selection: 'multi', required: false, itemIds: [] }),
    schema: extraGroupBody,
    fields: ['name'],
  },
  {
    method: 'post',
    url: () => '/api/menu-admin/extras',
    body: () => ({ groupId: ids.group, name: 'Maple', priceCents: 50, ingredients: ["cow's milk"] }),
    schema: extraBody,
    fields: ['name'],
  },
  { method: 'post', url: () => '/api/menu-admin/items', body: itemBodyOf, schema: itemBody, fields: ['name', 'sizes.0.name', 'sizes.0.cup'] },
  { method: 'put', url: () => `/api/menu-admin/items/${ids.item}`, body: itemBodyOf, schema: itemBody, fields: ['name', 'sizes.0.name', 'sizes.0.cup'] },
  {
    method: 'put',
    url: () => '/api/settings',
    body: () => ({ name: 'Harbour & Hearth Coffee', receiptFooter: 'See you tomorrow', timeZone: 'America/New_York', locale: 'en-US', currency: 'USD' }),
    schema: settingsBody,
    fields: ['name', 'receiptFooter', 'timeZone', 'locale', 'currency'],
  },
  {
    method: 'post',
    url: () => '/api/team',
    body: () => ({ name: 'Nell Harbour', username: 'nell', email: 'nell@example.com', role: 'barista' }),
    schema: newPersonBody,
    fields: ['name', 'username', 'email'],
  },
  {
    method: 'patch',
    url: () => `/api/team/${ids.person}`,
    body: () => ({ name: 'Jonah Reyes', email: 'jonah@example.com' }),
    schema: personPatchBody,
    fields: ['name', 'email'],
  },
  { method: 'post', url: () => '/api/beans/lots', body: lotWithNotes, schema: beanLotBody, fields: ['name', 'roaster', 'origin', 'notes'] },
  { method: 'put', url: () => `/api/beans/lots/${ids.lot}`, body: lotWithNotes, schema: beanLotBody, fields: ['name', 'roaster', 'origin', 'notes'] },
  {
    method: 'post',
    url: () => '/api/dial-in/shots',
    body: () => ({ lotId: ids.lot, grind: '2.4', doseG: 18, yieldG: 36, timeS: 28, tasteNote: 'sweet, round' }),
    schema: dialInShotBody,
    fields: ['grind', 'tasteNote'],
  },
];

/** The characters no free text may hold, one at a time. */
const forbidden = fc
  .oneof(
    fc.integer({ min: 0x00, max: 0x1f }), // C0, with U+0000, tab, LF and CR
    fc.constant(0x7f), // DEL
    fc.integer({ min: 0x80, max: 0x9f }), // C1, with NEL (U+0085)
    fc.constantFrom(0x2028, 0x2029), // line and paragraph separators
    fc.integer({ min: 0x202a, max: 0x202e }), // bidi embeddings and overrides (UAX #9)
    fc.integer({ min: 0x2066, max: 0x2069 }), // bidi isolates (UAX #9)
    fc.integer({ min: 0xd800, max: 0xdfff }), // a surrogate with no partner
  )
  .map((code) => String.fromCharCode(code));

function withText(body: Record<string, unknown>, path: string, change: (value: string) => string): Record<string, unknown> {
  const copy = structuredClone(body);
  const keys = path.split('.');
  let at: Record<string, unknown> = copy;
  for (const k of keys.slice(0, -1)) at = at[k] as Record<string, unknown>;
  const last = keys.at(-1)!;
  at[last] = change(at[last] as string);
  return copy;
}

describe('a forbidden character in any free-text field', () => {
  it('every case starts from a body its schema accepts', () => {
    for (const c of CASES) expect(c.schema.safeParse(c.body()).success, `${c.method} ${c.url()}`).toBe(true);
  });

  it.each(CASES.map((c) => [`${c.method.toUpperCase()} ${c.url().replace(/\d+/g, ':id')}`, c] as const))(
    '%s answers 400 naming the field and stores nothing',
    async (_label, c) => {
      await fc.assert(
        fc.asyncProperty(fc.constantFrom(...c.fields), forbidden, fc.nat(), async (field, ch, at) => {
          const body = withText(c.body(), field, (v) => {
            const i = at % (v.length + 1);
            return v.slice(0, i) + ch + v.slice(i);
          });
          const before = await rowCounts();
          const res = await owner[c.method](c.url()).send(body);
          const what = `${field} with U+${ch.charCodeAt(0).toString(16).padStart(4, '0')} → ${res.status} ${JSON.stringify(res.body).slice(0, 300)}`;
          expect(res.status, what).toBe(400);
          expect(res.body.error.code, what).toBe('validation_failed');
          expect(
            res.body.error.details.map((d: { path: string }) => d.path),
            what,
          ).toContain(field);
          expect(await rowCounts(), what).toEqual(before);
        }),
        { numRuns: RUNS },
      );
    },
  );
});

describe('menu CSV import', () => {
  const HEADER = MENU_CSV_COLUMNS.join(',');
  const upload = (text: string) => owner.post('/api/menu/import').attach('file', Buffer.from(text, 'utf8'), { filename: 'menu.csv', contentType: 'text/csv' });
  // one latte row, its names quoted so a line break or a comma stays inside its cell
  const fileWith = (cells: { category: string; item: string; size: string }) =>
    `${HEADER}\r\n"${cells.category}","${cells.item}",bar,"${cells.size}",355,4.80,2,18,36,240,yes,WH,silky,milk,yes\r\n`;

  it('refuses a forbidden character in a name cell with the row and column, and imports nothing', async () => {
    // a lone surrogate can't be written as UTF-8 at all (the file would carry U+FFFD instead);
    // a NUL byte marks the whole upload as binary (415), checked in its own test below
    const inFile = forbidden.filter((ch) => ch !== '\u0000' && !/[\uD800-\uDFFF]/.test(ch));
    await fc.assert(
      fc.asyncProperty(fc.constantFrom('category', 'item', 'size'), inFile, async (column, ch) => {
        const cells = { category: 'Brunch', item: 'Quay Latte', size: 'Regular' };
        cells[column] = `Qu${ch}ay`;
        const before = await rowCounts();
        const res = await upload(fileWith(cells));
        const what = `${column} with U+${ch.charCodeAt(0).toString(16).padStart(4, '0')} → ${res.status} ${JSON.stringify(res.body).slice(0, 300)}`;
        expect(res.status, what).toBe(400);
        expect(res.body.error.details, what).toContainEqual(expect.objectContaining({ row: 2, column }));
        expect(await rowCounts(), what).toEqual(before);
      }),
      { numRuns: RUNS },
    );
  });

  it('refuses a NUL byte in a name cell as a file that is not text, and imports nothing', async () => {
    const before = await rowCounts();
    const res = await upload(fileWith({ category: 'Brunch', item: 'Qu\u0000ay Latte', size: 'Regular' }));
    expect(res.status).toBe(415);
    expect(res.body.error.message).toMatch(/not a CSV text file/);
    expect(await rowCounts()).toEqual(before);
  });
});
