// The Counter as the staff live a morning rush: every width from a phone to a wide screen without
// sideways scrolling, a ready strip that stays one row, many of one drink as one line with a
// quantity, payment in reach on a 1024×768 tablet, and the small things a cashier reads.
// Screenshots go to test-results/shots/ for a person to look at.
import type { APIRequestContext, Locator, Page } from '@playwright/test';
import { DEMO_PASSWORD, errorsOf, expect, pageAs, test, type Login, WIDTHS } from './fixtures';
import { shot } from './shots';

async function apiAs(playwright: { request: { newContext(o: { baseURL?: string }): Promise<APIRequestContext> } }, baseURL: string | undefined, login: Login) {
  const api = await playwright.request.newContext({ baseURL });
  expect((await api.post('/api/session', { data: { username: login, password: DEMO_PASSWORD } })).ok()).toBe(true);
  return api;
}

async function itemId(api: APIRequestContext, name: string): Promise<number> {
  const menu = (await (await api.get('/api/menu')).json()) as { items: { id: number; name: string }[] };
  return menu.items.find((i) => i.name === name)!.id;
}

/** A menu tile (not an order line of the same name). */
const tile = (page: Page, name: string) => page.getByRole('tabpanel').getByRole('button', { name: new RegExp(`^${name}`) });

/** Nothing on the page is wider than the window. */
async function expectNoSidewaysScroll(page: Page) {
  const { scroll, client } = await page.evaluate(() => ({ scroll: document.documentElement.scrollWidth, client: document.documentElement.clientWidth }));
  expect(scroll, 'page width').toBeLessThanOrEqual(client);
}

/** How far any scrolling box inside `within` is scrolled down. */
const scrolledDown = (within: Locator) => within.evaluate((root) => Math.max(0, ...[root, ...root.querySelectorAll('*')].map((el) => el.scrollTop)));

