// The demo group: Harbour & Hearth Coffee, an invented quay-side café with invented staff, and
// Ropewalk Coffee Bar, the group's second café with the same menu and staff of its own.
// Loaded only into an empty database when SEED_DEMO is on.
import type { BarEffect } from '@/domain/drink-options';
import type { Knex } from 'knex';
import { hashPassword, verifyPassword } from '@server/auth/passwords';
import { adviseShot, doseRange, DEFAULT_SHOT_TARGETS } from '@/domain/dial-in';
import { addDays } from '@/domain/freshness';
import { businessDate } from '@/domain/business-date';
import { defaultMinFillMl } from '@/domain/settings-schemas';
import { inOrder, type Ingredient } from '@/domain/ingredients';

export const DEMO_PASSWORD = 'jugline-demo';

export const DEMO_STAFF = [
  { username: 'owner', name: 'Mara Quill', role: 'owner', email: 'mara@harbour-hearth.example' },
  { username: 'lead', name: 'Theo Brand', role: 'lead' },
  { username: 'cashier', name: 'Priya Onslow', role: 'cashier' },
  { username: 'barista', name: 'Jonah Reyes', role: 'barista' },
  { username: 'barista2', name: 'Ines Calder', role: 'barista' },
] as const;

/**
 * The group's second café, Ropewalk Coffee Bar: the same menu, its own few staff. Usernames are
 * unique across the whole installation, so its people carry the café's prefix. Mara, the owner,
 * holds both cafés through the group.
 */
export const SECOND_CAFE_NAME = 'Ropewalk Coffee Bar';
export const SECOND_CAFE_STAFF = [
  { username: 'rw-lead', name: 'Sunniva Oduya', role: 'lead' },
  { username: 'rw-cashier', name: 'Keir Tamsett', role: 'cashier' },
  { username: 'rw-barista', name: 'Lotte Varga', role: 'barista' },
] as const;

/** Everyone the demo seed signs in, in both cafés. */
export const DEMO_SIGN_INS = [...DEMO_STAFF, ...SECOND_CAFE_STAFF] as const;
type DemoUsername = (typeof DEMO_SIGN_INS)[number]['username'];

/** Demo PINs for "Switch person" on a shared terminal (none of them a run or a repeat). */
export const DEMO_PINS: Record<DemoUsername, string> = {
  owner: '8264',
  lead: '5139',
  cashier: '4072',
  barista: '6318',
  barista2: '7450',
  'rw-lead': '3916',
  'rw-cashier': '2857',
  'rw-barista': '6093',
};

/** The demo group's first café (the demo owner's own): the café every single-café test means. */
export async function demoCafeId(db: Knex | Knex.Transaction): Promise<number> {
  const { location_id } = await db('users').where({ username: 'owner' }).first('location_id');
  return location_id as number;
}

type SizeSeed = [name: string, volumeMl: number, priceCents: number, milkMl: number];
const SML = (prices: [number, number, number], milk: [number, number, number]): SizeSeed[] => [
  ['Small', 240, prices[0], milk[0]],
  ['Regular', 350, prices[1], milk[1]],
  ['Large', 470, prices[2], milk[2]],
];

interface ItemSeed {
  name: string;
  station: 'bar' | 'counter';
  shots?: number;
  milk?: boolean;
  texture?: 'flat' | 'silky' | 'foamy' | 'cold';
  priceCents?: number;
  sizes?: SizeSeed[];
  /** What it contains (src/domain/ingredients.ts); the allergens follow for the café's list. */
  ingredients?: Ingredient[];
}

