// The Bar's all-day line (how many of each drink are waiting, across the lanes) and its optional
// new-ticket sound, a setting of the screen that outlives a reload.
import { cashierApi, order } from './bar-orders';
import { errorsOf, expect, pageAs, test } from './fixtures';
import { ownServerFor } from './own-server';
import { shot } from './shots';

test.describe('the all-day line and the new-ticket sound', () => {
  // a board with only this spec's tickets, so the counts are exact
  const own = ownServerFor('bar-all-day');

  test('counts each drink still to make; the sound rings for a new ticket once switched on', async ({ browser }) => {
    const bar = await pageAs(browser, 'barista', '/bar', { width: 1366, height: 900 }, own.baseURL);
    await expect(bar.getByRole('status').filter({ hasText: 'Live' })).toBeVisible();
    await expect(bar.getByTestId('all-day')).toHaveCount(0); // nothing waiting, no line

    const api = await cashierApi(own.baseURL);
    await order(api, 'Ada', [{ item: 'Flat white' }, { item: 'Latte', milk: 'Oat' }]);
    await order(api, 'Bram', [{ item: 'Flat white' }, { item: 'Long black' }]);
    await order(api, 'Cora', [{ item: 'Flat white', milk: 'Oat' }]);
    // the flat whites sit in two lanes (whole and oat); the line counts them together
    await expect(bar.getByTestId('all-day-count')).toHaveText(['3 Flat white', '1 Latte', '1 Long black']);

    // the sound: off at first; a tap switches it on (and lets the page play)
    const sound = bar.getByRole('button', { name: /^Sound/ });
    await expect(sound).toHaveAttribute('aria-pressed', 'false');
    await sound.click();
    await expect(sound).toHaveAttribute('aria-pressed', 'true');
    await expect(sound).toHaveText('Sound on');
    await order(api, 'Dee', [{ item: 'Long black' }]);
    await expect(bar.getByTestId('all-day-count')).toHaveText(['3 Flat white', '2 Long black', '1 Latte']);
    await expect(sound).toHaveAttribute('data-rings', '1');
    await bar.screenshot(shot('bar-all-day'));

    // bumping takes a drink off the count
    await bar.getByTestId('drink-card').filter({ hasText: 'Latte' }).getByRole('button', { name: /^Bump/ }).click();
    await expect(bar.getByTestId('all-day-count')).toHaveText(['3 Flat white', '2 Long black']);

    // the setting is this screen's and outlives a reload; the browser then wants a tap before sound
    await bar.reload();
    await expect(bar.getByRole('button', { name: /^Sound on/ })).toHaveAttribute('aria-pressed', 'true');
    expect(errorsOf(bar)).toEqual([]);
    await api.dispose();
    await bar.context().close();
  });
});
