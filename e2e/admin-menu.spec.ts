// The owner's menu editor, end to end: a seasonal drink added with its recipe shows on an open
// Counter without a reload, a cashier sells it with oat milk, and the Bar pours the right jug.
// On a server of its own, so the new category and drink never reach the other specs' Counter.
import type { Browser, Page } from '@playwright/test';
import { errorsOf, expect, pageAs, test, type Login } from './fixtures';
import { shot } from './shots';
import { OwnServer } from './own-server';

let own: OwnServer;

test.beforeAll(async () => {
  own = await OwnServer.create('admin-menu');
  await own.start();
});
test.afterAll(() => own?.dispose());

const pageOn = (browser: Browser, login: Login, path: string, viewport: { width: number; height: number }) =>
  pageAs(browser, login, path, viewport, own.baseURL);

const live = (page: Page) => expect(page.getByRole('status').filter({ hasText: 'Live' })).toBeVisible();

async function fillSize(sheet: ReturnType<Page['getByRole']>, index: number, values: Record<string, string>) {
  const row = sheet.getByTestId('size-row').nth(index);
  for (const [label, value] of Object.entries(values)) await row.getByLabel(label, { exact: true }).fill(value);
}

test('the owner adds a seasonal drink with its recipe; the open Counter sells it; the Bar pours its jug', async ({ browser }) => {
  test.setTimeout(120_000);
  const counter = await pageOn(browser, 'cashier', '/counter', { width: 1024, height: 768 });
  const bar = await pageOn(browser, 'barista', '/bar', { width: 1920, height: 1080 });
  await live(counter);
  await live(bar);
  // a marker a reload would wipe: the Counter must take the new drink in place
  await counter.evaluate(() => ((window as unknown as { marker: number }).marker = 7));

  const owner = await pageOn(browser, 'owner', '/admin/menu', { width: 1280, height: 800 });
  await expect(owner.getByRole('tab', { name: 'Espresso' })).toHaveAttribute('aria-selected', 'true');
  await expect(owner.getByTestId('menu-item-row').filter({ hasText: 'Latte' }).first()).toContainText('Small · $4.80');
  await owner.screenshot(shot('admin-menu-editor-items'));

  // a category for the season
  await owner.getByRole('button', { name: '+ New category' }).click();
  await owner.getByLabel('Category name').fill('Seasonal');
  await owner.getByRole('button', { name: 'Add category' }).click();
  await expect(owner.getByRole('tab', { name: 'Seasonal' })).toHaveAttribute('aria-selected', 'true');

  // the drink: 12 oz 2 shots 18 g → 36 g with 240 ml milk; 16 oz 2 shots with 320 ml
  await owner.getByRole('button', { name: '+ New item in Seasonal' }).click();
  const sheet = owner.getByRole('dialog', { name: 'New item' });
  await sheet.getByLabel('Name', { exact: true }).fill('Ember Spice Latte');
  await sheet.getByLabel(/Takes milk/).check();
  await sheet.getByLabel('Comes with').selectOption({ label: 'Whole (WH)' });
  await sheet.getByRole('radio', { name: /silky/ }).click();
  await sheet.screenshot(shot('admin-menu-editor-item-form-top'));
  await fillSize(sheet, 0, {
    'Size name': '12 oz',
    'Cup volume': '355',
    Cup: '12 oz hot cup',
    Price: '5.60',
    Shots: '2',
    Dose: '4',
    'Target yield': '36',
    Milk: '240',
  });
  await sheet.getByRole('button', { name: '+ Add a size' }).click();
  // the new size starts with the espresso of the size before it; cup, price and milk are its own
  const second = sheet.getByTestId('size-row').nth(1);
  await expect(second.getByLabel('Shots', { exact: true })).toHaveValue('2');
  await expect(second.getByLabel('Target yield', { exact: true })).toHaveValue('36');
  await expect(second.getByLabel('Price', { exact: true })).toHaveValue('');
  await fillSize(sheet, 1, { 'Size name': '16 oz', 'Cup volume': '473', Cup: '16 oz hot cup', Price: '6.20', Dose: '18', Milk: '320' });
  // 4 g is no dose for two shots: refused beside the field, nothing saved
  await sheet.getByRole('button', { name: 'Add item' }).click();
  await expect(sheet.getByTestId('size-row').first().getByRole('alert')).toHaveText('Dose 5–30 g for a size with shots');
  await fillSize(sheet, 0, { Dose: '18' });
  // 18 g in, 36 g out: a 1:2 ratio (common practice for espresso)
  await expect(sheet.getByTestId('size-row').first()).toContainText('Brew ratio 1:2.0');
  await expect(sheet.getByTestId('size-row').first()).toContainText('= 12.0 US fl oz'); // 355 ml ÷ 29.5735 (NIST HB 44)
  await sheet.screenshot(shot('admin-menu-editor-item-form'));
  await sheet.getByRole('button', { name: 'Add item' }).click();
  await expect(sheet).toBeHidden();
  const row = owner.getByTestId('menu-item-row').filter({ hasText: 'Ember Spice Latte' });
  await expect(row).toContainText('12 oz · $5.60');
  await expect(row).toContainText('16 oz · $6.20');
  await expect(row).toContainText('2 · 18 g');
  await expect(row).toContainText('240 ml');
  await expect(row).toContainText('320 ml');
  await expect(row.locator('[data-status]')).toHaveText(/On/);
  await owner.screenshot(shot('admin-menu-editor-seasonal'));

  // the open Counter has the new tab and drink, with no reload
  await counter.getByRole('tab', { name: 'Seasonal' }).click();
  await counter.getByRole('button', { name: /^Ember Spice Latte/ }).click();
  expect(await counter.evaluate(() => (window as unknown as { marker?: number }).marker)).toBe(7);
  const itemSheet = counter.getByRole('dialog', { name: 'Ember Spice Latte' });
  await expect(itemSheet.getByRole('radio', { name: /12 oz/ })).toHaveAttribute('aria-checked', 'true');
  await itemSheet.getByRole('radio', { name: /Oat/ }).click();
  // $5.60 and oat's $0.70 upcharge (demo menu)
  await itemSheet.getByRole('button', { name: /Add to order · \$6\.30/ }).click();
  await counter.getByLabel('Name for the cup').fill('Wren Ashby');
  await counter.getByRole('button', { name: /^Send/ }).click();
  await expect(counter.getByRole('status').filter({ hasText: 'Wren Ashby' })).toBeVisible();

  // The Bar: the drink in the Oat lane, alone there, with its jug.
  // The jug plan pours the drinks' cold milk plus the café's jug waste, in the smallest pitcher
  // whose fill line holds it. Demo café: waste 15 ml; pitchers 350/190, 600/330, 950/520 ml.
  // By hand: 240 ml + 15 ml = 255 ml; 255 > 190, 255 ≤ 330 → the 600 ml pitcher, pour 255 ml.
  const menu = await (await owner.request.get(`${own.baseURL}/api/menu`)).json();
  expect(menu.location.jugWasteMl).toBe(15);
  const oat = bar.getByTestId('lane').filter({ has: bar.getByRole('heading', { name: 'Oat' }) });
  await expect(oat.getByTestId('drink-card')).toHaveCount(1);
  await expect(oat.getByTestId('drink-card')).toContainText('Ember Spice Latte');
  // in the café's US fl oz: 600 ml ≈ 20.3 → 20 oz; 255 ml ≈ 8.6 → 8.5 oz
  await expect(oat.getByTestId('jug-plan')).toContainText('20 oz pitcher · fill to 8.5 oz');
  await expect(oat.getByTestId('jug-plan')).toContainText('1 drink · medium stretch (silky)');
  // the recipe's dose reaches the shot plan: 2 shots, 18 g
  await expect(oat.getByTestId('shot-plan')).toContainText('2 shots · 18 g');
  await bar.screenshot(shot('admin-menu-bar-ember'));

  // 86 from the editor, in words; the Counter greys the tile at once; then back on
  await row.getByRole('button', { name: '86 Ember Spice Latte' }).click();
  await expect(row.locator('[data-status]')).toHaveText(/86'd/);
  await expect(counter.getByRole('button', { name: /^Ember Spice Latte/ })).toBeDisabled();
  await row.getByRole('button', { name: 'Put Ember Spice Latte back on' }).click();
  await expect(row.locator('[data-status]')).toHaveText(/On/);
  await expect(counter.getByRole('button', { name: /^Ember Spice Latte/ })).toBeEnabled();

  // retiring asks first; "Keep it" keeps it
  await row.getByRole('button', { name: 'Edit Ember Spice Latte' }).click();
  const edit = owner.getByRole('dialog', { name: 'Edit Ember Spice Latte' });
  await edit.getByRole('button', { name: 'Retire item…' }).click();
  const confirm = owner.getByRole('alertdialog', { name: 'Retire Ember Spice Latte?' });
  await expect(confirm).toContainText('Past orders keep it as it was sold');
  await confirm.screenshot(shot('admin-menu-editor-confirm-retire'));
  await confirm.getByRole('button', { name: 'Keep it' }).click();
  await expect(confirm).toBeHidden();
  await edit.getByRole('button', { name: 'Cancel' }).click();
  await expect(row.locator('[data-status]')).toHaveText(/On/);

  // milks and extras are editable too
  await owner.getByRole('tab', { name: 'Milks' }).click();
  await expect(owner.getByTestId('milk-row').filter({ hasText: 'Oat' })).toContainText('OA');
  await owner.screenshot(shot('admin-menu-editor-milks'));
  await owner.getByRole('tab', { name: 'Extras' }).click();
  await expect(owner.getByRole('article', { name: 'Group Syrup' })).toContainText('Vanilla syrup');
  // an extra that changes how the Bar makes the drink says so in its row, in words
  const dryRow = owner
    .getByRole('article', { name: 'Group Foam' })
    .getByRole('listitem')
    .filter({ has: owner.getByText('Dry', { exact: true }) });
  await expect(dryRow.getByTestId('extra-bar-effect')).toHaveText('At the bar: Dry');
  await expect(owner.getByRole('article', { name: 'Group Syrup' }).getByTestId('extra-bar-effect')).toHaveCount(0);
  await owner.screenshot(shot('admin-menu-editor-extras', { fullPage: true }));
  // its form: "At the bar" is labelled as Name and Price are
  await owner.getByRole('button', { name: 'Edit Dry' }).click();
  const extraSheet = owner.getByRole('dialog', { name: 'Edit Dry' });
  await expect(extraSheet.getByLabel('At the bar')).toHaveValue('dry');
  const labelLook = (name: string) =>
    extraSheet
      .locator('label')
      .filter({ hasText: new RegExp(`^${name}$`) })
      .evaluate((l) => ['fontSize', 'fontWeight', 'textTransform', 'letterSpacing', 'color'].map((k) => getComputedStyle(l)[k as 'fontSize']).join(' '));
  expect(await labelLook('At the bar')).toBe(await labelLook('Name'));
  expect(await labelLook('At the bar')).toBe(await labelLook('Price'));
  await extraSheet.screenshot(shot('admin-menu-extra-form'));
  await extraSheet.getByRole('button', { name: 'Cancel' }).click();
  await expect(extraSheet).toBeHidden();

  for (const page of [counter, bar, owner]) expect(errorsOf(page)).toEqual([]);
});

test('the editor fits a 1024×768 tablet', async ({ browser }) => {
  const owner = await pageOn(browser, 'owner', '/admin/menu', { width: 1024, height: 768 });
  await expect(owner.getByTestId('menu-item-row').first()).toBeVisible();
  // nothing runs off the side: no sideways scrolling of the page
  expect(await owner.evaluate(() => document.documentElement.scrollWidth)).toBeLessThanOrEqual(1024);
  await owner.screenshot(shot('admin-menu-editor-tablet'));
  await owner.getByRole('button', { name: 'Edit Latte' }).click();
  const sheet = owner.getByRole('dialog', { name: 'Edit Latte' });
  await expect(sheet.getByTestId('size-row')).toHaveCount(3);
  expect(await owner.evaluate(() => document.documentElement.scrollWidth)).toBeLessThanOrEqual(1024);
  await owner.screenshot(shot('admin-menu-editor-tablet-form'));
  await sheet.getByTestId('size-row').nth(1).scrollIntoViewIfNeeded();
  await owner.screenshot(shot('admin-menu-editor-tablet-sizes'));
  expect(errorsOf(owner)).toEqual([]);
});
