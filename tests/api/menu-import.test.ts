// Menu CSV import and export through the real server: owner only, a preview that saves nothing,
// an import that is all or nothing, nothing deleted, and an export that imports back unchanged.
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { MENU_CSV_COLUMNS, MENU_CSV_MAX_BYTES } from '@/domain/menu-csv';
import { demoCafeId } from '@seeds/demo-cafe';
import { startTestServer, type TestServer } from '../support/test-server';
import type { Agent } from './helpers';
import { boolOf, jsonOf } from '../support/rows';

let server: TestServer;
let owner: Agent;

beforeAll(async () => {
  server = await startTestServer();
  owner = await server.signIn('owner');
});
afterAll(() => server.close());

const HEADER = MENU_CSV_COLUMNS.join(',');
const csv = (...lines: string[]) => [HEADER, ...lines].join('\r\n') + '\r\n';
const send = (agent: Agent | ReturnType<typeof request>, path: string, text: string | Buffer, filename = 'menu.csv', contentType = 'text/csv') =>
  agent.post(`/api${path}`).attach('file', Buffer.isBuffer(text) ? text : Buffer.from(text, 'utf8'), { filename, contentType });

/** Every menu row, to show an import or a refusal changed nothing (or exactly what it should). */
async function menuSnapshot() {
  return {
    categories: await server.db('menu_categories').orderBy('id'),
    items: await server.db('menu_items').orderBy('id'),
    sizes: await server.db('item_sizes').orderBy('id'),
    events: Number((await server.db('events').count({ n: '*' }).first())?.n),
  };
}

async function exported(): Promise<string> {
  const res = await owner
    .get('/api/menu/export.csv')
    .buffer(true)
    .parse((r, done) => {
      let text = '';
      r.on('data', (c: Buffer) => (text += c.toString('utf8')));
      r.on('end', () => done(null, text));
    });
  expect(res.status).toBe(200);
  return res.body as string;
}

describe('who may import and export', () => {
  it.each(['cashier', 'barista', 'lead'] as const)('%s gets 403 on every import route and nothing changes', async (login) => {
    const agent = await server.signIn(login);
    const before = await menuSnapshot();
    const file = csv('Food,Scone,counter,,,3.50,0,,,,no,,,wheat,,no');
    for (const res of [await agent.get('/api/menu/export.csv'), await send(agent, '/menu/import/preview', file), await send(agent, '/menu/import', file)]) {
      expect(res.status).toBe(403);
      expect(res.body.error.code).toBe('forbidden');
    }
    expect(await menuSnapshot()).toEqual(before);
  });

  it('signed out gets 401', async () => {
    expect((await request(server.url).get('/api/menu/export.csv')).status).toBe(401);
    expect((await send(request(server.url), '/menu/import', csv())).status).toBe(401);
  });
});

