// Filling a grinder moves the lot in it to the shelf: the owner is asked first, naming that lot,
// and told after.
import { errorsOf, expect, pageAs, test } from './fixtures';
import { ownServerFor } from './own-server';
import { shot } from './shots';

// the seed's grinders as they were: other specs fill and empty them on the shared server
const own = ownServerFor('beans-move');

test('adding a lot to a full grinder asks first, naming the lot that moves, and says so after', async ({ browser }) => {
  const page = await pageAs(browser, 'owner', '/admin/beans', { width: 1366, height: 768 }, own.baseURL);
  const lots = page.getByTestId('lots-table');
  const inEspresso = (await lots
    .getByRole('row')
    .filter({ hasText: 'Espresso' })
    .first()
    .getByRole('button', { name: /^Edit / })
    .getAttribute('aria-label'))!.replace(/^Edit /, '');
  await page.getByRole('button', { name: 'Add a lot' }).click();
  const form = page.getByRole('form', { name: 'Add a lot' });
  await form.getByLabel('Name').fill('Tidewater Natural');
  await form.getByLabel('Roaster').fill('Invented Roasting');
  await form.getByRole('radiogroup', { name: 'Grinder' }).getByRole('radio', { name: 'Espresso' }).click();
  await form.getByRole('button', { name: 'Add lot' }).click();

  // nothing saved yet: the question names the lot that will move
  const confirm = page.getByRole('group', { name: 'Move a lot to the shelf' });
  await expect(confirm).toContainText(`${inEspresso} is in the espresso grinder. Put Tidewater Natural in and move ${inEspresso} to the shelf?`);
  await expect(lots).not.toContainText('Tidewater Natural');
  await page.screenshot(shot('beans-move-confirm', { fullPage: true }));
  await confirm.getByRole('button', { name: `Yes, move ${inEspresso} to the shelf` }).click();

  await expect(page.getByRole('status').filter({ hasText: 'Added Tidewater Natural' })).toHaveText(
    `✓ Added Tidewater Natural to the espresso grinder. ${inEspresso} moved to the shelf.`,
  );
  await expect(lots.getByRole('row').filter({ hasText: inEspresso })).toContainText('Shelf');
  expect(errorsOf(page)).toEqual([]);
});
