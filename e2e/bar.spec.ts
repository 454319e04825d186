// The Bar at work: two screens kept in step, jug plans, keyboard bumps, the allergy read before a
// bump, Pickup, a rush, and a screen that rides out a server restart.
import { request as apiRequest, type Page } from '@playwright/test';
import { cashierApi, order } from './bar-orders';
import { DEMO_PASSWORD, errorsOf, expect, pageAs, signIn, test } from './fixtures';
import { shot } from './shots';
import { expectedWhileDown, OwnServer, ownServerFor } from './own-server';

const cardsOf = (page: Page, name: string) => page.getByTestId('drink-card').filter({ hasText: name });
const live = (page: Page) => expect(page.getByRole('status').filter({ hasText: 'Live' })).toBeVisible();

test.describe('two bar screens at work', () => {
  // a board with only this test's tickets: key numbers and lane order are exact
  const own = ownServerFor('bar-two-screens');

  test('two bar screens: jug plan, keyboard bump, allergy read, Pickup, rush', async ({ browser }) => {
    const bar1 = await pageAs(browser, 'barista', '/bar', undefined, own.baseURL);
    const bar2 = await pageAs(browser, 'lead', '/bar', undefined, own.baseURL);
    const pickup = await pageAs(browser, 'cashier', '/pickup', undefined, own.baseURL);
    const counter = await pageAs(browser, 'cashier', '/counter', { width: 1280, height: 900 }, own.baseURL);
    for (const p of [bar1, bar2, pickup, counter]) await live(p);

    // From the Counter: a regular oat latte → the Oat lane, with a jug plan of 270 ml + 15 ml waste
    await counter.getByRole('button', { name: /^Latte/ }).click();
    await counter.getByRole('radio', { name: /Oat/ }).click();
    await counter.getByRole('button', { name: /Add to order/ }).click();
    await counter.getByLabel('Name for the cup').fill('Ada Whitlow');
    await counter.getByRole('button', { name: /^Send/ }).click();
    await expect(counter.getByRole('status').filter({ hasText: 'Ada Whitlow' })).toBeVisible();
    const oat1 = bar1.getByTestId('lane').filter({ has: bar1.getByRole('heading', { name: 'Oat' }) });
    await expect(oat1.getByTestId('drink-card').filter({ hasText: 'Ada Whitlow' })).toHaveCount(1);
    await expect(oat1.getByTestId('jug-plan')).toContainText('fill to');
    await expect(cardsOf(bar2, 'Ada Whitlow')).toHaveCount(1);

    // Keyboard on screen 1: the card's number key bumps it; it leaves both screens
    const key = await cardsOf(bar1, 'Ada Whitlow').locator('kbd').textContent();
    await bar1.keyboard.press(key!.trim());
    await expect(cardsOf(bar1, 'Ada Whitlow')).toHaveCount(0);
    await expect(cardsOf(bar2, 'Ada Whitlow')).toHaveCount(0);
    await expect(pickup.getByRole('region', { name: 'Ready' })).toContainText('Ada');

    // An allergy drink can't be bumped before someone reads the allergy
    const api = await cashierApi(own.baseURL);
    await order(api, 'Bram Okafor', [{ item: 'Flat white', milk: 'Soy' }], { allergens: ['peanuts'], allergyNote: 'carries an auto-injector' });
    const bram = cardsOf(bar2, 'Bram Okafor');
    await expect(bram.getByTestId('allergy')).toContainText('ALLERGY');
    await expect(bram.getByTestId('allergy')).toContainText('PEANUTS');
    await expect(bram.getByTestId('allergy')).toContainText('carries an auto-injector');
    await expect(bram.getByRole('button', { name: 'Bump ✓' })).toBeDisabled();
    // its bump key doesn't read the allergy for anyone: it only puts the focus ring on the card
    const bramKey = (await bram.locator('kbd').textContent())!.trim();
    await bar2.keyboard.press(bramKey);
    await expect(bram).toHaveAttribute('data-focused', 'true');
    await expect(bram.getByRole('button', { name: 'I have read the allergy' })).toBeVisible();
    await bram.getByRole('button', { name: 'I have read the allergy' }).click();
    await expect(cardsOf(bar1, 'Bram Okafor').getByTestId('allergy')).toContainText('Read by Theo Brand');
    await bram.getByRole('button', { name: 'Bump ✓' }).click();
    await expect(cardsOf(bar1, 'Bram Okafor')).toHaveCount(0);

    // A rush at the morning peak: 16+ drinks across four milks; a lead rushes a newer ticket
    const rush: [string, { item: string; milk?: string; size?: string }[]][] = [
      [
        'Cleo Marsh',
        [
          { item: 'Latte', milk: 'Whole' },
          { item: 'Cappuccino', milk: 'Whole', size: 'Small' },
        ],
      ],
      ['Dev Anand', [{ item: 'Flat white', milk: 'Oat' }, { item: 'Long black' }]],
      ['Effie Rowe', [{ item: 'Latte', milk: 'Almond', size: 'Large' }]],
      ['Finn Doyle', [{ item: 'Cappuccino', milk: 'Oat' }, { item: 'Mocha', milk: 'Whole' }, { item: 'Espresso' }]],
      ['Gus Tran', [{ item: 'Chai latte', milk: 'Soy' }]],
      [
        'Hana Ito',
        [
          { item: 'Latte', milk: 'Whole', size: 'Large' },
          { item: 'Iced latte', milk: 'Oat' },
        ],
      ],
      [
        'Ivo Berg',
        [
          { item: 'Flat white', milk: 'Whole' },
          { item: 'Cappuccino', milk: 'Almond' },
        ],
      ],
      [
        'Jude Park',
        [
          { item: 'Latte', milk: 'Oat', size: 'Small' },
          { item: 'Mocha', milk: 'Soy' },
        ],
      ],
      [
        'Kai Webb',
        [
          { item: 'Latte', milk: 'Whole' },
          { item: 'Flat white', milk: 'Almond' },
        ],
      ],
    ];
    for (const [name, items] of rush) await order(api, name, items);
    await expect(cardsOf(bar1, 'Kai Webb')).toHaveCount(2);
    expect(await bar1.getByTestId('drink-card').count()).toBeGreaterThanOrEqual(17);
    await cardsOf(bar2, 'Jude Park').first().getByRole('button', { name: 'Rush' }).click();
    await expect(cardsOf(bar1, 'Jude Park').first()).toContainText('RUSH');
    // rushed: first in the Oat lane, ahead of older tickets
    const oat = bar1.getByTestId('lane').filter({ has: bar1.getByRole('heading', { name: 'Oat' }) });
    await expect(oat.getByTestId('drink-card').first()).toContainText('Jude Park');
    // a lane longer than the screen says how many cards are out of sight, in words
    const whole = bar1.getByTestId('lane').filter({ has: bar1.getByRole('heading', { name: 'Whole' }) });
    await expect(whole.getByTestId('more-below')).toHaveText(/^↓ [1-9]\d* more below$/);
    await bar1.screenshot(shot('bar-rush'));

    await api.dispose();
    for (const page of [bar1, bar2, pickup, counter]) expect(errorsOf(page)).toEqual([]);
  });
});

