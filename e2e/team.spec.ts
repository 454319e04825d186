// The Team screen end to end: the owner invites a barista, the barista opens the link from the
// mail the Outbox caught, sets a password and lands on the Bar; the used link is refused; and a
// shared terminal switches person by PIN.
import { errorsOf, expect, pageAs, test, watchForErrors } from './fixtures';
import { ownServerFor } from './own-server';
import { shot } from './shots';

test('the owner invites a barista, who sets a password from the mailed link and signs in to the Bar', async ({ browser }) => {
  const owner = await pageAs(browser, 'owner', '/admin/team', { width: 1600, height: 1000 });
  await expect(owner.getByRole('heading', { name: 'Team', level: 1 })).toBeVisible();
  await expect(owner.getByTestId('team-row')).toHaveCount(5);
  await expect(owner.getByRole('button', { name: 'Add and send invitation' })).toBeEnabled(); // hydrated

  await owner.getByLabel('Name', { exact: true }).fill('Rosa Bright');
  await owner.getByLabel('Sign-in name').fill('rosa');
  await owner.getByLabel('E-mail', { exact: true }).fill('rosa@example.com');
  await owner.getByRole('radio', { name: /Barista/ }).click();
  await owner.getByRole('button', { name: 'Add and send invitation' }).click();
  await expect(owner.getByRole('status')).toContainText('Rosa Bright was added. The invitation went to rosa@example.com');
  const row = owner.locator('[data-testid="team-row"][data-username="rosa"]');
  await expect(row).toContainText('Invited · no password yet');
  await expect(row).toContainText('Invitation sent');
  await owner.screenshot(shot('team', { fullPage: true }));

  // the invitation, as the local SMTP fake caught it
  await owner.goto('/outbox');
  const mail = owner.getByTestId('outbox-mail').filter({ hasText: 'Your Jugline sign-in at Harbour & Hearth Coffee' }).filter({ hasText: 'rosa@example.com' });
  await mail.first().click();
  const text = await owner.getByTestId('outbox-text').innerText();
  expect(text).toContain('Your sign-in name: rosa');
  const link = /(http:\/\/\S+\/welcome\/[A-Za-z0-9_-]{43})/.exec(text)?.[1];
  expect(link, text).toBeDefined();

  // the barista, on a device of her own
  const barista = await (await browser.newContext({ viewport: { width: 1280, height: 900 } })).newPage();
  watchForErrors(barista);
  await barista.goto(link!);
  await expect(barista.getByRole('heading', { name: 'Welcome to Harbour & Hearth Coffee, Rosa' })).toBeVisible();
  await expect(barista.getByText('sign-in name')).toContainText('rosa');
  await expect(barista.getByRole('button', { name: 'Set password and sign in' })).toBeEnabled();
  await barista.screenshot(shot('team-welcome'));
  await barista.getByLabel('Password', { exact: true }).fill('crema on the quay');
  await barista.getByLabel('The same password again').fill('crema on the quey');
  await barista.getByRole('button', { name: 'Set password and sign in' }).click();
  await expect(barista.getByText('The two passwords differ')).toBeVisible();
  await barista.getByLabel('The same password again').fill('crema on the quay');
  await barista.getByRole('button', { name: 'Set password and sign in' }).click();
  await barista.waitForURL('**/bar');
  await expect(barista.getByRole('navigation', { name: 'Screens' })).toContainText('Rosa Bright');
  await expect(barista.locator('[data-link-state="live"]')).toBeVisible(); // hydrated and live as Rosa

  // signing out and in again with the new password lands on the Bar too
  await barista.getByRole('button', { name: 'Sign out' }).click();
  await barista.waitForURL(/\/signin/);
  await barista.getByLabel('Sign-in name').fill('rosa');
  await barista.getByLabel('Password').fill('crema on the quay');
  await barista.getByRole('button', { name: 'Sign in' }).click();
  await barista.waitForURL('**/bar');

  // the link is used up
  const again = await barista.goto(link!);
  expect(again?.status()).toBe(404);
  await expect(barista.getByRole('heading', { name: "This link can't be used" })).toBeVisible();
  await barista.screenshot(shot('team-welcome-used'));

  await owner.goto('/admin/team');
  await expect(owner.locator('[data-testid="team-row"][data-username="rosa"]')).toContainText('Active');
  expect(errorsOf(owner)).toEqual([]);
  // the used link's page is a 404 document, which the browser logs; nothing else may be
  expect(errorsOf(barista).filter((e) => !/status of 404/.test(e))).toEqual([]);
});

