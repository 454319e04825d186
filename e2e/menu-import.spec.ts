// Menu import: the owner uploads a CSV with one bad row and sees that row's problem, chooses the
// fixed file, imports it, adds a photo to the new item, and a cashier finds it on the Counter.
import sharp from 'sharp';
import { errorsOf, expect, pageAs, test } from './fixtures';
import { shot } from './shots';

const HEADER = 'category,item,station,size,volume_ml,price,shots,dose_g,yield_g,milk_ml,takes_milk,default_milk,texture,ingredients,allergens,default_size';
const SCONE = (price: string) => `Baked,Quayside scone,counter,,,${price},0,,,,no,,,wheat; cow's milk; egg,milk; eggs; wheat,no`;
const CORTADO = 'Espresso,Cortado,bar,Regular,120,4.20,2,18.5,37,60,yes,OA,flat,,,yes';
const file = (name: string, ...rows: string[]) => ({ name, mimeType: 'text/csv', buffer: Buffer.from([HEADER, ...rows].join('\r\n') + '\r\n') });

test('the owner imports a menu file after fixing its bad row, and the new item is on the Counter', async ({ browser }) => {
  const page = await pageAs(browser, 'owner', '/admin/menu', { width: 1600, height: 1000 });
  const panel = page.getByRole('region', { name: 'Import and export' });
  await expect(panel).toBeVisible();
  await expect(panel.getByText('Nothing is deleted')).toBeVisible();

  // a price written with a comma: that row is marked, with what to fix beside it, and no Import button
  await page.getByLabel('Menu CSV file').setInputFiles(file('new-items.csv', CORTADO, SCONE('"3,75"')));
  await expect(panel.getByTestId('import-problems')).toContainText('1 row has a problem');
  const bad = panel.locator('[data-testid="import-row"][data-row="3"]');
  await expect(bad).toHaveAttribute('data-problem', 'yes');
  await expect(bad).toContainText('Problem');
  await expect(bad).toContainText('price: Use a price like 4.80');
  await expect(panel.locator('[data-testid="import-row"][data-row="2"]')).toContainText('Add');
  await expect(panel.getByRole('button', { name: /^Import/ })).toHaveCount(0);
  await panel.screenshot(shot('menu-import'));
  await page.screenshot(shot('menu-import-problem', { fullPage: true }));

  // the fixed file: both rows to add, then imported
  await page.getByLabel('Menu CSV file').setInputFiles(file('new-items.csv', CORTADO, SCONE('3.75')));
  await expect(panel.getByTestId('import-ready')).toContainText('2 rows — 2 to add, 0 to update');
  await expect(panel.locator('[data-testid="import-row"][data-problem="yes"]')).toHaveCount(0);
  await page.screenshot(shot('menu-import-preview', { fullPage: true }));
  await panel.getByRole('button', { name: 'Import 2 rows' }).click();
  await expect(panel.getByTestId('import-result')).toContainText('2 rows: 2 added, 0 updated');
  // the editor above the panel shows the new drink without a reload
  await expect(page.getByRole('region', { name: 'Items', exact: true })).toContainText('Cortado');

  // a photo for the new item, with the upload's progress shown until it is stored
  await panel.getByText('Item photos').click();
  const png = await sharp({ create: { width: 1200, height: 900, channels: 3, background: '#c8743a' } })
    .png()
    .toBuffer();
  await page.getByLabel('Photo for Quayside scone').setInputFiles({ name: 'scone.png', mimeType: 'image/png', buffer: png });
  const photo = panel.getByRole('img', { name: 'Photo of Quayside scone' });
  await expect(photo).toHaveAttribute('src', /^\/media\/menu\/[0-9a-f]{32}\.webp$/);
  await expect(panel.getByRole('progressbar')).toHaveCount(0);
  await photo.scrollIntoViewIfNeeded();
  await page.screenshot(shot('menu-import-done', { fullPage: true }));
  expect(errorsOf(page)).toEqual([]);

  // the Counter has the new category and items
  const counter = await pageAs(browser, 'cashier', '/counter', { width: 1280, height: 800 });
  await counter.getByRole('tab', { name: 'Baked' }).click();
  const tile = counter.getByRole('button', { name: /Quayside scone/ });
  await expect(tile).toContainText('$3.75');
  await expect(tile.locator('img')).toHaveAttribute('src', /^\/media\/menu\/.+\.webp$/);
  await counter.getByRole('tab', { name: 'Espresso' }).click();
  await expect(counter.getByRole('button', { name: /Cortado/ })).toContainText('$4.20');
  await counter.getByRole('tab', { name: 'Baked' }).click();
  await counter.screenshot(shot('counter-new-item'));
  expect(errorsOf(counter)).toEqual([]);
});