test.describe('a bar screen while the server restarts', () => {
  let own: OwnServer;
  test.beforeAll(async () => {
    own = await OwnServer.create('bar-restart');
    await own.start();
  });
  test.afterAll(() => own?.dispose());

  test('shows it is reconnecting, then every change made meanwhile, with no reload', async ({ browser }) => {
    test.setTimeout(120_000);
    const context = await browser.newContext({ baseURL: own.baseURL, viewport: { width: 1920, height: 1080 } });
    const bar = await context.newPage();
    const errors: string[] = [];
    bar.on('pageerror', (e) => errors.push(e.message));
    bar.on('console', (m) => {
      if (m.type() === 'error' && !expectedWhileDown.some((re) => re.test(m.text()))) errors.push(m.text());
    });
    await signIn(bar, 'barista', '/bar');
    await bar.waitForURL('**/bar');
    await live(bar);
    await bar.evaluate(() => ((window as unknown as { marker: number }).marker = 7));
    const api = await cashierApi(own.baseURL);
    const kept = await order(api, 'Lior Vance', [{ item: 'Latte', milk: 'Whole' }]);
    await expect(cardsOf(bar, 'Lior Vance')).toHaveCount(1);

    await own.kill();
    await expect(bar.getByRole('status')).toContainText(/Offline|Connecting/);
    await own.start();
    // changes made by others while this screen may still be away
    const again = await cashierApi(own.baseURL);
    await order(again, 'Maya Solis', [{ item: 'Cappuccino', milk: 'Oat' }]);
    const barista = await apiRequest.newContext({ baseURL: own.baseURL });
    await barista.post('/api/session', { data: { username: 'barista2', password: DEMO_PASSWORD } });
    expect((await barista.post(`/api/tickets/${kept.id}/bump`)).status()).toBe(200);

    // the socket tries again after its backoff, which grows to 10 s (+25 % jitter) while the server
    // is down (MAX_BACKOFF_MS in src/lib/live-socket.ts): wait out one whole backoff, not less
    await expect(bar.getByRole('status').filter({ hasText: 'Live' })).toBeVisible({ timeout: 15_000 });
    await expect(cardsOf(bar, 'Maya Solis')).toHaveCount(1);
    await expect(cardsOf(bar, 'Lior Vance')).toHaveCount(0);
    expect(await bar.evaluate(() => (window as unknown as { marker?: number }).marker)).toBe(7);
    for (const a of [api, again, barista]) await a.dispose();
    await context.close();
    expect(errors).toEqual([]);
  });
});
