// The location's settings through the real API: who may change them, what a bad value is
// answered with (and that nothing changed), switching allergen lists, the pitcher rules, and the
// menu.changed event that makes open screens reload.
import { demoCafeId } from '@seeds/demo-cafe';
import { afterAll, afterEach, beforeAll, describe, expect, it } from 'vitest';
import type { SettingsPage } from '@/domain/settings-schemas';
import type { BoardSnapshot, MenuView, ServerMessage } from '@/domain/types';
import { startTestServer, type TestServer } from '../support/test-server';
import { groupOfItsOwn } from '../support/cafe-groups';
import { closeAllSockets, connectAndResume } from '../realtime/ws-client';
import type { Agent } from './helpers';

let server: TestServer;
let owner: Agent;

beforeAll(async () => {
  server = await startTestServer();
  owner = await server.signIn('owner');
});
afterEach(() => closeAllSockets());
afterAll(() => server.close());

/** Everything a settings command may write: a refusal must leave all of it as it was. */
async function stored() {
  return {
    location: await server.db('locations').orderBy('id'),
    pitchers: await server.db('pitchers').orderBy('id'),
    milks: await server.db('milk_options').orderBy('id').select('id', 'ingredients'),
    extras: await server.db('extras').orderBy('id').select('id', 'ingredients'),
    items: await server.db('menu_items').orderBy('id').select('id', 'ingredients'),
    events: Number((await server.db('events').count({ n: '*' }).first())?.n),
  };
}

const page = async (): Promise<SettingsPage> => (await owner.get('/api/settings').expect(200)).body;
const fieldsOf = (body: { error: { details?: { path: string }[] } }) => (body.error.details ?? []).map((d) => d.path);

describe('GET /api/settings', () => {
  it('shows the owner the demo café as seeded, with its pitchers and the cup sizes on the menu', async () => {
    const p = await page();
    expect(p.settings).toEqual({
      name: 'Harbour & Hearth Coffee',
      timeZone: 'America/New_York',
      currency: 'USD',
      locale: 'en-US',
      taxMode: 'exclusive',
      taxRatePercent: '8.25', // stored as 8250 thousandths of a percent
      extraShotCents: 100,
      waitTargetSeconds: 240,
      pickupTimeoutSeconds: 600,
      volumeUnit: 'us_floz',
      temperatureUnit: 'F',
      jugWasteMl: 15,
      // the migration's defaults: common practice, from memory (see migrations/20261202170500_jug_plan.ts)
      jugMaxDrinks: 4,
      expansionFlatPct: 15,
      expansionSilkyPct: 25,
      expansionFoamyPct: 75,
      allergenList: 'US',
      receiptFooter: null,
      readyMail: true, // the migration's default (20261203130000_ready_mail.ts)
      // tips off by default; the suggestions the owner sees on turning them on (20261203150000_tips.ts)
      tipsOn: false,
      tipPercents: [10, 15, 20],
      tipCustom: true,
    });
    // minimum fill: a third of the capacity rounded up to 10 ml (common practice, from memory)
    expect(p.pitchers.map((x) => [x.capacityMl, x.fillLineMl, x.minFillMl])).toEqual([
      [350, 190, 120],
      [600, 330, 200],
      [950, 520, 320],
    ]);
    expect(p.cupSizes.map((c) => c.volumeMl)).toEqual(expect.arrayContaining([240, 350, 470]));
    expect(p.cupSizes.find((c) => c.volumeMl === 350)?.names).toContain('Regular');
  });
});

describe('who may change settings', () => {
  for (const login of ['cashier', 'barista', 'lead'] as const) {
    it(`a ${login} gets 403 on every settings route and nothing changes`, async () => {
      const agent = await server.signIn(login);
      const pitcherId = (await page()).pitchers[0].id;
      const before = await stored();
      const answers = [
        await agent.get('/api/settings'),
        await agent.put('/api/settings').send({ name: 'Taken over' }),
        await agent.post('/api/settings/pitchers').send({ capacityMl: 500, fillLineMl: 300 }),
        await agent.put(`/api/settings/pitchers/${pitcherId}`).send({ capacityMl: 500, fillLineMl: 300 }),
        await agent.delete(`/api/settings/pitchers/${pitcherId}`),
      ];
      for (const res of answers) {
        expect(res.status).toBe(403);
        expect(res.body.error.code).toBe('forbidden');
      }
      expect(await stored()).toEqual(before);
    });
  }
});

