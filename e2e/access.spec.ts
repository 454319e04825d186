// Screens and sign-in: where a signed-out browser goes, what a wrong role sees, and the
// server-rendered Bar HTML without any JavaScript.
import { DEMO_PASSWORD, errorsOf, expect, pageAs, signIn, test } from './fixtures';
import { shot } from './shots';

test('a signed-out browser on a screen is sent to sign-in and back', async ({ page }) => {
  await page.goto('/bar');
  await expect(page).toHaveURL(/\/signin\?next=%2Fbar$/);
  await page.screenshot(shot('signin'));
  await signIn(page, 'barista', '/bar');
  await expect(page).toHaveURL(/\/bar$/);
  await expect(page.getByRole('heading', { name: 'Bar', level: 1 })).toBeVisible();
});

test('a wrong password says so and stays on sign-in', async ({ page }) => {
  await page.goto('/signin');
  await expect(page.getByRole('button', { name: 'Sign in' })).toBeEnabled();
  await page.getByLabel('Sign-in name').fill('barista');
  await page.getByLabel('Password').fill('not-the-password');
  await page.getByRole('button', { name: 'Sign in' }).click();
  await expect(page.getByRole('alert')).toContainText('do not match');
  await expect(page).toHaveURL(/\/signin/);
});

test('a cashier who opens the Bar gets the 403 screen', async ({ browser }) => {
  const page = await pageAs(browser, 'cashier', '/counter');
  const res = await page.goto('/bar');
  expect(res?.status()).toBe(403);
  await expect(page.getByRole('heading', { name: 'Not your screen' })).toBeVisible();
});

test('the server-rendered Bar lists every open drink before any script runs', async ({ playwright, baseURL }) => {
  const api = await playwright.request.newContext({ baseURL });
  await api.post('/api/session', { data: { username: 'cashier', password: DEMO_PASSWORD } });
  const menu = await (await api.get('/api/menu')).json();
  const id = (name: string) => menu.items.find((i: { name: string }) => i.name === name).id;
  const milk = (name: string) => menu.milks.find((m: { name: string }) => m.name === name).id;
  const orders = [
    { name: 'Kit Morrow', items: [{ menuItemId: id('Mocha'), milkId: milk('Soy') }, { menuItemId: id('Long black') }] },
    { name: 'Dana Pell', items: [{ menuItemId: id('Chai latte'), milkId: milk('Almond') }] },
  ];
  for (const o of orders) {
    const res = await api.post('/api/orders', {
      data: { clientOrderId: crypto.randomUUID(), customerName: o.name, items: o.items, payment: { method: 'cash', tenderedCents: 5000 } },
    });
    expect(res.status()).toBe(201);
  }
  await api.post('/api/session', { data: { username: 'barista', password: DEMO_PASSWORD } });
  const open = await (await api.get('/api/tickets?view=open')).json();
  const html = await (await api.get('/bar')).text();
  const drinks = open.tickets.flatMap((t: { drinks: { id: number }[] }) => t.drinks);
  expect(drinks.length).toBeGreaterThanOrEqual(3);
  for (const d of drinks) expect(html).toContain(`data-drink-id="${d.id}"`);
  for (const name of ['Mocha', 'Long black', 'Chai latte', 'Kit Morrow', 'Dana Pell']) expect(html).toContain(name);
  // lanes, jug plans and ages are in the HTML too, and a no-script refresh keeps it current
  for (const lane of ['Soy', 'Almond', 'No milk']) expect(html).toContain(`data-lane="${lane}"`);
  expect(html).toMatch(/Jug 1(<!-- -->)?:<\/span> <!-- -->\d+ oz pitcher · fill to \d+(\.5)? oz/);
  expect(html).toMatch(/data-testid="age"[^>]*>\d+:\d\d</);
  expect(html).toContain('<noscript><meta http-equiv="refresh" content="10"></noscript>');
  await api.dispose();
});

test('the Bar and Pickup hydrate without console errors', async ({ browser }) => {
  const bar = await pageAs(browser, 'lead', '/bar');
  await expect(bar.getByRole('status').filter({ hasText: 'Live' })).toBeVisible();
  await bar.goto('/pickup');
  await expect(bar.getByRole('status').filter({ hasText: 'Live' })).toBeVisible();
  expect(errorsOf(bar)).toEqual([]);
});

test('signing out from a screen returns to sign-in and closes the screen to that browser', async ({ browser }) => {
  const page = await pageAs(browser, 'lead', '/bar');
  await expect(page.getByRole('navigation', { name: 'Screens' })).toContainText('Theo Brand');
  await expect(page.getByRole('link', { name: 'Pulse' })).toBeVisible(); // the lead's other screens
  await page.getByRole('button', { name: 'Sign out' }).click();
  await expect(page).toHaveURL(/\/signin$/);
  await page.goto('/bar');
  await expect(page).toHaveURL(/\/signin\?next=%2Fbar$/);
});

test('pages carry a Content-Security-Policy with no inline script, and a hostile name renders as text', async ({ playwright, baseURL, browser }) => {
  const api = await playwright.request.newContext({ baseURL });
  await api.post('/api/session', { data: { username: 'cashier', password: DEMO_PASSWORD } });
  const menu = await (await api.get('/api/menu')).json();
  const espresso = menu.items.find((i: { name: string }) => i.name === 'Espresso').id;
  const hostile = '<img src=x onerror="window.pwned=1">';
  const res = await api.post('/api/orders', {
    data: { clientOrderId: crypto.randomUUID(), customerName: hostile, items: [{ menuItemId: espresso }], payment: { method: 'cash', tenderedCents: 1000 } },
  });
  expect(res.status()).toBe(201);
  await api.post('/api/session', { data: { username: 'barista', password: DEMO_PASSWORD } });
  const page = await api.get('/bar');
  const csp = page.headers()['content-security-policy'];
  expect(csp).toContain("script-src 'self'");
  expect(csp).not.toContain("unsafe-inline'; script");
  const html = await page.text();
  expect(html).not.toContain(hostile); // neither in the markup nor in the JSON state
  expect(html).toContain('&lt;img src=x onerror=');
  // every script tag is either the bundle (src) or non-executable JSON
  for (const tag of html.match(/<script[^>]*>/g) ?? []) expect(tag).toMatch(/src=|type="application\/json"/);
  await api.dispose();

  const bar = await pageAs(browser, 'barista', '/bar');
  await expect(bar.getByTestId('drink-card').filter({ hasText: '<img src=x' }).first()).toBeVisible();
  expect(await bar.evaluate(() => (window as unknown as { pwned?: number }).pwned)).toBeUndefined();
  expect(errorsOf(bar)).toEqual([]);
});