const MENU: { category: string; items: ItemSeed[] }[] = [
  {
    category: 'Espresso',
    items: [
      { name: 'Espresso', station: 'bar', shots: 2, sizes: [['Double', 53, 320, 0]] },
      { name: 'Long black', station: 'bar', shots: 2, sizes: [['Regular', 240, 400, 0]] },
      { name: 'Flat white', station: 'bar', shots: 2, milk: true, texture: 'flat', sizes: [['Regular', 160, 460, 120]] },
      { name: 'Latte', station: 'bar', shots: 2, milk: true, texture: 'silky', sizes: SML([480, 540, 590], [180, 270, 360]) },
      { name: 'Cappuccino', station: 'bar', shots: 2, milk: true, texture: 'foamy', sizes: SML([480, 540, 590], [140, 210, 280]) },
      { name: 'Mocha', station: 'bar', shots: 2, milk: true, texture: 'silky', sizes: SML([520, 580, 630], [170, 250, 340]) },
      {
        name: 'Iced latte',
        station: 'bar',
        shots: 2,
        milk: true,
        texture: 'cold',
        sizes: [
          ['Regular', 350, 540, 200],
          ['Large', 470, 590, 280],
        ],
      },
    ],
  },
  {
    category: 'Tea & brew',
    items: [
      { name: 'Chai latte', station: 'bar', shots: 0, milk: true, texture: 'silky', sizes: SML([490, 550, 600], [200, 290, 380]) },
      {
        name: 'Batch brew',
        station: 'bar',
        shots: 0,
        sizes: [
          ['Small', 240, 350, 0],
          ['Regular', 350, 400, 0],
        ],
      },
    ],
  },
  {
    category: 'Food',
    items: [
      { name: 'Butter croissant', station: 'counter', priceCents: 425, ingredients: ['wheat', "cow's milk", 'egg'] },
      { name: 'Almond croissant', station: 'counter', priceCents: 495, ingredients: ['almond', 'wheat', "cow's milk", 'egg'] },
      { name: 'Banana bread', station: 'counter', priceCents: 395, ingredients: ['wheat', 'egg', "cow's milk"] },
      { name: 'Bottled water', station: 'counter', priceCents: 250 },
    ],
  },
];

// What each milk is made of. The allergens follow for the café's list: on the US list oat and
// coconut milk contain none (oats are not a US major allergen; coconut is not a tree nut under
// FDA guidance of January 2025); on the EU list oat milk contains a cereal containing gluten.
const MILKS: { name: string; code: string; upcharge: number; ingredients: Ingredient[] }[] = [
  { name: 'Whole', code: 'WH', upcharge: 0, ingredients: ["cow's milk"] },
  { name: 'Skim', code: 'SK', upcharge: 0, ingredients: ["cow's milk"] },
  { name: 'Oat', code: 'OA', upcharge: 70, ingredients: ['oats'] },
  { name: 'Soy', code: 'SO', upcharge: 70, ingredients: ['soy'] },
  { name: 'Almond', code: 'AL', upcharge: 80, ingredients: ['almond'] },
  { name: 'Coconut', code: 'CO', upcharge: 80, ingredients: ['coconut'] },
];

/** The café's cups by what they hold (invented stock; the menu editor can change them). */
function cupFor(volumeMl: number, cold: boolean): string | null {
  const cups: Record<number, string> = { 53: 'Demitasse', 160: 'Tulip cup', 240: '8 oz cup', 350: '12 oz cup', 470: '16 oz cup' };
  const cup = cups[volumeMl];
  return cup && cold ? cup.replace('cup', 'cold cup') : (cup ?? null);
}

const GROUPS = [
  { name: 'Coffee', selection: 'multi' },
  { name: 'Syrup', selection: 'multi' },
  { name: 'Temperature', selection: 'single' },
  { name: 'Sweetness', selection: 'single' },
  // drink options the bar honours (src/domain/drink-options.ts): one foam at a time
  { name: 'Foam', selection: 'single' },
  { name: 'Ice', selection: 'single' },
] as const;
type GroupName = (typeof GROUPS)[number]['name'];