describe('PUT /api/settings refuses bad values with the field named, and changes nothing', () => {
  const bad: [string, Record<string, unknown>, string][] = [
    // IANA time zone database names; an offset is not a zone (no daylight saving time)
    ['an unknown time zone', { timeZone: 'Mars/Olympus_Mons' }, 'timeZone'],
    ['a UTC offset instead of a zone', { timeZone: '+05:00' }, 'timeZone'],
    // ISO 4217: three capital letters of a real currency, here with 2 decimal places (cents)
    ['a lower-case currency', { currency: 'usd' }, 'currency'],
    ['a made-up currency', { currency: 'XQZ' }, 'currency'],
    ['a currency without cents (ISO 4217: JPY has 0 decimals)', { currency: 'JPY' }, 'currency'],
    // BCP 47 (Intl.getCanonicalLocales): "en_US" is not a language tag
    ['an underscore locale', { locale: 'en_US' }, 'locale'],
    ['a locale nobody can format for', { locale: 'zz-QQ' }, 'locale'],
    ['a tax rate with 4 decimals', { taxRatePercent: '8.2555' }, 'taxRatePercent'],
    ['a tax rate over 100 %', { taxRatePercent: '100.5' }, 'taxRatePercent'],
    ['a negative tax rate', { taxRatePercent: -1 }, 'taxRatePercent'],
    ['an unknown tax mode', { taxMode: 'sometimes' }, 'taxMode'],
    ['a wait target under a minute', { waitTargetSeconds: 59 }, 'waitTargetSeconds'],
    ['a wait target over 30 minutes', { waitTargetSeconds: 1801 }, 'waitTargetSeconds'],
    ['a pickup timeout of 0', { pickupTimeoutSeconds: 0 }, 'pickupTimeoutSeconds'],
    ['an unknown volume unit', { volumeUnit: 'cups' }, 'volumeUnit'],
    ['the nutrition-label ounce', { volumeUnit: 'floz_30ml' }, 'volumeUnit'],
    ['a temperature unit of Kelvin', { temperatureUnit: 'K' }, 'temperatureUnit'],
    ['a receipt footer of 201 characters', { receiptFooter: 'x'.repeat(201) }, 'receiptFooter'],
    ['an empty café name', { name: '   ' }, 'name'],
    ['negative jug waste', { jugWasteMl: -5 }, 'jugWasteMl'],
    ['no drinks in a jug', { jugMaxDrinks: 0 }, 'jugMaxDrinks'],
    ['13 drinks in a jug', { jugMaxDrinks: 13 }, 'jugMaxDrinks'],
    ['milk that shrinks when steamed', { expansionFlatPct: -1 }, 'expansionFlatPct'],
    ['silky milk growing by half a percent', { expansionSilkyPct: 20.5 }, 'expansionSilkyPct'],
    ['foamy milk tripling', { expansionFoamyPct: 201 }, 'expansionFoamyPct'],
    ['an extra shot price in dollars', { extraShotCents: 1.5 }, 'extraShotCents'],
    ['the ready mail as a word', { readyMail: 'off' }, 'readyMail'],
    ['the ready mail as a number', { readyMail: 0 }, 'readyMail'],
  ];
  for (const [what, body, field] of bad) {
    it(what, async () => {
      const before = await stored();
      const res = await owner.put('/api/settings').send({ name: 'Should not be saved', ...body });
      expect(res.status).toBe(400);
      expect(res.body.error.code).toBe('validation_failed');
      expect(fieldsOf(res.body)).toEqual([field]);
      expect(await stored()).toEqual(before);
    });
  }

  it('an empty body, or only a key it does not know, is 400', async () => {
    const before = await stored();
    expect((await owner.put('/api/settings').send({})).status).toBe(400);
    const unknown = await owner.put('/api/settings').send({ name: 'X', volume_unit: 'ml' });
    expect(unknown.status).toBe(400);
    expect(await stored()).toEqual(before);
  });
});

