// The owner's menu editor over HTTP: who may call it, what it refuses (and that a refusal changes
// nothing), another café's ids, retiring without rewriting past orders, and the live menu.changed.
import { afterAll, afterEach, beforeAll, describe, expect, it } from 'vitest';
import type { AdminMenuView } from '@/domain/menu-admin-view';
import type { MenuView } from '@/domain/types';
import { demoMenu, startTestServer, type TestServer } from '../support/test-server';
import { groupOfItsOwn } from '../support/cafe-groups';
import { closeAllSockets, connectAndResume } from '../realtime/ws-client';
import { orderBody, type Agent } from './helpers';
import { jsonOf } from '../support/rows';

let server: TestServer;
let owner: Agent;
let cashier: Agent;
let refused: Record<'cashier' | 'barista' | 'lead', Agent>;
let ids: Awaited<ReturnType<typeof demoMenu>>;
let espressoCategory: number;
let syrupGroup: number;
let north: Awaited<ReturnType<typeof insertNorthCafe>>;

const MENU_TABLES = ['menu_categories', 'menu_items', 'item_sizes', 'milk_options', 'extra_groups', 'item_extra_groups', 'extras'];

/** Every menu row and the event count: what "the database is unchanged" means here. */
async function snapshot() {
  const out: Record<string, unknown> = {};
  for (const t of MENU_TABLES) out[t] = await server.db(t).select('*').orderByRaw('1, 2');
  out.events = Number((await server.db('events').count({ n: '*' }).first())?.n);
  return out;
}

/** A second café with one of everything, so its ids exist but are not the demo café's. */
async function insertNorthCafe(db: TestServer['db']) {
  const [{ id: locationId }] = await db('locations')
    .insert({
      name: 'North Quay Espresso',
      currency: 'GBP',
      allergen_list: 'EU',
      created_at: new Date().toISOString(),
      group_id: await groupOfItsOwn(db, 'North Quay Espresso', new Date().toISOString()),
    })
    .returning('id');
  const [{ id: categoryId }] = await db('menu_categories').insert({ location_id: locationId, name: 'Coffee' }).returning('id');
  const [{ id: milkId }] = await db('milk_options').insert({ location_id: locationId, name: 'Whole', code: 'WH' }).returning('id');
  const [{ id: itemId }] = await db('menu_items')
    .insert({ category_id: categoryId, name: 'Cortado', station: 'bar', takes_milk: true, default_milk_id: milkId, texture: 'silky' })
    .returning('id');
  const [{ id: sizeId }] = await db('item_sizes')
    .insert({ item_id: itemId, name: 'Regular', volume_ml: 120, price_cents: 350, shots: 2, milk_ml: 60, dose_dg: 180, yield_dg: 360, is_default: true })
    .returning('id');
  const [{ id: groupId }] = await db('extra_groups').insert({ location_id: locationId, name: 'Syrup' }).returning('id');
  const [{ id: extraId }] = await db('extras').insert({ location_id: locationId, group_id: groupId, name: 'Vanilla' }).returning('id');
  return { locationId, categoryId, milkId, itemId, sizeId, groupId, extraId };
}

const size = (over: Record<string, unknown> = {}) => ({
  name: '12 oz',
  volumeMl: 355,
  cup: '12 oz cup',
  priceCents: 560,
  shots: 2,
  doseDg: 180,
  yieldDg: 360,
  milkMl: 240,
  isDefault: true,
  ...over,
});

/** A seasonal milk drink of our own invention, 12 oz and 16 oz. */
const latteBody = (name: string, over: Record<string, unknown> = {}) => ({
  categoryId: espressoCategory,
  name,
  station: 'bar',
  takesMilk: true,
  defaultMilkId: ids.milk('Whole'),
  texture: 'silky',
  ingredients: [],
  extraGroupIds: [syrupGroup],
  sizes: [size(), size({ name: '16 oz', volumeMl: 473, cup: '16 oz cup', priceCents: 620, milkMl: 320, isDefault: false })],
  ...over,
});

const counterMenu = async (): Promise<MenuView> => (await cashier.get('/api/menu').expect(200)).body;
const editable = async (): Promise<AdminMenuView> => (await owner.get('/api/menu-admin').expect(200)).body;

async function create(kind: string, body: object): Promise<{ id: number; menu: AdminMenuView }> {
  const res = await owner.post(`/api/menu-admin/${kind}`).send(body);
  expect(res.status, JSON.stringify(res.body)).toBe(201);
  return res.body;
}

/** 400 validation_failed naming `path`, and nothing changed. */
async function expectInvalid(
  send: () => Promise<{ status: number; body: { error: { code: string; message: string; details: { path: string; message: string }[] } } }>,
  path: string,
) {
  const before = await snapshot();
  const res = await send();
  expect(res.status, JSON.stringify(res.body)).toBe(400);
  expect(res.body.error.code).toBe('validation_failed');
  expect(res.body.error.details.map((d: { path: string }) => d.path)).toContain(path);
  expect(await snapshot()).toEqual(before);
}