// Hazelnut syrup records no hazelnut: the owner adds it if their syrup contains nut.
const EXTRAS: { group: GroupName; name: string; price: number; barEffect?: BarEffect }[] = [
  { group: 'Coffee', name: 'Decaf', price: 50 },
  { group: 'Coffee', name: 'Half-caf', price: 50 },
  { group: 'Syrup', name: 'Vanilla syrup', price: 60 },
  { group: 'Syrup', name: 'Caramel syrup', price: 60 },
  { group: 'Syrup', name: 'Hazelnut syrup', price: 60 },
  { group: 'Temperature', name: 'Extra hot', price: 0 },
  { group: 'Temperature', name: 'Kids’ temp', price: 0, barEffect: 'kids_temp' },
  { group: 'Sweetness', name: 'Half sweet', price: 0 },
  { group: 'Foam', name: 'Wet', price: 0, barEffect: 'wet' },
  { group: 'Foam', name: 'More foam', price: 0, barEffect: 'more_foam' },
  { group: 'Foam', name: 'Dry', price: 0, barEffect: 'dry' },
  { group: 'Ice', name: 'Light ice', price: 0 },
  { group: 'Ice', name: 'No ice', price: 0 },
];

/** Which extras each drink offers. */
const OFFERED: Record<string, GroupName[]> = {
  Espresso: ['Coffee', 'Syrup'],
  'Long black': ['Coffee', 'Syrup', 'Temperature'],
  'Flat white': ['Coffee', 'Syrup', 'Temperature', 'Sweetness', 'Foam'],
  Latte: ['Coffee', 'Syrup', 'Temperature', 'Sweetness', 'Foam'],
  Cappuccino: ['Coffee', 'Syrup', 'Temperature', 'Sweetness', 'Foam'],
  Mocha: ['Coffee', 'Syrup', 'Temperature', 'Sweetness', 'Foam'],
  'Iced latte': ['Coffee', 'Syrup', 'Sweetness', 'Ice'],
  'Chai latte': ['Syrup', 'Temperature', 'Sweetness', 'Foam'],
};

export async function isEmpty(db: Knex | Knex.Transaction): Promise<boolean> {
  const row = await db('locations').count<{ n: number }>({ n: '*' }).first();
  return Number(row?.n ?? 0) === 0;
}

/** True while the demo owner can still sign in with the demo password. */
export async function demoPasswordStillSet(db: Knex): Promise<boolean> {
  const owner = await db('users').where({ username: 'owner' }).first('password_hash');
  return owner ? verifyPassword(DEMO_PASSWORD, owner.password_hash) : false;
}

export async function seedDemoCafe(db: Knex, now = new Date(), passwordCost?: number): Promise<number> {
  return (await seedDemo(db, now, passwordCost, false))!;
}

/**
 * The demo café, only into an empty database: the emptiness is checked inside the seeding
 * transaction, so of two processes seeding at once one finds the other's café (on SQLite the
 * second may instead fail busy and try again: server/db/migrate.ts). Null when a café was there.
 */
export async function seedDemoCafeIfEmpty(db: Knex, now = new Date(), hash: Hasher = hashPassword): Promise<number | null> {
  // Most starts find a café: asked first, so they hash nothing (sixteen bcrypt hashes, about two
  // seconds before the server could answer). Asked again inside the transaction, which decides.
  if (!(await isEmpty(db))) return null;
  return seedDemo(db, now, undefined, true, hash);
}

interface CafeSeed {
  name: string;
  staff: readonly { username: DemoUsername; name: string; role: 'owner' | 'lead' | 'cashier' | 'barista'; email?: string }[];
  /** Who pulled this morning's dial-in shots. */
  barista: DemoUsername;
}

const CAFES: CafeSeed[] = [
  { name: 'Harbour & Hearth Coffee', staff: DEMO_STAFF, barista: 'barista' },
  { name: SECOND_CAFE_NAME, staff: SECOND_CAFE_STAFF, barista: 'rw-barista' },
];

type Hasher = (password: string, cost?: number) => Promise<string>;

async function seedDemo(db: Knex, now: Date, passwordCost: number | undefined, onlyIfEmpty: boolean, hash: Hasher = hashPassword): Promise<number | null> {
  const createdAt = now.toISOString();
  const hashes = new Map(
    await Promise.all(
      DEMO_SIGN_INS.map(
        async (s) => [s.username, { password: await hash(DEMO_PASSWORD, passwordCost), pin: await hash(DEMO_PINS[s.username], passwordCost) }] as const,
      ),
    ),
  );
  return db.transaction(async (trx) => {
    if (onlyIfEmpty && !(await isEmpty(trx))) return null;
    const [{ id: groupId }] = await trx('cafe_groups').insert({ name: CAFES[0].name, created_at: createdAt }).returning('id');
    const ids: number[] = [];
    for (const cafe of CAFES) ids.push(await seedCafe(trx, groupId, cafe, hashes, now));
    return ids[0];
  });
}