describe('PUT /api/settings saves good values', () => {
  it('stores canonical names, the tax rate in thousandths of a percent, and the Counter menu shows them', async () => {
    const res = await owner.put('/api/settings').send({
      timeZone: 'europe/dublin', // IANA canonical spelling: Europe/Dublin
      locale: 'en-ie', // BCP 47 canonical casing: en-IE
      currency: 'EUR',
      taxRatePercent: '8.875', // 8.875 % = 8875 (DEVELOPERS.md convention)
      taxMode: 'inclusive',
      receiptFooter: '  Thank you — see you tomorrow  ',
    });
    expect(res.status).toBe(200);
    expect(res.body.settings).toMatchObject({
      timeZone: 'Europe/Dublin',
      locale: 'en-IE',
      currency: 'EUR',
      taxRatePercent: '8.875',
      taxMode: 'inclusive',
      receiptFooter: 'Thank you — see you tomorrow',
    });
    const row = await server
      .db('locations')
      .where({ id: await demoCafeId(server.db) })
      .first();
    expect(row.tax_rate_milli_pct).toBe(8875);

    const menu: MenuView = (await owner.get('/api/menu').expect(200)).body;
    expect(menu.location).toMatchObject({ currency: 'EUR', taxMode: 'inclusive', taxRateMilliPct: 8875, volumeUnit: 'us_floz', temperatureUnit: 'F' });

    // back as it was, and an empty footer clears it
    await owner
      .put('/api/settings')
      .send({ timeZone: 'America/New_York', locale: 'en-US', currency: 'USD', taxRatePercent: 8.25, taxMode: 'exclusive', receiptFooter: '' })
      .expect(200);
    expect(
      await server
        .db('locations')
        .where({ id: await demoCafeId(server.db) })
        .first(),
    ).toMatchObject({ tax_rate_milli_pct: 8250, receipt_footer: null, currency: 'USD' });
  });

  it('turns the ready mail off and on again; the Counter menu carries it, so the Counter says what the address is for', async () => {
    const stored = async () =>
      (
        await server
          .db('locations')
          .where({ id: await demoCafeId(server.db) })
          .first('ready_mail')
      ).ready_mail;
    const off = await owner.put('/api/settings').send({ readyMail: false });
    expect(off.status).toBe(200);
    expect(off.body.settings.readyMail).toBe(false);
    expect([false, 0]).toContain(await stored()); // a boolean on PostgreSQL, 0 on SQLite
    expect((await owner.get('/api/menu').expect(200)).body.location.readyMail).toBe(false);
    const on = await owner.put('/api/settings').send({ readyMail: true });
    expect(on.body.settings.readyMail).toBe(true);
    expect([true, 1]).toContain(await stored());
    expect((await owner.get('/api/menu').expect(200)).body.location.readyMail).toBe(true);
  });

  it('switches units both ways without touching a stored size', async () => {
    const sizes = await server.db('item_sizes').orderBy('id').select('id', 'volume_ml', 'milk_ml');
    await owner.put('/api/settings').send({ volumeUnit: 'ml', temperatureUnit: 'C' }).expect(200);
    expect((await owner.get('/api/menu')).body.location).toMatchObject({ volumeUnit: 'ml', temperatureUnit: 'C' });
    await owner.put('/api/settings').send({ volumeUnit: 'us_floz', temperatureUnit: 'F' }).expect(200);
    expect(await server.db('item_sizes').orderBy('id').select('id', 'volume_ml', 'milk_ml')).toEqual(sizes);
  });
});