/** `status` with the API's error code for it, and nothing changed. */
async function expectRefused(
  status: 404 | 409,
  send: () => Promise<{ status: number; body: { error: { code: string; message: string; details?: { path: string; message: string }[] } } }>,
) {
  const before = await snapshot();
  const res = await send();
  expect(res.status, JSON.stringify(res.body)).toBe(status);
  expect(res.body.error.code).toBe(status === 404 ? 'not_found' : 'conflict');
  expect(await snapshot()).toEqual(before);
  return res.body.error as { message: string };
}

beforeAll(async () => {
  server = await startTestServer();
  owner = await server.signIn('owner');
  cashier = await server.signIn('cashier');
  refused = { cashier, barista: await server.signIn('barista'), lead: await server.signIn('lead') };
  ids = await demoMenu(server);
  espressoCategory = (await server.db('menu_categories').where({ name: 'Espresso' }).first('id')).id;
  syrupGroup = (await server.db('extra_groups').where({ name: 'Syrup' }).first('id')).id;
  north = await insertNorthCafe(server.db);
});
afterEach(() => closeAllSockets());
afterAll(() => server.close());

describe('who may edit the menu', () => {
  it('every menu-admin route: the owner gets through, a cashier, barista or lead gets 403 and nothing changes', async () => {
    // one valid call per route, in an order where each succeeds for the owner
    const made = await create('items', latteBody('Guard Test Latte'));
    const item = made.id;
    const sizes = made.menu.items.find((i) => i.id === item)!.sizes;
    const cat = (await create('categories', { name: 'Guard tests' })).id;
    const milk = (await create('milks', { name: 'Guard milk', code: 'GT', upchargeCents: 0 })).id;
    const group = (await create('extra-groups', { name: 'Guard group', selection: 'multi', required: false })).id;
    const extra = (await create('extras', { groupId: group, name: 'Guard extra', priceCents: 0 })).id;
    const calls: [method: 'get' | 'post' | 'put', path: string, url: string, body?: object][] = [
      ['get', '/menu-admin', '/api/menu-admin'],
      ['post', '/menu-admin/categories', '/api/menu-admin/categories', { name: 'Guard two' }],
      ['put', '/menu-admin/categories/:id', `/api/menu-admin/categories/${cat}`, { name: 'Guard renamed' }],
      ['post', '/menu-admin/categories/:id/move', `/api/menu-admin/categories/${cat}/move`, { direction: 'up' }],
      ['post', '/menu-admin/categories/:id/retired', `/api/menu-admin/categories/${cat}/retired`, { retired: true }],
      ['post', '/menu-admin/categories/:id/retired', `/api/menu-admin/categories/${cat}/retired`, { retired: false }],
      ['post', '/menu-admin/items', '/api/menu-admin/items', latteBody('Guard Two Latte')],
      [
        'put',
        '/menu-admin/items/:id',
        `/api/menu-admin/items/${item}`,
        latteBody('Guard Test Latte', { sizes: sizes.map((s) => ({ ...size({ name: s.name, milkMl: s.milkMl, isDefault: s.isDefault }), id: s.id })) }),
      ],
      ['post', '/menu-admin/items/:id/move', `/api/menu-admin/items/${item}/move`, { direction: 'up' }],
      ['post', '/menu-admin/sizes/:id/retired', `/api/menu-admin/sizes/${sizes[1].id}/retired`, { retired: true }],
      ['post', '/menu-admin/sizes/:id/retired', `/api/menu-admin/sizes/${sizes[1].id}/retired`, { retired: false }],
      ['post', '/menu-admin/items/:id/retired', `/api/menu-admin/items/${item}/retired`, { retired: true }],
      ['post', '/menu-admin/items/:id/retired', `/api/menu-admin/items/${item}/retired`, { retired: false }],
      ['post', '/menu-admin/milks', '/api/menu-admin/milks', { name: 'Guard milk 2', code: 'GU', upchargeCents: 50 }],
      ['put', '/menu-admin/milks/:id', `/api/menu-admin/milks/${milk}`, { name: 'Guard milk', code: 'GT', upchargeCents: 10 }],
      ['post', '/menu-admin/milks/:id/move', `/api/menu-admin/milks/${milk}/move`, { direction: 'up' }],
      ['post', '/menu-admin/milks/:id/retired', `/api/menu-admin/milks/${milk}/retired`, { retired: true }],
      ['post', '/menu-admin/milks/:id/retired', `/api/menu-admin/milks/${milk}/retired`, { retired: false }],
      ['post', '/menu-admin/extra-groups', '/api/menu-admin/extra-groups', { name: 'Guard group 2', selection: 'single', required: false }],
      [
        'put',
        '/menu-admin/extra-groups/:id',
        `/api/menu-admin/extra-groups/${group}`,
        { name: 'Guard group', selection: 'single', required: false, itemIds: [item] },
      ],
      ['post', '/menu-admin/extra-groups/:id/move', `/api/menu-admin/extra-groups/${group}/move`, { direction: 'up' }],
      ['post', '/menu-admin/extra-groups/:id/retired', `/api/menu-admin/extra-groups/${group}/retired`, { retired: true }],
      ['post', '/menu-admin/extra-groups/:id/retired', `/api/menu-admin/extra-groups/${group}/retired`, { retired: false }],
      ['post', '/menu-admin/extras', '/api/menu-admin/extras', { groupId: group, name: 'Guard extra 2', priceCents: 25 }],
      [
        'put',
        '/menu-admin/extras/:id',
        `/api/menu-admin/extras/${extra}`,
        { groupId: group, name: 'Guard extra', priceCents: 30, ingredients: ["cow's milk"] },
      ],
      ['post', '/menu-admin/extras/:id/move', `/api/menu-admin/extras/${extra}/move`, { direction: 'down' }],
      ['post', '/menu-admin/extras/:id/retired', `/api/menu-admin/extras/${extra}/retired`, { retired: true }],
      ['post', '/menu-admin/extras/:id/retired', `/api/menu-admin/extras/${extra}/retired`, { retired: false }],
    ];
    const declared = server.routes.filter((r) => r.path.startsWith('/menu-admin')).map((r) => `${r.method} ${r.path}`);
    expect([...new Set(calls.map(([m, p]) => `${m} ${p}`))].sort()).toEqual(declared.sort());
    expect(server.routes.filter((r) => r.path.startsWith('/menu-admin')).every((r) => r.capability === 'editMenu')).toBe(true);

    for (const [method, , url, body] of calls) {
      for (const [role, agent] of Object.entries(refused)) {
        const before = await snapshot();
        const res = method === 'get' ? await agent.get(url) : await agent[method](url).send(body ?? {});
        expect(res.status, `${role} ${method} ${url}`).toBe(403);
        expect(res.body.error.code).toBe('forbidden');
        expect(await snapshot(), `${role} ${method} ${url}`).toEqual(before);
      }
      const res = method === 'get' ? await owner.get(url) : body ? await owner[method](url).send(body) : await owner[method](url);
      expect(res.status, `owner ${method} ${url}: ${JSON.stringify(res.body).slice(0, 300)}`).toBeLessThan(300);
    }
  }, 60_000); // about a hundred requests, each between two full reads of the menu tables
});