test('from a phone to a wide screen nothing scrolls sideways and the menu, order and payment are in reach', async ({ browser }) => {
  test.setTimeout(120_000);
  for (const viewport of WIDTHS) {
    const page = await pageAs(browser, 'cashier', '/counter', viewport);
    await expect(page.getByRole('status').filter({ hasText: 'Live' })).toBeVisible();
    await expectNoSidewaysScroll(page);
    await expect(tile(page, 'Long black')).toBeInViewport({ ratio: 1 });
    await tile(page, 'Long black').click();
    await page.getByRole('button', { name: /Add to order/ }).click();
    await tile(page, 'Flat white').click();
    await page.getByRole('button', { name: /Add to order/ }).click();
    await expectNoSidewaysScroll(page);
    if (viewport.width < 768) {
      // a phone: the order is one tap away, and sending is in view there
      await page.getByRole('button', { name: /^Order · 2 drinks/ }).click();
    }
    await expect(page.getByTestId('order-line').first()).toBeInViewport({ ratio: 1 });
    await expect(page.getByRole('button', { name: /^Send/ })).toBeInViewport({ ratio: 1 });
    if (viewport.width >= 768) {
      // beside the menu: name and payment in view at once
      await expect(page.getByLabel('Name for the cup')).toBeInViewport({ ratio: 1 });
      await expect(page.getByRole('radio', { name: 'Card' })).toBeInViewport({ ratio: 1 });
    }
    await expectNoSidewaysScroll(page);
    await page.screenshot(shot(`counter-${viewport.width}x${viewport.height}`));
    if (viewport.width < 768) {
      await page.getByLabel('Name for the cup').fill('Ivo Sand');
      await page.getByRole('button', { name: /^Send/ }).click();
      await expect(page.getByRole('status').filter({ hasText: /Sent #\d+ for Ivo Sand/ })).toBeInViewport();
      await expectNoSidewaysScroll(page);
      await page.screenshot(shot('counter-390-sent'));
    }
    expect(errorsOf(page)).toEqual([]);
    await page.context().close();
  }
});

test('the ready strip stays one row, newest first, with the rest behind "+n more", and each chip says what tapping does', async ({
  browser,
  playwright,
  baseURL,
}) => {
  test.setTimeout(120_000);
  const cashier = await apiAs(playwright, baseURL, 'cashier');
  const barista = await apiAs(playwright, baseURL, 'barista');
  const longBlack = await itemId(cashier, 'Long black');
  const ids: number[] = [];
  for (let i = 1; i <= 26; i++) {
    const res = await cashier.post('/api/orders', {
      data: {
        clientOrderId: crypto.randomUUID(),
        customerName: `Rush ${i}`,
        items: [{ menuItemId: longBlack }],
        payment: { method: 'cash', tenderedCents: 1000 },
      },
    });
    expect(res.status()).toBe(201);
    ids.push(((await res.json()) as { order: { id: number } }).order.id);
  }
  for (const id of ids) expect((await barista.post(`/api/tickets/${id}/bump`)).ok()).toBe(true);

  for (const viewport of [
    { width: 1024, height: 768 },
    { width: 390, height: 844 },
    { width: 1366, height: 768 },
  ]) {
    const page = await pageAs(browser, 'cashier', '/counter', viewport);
    const strip = page.getByRole('region', { name: 'Ready for pickup' });
    const chips = strip.getByRole('button', { name: /^Mark collected #\d+/ });
    await expect(chips.first()).toHaveAccessibleName(/^Mark collected #\d+ Rush 26/); // the newest first
    const one = (await chips.first().boundingBox())!;
    const box = (await strip.boundingBox())!;
    expect(box.height, 'one row').toBeLessThan(one.height * 2);
    await expect(strip.getByRole('button', { name: /^\+\d+ more ready/ })).toBeInViewport({ ratio: 1 });
    await expectNoSidewaysScroll(page);
    if (viewport.width >= 1024) {
      // a long order beside it: the order and Send stay in view
      for (const name of ['Long black', 'Flat white', 'Latte', 'Cappuccino', 'Mocha', 'Iced latte', 'Espresso']) {
        await tile(page, name).click();
        await page.getByRole('button', { name: /Add to order/ }).click();
      }
      await expect(page.getByRole('button', { name: /^Send/ })).toBeInViewport({ ratio: 1 });
    }
    await page.screenshot(shot(`counter-ready-${viewport.width}x${viewport.height}`));
    if (viewport.width === 1024) {
      await strip.getByRole('button', { name: /^\+\d+ more ready/ }).click();
      const all = page.getByRole('dialog', { name: 'Ready for pickup' });
      await expect(all.getByRole('button', { name: /^Mark collected #\d+ Rush \d+/ })).toHaveCount(26);
      await all.getByRole('button', { name: /^Mark collected #\d+ Rush 1$/ }).click();
      await expect(all.getByRole('button', { name: /^Mark collected #\d+ Rush \d+/ })).toHaveCount(25);
      await page.keyboard.press('Escape');
      await expect(all).toHaveCount(0);
    }
    expect(errorsOf(page)).toEqual([]);
    await page.context().close();
  }
  // leave the shelf as it was for the specs after this one
  for (const id of ids.slice(1)) expect((await cashier.post(`/api/tickets/${id}/collect`)).ok()).toBe(true);
  await cashier.dispose();
  await barista.dispose();
});

test('thirty-one of one drink are one line with a quantity; the Bar still gets one drink per cup', async ({ browser, playwright, baseURL }) => {
  const page = await pageAs(browser, 'cashier', '/counter', { width: 1024, height: 768 });
  await expect(page.getByRole('status').filter({ hasText: 'Live' })).toBeVisible();
  for (let i = 0; i < 3; i++) {
    await tile(page, 'Long black').click();
    await page.getByRole('button', { name: /Add to order/ }).click();
  }
  const line = page.getByTestId('order-line');
  await expect(line).toHaveCount(1);
  await expect(line).toContainText('3 × Long black');
  await expect(page.getByRole('heading', { name: 'Order · 3 drinks' })).toBeVisible();
  await line.getByRole('button', { name: 'One more Long black' }).click();
  await expect(line).toContainText('4 × Long black');
  await line.getByRole('button', { name: 'One fewer Long black' }).click();
  await expect(line).toContainText('3 × Long black');
  await line.getByLabel('How many Long black').fill('31');
  await expect(line).toContainText('31 × Long black');
  await line.getByLabel('How many Long black').fill('3');
  await expect(line).toContainText('3 × Long black');
  await page.getByLabel('Name for the cup').fill('Office Run');
  await page.getByRole('button', { name: /^Send/ }).click();
  const sent = page.getByRole('status').filter({ hasText: /Sent #\d+ for Office Run/ });
  await expect(sent).toBeVisible();
  const number = Number(/Sent #(\d+)/.exec((await sent.textContent()) ?? '')![1]);

  const api = await apiAs(playwright, baseURL, 'cashier');
  const { tickets } = (await (await api.get('/api/tickets?view=open')).json()) as { tickets: { number: number; customerName: string; drinks: unknown[] }[] };
  expect(tickets.find((t) => t.customerName === 'Office Run' && t.number === number)!.drinks).toHaveLength(3);
  await api.dispose();
  expect(errorsOf(page)).toEqual([]);
});

test('on a 1024×768 tablet the test cards are in view without scrolling, and the order starts at the top after sending', async ({ browser }) => {
  const page = await pageAs(browser, 'cashier', '/counter', { width: 1024, height: 768 });
  await expect(page.getByRole('status').filter({ hasText: 'Live' })).toBeVisible();
  for (const name of ['Long black', 'Flat white', 'Latte', 'Cappuccino', 'Mocha', 'Iced latte']) {
    await tile(page, name).click();
    await page.getByRole('button', { name: /Add to order/ }).click();
  }
  await page.getByLabel('Name for the cup').fill('Tablet Test');
  await page.getByRole('radio', { name: 'Card' }).click();
  for (const card of [/4242/, /0002/, /9995/, /0069/]) await expect(page.getByRole('radio', { name: card })).toBeInViewport({ ratio: 1 });
  await page.screenshot(shot('counter-1024-card'));
  const order = page.getByRole('complementary');
  await order.evaluate((root) => [root, ...root.querySelectorAll('*')].forEach((el) => (el.scrollTop = el.scrollHeight)));
  await page.getByRole('radio', { name: /4242/ }).click();
  await page.getByRole('button', { name: /^Charge card/ }).click();
  await expect(page.getByRole('status').filter({ hasText: /Sent #\d+ for Tablet Test/ })).toBeVisible();
  await expect.poll(() => scrolledDown(order)).toBe(0);
  await expect(page.getByText('Tap an item to start')).toBeInViewport();
  expect(errorsOf(page)).toEqual([]);
});

test('what the cashier reads: counts, field limits, items that are not drinks, sizes and single choices', async ({ browser }) => {
  const page = await pageAs(browser, 'cashier', '/counter', { width: 1024, height: 768 });
  await expect(page.getByRole('status').filter({ hasText: 'Live' })).toBeVisible();

  // one drink, not "1 drinks"; a 2-shot espresso is not a "Single cup"
  await tile(page, 'Espresso').click();
  await page.getByRole('button', { name: /Add to order/ }).click();
  await expect(page.getByRole('heading', { name: 'Order · 1 drink' })).toBeVisible();
  await expect(page.getByTestId('order-line')).not.toContainText('Single cup');

  // a group with one choice doesn't say "pick one"; a group of several single choices does
  await tile(page, 'Latte').click();
  const sheet = page.getByRole('dialog');
  const sweetness = sheet.getByRole('group', { name: /Sweetness/ });
  await expect(sweetness).toBeVisible();
  await expect(sweetness).not.toContainText('pick one');
  await expect(sheet.getByRole('group', { name: /Foam/ })).toContainText('pick one');
  await sheet.getByRole('button', { name: 'Cancel' }).click();

  // a croissant is an item, not a drink
  await page.getByRole('tab', { name: 'Food' }).click();
  await tile(page, 'Butter croissant').click();
  await expect(page.getByRole('heading', { name: 'Order · 1 drink, 1 item' })).toBeVisible();
  await page.getByRole('button', { name: /Allergy/ }).click();
  await page.getByRole('button', { name: 'wheat', exact: true }).click();
  const clash = page.getByTestId('allergy-clash');
  await expect(clash).toContainText('Butter croissant contains wheat (from the item itself)');
  await expect(clash).not.toContainText('drink');
  await clash.getByRole('checkbox').check();

  // a name too long for the cup, said in words
  await page.getByLabel('Name for the cup').fill('Bartholomew Ignatius Featherstonehaugh-Smythe');
  await page.getByRole('button', { name: /^Send/ }).click();
  await expect(page.getByText('A name for the cup is at most 40 characters')).toBeVisible();
  await expect(page.getByText(/Too big|expected string/)).toHaveCount(0);
  expect(errorsOf(page)).toEqual([]);
});

test('the header stays on one line at tablet width', async ({ browser }) => {
  test.setTimeout(60_000);
  for (const login of ['cashier', 'lead'] as const) {
    const page = await pageAs(browser, login, '/counter', { width: 1024, height: 768 });
    const signOut = page.getByRole('button', { name: 'Sign out' });
    await expect(signOut).toBeInViewport({ ratio: 1 });
    for (const control of [signOut, page.getByRole('button', { name: 'Today’s orders' })]) {
      // the lines its words are set on
      const lines = await control.evaluate((el) => {
        const range = document.createRange();
        range.selectNodeContents(el);
        return new Set([...range.getClientRects()].filter((r) => r.width > 0).map((r) => Math.round(r.top))).size;
      });
      expect(lines, `${await control.textContent()} on one line`).toBe(1);
    }
    await expectNoSidewaysScroll(page);
    await page.context().close();
  }
});

test("an order of only 86'd lines can't be sent for $0.00, and says which lines are 86'd", async ({ browser, playwright, baseURL }) => {
  const page = await pageAs(browser, 'cashier', '/counter', { width: 1024, height: 768 });
  await expect(page.getByRole('status').filter({ hasText: 'Live' })).toBeVisible();
  await tile(page, 'Mocha').click();
  await page.getByRole('button', { name: /Add to order/ }).click();
  const lead = await apiAs(playwright, baseURL, 'lead');
  const mocha = await itemId(lead, 'Mocha');
  expect((await lead.post(`/api/menu/items/${mocha}/availability`, { data: { available: false } })).status()).toBe(200);
  try {
    await expect(tile(page, 'Mocha')).toBeDisabled();
    const send = page.getByRole('button', { name: /^Send/ });
    await expect(send).toBeDisabled();
    await expect(send).not.toContainText('$0.00');
    await expect(page.getByTestId('send-blocked')).toContainText("Mocha is 86'd — remove it to send");
  } finally {
    expect((await lead.post(`/api/menu/items/${mocha}/availability`, { data: { available: true } })).status()).toBe(200);
    await lead.dispose();
  }
  expect(errorsOf(page)).toEqual([]);
});

test('the item sheet takes focus, keeps it, closes on Esc and gives it back', async ({ browser }) => {
  const page = await pageAs(browser, 'cashier', '/counter', { width: 1024, height: 768 });
  await expect(page.getByRole('status').filter({ hasText: 'Live' })).toBeVisible();
  const inSheet = () => page.evaluate(() => !!document.activeElement?.closest('[role="dialog"]'));

  // by its number key
  await page.keyboard.press('4'); // the 4th tile: Latte
  await expect(page.getByRole('dialog', { name: 'Latte' })).toBeVisible();
  await expect.poll(inSheet).toBe(true);
  for (let i = 0; i < 30; i++) await page.keyboard.press('Tab');
  expect(await inSheet()).toBe(true);
  for (let i = 0; i < 5; i++) await page.keyboard.press('Shift+Tab');
  expect(await inSheet()).toBe(true);
  await page.keyboard.press('Escape');
  await expect(page.getByRole('dialog')).toHaveCount(0);

  // from a focused tile: focus comes back to it
  const cappuccino = tile(page, 'Cappuccino');
  await cappuccino.focus();
  await page.keyboard.press('Enter');
  await expect(page.getByRole('dialog', { name: 'Cappuccino' })).toBeVisible();
  await expect.poll(inSheet).toBe(true);
  await page.keyboard.press('Escape');
  await expect(page.getByRole('dialog')).toHaveCount(0);
  await expect(cappuccino).toBeFocused();
  expect(errorsOf(page)).toEqual([]);
});
