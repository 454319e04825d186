// The wait as the staff read it: the Counter can say "wait now ~N min" before the customer pays, and
// Pulse says the same figure; Pulse speaks café words (the statistics in help notes), draws each chart
// on one axis with a legend in words, and works from 1366 px down to a 390 px phone.
import type { Page } from '@playwright/test';
import { apiAs, errorsOf, expect, pageAs, test } from './fixtures';
import { shot } from './shots';

async function rush(baseURL: string) {
  const [cashier, barista] = [await apiAs(baseURL, 'cashier'), await apiAs(baseURL, 'barista')];
  const menu = await (await cashier.get('/api/menu')).json();
  const latte = menu.items.find((i: { name: string }) => i.name === 'Latte').id;
  const ids: number[] = [];
  for (const name of ['Ari Moss', 'Bea Lund', 'Cy Holt', 'Di Vane', 'Eli Ross', 'Fay Dunn']) {
    const res = await cashier.post('/api/orders', {
      data: {
        clientOrderId: crypto.randomUUID(),
        customerName: name,
        items: [{ menuItemId: latte }, { menuItemId: latte }],
        payment: { method: 'cash', tenderedCents: 2000 },
      },
    });
    expect(res.status()).toBe(201);
    ids.push((await res.json()).order.id);
  }
  for (const id of ids.slice(0, 2)) expect((await barista.post(`/api/tickets/${id}/bump`)).status()).toBe(200);
  await cashier.dispose();
  await barista.dispose();
}

/** Nothing scrolls sideways, and no number on a tile is cut off. */
function layoutProblems(page: Page) {
  return page.evaluate(() => {
    const problems: string[] = [];
    if (document.documentElement.scrollWidth > window.innerWidth) {
      problems.push(`page is ${document.documentElement.scrollWidth} px wide`);
      // name the widest culprits: elements sticking out whose parent doesn't
      for (const el of document.querySelectorAll<HTMLElement>('body *')) {
        const out = (e: Element | null) => !!e && e.getBoundingClientRect().right > window.innerWidth + 1;
        if (out(el) && !out(el.parentElement?.closest('section, table, form, div') === el.parentElement ? el.parentElement : el.parentElement))
          problems.push(`too wide: <${el.tagName.toLowerCase()}> ${(el.textContent ?? '').slice(0, 40)}`);
      }
    }
    for (const el of document.querySelectorAll<HTMLElement>('[data-testid="pulse-number"] p, [data-testid="wait-now"], [data-testid="staffing"]')) {
      const r = el.getBoundingClientRect();
      if (el.scrollWidth > el.clientWidth + 1 || r.right > window.innerWidth + 1 || r.left < -1) problems.push(`cut off: ${el.textContent}`);
    }
    return problems;
  });
}

test('the Counter tells the wait before payment, and Pulse says the same', async ({ browser, baseURL }) => {
  test.setTimeout(90_000);
  await rush(baseURL!);
  const counter = await pageAs(browser, 'cashier', '/counter', { width: 1366, height: 768 });
  await expect(counter.getByRole('status').filter({ hasText: 'Live' })).toBeVisible();
  const atCounter = counter.getByTestId('wait-now');
  await expect(atCounter).toHaveText(/^Wait now ~\d+ min$/);

  const pulse = await pageAs(browser, 'lead', '/pulse', { width: 1366, height: 900 });
  await expect(pulse.getByRole('status').filter({ hasText: 'Live' })).toBeVisible();
  const minutes = /~(\d+) min/.exec((await atCounter.textContent())!)![1];
  await expect(pulse.getByTestId('wait-now')).toContainText(`~${minutes} min`);
  expect(errorsOf(counter)).toEqual([]);
});

for (const viewport of [
  { width: 1366, height: 900 },
  { width: 390, height: 844 },
]) {
  test(`Pulse at ${viewport.width} px: café words, one axis a chart, a legend in words, nothing cut off`, async ({ browser, baseURL }) => {
    test.setTimeout(90_000);
    await rush(baseURL!);
    const pulse = await pageAs(browser, 'lead', '/pulse', viewport);
    await expect(pulse.getByRole('status').filter({ hasText: 'Live' })).toBeVisible();
    await expect(pulse.locator('.recharts-surface').first()).toBeVisible();

    expect(await layoutProblems(pulse)).toEqual([]);
    // one y-axis a chart
    const charts = pulse.locator('.recharts-wrapper');
    for (let i = 0; i < (await charts.count()); i++) await expect(charts.nth(i).locator('.recharts-yAxis')).toHaveCount(1);
    // a legend in words, in ink, each line with its own pattern
    const legend = pulse.getByTestId('chart-legend');
    for (const word of ['half waited under', '9 in 10 waited under', 'target']) await expect(legend).toContainText(word);
    expect(await legend.evaluate((el) => getComputedStyle(el).color)).toBe('rgb(29, 26, 23)');
    // café words on the screen; the statistics only in the help notes
    await expect(pulse.getByTestId('pulse-number').first()).toContainText('Half waited under');
    for (const jargon of ['Hyndman', 'Erlang', 'M/M/c', 'percentile']) await expect(pulse.getByText(jargon)).toBeHidden();
    const body = await pulse.locator('body').innerText();
    expect(body).not.toMatch(/\b1 (drinks|tickets|baristas)\b/);
    await pulse.getByRole('region', { name: 'Staffing' }).getByText('How we work this out').click();
    await expect(pulse.getByRole('region', { name: 'Staffing' })).toContainText('Erlang C');
    await pulse.screenshot(shot(`pulse-${viewport.width}`, { fullPage: true }));
    expect(errorsOf(pulse)).toEqual([]);
  });
}