describe('the editable menu', () => {
  it('lists everything with the café allergen list; retired things are there, marked', async () => {
    const menu = await editable();
    expect(menu.location.allergenList).toBe('US');
    // FALCPA + FASTER Act: nine US major food allergens
    expect(menu.location.allergens).toHaveLength(9);
    const latte = menu.items.find((i) => i.name === 'Latte')!;
    expect(latte.sizes.map((s) => [s.name, s.milkMl, s.doseDg, s.yieldDg, s.cup])).toEqual([
      ['Small', 180, 190, 380, '8 oz cup'],
      ['Regular', 270, 190, 380, '12 oz cup'],
      ['Large', 360, 190, 380, '16 oz cup'],
    ]);
    const { id } = await create('categories', { name: 'Winter only' });
    await owner.post(`/api/menu-admin/categories/${id}/retired`).send({ retired: true }).expect(200);
    expect((await editable()).categories.find((c) => c.id === id)).toEqual({ id, name: 'Winter only', retired: true });
    expect((await counterMenu()).categories.map((c) => c.id)).not.toContain(id);
  });
});

describe('items and recipes', () => {
  it('a new drink with its recipe reaches the Counter menu, sized and priced', async () => {
    const { id, menu } = await create('items', latteBody('Ember Spice Latte'));
    expect(menu.items.find((i) => i.id === id)!.sizes).toHaveLength(2);
    const item = (await counterMenu()).items.find((i) => i.id === id)!;
    expect(item).toMatchObject({ name: 'Ember Spice Latte', takesMilk: true, texture: 'silky', available: true, extraGroupIds: [syrupGroup] });
    expect(item.sizes.map((s) => [s.name, s.priceCents, s.shots, s.doseDg, s.yieldDg, s.milkMl, s.isDefault])).toEqual([
      ['12 oz', 560, 2, 180, 360, 240, true],
      ['16 oz', 620, 2, 180, 360, 320, false],
    ]);
  });

  it('refuses bad recipes with the field named, and stores nothing', async () => {
    const post = (body: object) => () => owner.post('/api/menu-admin/items').send(body);
    await expectInvalid(post(latteBody('   ')), 'name');
    await expectInvalid(post(latteBody('x'.repeat(61))), 'name');
    await expectInvalid(post(latteBody('Two Defaults', { sizes: [size(), size({ name: '16 oz' })] })), 'sizes');
    await expectInvalid(post(latteBody('No Default', { sizes: [size({ isDefault: false })] })), 'sizes');
    await expectInvalid(post(latteBody('Dry Latte', { sizes: [size({ milkMl: 0 })] })), 'sizes.0.milkMl');
    await expectInvalid(post(latteBody('Flood Latte', { sizes: [size({ milkMl: 601 })] })), 'sizes.0.milkMl');
    await expectInvalid(post(latteBody('Weak Latte', { sizes: [size({ doseDg: 40 })] })), 'sizes.0.doseDg');
    await expectInvalid(post(latteBody('Heavy Latte', { sizes: [size({ doseDg: 310 })] })), 'sizes.0.doseDg');
    await expectInvalid(post(latteBody('Long Latte', { sizes: [size({ yieldDg: 1210 })] })), 'sizes.0.yieldDg');
    await expectInvalid(post(latteBody('Five Shot Latte', { sizes: [size({ shots: 5 })] })), 'sizes.0.shots');
    await expectInvalid(post(latteBody('Dear Latte', { sizes: [size({ priceCents: 100_001 })] })), 'sizes.0.priceCents');
    await expectInvalid(post(latteBody('Cent Latte', { sizes: [size({ priceCents: 5.5 })] })), 'sizes.0.priceCents');
    await expectInvalid(post(latteBody('Milkless', { defaultMilkId: null })), 'defaultMilkId');
    await expectInvalid(post(latteBody('Textureless', { texture: null })), 'texture');
    await expectInvalid(post(latteBody('Counter Latte', { station: 'counter' })), 'station');
    await expectInvalid(post(latteBody('Sizeless Latte', { sizes: [] })), 'sizes');
    await expectInvalid(post({ ...latteBody('Extra Key'), colour: 'red' }), '');
    await expectInvalid(post({ categoryId: espressoCategory, name: 'Priceless scone', station: 'counter', takesMilk: false }), 'priceCents');
    // ingredients come from Jugline's own list; an allergen of a published list is no ingredient
    await expectInvalid(post(latteBody('Gluten Latte', { ingredients: ['gluten'] })), 'ingredients.0');
    await expectInvalid(post(latteBody('Tagged Latte', { allergens: ['milk'] })), '');
  });

  it('an item without milk or shots: milk and dose must be nothing', async () => {
    const tea = {
      categoryId: espressoCategory,
      name: 'Hearth Tea',
      station: 'bar',
      takesMilk: false,
      sizes: [size({ shots: 0, doseDg: 0, yieldDg: 0, milkMl: 0 })],
    };
    await expectInvalid(
      () => owner.post('/api/menu-admin/items').send({ ...tea, sizes: [size({ shots: 0, doseDg: 180, yieldDg: 0, milkMl: 0 })] }),
      'sizes.0.doseDg',
    );
    await expectInvalid(
      () => owner.post('/api/menu-admin/items').send({ ...tea, sizes: [size({ shots: 0, doseDg: 0, yieldDg: 0, milkMl: 100 })] }),
      'sizes.0.milkMl',
    );
    const { id } = await create('items', tea);
    const made = (await counterMenu()).items.find((i) => i.id === id)!;
    expect(made).toMatchObject({ takesMilk: false, texture: null, defaultMilkId: null, shots: 0 });
    const scone = await create('items', {
      categoryId: espressoCategory,
      name: 'Hearth Scone',
      station: 'counter',
      takesMilk: false,
      priceCents: 375,
      ingredients: ['wheat', "cow's milk"],
    });
    // stored in the editor's order; FALCPA + FASTER Act list order for the allergens
    expect((await counterMenu()).items.find((i) => i.id === scone.id)).toMatchObject({
      priceCents: 375,
      sizes: [],
      ingredients: ["cow's milk", 'wheat'],
      allergens: ['milk', 'wheat'],
    });
  });

  it('a second item of the same name on sale is a 409', async () => {
    await expectRefused(409, () => owner.post('/api/menu-admin/items').send(latteBody('latte')));
  });

  it('editing a price changes new orders only; past orders keep what they were sold at', async () => {
    const { id, menu } = await create('items', latteBody('Harbour Honey Latte'));
    const sizes = menu.items.find((i) => i.id === id)!.sizes;
    const before = await cashier
      .post('/api/orders')
      .send(orderBody('Pia Lund', [{ menuItemId: id, sizeId: sizes[0].id }]))
      .expect(201);
    expect(before.body.order.lines[0].priceCents).toBe(560);

    const edited = latteBody('Harbour Honey Latte', {
      sizes: [
        { ...size({ priceCents: 610 }), id: sizes[0].id },
        { ...size({ name: '16 oz', volumeMl: 473, priceCents: 680, milkMl: 320, isDefault: false }), id: sizes[1].id },
      ],
    });
    await owner.put(`/api/menu-admin/items/${id}`).send(edited).expect(200);
    const past = await cashier.get(`/api/orders/${before.body.order.id}`).expect(200);
    expect(past.body.order.lines[0]).toMatchObject({ itemName: 'Harbour Honey Latte', sizeName: '12 oz', priceCents: 560 });
    expect(past.body.order.subtotalCents).toBe(560);
    const after = await cashier
      .post('/api/orders')
      .send(orderBody('Pia Lund', [{ menuItemId: id, sizeId: sizes[0].id }]))
      .expect(201);
    expect(after.body.order.lines[0].priceCents).toBe(610);
  });

  it('retiring an item takes it off the Counter; past orders keep its name and price; restore brings it back', async () => {
    const { id } = await create('items', latteBody('Quayside Mocha'));
    const sold = await cashier
      .post('/api/orders')
      .send(orderBody('Ola Brandt', [{ menuItemId: id, milkId: ids.milk('Oat') }]))
      .expect(201);
    const line = sold.body.order.lines[0];
    expect(line).toMatchObject({ itemName: 'Quayside Mocha', milkName: 'Oat', priceCents: 560 + 70 });

    await owner.post(`/api/menu-admin/items/${id}/retired`).send({ retired: true }).expect(200);
    expect((await counterMenu()).items.map((i) => i.id)).not.toContain(id);
    expect((await server.db('menu_items').where({ id }).first()).retired_at).not.toBeNull(); // kept, not deleted
    const past = await cashier.get(`/api/orders/${sold.body.order.id}`).expect(200);
    expect(past.body.order.lines[0]).toEqual(line);
    // no new orders for it
    const refusedOrder = await cashier.post('/api/orders').send(orderBody('Ola Brandt', [{ menuItemId: id }]));
    expect(refusedOrder.status).toBeGreaterThanOrEqual(400);
    await expectRefused(409, () => owner.post(`/api/menu-admin/items/${id}/retired`).send({ retired: true }));
    await expectInvalid(() => owner.post(`/api/menu-admin/items/${id}/retired`).send({ retired: 'yes' }), 'retired');

    await owner.post(`/api/menu-admin/items/${id}/retired`).send({ retired: false }).expect(200);
    expect((await counterMenu()).items.find((i) => i.id === id)?.name).toBe('Quayside Mocha');
  });

  it('a restored item comes back in its old place among the tiles', async () => {
    const flatWhite = ids.item('Flat white');
    const order = async () => {
      const { items } = await counterMenu();
      const categoryId = items.find((x) => x.id === flatWhite)?.categoryId;
      return items.filter((i) => i.categoryId === categoryId).map((i) => i.id);
    };
    const before = await order();
    await owner.post(`/api/menu-admin/items/${flatWhite}/retired`).send({ retired: true }).expect(200);
    await owner.post(`/api/menu-admin/items/${flatWhite}/retired`).send({ retired: false }).expect(200);
    expect(await order()).toEqual(before);
  });

  it('a size left out of the item is retired, not deleted; the last size and the default size stay', async () => {
    const { id, menu } = await create('items', latteBody('Pier Cortado'));
    const [small, large] = menu.items.find((i) => i.id === id)!.sizes;
    const sold = await cashier
      .post('/api/orders')
      .send(orderBody('Rue Hale', [{ menuItemId: id, sizeId: large.id }]))
      .expect(201);

    // only the 12 oz in the list: the 16 oz is retired
    await owner
      .put(`/api/menu-admin/items/${id}`)
      .send(latteBody('Pier Cortado', { sizes: [{ ...size(), id: small.id }] }))
      .expect(200);
    expect((await counterMenu()).items.find((i) => i.id === id)!.sizes.map((s) => s.name)).toEqual(['12 oz']);
    expect((await server.db('item_sizes').where({ id: large.id }).first()).retired_at).not.toBeNull();
    expect((await cashier.get(`/api/orders/${sold.body.order.id}`)).body.order.lines[0]).toMatchObject({ sizeName: '16 oz', priceCents: 620 });
    expect((await editable()).items.find((i) => i.id === id)!.sizes.map((s) => [s.name, s.retired])).toEqual([
      ['12 oz', false],
      ['16 oz', true],
    ]);

    // no sizes at all, or the last or default size alone: 409
    const lastOne = await expectRefused(409, () =>
      owner
        .put(`/api/menu-admin/items/${id}`)
        .send(latteBody('Pier Cortado', { sizes: [], priceCents: 500, takesMilk: false, defaultMilkId: null, texture: null })),
    );
    expect(lastOne.message).toMatch(/keep at least one/);
    await expectRefused(409, () => owner.post(`/api/menu-admin/sizes/${small.id}/retired`).send({ retired: true }));

    // restore the 16 oz; it comes back last and not default, so the 12 oz can't be retired (default)
    await owner.post(`/api/menu-admin/sizes/${large.id}/retired`).send({ retired: false }).expect(200);
    expect((await counterMenu()).items.find((i) => i.id === id)!.sizes.map((s) => [s.name, s.isDefault])).toEqual([
      ['12 oz', true],
      ['16 oz', false],
    ]);
    const defaultOne = await expectRefused(409, () => owner.post(`/api/menu-admin/sizes/${small.id}/retired`).send({ retired: true }));
    expect(defaultOne.message).toMatch(/default/);
    await owner.post(`/api/menu-admin/sizes/${large.id}/retired`).send({ retired: true }).expect(200);
    await expectRefused(409, () => owner.post(`/api/menu-admin/sizes/${large.id}/retired`).send({ retired: true }));
  });

  it('moves an item up among its category on the Counter', async () => {
    const order = async () => (await counterMenu()).items.filter((i) => i.categoryId === espressoCategory).map((i) => i.name);
    const before = await order();
    const second = before[1];
    const { body } = await owner
      .post(`/api/menu-admin/items/${ids.item(second)}/move`)
      .send({ direction: 'up' })
      .expect(200);
    expect(body.id).toBe(ids.item(second));
    const after = await order();
    expect(after.slice(0, 2)).toEqual([second, before[0]]);
    expect(after.slice(2)).toEqual(before.slice(2));
    await expectRefused(409, () => owner.post(`/api/menu-admin/items/${ids.item(second)}/move`).send({ direction: 'up' }));
    await expectInvalid(() => owner.post(`/api/menu-admin/items/${ids.item(second)}/move`).send({ direction: 'sideways' }), 'direction');
  });
});