async function seedCafe(
  trx: Knex.Transaction,
  groupId: number,
  cafe: CafeSeed,
  hashes: Map<DemoUsername, { password: string; pin: string }>,
  now: Date,
): Promise<number> {
  const createdAt = now.toISOString();
  const [{ id: locationId }] = await trx('locations')
    .insert({
      group_id: groupId,
      name: cafe.name,
      time_zone: 'America/New_York',
      currency: 'USD',
      locale: 'en-US',
      tax_mode: 'exclusive',
      tax_rate_milli_pct: 8250,
      extra_shot_cents: 100,
      wait_target_seconds: 240,
      pickup_timeout_seconds: 600,
      allergen_list: 'US',
      // a US café: cup sizes in ounces, temperatures in °F (stored sizes stay in ml)
      volume_unit: 'us_floz',
      temperature_unit: 'F',
      created_at: createdAt,
    })
    .returning('id');

  await trx('users').insert(
    cafe.staff.map((s) => ({
      location_id: locationId,
      group_id: groupId,
      username: s.username,
      name: s.name,
      role: s.role,
      email: s.email ?? null,
      password_hash: hashes.get(s.username)!.password,
      pin_hash: hashes.get(s.username)!.pin,
      created_at: createdAt,
    })),
  );

  await trx('pitchers').insert(
    [
      [350, 190],
      [600, 330],
      [950, 520],
    ].map(([capacity_ml, fill_line_ml]) => ({
      location_id: locationId,
      capacity_ml,
      fill_line_ml,
      min_fill_ml: defaultMinFillMl(capacity_ml, fill_line_ml),
    })),
  );

  const milkIds: number[] = [];
  for (const [i, m] of MILKS.entries()) {
    const [{ id }] = await trx('milk_options')
      .insert({
        location_id: locationId,
        name: m.name,
        code: m.code,
        upcharge_cents: m.upcharge,
        ingredients: JSON.stringify(inOrder(m.ingredients)),
        sort: i,
      })
      .returning('id');
    milkIds.push(id);
  }

  const groupIds = new Map<GroupName, number>();
  for (const [i, g] of GROUPS.entries()) {
    const [{ id }] = await trx('extra_groups')
      .insert({ location_id: locationId, name: g.name, selection: g.selection, required: false, sort: i })
      .returning('id');
    groupIds.set(g.name, id);
  }

  for (const [ci, cat] of MENU.entries()) {
    const [{ id: categoryId }] = await trx('menu_categories').insert({ location_id: locationId, name: cat.category, sort: ci }).returning('id');
    for (const [ii, item] of cat.items.entries()) {
      const [{ id: itemId }] = await trx('menu_items')
        .insert({
          category_id: categoryId,
          name: item.name,
          station: item.station,
          price_cents: item.priceCents ?? null,
          shots: item.shots ?? 0,
          takes_milk: item.milk ?? false,
          default_milk_id: item.milk ? milkIds[0] : null,
          texture: item.texture ?? null,
          ingredients: JSON.stringify(inOrder(item.ingredients ?? [])),
          sort: ii,
        })
        .returning('id');
      for (const group of OFFERED[item.name] ?? []) {
        await trx('item_extra_groups').insert({ item_id: itemId, group_id: groupIds.get(group) });
      }
      const sizes = item.sizes ?? [];
      const defaultIndex = sizes.findIndex(([name]) => name === 'Regular');
      for (const [si, [name, volumeMl, priceCents, milkMl]] of sizes.entries()) {
        await trx('item_sizes').insert({
          item_id: itemId,
          name,
          volume_ml: volumeMl,
          price_cents: priceCents,
          shots: item.shots ?? 0,
          milk_ml: milkMl,
          // the house recipe: 19 g in, 38 g out for a double (19 × shots / 2)
          dose_dg: (item.shots ?? 0) * 95,
          yield_dg: (item.shots ?? 0) * 190,
          is_default: si === (defaultIndex >= 0 ? defaultIndex : 0),
          sort: si,
          cup: cupFor(volumeMl, item.texture === 'cold'),
        });
      }
    }
  }

  await trx('extras').insert(
    EXTRAS.map((m, i) => ({
      location_id: locationId,
      group_id: groupIds.get(m.group),
      name: m.name,
      price_cents: m.price,
      bar_effect: m.barEffect ?? null,
      sort: i,
    })),
  );
  await seedBeans(trx, locationId, cafe.barista, now);
  return locationId;
}

