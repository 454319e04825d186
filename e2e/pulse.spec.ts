// Pulse: a lead opens a shift, orders flow and the numbers move live, the shift closes with a
// cash count, and the shift report reaches the owner's mail (the Outbox).
import { request as apiRequest } from '@playwright/test';
import { DEMO_PASSWORD, errorsOf, expect, pageAs, test } from './fixtures';
import { ownServerFor } from './own-server';
import { shot } from './shots';

// the shift's counts and the open tickets at close are this file's alone
const own = ownServerFor('pulse');

test('a shift on Pulse: open, live numbers, close with a count, report mailed', async ({ browser }) => {
  test.setTimeout(90_000); // four sign-ins on a shared machine: the default 30 s is close
  const pulse = await pageAs(browser, 'lead', '/pulse', { width: 1440, height: 1200 }, own.baseURL);
  await expect(pulse.getByRole('status').filter({ hasText: 'Live' })).toBeVisible();
  await pulse.evaluate(() => ((window as unknown as { marker: number }).marker = 5));

  const openForm = pulse.getByRole('form', { name: 'Open a shift' });
  await openForm.getByLabel('Cash float ($)').fill('150.00');
  await openForm.getByRole('button', { name: 'Open shift' }).click();
  await expect(pulse.getByRole('region', { name: 'Shift', exact: true })).toContainText('Shift open since');
  await pulse.getByRole('tab', { name: 'This shift' }).click();
  const done = pulse.getByTestId('pulse-number').filter({ hasText: 'Tickets done' });
  await expect(done).toContainText('0');

  const cashier = await apiRequest.newContext({ baseURL: own.baseURL });
  await cashier.post('/api/session', { data: { username: 'cashier', password: DEMO_PASSWORD } });
  const barista = await apiRequest.newContext({ baseURL: own.baseURL });
  await barista.post('/api/session', { data: { username: 'barista', password: DEMO_PASSWORD } });
  const menu = await (await cashier.get('/api/menu')).json();
  const latte = menu.items.find((i: { name: string }) => i.name === 'Latte').id;
  const ids: number[] = [];
  for (const name of ['Nell Prior', 'Oren Kade', 'Pax Ruiz']) {
    const res = await cashier.post('/api/orders', {
      data: { clientOrderId: crypto.randomUUID(), customerName: name, items: [{ menuItemId: latte }], payment: { method: 'cash', tenderedCents: 1000 } },
    });
    ids.push((await res.json()).order.id);
  }
  await expect(pulse.getByRole('table').filter({ hasText: 'Open tickets' })).toContainText('Pax Ruiz');
  for (const id of ids.slice(0, 2)) expect((await barista.post(`/api/tickets/${id}/bump`)).status()).toBe(200);
  await expect(done).toContainText('2'); // moved live
  expect(await pulse.evaluate(() => (window as unknown as { marker?: number }).marker)).toBe(5);
  await expect(pulse.getByTestId('staffing')).not.toBeEmpty();
  // the target as it is, and what the estimate was made from in café words; the method in a help note
  await expect(pulse.getByRole('banner').getByText('Target 4:00')).toBeVisible();
  await expect(pulse.getByTestId('staffing-inputs')).toContainText(/From \d+ drinks fired in the last 30 min/);
  await expect(pulse.getByTestId('staffing-inputs')).toContainText('with 2 on bar');
  await expect(pulse.getByTestId('staffing-inputs')).not.toContainText('Erlang');
  // this café takes no tips: no "Tips today" (e2e/tips.spec.ts shows it on)
  await expect(pulse.getByTestId('tips-today')).toHaveCount(0);
  await pulse.screenshot(shot('pulse', { fullPage: true }));
  await pulse.getByRole('region', { name: 'Staffing' }).getByText('How we work this out').click();
  await expect(pulse.getByRole('region', { name: 'Staffing' })).toContainText('Erlang C');
  await pulse.getByRole('region', { name: 'Staffing' }).screenshot(shot('pulse-staffing'));

  const expected = (await pulse.getByTestId('expected-cash').textContent())!.replace(/[$,]/g, '');
  const closeForm = pulse.getByRole('form', { name: 'Close the shift' });
  await closeForm.getByLabel('Cash counted ($)').fill(expected);
  await closeForm.getByRole('button', { name: 'Close shift' }).click();
  // nothing is closed until the lead confirms the count and its difference
  const confirm = pulse.getByRole('group', { name: 'Confirm closing the shift' });
  await expect(confirm).toContainText('difference $0.00');
  await confirm.getByRole('button', { name: 'Yes, close the shift' }).click();
  // Pax Ruiz's ticket is still at the bar: the lead is told how many and how old, and asked again
  const stillOpen = pulse.getByRole('group', { name: 'Tickets still open' });
  await expect(stillOpen).toContainText(/1 ticket is still open at the bar; the ticket has waited \d+:\d\d\./);
  await pulse.screenshot(shot('shift-close-open-tickets', { fullPage: true }));
  await stillOpen.getByRole('button', { name: 'Close with the ticket open' }).click();
  await expect(pulse.getByRole('status').filter({ hasText: 'Last shift closed' })).toContainText('difference $0.00');

  await pulse.goto('/outbox');
  await expect(pulse.getByText('mara@harbour-hearth.example').first()).toBeVisible();
  await expect(pulse.getByText(/shift report/i).first()).toBeVisible();
  await cashier.dispose();
  await barista.dispose();
  // the close refused for the open ticket is the one 409 the browser logs
  expect(errorsOf(pulse).filter((e) => !/status of 409/.test(e))).toEqual([]);
});

test('the Bar: the target and ticket ages as they are, the caution from burn times', async ({ browser }) => {
  const bar = await pageAs(browser, 'barista', '/bar', { width: 1440, height: 900 }, own.baseURL);
  await expect(bar.getByRole('status').filter({ hasText: 'Live' })).toBeVisible();
  const cashier = await apiRequest.newContext({ baseURL: own.baseURL });
  await cashier.post('/api/session', { data: { username: 'cashier', password: DEMO_PASSWORD } });
  const menu = await (await cashier.get('/api/menu')).json();
  const latte = menu.items.find((i: { name: string }) => i.name === 'Latte').id;
  const res = await cashier.post('/api/orders', {
    data: { clientOrderId: crypto.randomUUID(), customerName: 'Quin Adair', items: [{ menuItemId: latte }], payment: { method: 'cash', tenderedCents: 1000 } },
  });
  expect(res.status()).toBe(201);

  await expect(bar.getByText('Target 4:00')).toBeVisible();
  await expect(bar.getByTestId('drink-card').filter({ hasText: 'Quin Adair' }).getByTestId('age')).toHaveText(/^\d+:\d\d$/);
  await expect(bar.getByTestId('steam-caution')).toContainText('burn skin in seconds');
  await expect(bar.getByTestId('steam-caution')).not.toContainText('above about');
  await bar.screenshot(shot('pulse-bar'));
  await cashier.dispose();
  expect(errorsOf(bar)).toEqual([]);
});
