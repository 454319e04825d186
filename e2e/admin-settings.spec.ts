// The owner's settings screen: units both ways, the wait target, a pitcher and the allergen list —
// with a Bar and a Counter open beside it that follow each change without a reload.
import { request as apiRequest, type Page } from '@playwright/test';
import { DEMO_PASSWORD, errorsOf, expect, pageAs, test } from './fixtures';
import { shot } from './shots';

const live = (page: Page) => expect(page.getByRole('status').filter({ hasText: 'Live' })).toBeVisible();
const section = (page: Page, name: string) => page.getByRole('form', { name, exact: true });

test('owner changes units, wait target, a pitcher and the allergen list; an open Bar follows without reload', async ({ browser, baseURL }) => {
  const bar = await pageAs(browser, 'barista', '/bar');
  const counter = await pageAs(browser, 'cashier', '/counter', { width: 1280, height: 900 });
  const owner = await pageAs(browser, 'owner', '/admin/settings', { width: 1440, height: 1000 });
  await live(bar);
  await live(counter);
  await expect(owner.getByRole('heading', { name: 'Settings', level: 1 })).toBeVisible();
  await expect(owner.getByRole('button', { name: 'Save' }).first()).toBeEnabled(); // hydrated
  // a page that reloads loses this mark
  await bar.evaluate(() => ((window as unknown as { settingsMark: number }).settingsMark = 1));

  // A regular oat latte: 270 ml of milk + 15 ml jug waste = 285 ml → the 600 ml pitcher (fill line 330)
  const api = await apiRequest.newContext({ baseURL });
  await api.post('/api/session', { data: { username: 'cashier', password: DEMO_PASSWORD } });
  const menu = await (await api.get('/api/menu')).json();
  const latte = menu.items.find((i: { name: string }) => i.name === 'Latte');
  const oat = menu.milks.find((m: { name: string }) => m.name === 'Oat');
  const placed = await api.post('/api/orders', {
    data: {
      clientOrderId: crypto.randomUUID(),
      customerName: 'Juno Pell',
      items: [{ menuItemId: latte.id, milkId: oat.id }],
      payment: { method: 'cash', tenderedCents: 10_000 },
    },
  });
  expect(placed.status()).toBe(201);
  const oatLane = bar.getByTestId('lane').filter({ has: bar.getByRole('heading', { name: 'Oat' }) });
  // in the café's US fl oz: 600 ml ≈ 20.3 → a 20 oz pitcher (whole ounces); 285 ml ≈ 9.6 → 9.5 oz (half ounces)
  await expect(oatLane.getByTestId('jug-plan')).toContainText('20 oz pitcher · fill to 9.5 oz');

  // The demo café reads ounces and °F: the Counter's sizes and the Bar's caution say so
  await expect(bar.getByTestId('steam-caution')).toContainText('266 °F');
  await counter.getByRole('button', { name: /^Latte/ }).click();
  await expect(counter.getByRole('radio', { name: /Regular/ })).toContainText('12 oz');
  await counter.getByRole('button', { name: 'Cancel' }).click();

  // Units → millilitres and °C: the preview changes before saving, the screens after
  const units = section(owner, 'Units');
  await expect(units.getByTestId('cup-size-preview')).toContainText('12 oz = 350 ml');
  await units.getByRole('radio', { name: /Millilitres/ }).click();
  await units.getByRole('radio', { name: /Celsius/ }).click();
  await expect(units.getByTestId('cup-size-preview')).not.toContainText('oz');
  // the note gives the published burn times in both units (docs/check-values.md, "Temperatures and burns")
  await expect(units.getByTestId('steam-note')).toContainText('about 3 seconds at 60 °C (140 °F)');
  await owner.screenshot(shot('admin-settings', { fullPage: true }));
  await units.getByRole('button', { name: 'Save' }).click();
  await expect(units.getByRole('status')).toContainText('Saved');
  await expect(bar.getByTestId('steam-caution')).toContainText('130 °C');
  await expect(bar.getByTestId('steam-caution')).not.toContainText('°F');
  await expect(oatLane.getByTestId('jug-plan')).toContainText('600 ml pitcher · fill to 285 ml');
  await counter.getByRole('button', { name: /^Latte/ }).click();
  await expect(counter.getByRole('radio', { name: /Regular/ })).toContainText('350 ml');
  await counter.getByRole('button', { name: 'Cancel' }).click();

  // …and back to ounces and °F
  await units.getByRole('radio', { name: /US fluid ounces/ }).click();
  await units.getByRole('radio', { name: /Fahrenheit/ }).click();
  await units.getByRole('button', { name: 'Save' }).click();
  await expect(units.getByRole('status')).toContainText('Saved');
  await expect(bar.getByTestId('steam-caution')).toContainText('266 °F');
  await counter.getByRole('button', { name: /^Latte/ }).click();
  await expect(counter.getByRole('radio', { name: /Regular/ })).toContainText('12 oz');
  await counter.getByRole('button', { name: 'Cancel' }).click();

  // Bar: a wait target of 5 min 30 s; a bad one is refused beside its field
  const barForm = section(owner, 'Bar');
  await expect(bar.getByText('Target 4:00')).toBeVisible();
  await barForm.getByLabel('Minutes').fill('45');
  await barForm.getByRole('button', { name: 'Save' }).click();
  await expect(barForm.getByText('Between 1 and 30 minutes')).toBeVisible();
  await barForm.getByLabel('Minutes').fill('5');
  await barForm.getByLabel('Seconds').fill('30');
  await barForm.getByRole('button', { name: 'Save' }).click();
  await expect(barForm.getByRole('status')).toContainText('Saved');
  await expect(bar.getByText('Target 5:30')).toBeVisible(); // 330 s, as it is

  // Pitchers: the 600 ml one becomes 700 ml with a fill line of 400 ml → the jug plan takes it at once
  const pitchers = owner.getByRole('region', { name: 'Pitchers' });
  const six = pitchers.getByRole('form', { name: 'Pitcher of 600 ml' });
  await six.getByLabel('Fill line (ml)').fill('800');
  await six.getByRole('button', { name: 'Save pitcher' }).click();
  await expect(six.getByText('The fill line cannot be above the capacity')).toBeVisible();
  await six.getByLabel('Capacity (ml)').fill('700');
  await six.getByLabel('Fill line (ml)').fill('400');
  await six.getByRole('button', { name: 'Save pitcher' }).click();
  await expect(pitchers.getByRole('status')).toContainText('Pitcher saved');
  await expect(pitchers.getByRole('form', { name: 'Pitcher of 700 ml' })).toBeVisible();
  // 700 ml ≈ 23.7 → a 24 oz pitcher
  await expect(oatLane.getByTestId('jug-plan')).toContainText('24 oz pitcher · fill to 9.5 oz');

  // Money: a lower-case currency is taken as its code; 8.875 % is stored as 8875 and shown as typed
  const money = section(owner, 'Money and tax');
  await money.getByLabel('Currency').fill('eur');
  await money.getByLabel('Tax rate (%)').fill('8.875');
  await money.getByLabel('Tax rate (%)').fill('8.8755');
  await money.getByRole('button', { name: 'Save' }).click();
  await expect(money.getByText('A percent from 0 to 100 with up to 3 decimals, like 8.25')).toBeVisible();
  await money.getByLabel('Tax rate (%)').fill('8.875');
  await money.getByRole('button', { name: 'Save' }).click();
  await expect(money.getByRole('status')).toContainText('Saved');
  // $5.40 × 8.875 % = 0.47925 → €0.48, half up (SSUTA §324 rounding)
  await expect(money.getByTestId('tax-example')).toContainText('tax €0.48');
  await expect(money.getByLabel('Currency')).toHaveValue('EUR');
  await money.getByLabel('Currency').fill('USD');
  await money.getByLabel('Tax rate (%)').fill('8.25');
  await money.getByRole('button', { name: 'Save' }).click();
  await expect(money.getByTestId('tax-example')).toContainText('tax $0.45');

  // Allergens: the EU list reads oat milk as a cereal containing gluten (Annex II item 1); the
  // switch shows that first and rewrites nothing (more in e2e/ingredients.spec.ts)
  const allergens = section(owner, 'Allergens');
  await allergens.getByRole('radio', { name: /EU list/ }).click();
  await expect(allergens.getByTestId('switch-row').filter({ hasText: 'Oat (milk)' })).toContainText('cereals containing gluten');
  await owner.screenshot(shot('admin-settings-allergen-switch', { fullPage: true }));
  await allergens.getByRole('button', { name: 'Switch to the EU list' }).click();
  await expect(allergens.getByRole('status')).toContainText('the EU list');
  await allergens.getByRole('radio', { name: /US list/ }).click();
  await allergens.getByRole('button', { name: 'Switch to the US list' }).click();
  await expect(allergens.getByRole('status')).toContainText('the US list');

  // the Bar never reloaded
  expect(await bar.evaluate(() => (window as unknown as { settingsMark?: number }).settingsMark)).toBe(1);
  await bar.screenshot(shot('bar-after-settings'));
  await owner.setViewportSize({ width: 1024, height: 768 });
  await owner.screenshot(shot('admin-settings-1024', { fullPage: true }));
  for (const p of [bar, counter, owner]) expect(errorsOf(p)).toEqual([]);
});