describe('switching the allergen list', () => {
  // Finding: switching to the EU list left oat milk untagged. Regulation (EU) No 1169/2011 Annex II
  // item 1 names oats among the cereals containing gluten (docs/check-values.md, "Allergens"); the
  // allergens follow from what the milk is made of, so the switch needs no retagging step.
  it('US → EU: oat milk contains cereals containing gluten at once; back to US it contains none', async () => {
    const milk = async (name: string) => ((await owner.get('/api/menu').expect(200)).body as MenuView).milks.find((m) => m.name === name)!;
    const toEu = await owner.put('/api/settings').send({ allergenList: 'EU' });
    expect(toEu.status).toBe(200);
    expect((await milk('Oat')).allergens).toEqual(['cereals containing gluten']); // Annex II item 1
    const toUs = await owner.put('/api/settings').send({ allergenList: 'US' });
    expect(toUs.status).toBe(200);
    expect((await milk('Oat')).allergens).toEqual([]); // oats are not among FALCPA's nine
  });

  it('Settings shows what the other list changes before the owner switches: per entry, both lists, from the ingredients', async () => {
    const preview = (await page()).allergenSwitch;
    expect(preview).toMatchObject({ from: 'US', to: 'EU', toCheck: [] });
    const row = (name: string) => preview.changed.find((c) => c.name === name);
    // Annex II item 1 (oats); item 8 (almonds) against FALCPA's "tree nuts"; wheat is a cereal containing gluten
    expect(row('Oat')).toEqual({ kind: 'milk', id: expect.any(Number), name: 'Oat', ingredients: ['oats'], before: [], after: ['cereals containing gluten'] });
    expect(row('Almond')).toMatchObject({ kind: 'milk', before: ['tree nuts'], after: ['nuts'] });
    expect(row('Almond croissant')).toMatchObject({
      before: ['milk', 'eggs', 'tree nuts', 'wheat'],
      after: ['cereals containing gluten', 'eggs', 'milk', 'nuts'],
    });
    // milk is milk and coconut is in neither list (FDA Q&A Edition 5, January 2025): unchanged
    expect(row('Whole')).toBeUndefined();
    expect(row('Coconut')).toBeUndefined();
    expect(preview.unchanged).toBeGreaterThan(0);
  });

  it('a switch rewrites nothing stored but the list; the Counter menu reads the allergens under the new list', async () => {
    const before = await stored();
    const res = await owner.put('/api/settings').send({ allergenList: 'EU' });
    expect(res.status).toBe(200);
    expect((res.body as SettingsPage).allergenSwitch).toMatchObject({ from: 'EU', to: 'US' });
    const after = await stored();
    expect({ ...after, location: undefined, events: undefined }).toEqual({ ...before, location: undefined, events: undefined });
    expect(after.events).toBe(before.events + 1); // menu.changed: open Counters and Bars reload

    const menu: MenuView = (await owner.get('/api/menu').expect(200)).body;
    const milk = (name: string) => menu.milks.find((m) => m.name === name)!.allergens;
    expect(milk('Almond')).toEqual(['nuts']); // Annex II item 8
    expect(milk('Coconut')).toEqual([]); // not in Annex II
    expect(menu.items.find((i) => i.name === 'Butter croissant')).toMatchObject({
      ingredients: ["cow's milk", 'egg', 'wheat'],
      allergens: ['cereals containing gluten', 'eggs', 'milk'],
    });

    await owner.put('/api/settings').send({ allergenList: 'US' }).expect(200);
    const us: MenuView = (await owner.get('/api/menu').expect(200)).body;
    expect(us.milks.find((m) => m.name === 'Almond')!.allergens).toEqual(['tree nuts']); // §201(qq)
    expect(us.milks.find((m) => m.name === 'Coconut')!.allergens).toEqual([]); // FDA Edition 5: not a tree nut
  });

  it('the old retag field is gone: a body carrying it is 400 and changes nothing', async () => {
    const before = await stored();
    const res = await owner.put('/api/settings').send({ allergenList: 'EU', allergenRetag: { 'tree nuts': 'nuts' } });
    expect(res.status).toBe(400);
    expect(await stored()).toEqual(before);
  });
});