describe('export', () => {
  it('is the current menu as CSV in the import columns, one row per size', async () => {
    const res = await owner.get('/api/menu/export.csv');
    expect(res.status).toBe(200);
    expect(res.headers['content-type']).toMatch(/^text\/csv; charset=utf-8/);
    expect(res.headers['content-disposition']).toMatch(/^attachment; filename="jugline-menu-\d{4}-\d{2}-\d{2}\.csv"$/);
    const text = await exported();
    const lines = text.split('\r\n');
    expect(lines[0]).toBe(MENU_CSV_COLUMNS.map((c) => `"${c}"`).join(','));
    // the demo seed's latte: 19 g in, 38 g out, 270 mL of whole milk in a Regular at 5.40
    expect(lines).toContain('"Espresso","Latte","bar","Regular","350","5.40","2","19","38","270","yes","WH","silky","","","yes"');
    // its ingredients as recorded, and the allergens they give on the US list (FALCPA + FASTER Act order)
    expect(lines).toContain(
      `"Food","Almond croissant","counter","","","4.95","0","","","","no","","","cow's milk; egg; wheat; almond","milk; eggs; tree nuts; wheat","no"`,
    );
    // the demo café's own menu (the group's other café has a copy of it)
    const cafeItems = () => server.db('menu_items').whereIn('category_id', server.db('menu_categories').where({ location_id: cafe }).select('id'));
    const cafe = await demoCafeId(server.db);
    const sizes = Number((await server.db('item_sizes').whereNull('retired_at').whereIn('item_id', cafeItems().select('id')).count({ n: '*' }).first())?.n);
    const unsized = Number((await cafeItems().whereNull('price_cents').count({ n: '*' }).first())?.n);
    const items = Number((await cafeItems().count({ n: '*' }).first())?.n);
    expect(lines.filter(Boolean)).toHaveLength(1 + sizes + (items - unsized));
  });

  it('imports back with nothing changed: preview says so, import writes nothing and sends no event', async () => {
    const text = await exported();
    const before = await menuSnapshot();
    const preview = await send(owner, '/menu/import/preview', text, 'jugline-menu.csv');
    expect(preview.status).toBe(200);
    expect(preview.body.errors).toEqual([]);
    expect(preview.body.rows.length).toBeGreaterThan(10);
    expect(preview.body.rows.every((r: { action: string }) => r.action === 'unchanged')).toBe(true);
    const res = await send(owner, '/menu/import', text, 'jugline-menu.csv');
    expect(res.status).toBe(200);
    expect(res.body).toEqual({ rows: preview.body.rows.length, added: 0, updated: 0, unchanged: preview.body.rows.length });
    expect(await menuSnapshot()).toEqual(before);
    expect(await exported()).toBe(text);
  });

  it('under the EU list writes the EU allergens, and that file too imports back unchanged', async () => {
    await owner.put('/api/settings').send({ allergenList: 'EU' }).expect(200);
    try {
      const text = await exported();
      // Regulation (EU) No 1169/2011 Annex II: wheat is a cereal containing gluten, almonds are nuts
      expect(text.split('\r\n')).toContain(
        `"Food","Almond croissant","counter","","","4.95","0","","","","no","","","cow's milk; egg; wheat; almond","cereals containing gluten; eggs; milk; nuts","no"`,
      );
      const res = await send(owner, '/menu/import', text);
      expect(res.status).toBe(200);
      expect(res.body.updated).toBe(0);
      expect(await exported()).toBe(text);
    } finally {
      await owner.put('/api/settings').send({ allergenList: 'US' }).expect(200);
    }
  });
});