// Bean lots of our own invention (names, roasters), dated back from the seed time: a house blend in
// its best days on the espresso grinder, a single origin still resting on the shelf, and a decaf
// that is fading. Two test shots from this morning dial in the house blend.
const BEAN_LOTS = [
  {
    name: 'Breakwater House Blend',
    roaster: 'Kestrel & Vane Roasters',
    origin: 'Brazil and Colombia; cocoa, toffee',
    roastedDaysAgo: 12,
    receivedDaysAgo: 10,
    grams: 5000,
    hopper: 'espresso',
  },
  {
    name: 'Guji Hillside',
    roaster: 'Marlow Street Roastworks',
    origin: 'Ethiopia, washed; jasmine, peach',
    roastedDaysAgo: 3,
    receivedDaysAgo: 1,
    grams: 1000,
    hopper: 'shelf',
  },
  {
    name: 'Night Harbour Decaf',
    roaster: 'Kestrel & Vane Roasters',
    origin: 'Colombia, sugarcane decaf; brown sugar',
    roastedDaysAgo: 34,
    receivedDaysAgo: 31,
    grams: 1000,
    hopper: 'decaf',
  },
] as const;

const DIAL_IN_SHOTS = [
  { minutesAgo: 95, grind: '2.6', doseDg: 190, yieldDg: 440, timeDs: 210, note: 'thin and sour' },
  { minutesAgo: 88, grind: '2.4', doseDg: 190, yieldDg: 385, timeDs: 270, note: 'sweet, chocolate' },
];

async function seedBeans(trx: Knex.Transaction, locationId: number, baristaUsername: DemoUsername, now: Date) {
  const { time_zone: timeZone } = await trx('locations').where({ id: locationId }).first('time_zone');
  const today = businessDate(now, timeZone);
  const at = now.toISOString();
  const lotIds: number[] = [];
  for (const lot of BEAN_LOTS) {
    const [{ id }] = await trx('bean_lots')
      .insert({
        location_id: locationId,
        name: lot.name,
        roaster: lot.roaster,
        origin: lot.origin,
        roast_date: addDays(today, -lot.roastedDaysAgo),
        received_date: addDays(today, -lot.receivedDaysAgo),
        received_g: lot.grams,
        hopper: lot.hopper,
        created_at: at,
        updated_at: at,
      })
      .returning('id');
    lotIds.push(id);
  }
  const { id: barista } = await trx('users').where({ username: baristaUsername }).first('id');
  // the seed's house recipe is 19 g for a double, so the dose range is 18–20 g
  const window = { ...doseRange(190), ...DEFAULT_SHOT_TARGETS };
  for (const s of DIAL_IN_SHOTS) {
    const pulledAt = new Date(now.getTime() - s.minutesAgo * 60_000).toISOString();
    const advice = adviseShot(s, window);
    const [{ id }] = await trx('dial_in_shots')
      .insert({
        location_id: locationId,
        lot_id: lotIds[0],
        grind: s.grind,
        dose_dg: s.doseDg,
        yield_dg: s.yieldDg,
        time_ds: s.timeDs,
        advice: advice.code,
        good: advice.good,
        taste_note: s.note,
        pulled_by: barista,
        pulled_at: pulledAt,
      })
      .returning('id');
    await trx('bean_usage').insert({ lot_id: lotIds[0], source: 'dial_in', shot_id: id, dose_dg: s.doseDg, used_at: pulledAt });
  }
}