describe('categories', () => {
  it('create, rename and reorder show on the Counter; a category with items on sale cannot be retired', async () => {
    const { id } = await create('categories', { name: '  Seasonal  ' });
    expect((await counterMenu()).categories.at(-1)).toEqual({ id, name: 'Seasonal' });
    await owner.put(`/api/menu-admin/categories/${id}`).send({ name: 'Seasonal drinks' }).expect(200);
    await owner.post(`/api/menu-admin/categories/${id}/move`).send({ direction: 'up' }).expect(200);
    const cats = (await counterMenu()).categories;
    expect(cats.at(-2)).toEqual({ id, name: 'Seasonal drinks' });
    await expectInvalid(() => owner.post('/api/menu-admin/categories').send({ name: '' }), 'name');
    const refusal = await expectRefused(409, () => owner.post(`/api/menu-admin/categories/${espressoCategory}/retired`).send({ retired: true }));
    expect(refusal.message).toMatch(/still has \d+ items on sale/);
  });
});

describe('milks', () => {
  it('a new milk gets its lane code in capitals; a code in use (even by a retired milk) is a 409', async () => {
    const { id, menu } = await create('milks', { name: 'Hemp', code: 'he', upchargeCents: 80, ingredients: [] });
    expect(menu.milks.find((m) => m.id === id)).toMatchObject({ code: 'HE', upchargeCents: 80, retired: false });
    expect((await counterMenu()).milks.find((m) => m.id === id)).toMatchObject({ name: 'Hemp', code: 'HE' });
    await expectRefused(409, () => owner.post('/api/menu-admin/milks').send({ name: 'Oat again', code: 'OA', upchargeCents: 0 }));
    await expectRefused(409, () => owner.put(`/api/menu-admin/milks/${id}`).send({ name: 'Hemp', code: 'oa', upchargeCents: 0 }));
    await owner.post(`/api/menu-admin/milks/${id}/retired`).send({ retired: true }).expect(200);
    expect((await counterMenu()).milks.map((m) => m.id)).not.toContain(id);
    await expectRefused(409, () => owner.post('/api/menu-admin/milks').send({ name: 'Hemp two', code: 'HE', upchargeCents: 0 }));
    await owner.post(`/api/menu-admin/milks/${id}/retired`).send({ retired: false }).expect(200);
    await expectInvalid(() => owner.post('/api/menu-admin/milks').send({ name: 'Pea', code: 'P1', upchargeCents: 0 }), 'code');
    await expectInvalid(() => owner.post('/api/menu-admin/milks').send({ name: 'Pea', code: 'PE', upchargeCents: -1 }), 'upchargeCents');
    await expectInvalid(() => owner.post('/api/menu-admin/milks').send({ name: 'Pea', code: 'PE', upchargeCents: 0, ingredients: ['nuts'] }), 'ingredients.0');
  });

  it("the owner records what a milk is made of; the editor and the Counter show the allergens for the café's list", async () => {
    const { id, menu } = await create('milks', { name: 'Hazelnut', code: 'HZ', upchargeCents: 90, ingredients: ['hazelnut', 'rice'] });
    // FALCPA tree nuts (the FDA's twelve include hazelnut, Edition 5); rice is on neither list
    expect(menu.milks.find((m) => m.id === id)).toMatchObject({ ingredients: ['rice', 'hazelnut'], allergens: ['tree nuts'] });
    expect((await counterMenu()).milks.find((m) => m.id === id)!.allergens).toEqual(['tree nuts']);
    await owner
      .put(`/api/menu-admin/milks/${id}`)
      .send({ name: 'Hazelnut', code: 'HZ', upchargeCents: 90, ingredients: ['oats', 'hazelnut'] })
      .expect(200);
    const edited = (await editable()).milks.find((m) => m.id === id)!;
    // oats are not a US major allergen (FALCPA names wheat only)
    expect(edited).toMatchObject({ ingredients: ['oats', 'hazelnut'], allergens: ['tree nuts'] });
    await owner.post(`/api/menu-admin/milks/${id}/retired`).send({ retired: true }).expect(200);
  });

  it('an extra carries what it adds: an order with it contains that allergen', async () => {
    const { id } = await create('extras', { groupId: syrupGroup, name: 'Almond syrup', priceCents: 60, ingredients: ['almond'] });
    expect((await counterMenu()).extras.find((m) => m.id === id)!.allergens).toEqual(['tree nuts']); // §201(qq)
    const order = await cashier
      .post('/api/orders')
      .send(orderBody('Ida Marsh', [{ menuItemId: ids.item('Latte'), milkId: ids.milk('Oat'), extraIds: [id] }]))
      .expect(201);
    const drink = await server.db('order_items').where({ order_id: order.body.order.id }).first('contains');
    expect(jsonOf(drink.contains)).toEqual(['tree nuts']); // oat milk adds none on the US list
    await owner.post(`/api/menu-admin/extras/${id}/retired`).send({ retired: true }).expect(200);
  });

  it('the milk drinks come with cannot be retired until they come with another', async () => {
    const refusal = await expectRefused(409, () => owner.post(`/api/menu-admin/milks/${ids.milk('Whole')}/retired`).send({ retired: true }));
    expect(refusal.message).toMatch(/Whole is the milk .* comes with/);
  });
});