describe('import', () => {
  const scone = "Baked,Cheese scone,counter,,,3.75,0,,,,no,,,wheat; cow's milk,milk; wheat,no";
  const cortado = 'Espresso,Cortado,bar,Regular,120,4.20,2,18.5,37,60,yes,OA,flat,,,yes';
  const latteUp = 'Espresso,Latte,bar,Regular,350,5.60,2,19,38,270,yes,WH,silky,,,yes';
  const bad = 'Espresso,Mocha,bar,Regular,350,5.8O,2,19,38,250,yes,WH,silky,,,yes';

  it("a preview shows each row's action and errors and saves nothing", async () => {
    const before = await menuSnapshot();
    const res = await send(owner, '/menu/import/preview', csv(scone, cortado, latteUp, bad));
    expect(res.status).toBe(200);
    expect(res.body.fileName).toBe('menu.csv');
    expect(res.body.rows.map((r: { row: number; action: string | null }) => [r.row, r.action])).toEqual([
      [2, 'add'],
      [3, 'add'],
      [4, 'update'],
      [5, null],
    ]);
    expect(res.body.errors).toEqual([{ row: 5, column: 'price', message: expect.stringContaining('like 4.80') }]);
    expect(res.body.counts).toEqual({ rows: 4, added: 2, updated: 1, unchanged: 0 });
    expect(res.body.rows[3].cells.price).toBe('5.8O');
    expect(await menuSnapshot()).toEqual(before);
  });

  it("one bad row: 400 with that row's error and the menu unchanged; the fixed file saves every row", async () => {
    const before = await menuSnapshot();
    const refused = await send(owner, '/menu/import', csv(scone, cortado, latteUp, bad));
    expect(refused.status).toBe(400);
    expect(refused.body.error).toMatchObject({ code: 'validation_failed', message: '1 row needs fixing; nothing was imported' });
    expect(refused.body.error.details).toEqual([{ path: 'row.5.price', row: 5, column: 'price', message: expect.any(String) }]);
    expect(await menuSnapshot()).toEqual(before);

    const fixed = await send(owner, '/menu/import', csv(scone, cortado, latteUp, bad.replace('5.8O', '5.80')));
    expect(fixed.status).toBe(200);
    expect(fixed.body).toEqual({ rows: 4, added: 2, updated: 1, unchanged: 1 });

    const after = await menuSnapshot();
    expect(after.events).toBe(before.events + 1);
    const event = await server.db('events').orderBy('id', 'desc').first();
    expect(event.type).toBe('menu.changed');
    const baked = await server.db('menu_categories').where({ name: 'Baked' }).first();
    expect(baked.sort).toBeGreaterThan(Math.max(...before.categories.map((c) => c.sort)));
    const sconeRow = await server.db('menu_items').where({ name: 'Cheese scone' }).first();
    expect({ ...sconeRow, ingredients: jsonOf(sconeRow.ingredients), available: boolOf(sconeRow.available) }).toMatchObject({
      category_id: baked.id,
      station: 'counter',
      price_cents: 375,
      ingredients: ["cow's milk", 'wheat'],
      available: true,
    });
    const cortadoRow = await server.db('menu_items').where({ name: 'Cortado' }).first();
    const oat = await server.db('milk_options').where({ code: 'OA' }).first();
    expect({ ...cortadoRow, takes_milk: Number(cortadoRow.takes_milk) }).toMatchObject({
      takes_milk: 1,
      default_milk_id: oat.id,
      texture: 'flat',
      price_cents: null,
      shots: 2,
    });
    expect((await server.db('item_sizes').where({ item_id: cortadoRow.id })).map((r) => ({ ...r, is_default: Number(r.is_default) }))).toEqual([
      expect.objectContaining({ name: 'Regular', volume_ml: 120, price_cents: 420, shots: 2, dose_dg: 185, yield_dg: 370, milk_ml: 60, is_default: 1 }),
    ]);
    const latte = await server.db('menu_items').where({ name: 'Latte' }).first();
    const latteSizes = await server.db('item_sizes').where({ item_id: latte.id }).orderBy('id');
    expect(latteSizes.map((s) => [s.name, s.price_cents, Number(s.is_default)])).toEqual([
      ['Small', 480, 0],
      ['Regular', 560, 1],
      ['Large', 590, 0],
    ]);

    // every screen's menu has it, and nothing was deleted
    const cashier = await server.signIn('cashier');
    const menu = (await cashier.get('/api/menu')).body;
    expect(menu.items.map((i: { name: string }) => i.name)).toEqual(expect.arrayContaining(['Cheese scone', 'Cortado', 'Latte', 'Mocha', 'Bottled water']));
    expect(menu.categories.map((c: { name: string }) => c.name)).toContain('Baked');
    expect(after.items.length).toBe(before.items.length + 2);
    for (const item of before.items) expect(after.items.find((i) => i.id === item.id)?.retired_at).toBe(item.retired_at);
  });

  it("matches names without regard to case, keeps the menu's spelling, and moves the default size", async () => {
    const before = await menuSnapshot();
    const res = await send(owner, '/menu/import', csv('espresso,LATTE,bar,large,470,5.90,2,19,38,360,yes,WH,silky,,,yes'));
    expect(res.status).toBe(200);
    expect(res.body).toEqual({ rows: 1, added: 0, updated: 1, unchanged: 0 });
    const latte = await server.db('menu_items').where({ name: 'Latte' }).first();
    const sizes = await server.db('item_sizes').where({ item_id: latte.id }).orderBy('id');
    expect(sizes.map((s) => [s.name, Number(s.is_default)])).toEqual([
      ['Small', 0],
      ['Regular', 0],
      ['Large', 1],
    ]);
    expect((await menuSnapshot()).items.length).toBe(before.items.length);
  });

  it("refuses a row without a size for an item that has sizes, and one that differs from its item's other rows", async () => {
    const before = await menuSnapshot();
    const res = await send(
      owner,
      '/menu/import',
      csv(
        'Espresso,Latte,bar,,,5.00,2,,,,yes,WH,silky,,,no',
        'Espresso,Flat white,bar,Regular,160,4.60,2,19,38,120,yes,WH,flat,,,yes',
        'Espresso,Flat white,bar,Large,240,5.20,2,19,38,180,yes,OA,flat,,,no',
      ),
    );
    expect(res.status).toBe(400);
    expect(res.body.error.details).toEqual([
      { path: 'row.2.size', row: 2, column: 'size', message: expect.stringContaining('Latte has sizes on the menu') },
      { path: 'row.4.default_milk', row: 4, column: 'default_milk', message: expect.stringContaining('Differs from row 3 (WH)') },
    ]);
    expect(await menuSnapshot()).toEqual(before);
  });

  it("refuses allergens off the café's list or not following from the ingredients, unknown ingredients and milk codes not on the menu", async () => {
    const before = await menuSnapshot();
    const res = await send(
      owner,
      '/menu/import',
      csv(
        // coconut is not a US major allergen (FDA Q&A Edition 5, January 2025)
        'Food,Macaroon,counter,,,2.50,0,,,,no,,,coconut,coconut,no',
        "Espresso,Breve,bar,Regular,240,5.00,2,19,38,200,yes,HH,silky,cow's milk,milk,yes",
        'Food,Flapjack,counter,,,2.80,0,,,,no,,,oat,,no',
        // oats are not among FALCPA's nine: a file claiming wheat is asked to fix the ingredients
        'Food,Oat bar,counter,,,2.80,0,,,,no,,,oats,wheat,no',
      ),
    );
    expect(res.status).toBe(400);
    expect(res.body.error.message).toBe('4 rows need fixing; nothing was imported');
    expect(res.body.error.details.map((d: { path: string }) => d.path)).toEqual([
      'row.2.allergens',
      'row.3.default_milk',
      'row.4.ingredients',
      'row.5.allergens',
    ]);
    expect(await menuSnapshot()).toEqual(before);
  });
});

