// Drink options from the Counter to the Bar: a dry cappuccino is made with less milk than the
// plain one beside it, and a kids'-temperature latte gets a jug of its own, steamed cooler.
import { cashierApi, order } from './bar-orders';
import { errorsOf, expect, pageAs, test } from './fixtures';
import { ownServerFor } from './own-server';
import { shot } from './shots';

test.describe('drink options at the bar', () => {
  // a board with only this spec's drinks, so the jug plans are exact
  const own = ownServerFor('drink-options');

  test('a kids’ latte from the API, a dry cappuccino taken at the Counter: the Bar honours both', async ({ browser }) => {
    const bar = await pageAs(browser, 'barista', '/bar', { width: 1366, height: 1000 }, own.baseURL);
    const counter = await pageAs(browser, 'cashier', '/counter', { width: 1280, height: 900 }, own.baseURL);
    for (const p of [bar, counter]) await expect(p.getByRole('status').filter({ hasText: 'Live' })).toBeVisible();

    // first a kids'-temperature latte (through the API), so its jug is the one the Bar plans next
    const api = await cashierApi(own.baseURL);
    await order(api, 'Jon', [{ item: 'Latte', milk: 'Whole', extras: ['Kids’ temp'] }]);

    // at the Counter: a cappuccino, then "Dry" from the Foam options
    await counter.getByRole('button', { name: /^Cappuccino/ }).click();
    await counter.getByRole('button', { name: 'Dry', exact: true }).click();
    await expect(counter.getByRole('button', { name: /Dry/ })).toHaveAttribute('aria-pressed', 'true');
    await counter.getByRole('button', { name: /Add to order/ }).click();
    await counter.getByLabel('Name for the cup').fill('Ines');
    await counter.getByRole('button', { name: /^Send/ }).click();
    await expect(counter.getByRole('status').filter({ hasText: 'Ines' })).toBeVisible();

    const whole = bar.getByTestId('lane').filter({ has: bar.getByRole('heading', { name: 'Whole' }) });
    const dry = bar.getByTestId('drink-card').filter({ hasText: 'Ines' });
    await expect(dry).toContainText('Dry');
    const kids = bar.getByTestId('drink-card').filter({ hasText: 'Jon' });
    await expect(kids.getByTestId('kids-temp')).toHaveText("Kids' temperature: steam cooler, in its own jug");
    // two jugs though both would fit one pitcher: the kids' latte is steamed cooler, alone
    await expect(whole).toContainText("1 drink · medium stretch (silky) · kids' temperature: stop at about 50 °C / 122 °F");
    await expect(whole).toContainText('Then 1 more jug (1 drink)');
    await bar.screenshot(shot('drink-options-bar'));
    expect(errorsOf(bar)).toEqual([]);
    expect(errorsOf(counter)).toEqual([]);
    await api.dispose();
    await bar.context().close();
    await counter.context().close();
  });
});