describe('groups of extras', () => {
  it('a required group on an item needs a choice in use; retiring a group takes it off the Counter', async () => {
    const latte = ids.item('Latte');
    await expectRefused(409, () => owner.post('/api/menu-admin/extra-groups').send({ name: 'Spice', selection: 'single', required: true, itemIds: [latte] }));
    const { id: group } = await create('extra-groups', { name: 'Spice', selection: 'single', required: false, itemIds: [latte] });
    const { id: cinnamon } = await create('extras', { groupId: group, name: 'Cinnamon', priceCents: 40, ingredients: [] });
    await owner
      .put(`/api/menu-admin/extra-groups/${group}`)
      .send({ name: 'Spice', selection: 'single', required: true, itemIds: [latte] })
      .expect(200);
    let menu = await counterMenu();
    expect(menu.items.find((i) => i.id === latte)!.extraGroupIds).toContain(group);
    expect(menu.extras.find((m) => m.id === cinnamon)).toMatchObject({ groupName: 'Spice', priceCents: 40 });
    await expectRefused(409, () => owner.post(`/api/menu-admin/extras/${cinnamon}/retired`).send({ retired: true }));

    await owner.post(`/api/menu-admin/extra-groups/${group}/retired`).send({ retired: true }).expect(200);
    menu = await counterMenu();
    expect(menu.extraGroups.map((g) => g.id)).not.toContain(group);
    expect(menu.extras.map((m) => m.id)).not.toContain(cinnamon);
    expect(menu.items.find((i) => i.id === latte)!.extraGroupIds).not.toContain(group);
    // a latte can be ordered without the retired required group
    await cashier
      .post('/api/orders')
      .send(orderBody('Sol Baines', [{ menuItemId: latte }]))
      .expect(201);
    await owner.post(`/api/menu-admin/extra-groups/${group}/retired`).send({ retired: false }).expect(200);
    expect((await counterMenu()).items.find((i) => i.id === latte)!.extraGroupIds).toContain(group);
    // …and off again, so the rest of the file's lattes need no spice
    await owner.put(`/api/menu-admin/extra-groups/${group}`).send({ name: 'Spice', selection: 'single', required: false, itemIds: [] }).expect(200);
  });

  it('an extra edited or retired keeps past orders as sold', async () => {
    const vanilla = ids.extra('Vanilla syrup');
    const sold = await cashier
      .post('/api/orders')
      .send(orderBody('Tam Rook', [{ menuItemId: ids.item('Latte'), extraIds: [vanilla] }]))
      .expect(201);
    await owner.put(`/api/menu-admin/extras/${vanilla}`).send({ groupId: syrupGroup, name: 'Vanilla bean syrup', priceCents: 90 }).expect(200);
    await owner.post(`/api/menu-admin/extras/${vanilla}/retired`).send({ retired: true }).expect(200);
    const past = (await cashier.get(`/api/orders/${sold.body.order.id}`)).body.order;
    expect(past.lines[0]).toMatchObject({ extras: ['Vanilla syrup'], priceCents: 540 + 60 });
    await owner.post(`/api/menu-admin/extras/${vanilla}/retired`).send({ retired: false }).expect(200);
    await expectInvalid(() => owner.post('/api/menu-admin/extras').send({ groupId: syrupGroup, name: 'Gold leaf', priceCents: 100_001 }), 'priceCents');
  });
});

