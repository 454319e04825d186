// The morning rush as the Bar's staff live it: seven milks queued on a café that reads US fl oz.
// Every lane holding tickets shows at 1920 px (and at 1366 / 1024 the lanes off screen are named,
// with their tickets and the oldest age); at 390 px the lanes stack. Lanes stay put, each lane is
// oldest first, bump keys sit only on cards in sight and keep their number, each card says Here or
// To go, its jug and its build in large type, an allergy changes the whole card. And the grinder
// line follows a new good dial-in shot live. On a server of its own: it changes the menu and units.
import type { Browser, Page } from '@playwright/test';
import { apiAs, order, type Line } from './bar-orders';
import { errorsOf, expect, pageAs, signIn, test, watchForErrors, type Login } from './fixtures';
import { OwnServer } from './own-server';
import { shot } from './shots';

let own: OwnServer;
test.beforeAll(async () => {
  own = await OwnServer.create('bar-rush');
  await own.start();
});
test.afterAll(() => own?.dispose());

async function pageOn(browser: Browser, login: Login, at: string) {
  const page = await pageAs(browser, login, at, { width: 1920, height: 1080 }, own.baseURL);
  await expect(page.getByRole('status').filter({ hasText: 'Live' })).toBeVisible();
  return page;
}

const laneOf = (page: Page, milk: string) => page.getByTestId('lane').filter({ has: page.getByRole('heading', { name: milk, exact: true }) });
const cardOf = (page: Page, name: string) => page.getByTestId('drink-card').filter({ hasText: name });
const px = (page: Page, selector: string) =>
  page
    .locator(selector)
    .first()
    .evaluate((el) => parseFloat(getComputedStyle(el).fontSize));

/** Each card with a bump key: its key, and whether it is in sight (inside the window and its lane's card box). */
const keyedCards = (page: Page) =>
  page.evaluate(() =>
    [...document.querySelectorAll<HTMLElement>('[data-testid="drink-card"]')]
      .filter((c) => c.querySelector('kbd'))
      .map((c) => {
        const r = c.getBoundingClientRect();
        const box = c.closest('[data-testid="lane-cards"]')!.getBoundingClientRect();
        const mid = r.top + Math.min(r.height, 80) / 2; // the card's head, where its key is
        return {
          id: c.dataset.drinkId!,
          key: c.querySelector('kbd')!.textContent!.trim(),
          inSight: r.left >= 0 && r.right <= window.innerWidth && mid >= box.top && mid <= Math.min(box.bottom, window.innerHeight),
        };
      }),
  );

/** Lanes not wholly inside the window, by name. */
const lanesOffScreen = (page: Page) =>
  page.evaluate(() =>
    [...document.querySelectorAll<HTMLElement>('[data-testid="lane"]')]
      .filter((l) => {
        const r = l.getBoundingClientRect();
        return r.left < 0 || r.right > window.innerWidth;
      })
      .map((l) => l.dataset.lane!),
  );