test.describe('a shared terminal', () => {
  // the Bar shows only this test's ticket: its card is in sight and its Start button where it was
  const own = ownServerFor('team-switch');

  test('a shared terminal switches person by PIN, staying on the Bar or going to the new home screen', async ({ browser, playwright }) => {
    // a drink on the bar, taken at the counter by the cashier
    const api = await playwright.request.newContext({ baseURL: own.baseURL });
    await api.post('/api/session', { data: { username: 'cashier', password: 'jugline-demo' } });
    const menu = await (await api.get('/api/menu')).json();
    const latte = menu.items.find((i: { name: string }) => i.name === 'Latte').id;
    const placed = await api.post('/api/orders', {
      data: {
        clientOrderId: crypto.randomUUID(),
        customerName: 'Odette Lyle',
        items: [{ menuItemId: latte }],
        payment: { method: 'cash', tenderedCents: 2000 },
      },
    });
    expect(placed.status()).toBe(201);
    await api.dispose();

    const page = await pageAs(browser, 'barista', '/bar', undefined, own.baseURL);
    await expect(page.locator('[data-link-state="live"]')).toBeVisible();
    const card = page.getByTestId('drink-card').filter({ hasText: 'Odette' });
    await expect(card.getByTestId('who')).toHaveText('Taken by Priya');
    await card.getByRole('button', { name: 'Start' }).click();
    await expect(card.getByTestId('who')).toHaveText('Taken by Priya · Making: Jonah');
    await card.screenshot(shot('team-bar-card-who'));

    await page.getByRole('button', { name: 'Switch person' }).click();
    const dialog = page.getByRole('dialog', { name: 'Switch person' });
    await expect(dialog.getByRole('button', { name: /Ines Calder/ })).toBeVisible();
    await expect(dialog.getByRole('button', { name: /Jonah Reyes/ })).toHaveCount(0); // already signed in
    await page.screenshot(shot('team-switch-person'));
    await dialog.getByRole('button', { name: /Ines Calder/ }).click();

    const pad = page.getByRole('dialog', { name: 'PIN for Ines Calder' });
    // a wrong PIN typed on the keyboard is refused with the tries left
    await page.keyboard.type('2469');
    await page.keyboard.press('Enter');
    await expect(pad.getByRole('alert')).toContainText('That PIN is not right. 4 more wrong PINs');
    // the right one on the pad's buttons (Ines's demo PIN is 7450)
    for (const d of '7450') await pad.getByRole('button', { name: d, exact: true }).click();
    await page.screenshot(shot('team-switch-pin'));
    await pad.getByRole('button', { name: 'Switch', exact: true }).click();
    // the same screen, reloaded as Ines (a barista may see the Bar)
    await expect(page.getByRole('navigation', { name: 'Screens' })).toContainText('Ines Calder');
    expect(new URL(page.url()).pathname).toBe('/bar');
    await expect(page.locator('[data-link-state="live"]')).toBeVisible();

    // a cashier can't see the Bar: the terminal goes to the Counter
    await page.getByRole('button', { name: 'Switch person' }).click();
    await page
      .getByRole('dialog', { name: 'Switch person' })
      .getByRole('button', { name: /Priya Onslow/ })
      .click();
    await page.keyboard.type('4072');
    await page.keyboard.press('Enter');
    await page.waitForURL('**/counter');
    await expect(page.getByRole('navigation', { name: 'Screens' })).toContainText('Priya Onslow');
    // the wrong PIN's 401 is the only error the browser may log
    expect(errorsOf(page).filter((e) => !/status of 401/.test(e))).toEqual([]);
  });
});

test('a lead who opens the Team screen gets the 403 page', async ({ browser }) => {
  const page = await pageAs(browser, 'lead', '/pulse');
  const res = await page.goto('/admin/team');
  expect(res?.status()).toBe(403);
  await expect(page.getByRole('heading', { name: 'Not your screen' })).toBeVisible();
});