describe("another café's ids", () => {
  it('are not found, in the path or in the body, and nothing changes', async () => {
    const n = north;
    const paths: [string, string, object?][] = [
      ['put', `/api/menu-admin/categories/${n.categoryId}`, { name: 'Mine now' }],
      ['post', `/api/menu-admin/categories/${n.categoryId}/retired`, { retired: true }],
      ['post', `/api/menu-admin/categories/${n.categoryId}/move`, { direction: 'down' }],
      ['put', `/api/menu-admin/items/${n.itemId}`, latteBody('Cortado')],
      ['post', `/api/menu-admin/items/${n.itemId}/retired`, { retired: true }],
      ['post', `/api/menu-admin/items/${n.itemId}/retired`, { retired: false }],
      ['post', `/api/menu-admin/sizes/${n.sizeId}/retired`, { retired: true }],
      ['post', `/api/menu-admin/sizes/${n.sizeId}/retired`, { retired: false }],
      ['put', `/api/menu-admin/milks/${n.milkId}`, { name: 'Whole', code: 'ZZ', upchargeCents: 0 }],
      ['post', `/api/menu-admin/milks/${n.milkId}/retired`, { retired: true }],
      ['put', `/api/menu-admin/extra-groups/${n.groupId}`, { name: 'Syrup', selection: 'multi', required: false }],
      ['post', `/api/menu-admin/extra-groups/${n.groupId}/retired`, { retired: true }],
      ['put', `/api/menu-admin/extras/${n.extraId}`, { groupId: syrupGroup, name: 'Vanilla', priceCents: 0 }],
      ['post', `/api/menu-admin/extras/${n.extraId}/move`, { direction: 'up' }],
      // their ids inside a body
      ['post', '/api/menu-admin/items', latteBody('Borrowed Category', { categoryId: n.categoryId })],
      ['post', '/api/menu-admin/items', latteBody('Borrowed Milk', { defaultMilkId: n.milkId })],
      ['post', '/api/menu-admin/items', latteBody('Borrowed Group', { extraGroupIds: [n.groupId] })],
      ['put', `/api/menu-admin/items/${ids.item('Latte')}`, latteBody('Latte', { sizes: [{ ...size(), id: n.sizeId }] })],
      ['post', '/api/menu-admin/extras', { groupId: n.groupId, name: 'Borrowed', priceCents: 0 }],
      ['post', '/api/menu-admin/extra-groups', { name: 'Borrowing', selection: 'multi', required: false, itemIds: [n.itemId] }],
    ];
    for (const [method, url, body] of paths) {
      const send = () => (method === 'put' ? owner.put(url).send(body) : body ? owner.post(url).send(body) : owner.post(url));
      await expectRefused(404, send);
    }
    // the north café's rows are as they were
    expect(await server.db('menu_items').where({ id: n.itemId }).first()).toMatchObject({ name: 'Cortado', retired_at: null });
  });
});

describe('live', () => {
  it('every command reaches an open Counter socket as menu.changed; a refused one sends nothing', async () => {
    const { client } = await connectAndResume(server.url, await server.cookieFor('cashier'));
    const { id } = await create('items', latteBody('Lantern Latte'));
    const changed = await client.next((m) => m.type === 'event' && m.event.type === 'menu.changed', 'menu.changed');
    const seq = (changed as { event: { seq: number } }).event.seq;
    const logged = await server.db('events').where({ seq }).first();
    expect(logged).toMatchObject({ type: 'menu.changed' });
    expect((await counterMenu()).items.map((i) => i.id)).toContain(id);

    await owner
      .post(`/api/menu-admin/milks/${ids.milk('Whole')}/retired`)
      .send({ retired: true })
      .expect(409);
    await owner.post(`/api/menu-admin/items/${id}/retired`).send({ retired: true }).expect(200);
    const next = await client.next((m) => m.type === 'event', 'the next event');
    // the refused retire sent nothing: the next event is the item's retire, one seq on
    expect(next).toMatchObject({ type: 'event', event: { type: 'menu.changed' } });
    expect((next as { event: { seq: number } }).event.seq).toBe(seq + 1);
  });
});