describe('pitchers', () => {
  it('adds, edits and removes a pitcher; bad sizes are 400 with the field named', async () => {
    const added = await owner.post('/api/settings/pitchers').send({ capacityMl: 1500, fillLineMl: 800 });
    expect(added.status).toBe(201);
    const big = (added.body as SettingsPage).pitchers.find((p) => p.capacityMl === 1500)!;
    expect(big.fillLineMl).toBe(800);
    // No minimum given: a third of 1500, rounded up to 10 ml (common practice, from memory).
    expect(big.minFillMl).toBe(500);

    const before = await stored();
    const refusals: [Record<string, unknown>, string][] = [
      [{ capacityMl: 149, fillLineMl: 100 }, 'capacityMl'],
      [{ capacityMl: 2001, fillLineMl: 1000 }, 'capacityMl'],
      [{ capacityMl: 600, fillLineMl: 0 }, 'fillLineMl'],
      [{ capacityMl: 600, fillLineMl: 601 }, 'fillLineMl'],
      [{ capacityMl: 600 }, 'fillLineMl'],
      [{ capacityMl: 600, fillLineMl: 330, minFillMl: 331 }, 'minFillMl'],
      [{ capacityMl: 600, fillLineMl: 330, minFillMl: 0 }, 'minFillMl'],
    ];
    for (const [body, field] of refusals) {
      for (const res of [await owner.post('/api/settings/pitchers').send(body), await owner.put(`/api/settings/pitchers/${big.id}`).send(body)]) {
        expect(res.status, JSON.stringify(body)).toBe(400);
        expect(fieldsOf(res.body)).toEqual([field]);
      }
    }
    expect(await stored()).toEqual(before);

    const edited = await owner.put(`/api/settings/pitchers/${big.id}`).send({ capacityMl: 1000, fillLineMl: 600, minFillMl: 250 });
    expect(edited.status).toBe(200);
    expect(await server.db('pitchers').where({ id: big.id }).first()).toMatchObject({ capacity_ml: 1000, fill_line_ml: 600, min_fill_ml: 250 });
    // A fill line below the usual minimum takes the fill line as its minimum: min(300, 340) = 300.
    await owner.put(`/api/settings/pitchers/${big.id}`).send({ capacityMl: 1000, fillLineMl: 300 }).expect(200);
    expect(await server.db('pitchers').where({ id: big.id }).first()).toMatchObject({ fill_line_ml: 300, min_fill_ml: 300 });

    const removed = await owner.delete(`/api/settings/pitchers/${big.id}`);
    expect(removed.status).toBe(200);
    expect((removed.body as SettingsPage).pitchers.some((p) => p.id === big.id)).toBe(false);
  });

  it('a pitcher that is not there, or is another café’s, is 404', async () => {
    const [{ id: otherCafe }] = await server
      .db('locations')
      .insert({
        name: 'Another café',
        created_at: '2026-03-01T00:00:00.000Z',
        group_id: await groupOfItsOwn(server.db, 'Another café', '2026-03-01T00:00:00.000Z'),
      })
      .returning('id');
    const [{ id: theirs }] = await server.db('pitchers').insert({ location_id: otherCafe, capacity_ml: 600, fill_line_ml: 330 }).returning('id');
    const before = await stored();
    expect((await owner.put(`/api/settings/pitchers/${theirs}`).send({ capacityMl: 350, fillLineMl: 190 })).status).toBe(404);
    expect((await owner.delete(`/api/settings/pitchers/${theirs}`)).status).toBe(404);
    expect((await owner.delete('/api/settings/pitchers/999999')).status).toBe(404);
    expect(await stored()).toEqual(before);
  });

  it('the last pitcher stays: removing it is 409 and it is still there', async () => {
    const mine = (await page()).pitchers;
    for (const p of mine.slice(1)) await owner.delete(`/api/settings/pitchers/${p.id}`).expect(200);
    const before = await stored();
    const res = await owner.delete(`/api/settings/pitchers/${mine[0].id}`);
    expect(res.status).toBe(409);
    expect(res.body.error.code).toBe('conflict');
    expect(await stored()).toEqual(before);
    expect((await page()).pitchers.map((p) => p.id)).toEqual([mine[0].id]);
  });
});

describe('a settings change reaches open screens', () => {
  it('emits menu.changed on a barista’s live socket, and the board snapshot then carries the new pitchers and target', async () => {
    const { client, hello } = await connectAndResume(server.url, await server.cookieFor('barista'));
    const saved = await owner.post('/api/settings/pitchers').send({ capacityMl: 750, fillLineMl: 420 }).expect(201);
    const event = await client.next((m) => m.type === 'event' && m.event.type === 'menu.changed', 'a menu.changed event');
    expect((event as Extract<ServerMessage, { type: 'event' }>).event.seq).toBeGreaterThan(hello.seq);

    await owner.put('/api/settings').send({ waitTargetSeconds: 300, jugWasteMl: 20 }).expect(200);
    await client.next((m) => m.type === 'event' && m.event.type === 'menu.changed', 'a second menu.changed event');

    const barista = await server.signIn('barista');
    const board: BoardSnapshot = (await barista.get('/api/tickets?view=board').expect(200)).body;
    expect(board.location.waitTargetSeconds).toBe(300);
    expect(board.location.jugRules.wasteMl).toBe(20);
    expect(board.location.jugRules.pitchers).toEqual(
      (saved.body as SettingsPage).pitchers
        .map(({ id: _id, ...pitcher }) => pitcher)
        .sort((a, b) => a.fillLineMl - b.fillLineMl || a.capacityMl - b.capacityMl),
    );
  });
});
