// Allergens from ingredients, end to end on a server of its own (the switch must not reach the
// other specs' Counter): the owner reads what the EU list changes before switching (oat milk: a
// cereal containing gluten, Regulation (EU) No 1169/2011 Annex II item 1), an open Counter follows
// without a reload, the menu editor records ingredients and shows the allergens they give on the
// café's list, and the switch back to the US list (FALCPA + FASTER Act) reads oat milk as none.
import type { Browser, Locator, Page } from '@playwright/test';
import { errorsOf, expect, pageAs, test, type Login } from './fixtures';
import { shot } from './shots';
import { OwnServer } from './own-server';

let own: OwnServer;

test.beforeAll(async () => {
  own = await OwnServer.create('ingredients');
  await own.start();
});
test.afterAll(() => own?.dispose());

const pageOn = (browser: Browser, login: Login, path: string, viewport: { width: number; height: number }) =>
  pageAs(browser, login, path, viewport, own.baseURL);

const live = (page: Page) => expect(page.getByRole('status').filter({ hasText: 'Live' })).toBeVisible();
/** A row of the switch preview by its first cell ("Oat (milk)"): its four cells' text. */
const switchRow = (preview: Locator, entry: string) => preview.getByTestId('switch-row').filter({ hasText: entry }).getByRole('cell');

test('the owner switches US → EU after reading what changes; the Counter and the menu editor follow; back to US', async ({ browser }) => {
  test.setTimeout(120_000);
  const counter = await pageOn(browser, 'cashier', '/counter', { width: 1024, height: 768 });
  await live(counter);
  await counter.evaluate(() => ((window as unknown as { marker: number }).marker = 3));
  const owner = await pageOn(browser, 'owner', '/admin/settings', { width: 1280, height: 1000 });
  const allergens = owner.getByRole('form', { name: 'Allergens', exact: true });
  await expect(allergens.getByRole('button', { name: 'Save' })).toBeEnabled(); // hydrated
  await expect(allergens).toContainText('Cross-contact on a shared steam wand or jug is possible');

  // Choosing the EU list shows what it changes, from the ingredients; nothing to retag
  await allergens.getByRole('radio', { name: /EU list/ }).click();
  const toEu = allergens.getByTestId('allergen-switch');
  await expect(switchRow(toEu, 'Oat (milk)')).toHaveText(['Oat (milk)', 'oats', 'none', 'cereals containing gluten']); // Annex II item 1
  await expect(switchRow(toEu, 'Almond (milk)')).toHaveText(['Almond (milk)', 'almond', 'tree nuts', 'nuts']); // §201(qq); Annex II item 8
  // milk is milk on both lists; coconut is on neither (FDA Q&A Edition 5, January 2025)
  await expect(toEu.getByTestId('switch-row').filter({ hasText: 'Coconut' })).toHaveCount(0);
  await expect(toEu.getByTestId('switch-row').filter({ hasText: 'Whole' })).toHaveCount(0);
  await allergens.scrollIntoViewIfNeeded();
  await owner.screenshot(shot('ingredients-settings-switch-to-eu', { fullPage: true }));
  await allergens.getByRole('button', { name: 'Switch to the EU list' }).click();
  await expect(allergens.getByRole('status')).toContainText('the EU list');

  // the open Counter reads the oat milk under the EU list, without a reload
  await counter.getByRole('button', { name: /^Latte/ }).click();
  const sheet = counter.getByRole('dialog', { name: 'Latte' });
  await expect(sheet.getByRole('radio', { name: /Oat/ })).toContainText('cereals containing gluten');
  await expect(sheet.getByRole('radio', { name: /Coconut/ })).not.toContainText('nuts');
  await counter.screenshot(shot('ingredients-counter-eu-milks'));
  await sheet.getByRole('button', { name: 'Cancel' }).click();
  expect(await counter.evaluate(() => (window as unknown as { marker?: number }).marker)).toBe(3);

  // The menu editor: each milk's ingredients and the allergens they give on the EU list
  await owner.goto('/admin/menu');
  await owner.getByRole('tab', { name: 'Milks' }).click();
  const oatRow = owner.getByTestId('milk-row').filter({ hasText: 'Oat' });
  await expect(oatRow).toContainText('oats');
  await expect(oatRow).toContainText('cereals containing gluten');
  await owner.getByRole('button', { name: '+ New milk' }).click();
  const milk = owner.getByRole('dialog', { name: 'New milk' });
  await milk.getByLabel('Name').fill('Pistachio');
  await milk.getByLabel('Lane code').fill('pi');
  await milk.getByLabel('Upcharge').fill('0.90');
  const picker = milk.getByTestId('ingredient-picker');
  await expect(picker.getByTestId('derived-allergens')).toContainText('Allergens on the EU list: none');
  await picker.getByRole('checkbox', { name: 'pistachio' }).check();
  await expect(picker.getByTestId('derived-allergens')).toContainText('Allergens on the EU list: nuts'); // Annex II item 8
  await expect(picker.getByTestId('derived-allergens')).toContainText('Cross-contact on a shared steam wand or jug is possible');
  await milk.screenshot(shot('ingredients-editor-milk-ingredients'));
  await milk.getByRole('button', { name: 'Add milk' }).click();
  await expect(milk).toBeHidden();
  await expect(owner.getByTestId('milk-row').filter({ hasText: 'Pistachio' })).toContainText('nuts');
  await owner.screenshot(shot('ingredients-editor-milks-eu', { fullPage: true }));

  // an item: its own ingredients; the editor keeps them in its order
  await owner.getByRole('tab', { name: 'Items' }).click();
  await owner.getByRole('tab', { name: 'Food' }).click();
  await owner.getByRole('button', { name: 'Edit Almond croissant' }).click();
  const item = owner.getByRole('dialog', { name: 'Edit Almond croissant' });
  for (const name of ['almond', 'wheat', "cow's milk", 'egg']) await expect(item.getByRole('checkbox', { name, exact: true })).toBeChecked();
  await expect(item.getByTestId('derived-allergens')).toContainText('Allergens on the EU list: cereals containing gluten, eggs, milk, nuts');
  await item.getByRole('checkbox', { name: 'sesame' }).check();
  await expect(item.getByTestId('derived-allergens')).toContainText('milk, nuts, sesame');
  await item.getByTestId('ingredient-picker').screenshot(shot('ingredients-editor-item-ingredients'));
  await item.getByRole('button', { name: 'Save item' }).click();
  await expect(item).toBeHidden();
  await expect(owner.getByTestId('menu-item-row').filter({ hasText: 'Almond croissant' })).toContainText('sesame');

  // Back to the US list: oat milk contains none (FALCPA names wheat only); almond is a tree nut
  await owner.goto('/admin/settings');
  await allergens.getByRole('radio', { name: /US list/ }).click();
  const toUs = allergens.getByTestId('allergen-switch');
  await expect(switchRow(toUs, 'Oat (milk)')).toHaveText(['Oat (milk)', 'oats', 'cereals containing gluten', 'none']);
  await expect(switchRow(toUs, 'Almond (milk)')).toHaveText(['Almond (milk)', 'almond', 'nuts', 'tree nuts']);
  await expect(switchRow(toUs, 'Pistachio (milk)')).toHaveText(['Pistachio (milk)', 'pistachio', 'nuts', 'tree nuts']);
  await allergens.getByRole('button', { name: 'Switch to the US list' }).click();
  await expect(allergens.getByRole('status')).toContainText('the US list');
  await owner.screenshot(shot('ingredients-settings-after-switch-back', { fullPage: true }));

  for (const page of [counter, owner]) expect(errorsOf(page)).toEqual([]);
});