describe('files that are not a menu CSV', () => {
  it.each([
    ['a .txt file', () => send(owner, '/menu/import', csv(), 'menu.txt', 'text/plain'), 415],
    ['a file over 256 KB', () => send(owner, '/menu/import', csv('Food,Scone,counter,,,3.50,0,,,,no,,,,,no') + ' '.repeat(MENU_CSV_MAX_BYTES)), 413],
    ['Latin-1 text', () => send(owner, '/menu/import', Buffer.from(csv('Food,Café crème,counter,,,3.50,0,,,,no,,,,,no'), 'latin1')), 400],
    ['a binary file named .csv', () => send(owner, '/menu/import', Buffer.from([0x50, 0x4b, 0x03, 0x04, 0, 0, 0, 0])), 415],
    ['no file at all (JSON)', () => owner.post('/api/menu/import').send({ file: 'category,item' }), 400],
    ['the file in another field', () => owner.post('/api/menu/import').attach('upload', Buffer.from(csv()), 'menu.csv'), 400],
    ['two files', () => owner.post('/api/menu/import').attach('file', Buffer.from(csv()), 'a.csv').attach('file', Buffer.from(csv()), 'b.csv'), 400],
  ])('%s is refused with a message and nothing saved', async (_what, post, status) => {
    const before = await menuSnapshot();
    const res = await post();
    expect(res.status).toBe(status);
    expect(res.body.error.message).toEqual(expect.any(String));
    if (status === 413) expect(res.body.error).toMatchObject({ code: 'payload_too_large', message: expect.stringContaining('256 KB') });
    expect(await menuSnapshot()).toEqual(before);
  });

  it('a too-large preview is 413 as well', async () => {
    const res = await send(owner, '/menu/import/preview', 'x'.repeat(MENU_CSV_MAX_BYTES + 1));
    expect(res.status).toBe(413);
  });
});