test('a rush with seven milks: every lane in sight, oldest first, keys that stay, Here / To go, fl oz', async ({ browser }) => {
  test.setTimeout(240_000);
  const owner = await apiAs(own.baseURL, 'owner');
  const milk = await owner.post('/api/menu-admin/milks', { data: { name: 'Lactose-free', code: 'LF', upchargeCents: 0, ingredients: ["cow's milk"] } });
  expect(milk.status(), await milk.text()).toBe(201);
  expect((await owner.put('/api/settings', { data: { volumeUnit: 'us_floz' } })).status()).toBe(200);

  const bar = await pageOn(browser, 'barista', '/bar');
  const cashier = await apiAs(own.baseURL, 'cashier');
  const here = { service: 'dine_in' };
  const rush: [string, Line[], object?][] = [
    ['Ama Osei', [{ item: 'Latte', milk: 'Whole', size: 'Large', extras: ['Decaf', 'Vanilla syrup'] }], here],
    ['Bo Lind', [{ item: 'Flat white', milk: 'Coconut' }]],
    ['Cy Diaz', [{ item: 'Chai latte', milk: 'Whole' }]],
    ['Dee Park', [{ item: 'Cappuccino', milk: 'Oat' }], here],
    ['Eli Moss', [{ item: 'Latte', milk: 'Soy' }], { allergens: ['peanuts'] }],
    ['Fay Nunez', [{ item: 'Latte', milk: 'Almond' }]],
    ['Gil Ortiz', [{ item: 'Latte', milk: 'Skim' }]],
    ['Hal Pike', [{ item: 'Latte', milk: 'Lactose-free' }]],
    ['Ida Ruiz', [{ item: 'Espresso' }]],
    [
      'Jo Quist',
      [
        { item: 'Flat white', milk: 'Whole' },
        { item: 'Latte', milk: 'Oat' },
      ],
    ],
    ['Kit Roan', [{ item: 'Cappuccino', milk: 'Whole' }]],
    ['Lu Sato', [{ item: 'Latte', milk: 'Oat', size: 'Large' }]],
    ['Max Tull', [{ item: 'Mocha', milk: 'Whole' }]],
    ['Ned Ueda', [{ item: 'Latte', milk: 'Whole', size: 'Small' }]],
    ['Oli Vann', [{ item: 'Cappuccino', milk: 'Oat' }]],
    ['Pam West', [{ item: 'Flat white', milk: 'Whole' }]],
    ['Quin Yost', [{ item: 'Latte', milk: 'Whole' }]],
  ];
  const numbers = new Map<string, number>();
  const ids = new Map<string, number>();
  for (const [name, items, extra] of rush) {
    const placed = await order(cashier, name, items, extra);
    numbers.set(name, placed.number);
    ids.set(name, placed.id);
  }
  // the newest: a single-shot latte, which used to take the top of the lane
  numbers.set('Uma Vo', (await order(cashier, 'Uma Vo', [{ item: 'Latte', milk: 'Whole' }])).number);
  const menu = await (await cashier.get('/api/menu')).json();
  expect(menu.location.volumeUnit).toBe('us_floz');
  // a lead rushes the coconut ticket
  const lead = await apiAs(own.baseURL, 'lead');
  const bo = await (await lead.get('/api/tickets')).json();
  const boId = bo.tickets.find((t: { customerName: string }) => t.customerName === 'Bo Lind').id;
  expect((await lead.post(`/api/tickets/${boId}/rush`)).status()).toBe(200);
  await expect(cardOf(bar, 'Uma Vo')).toHaveCount(1);
  await expect(cardOf(bar, 'Bo Lind')).toContainText('RUSH');

  // 1. Every lane holding tickets is in sight at 1920 px: seven milks and the no-milk lane.
  await expect(bar.getByTestId('lane')).toHaveCount(8);
  expect(await lanesOffScreen(bar)).toEqual([]);
  await expect(cardOf(bar, 'Bo Lind')).toBeInViewport();
  await expect(bar.getByTestId('lanes-hidden')).toHaveCount(0);

  // 4. The lanes keep the menu's milk order, no milk last; each lane is oldest first.
  const laneNames = await bar.getByTestId('lane').evaluateAll((ls) => ls.map((l) => (l as HTMLElement).dataset.lane));
  expect(laneNames).toEqual(['Whole', 'Skim', 'Oat', 'Soy', 'Almond', 'Coconut', 'Lactose-free', 'No milk']);
  const wholeTickets = await laneOf(bar, 'Whole')
    .getByTestId('drink-card')
    .evaluateAll((cs) => cs.map((c) => Number((c as HTMLElement).dataset.ticket)));
  expect(wholeTickets).toEqual([...wholeTickets].sort((a, b) => a - b));
  expect(wholeTickets[0]).toBe(numbers.get('Ama Osei'));
  expect(wholeTickets.at(-1)).toBe(numbers.get('Uma Vo'));

  // 5. Keys only on cards in sight, each once; a bump leaves every other card on its key.
  const keys = await keyedCards(bar);
  expect(keys.length).toBeGreaterThan(0);
  expect(keys.length).toBeLessThanOrEqual(9);
  expect(keys.every((k) => k.inSight)).toBe(true);
  expect(new Set(keys.map((k) => k.key)).size).toBe(keys.length);
  const ama = cardOf(bar, 'Ama Osei');
  const amaKey = (await ama.locator('kbd').textContent())!.trim();
  await bar.keyboard.press(amaKey);
  await expect(ama).toHaveCount(0);
  const after = await keyedCards(bar);
  expect(after.every((k) => k.inSight)).toBe(true);
  for (const k of keys) {
    const still = after.find((a) => a.id === k.id);
    if (still) expect(still.key, `card ${k.id} kept its key`).toBe(k.key);
  }
  await order(cashier, 'Ama Osei', [{ item: 'Latte', milk: 'Whole', size: 'Large', extras: ['Decaf', 'Vanilla syrup'] }], here);
  await expect(cardOf(bar, 'Ama Osei')).toHaveCount(1);

  // 8. Here or To go, in words and a shape.
  const dee = cardOf(bar, 'Dee Park');
  await expect(dee.getByTestId('service')).toHaveText('Here · mug');
  await expect(dee.getByTestId('service').locator('svg')).toHaveCount(1);
  await expect(cardOf(bar, 'Bo Lind').getByTestId('service')).toHaveText('To go · cup');

  // 7, 14. The build in the café's unit, large and full contrast: Large is 470 ml → 16 oz.
  const build = cardOf(bar, 'Ama Osei').getByTestId('build');
  await expect(build).toContainText('Large 16 oz');
  await expect(build).toContainText('2 shots');
  await expect(build).toContainText('Decaf');
  await expect(build).toContainText('Vanilla syrup');
  await expect(bar.locator('main')).not.toContainText(/\d ml\b/);
  expect(await px(bar, '[data-testid="build"]')).toBeGreaterThanOrEqual(28);
  expect(
    await bar
      .getByTestId('build')
      .first()
      .evaluate((el) => getComputedStyle(el).color),
  ).toBe('rgb(246, 234, 216)'); // crema-100
  expect(await px(bar, '[data-testid="who"]')).toBeGreaterThanOrEqual(20);

  // 11. The jug names the drinks it serves; each drink names its jug. Fill the pitcher, pour cups.
  const oat = laneOf(bar, 'Oat');
  const jug1 = oat.getByTestId('jug').first();
  await expect(jug1).toContainText(/oz pitcher · fill to \d+(\.5)? oz/);
  await expect(jug1).toContainText(`#${numbers.get('Dee Park')} Dee`);
  await expect(jug1).not.toContainText('steam');
  await expect(cardOf(bar, 'Dee Park')).toContainText('Jug 1');
  const startJug = oat.getByRole('button', { name: 'Start jug 1' });
  expect(await startJug.evaluate((el) => parseFloat(getComputedStyle(el).fontSize))).toBeGreaterThanOrEqual(24);
  expect((await startJug.boundingBox())!.height).toBeGreaterThanOrEqual(64);

  // 14. An allergy changes the whole card: the word, the allergen, the caution.
  const eli = cardOf(bar, 'Eli Moss');
  await expect(eli).toHaveAttribute('data-allergy', 'true');
  await expect(eli.getByTestId('allergy')).toContainText('ALLERGY');
  await expect(eli.getByTestId('allergy')).toContainText('PEANUTS');
  await expect(eli).toContainText(/check the recipe and ingredients/i);
  await expect(eli).toContainText(/local allergen rules/i);
  await bar.screenshot(shot(`bar-rush-1920`));

  // 1. Narrower screens: a lane off screen is named in the signpost with its tickets and oldest age.
  for (const width of [1366, 1024]) {
    await bar.setViewportSize({ width, height: 900 });
    const sign = bar.getByTestId('lanes-hidden');
    await expect(sign).toBeVisible();
    await expect(sign).toBeInViewport({ ratio: 1 });
    await expect(sign).toContainText(/→ \d+ more lanes?/);
    await expect(sign).toContainText(/\d+ drinks?/);
    await expect(sign).toContainText(/oldest \+?\d+:\d\d/);
    const off = await lanesOffScreen(bar);
    expect(off.length).toBeGreaterThan(0);
    for (const name of off) await expect(sign).toContainText(name);
    expect((await keyedCards(bar)).every((k) => k.inSight)).toBe(true);
    await bar.screenshot(shot(`bar-rush-${width}`));
  }

  // 1. Phone width: nothing scrolls sideways; the lanes stack.
  await bar.setViewportSize({ width: 390, height: 844 });
  await expect(bar.getByTestId('lanes-hidden')).toHaveCount(0);
  expect(await bar.evaluate(() => document.documentElement.scrollWidth)).toBeLessThanOrEqual(390);
  const boxes = await bar
    .getByTestId('lane')
    .evaluateAll((ls) => ls.map((l) => l.getBoundingClientRect()).map((r) => ({ left: r.left, right: r.right, top: r.top })));
  for (const b of boxes) {
    expect(b.left).toBeGreaterThanOrEqual(0);
    expect(b.right).toBeLessThanOrEqual(390);
  }
  for (let i = 1; i < boxes.length; i++) expect(boxes[i].top).toBeGreaterThan(boxes[i - 1].top);
  await bar.screenshot(shot(`bar-rush-390`));
  await bar.evaluate(() => document.querySelector('[data-lane="Soy"]')!.scrollIntoView());
  await bar.screenshot(shot(`bar-rush-390-allergy`));

  // 8. The cup labels say it too, in words and a shape.
  const labels = await (await browser.newContext({ baseURL: own.baseURL, viewport: { width: 1024, height: 768 } })).newPage();
  watchForErrors(labels);
  await signIn(labels, 'cashier', `/labels/${ids.get('Dee Park')}`);
  await labels.waitForURL('**/labels/*');
  for (const [name, words] of [
    ['Dee Park', 'Here · mug'],
    ['Bo Lind', 'To go · cup'],
  ]) {
    await labels.goto(`/labels/${ids.get(name)}`);
    await expect(labels.getByTestId('cup-label').first().getByTestId('service')).toHaveText(words);
    await expect(labels.getByTestId('cup-label').first().getByTestId('service').locator('svg')).toHaveCount(1);
  }
  await labels.screenshot(shot(`cup-labels-here`));

  for (const api of [owner, cashier, lead]) await api.dispose();
  for (const page of [bar, labels]) expect(errorsOf(page)).toEqual([]);
});

test('the grinder line on the Bar follows a new good dial-in shot, live', async ({ browser }) => {
  const bar = await pageOn(browser, 'barista', '/bar');
  const strip = bar.getByTestId('grinder-espresso');
  await expect(strip).toBeVisible();
  await expect(strip).not.toContainText('grind 2.2 ');
  const barista = await apiAs(own.baseURL, 'barista2');
  const { espressoLotId } = await (await barista.get('/api/dial-in')).json();
  // 18 g → 36 g in 28 s: 1:2.0 inside 25–30 s, a good shot (the café's window)
  const pulled = await barista.post('/api/dial-in/shots', { data: { lotId: espressoLotId, grind: '2.2', doseG: 18, yieldG: 36, timeS: 28 } });
  expect(pulled.status(), await pulled.text()).toBe(201);
  expect((await pulled.json()).advice.good).toBe(true);
  await expect(strip).toContainText('grind 2.2 · 18.0 g → 36.0 g · 28 s');
  await barista.dispose();
  expect(errorsOf(bar)).toEqual([]);
});
