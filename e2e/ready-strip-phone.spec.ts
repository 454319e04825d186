// The Counter's ready strip on a phone: with two orders on the shelf, one chip and "+1 more ready"
// fit the 390 px row; two chips would run past the edge (the widths spec met this when earlier
// specs happened to leave exactly two ready).
import { apiAs, order } from './bar-orders';
import { errorsOf, expect, pageAs, test } from './fixtures';
import { ownServerFor } from './own-server';

test.describe('the ready strip at 390 px', () => {
  // a board with only this spec's tickets, so exactly two are ready
  const own = ownServerFor('ready-strip-phone');

  test('two ready: one chip and "+1 more ready", nothing past the edge', async ({ browser }) => {
    const cashier = await apiAs(own.baseURL, 'cashier');
    const barista = await apiAs(own.baseURL, 'barista');
    for (const name of ['Wilhelmina Castellanos', 'Bartholomew Featherstone']) {
      const { id } = await order(cashier, name, [{ item: 'Long black' }]);
      expect((await barista.post(`/api/tickets/${id}/bump`)).status()).toBe(200);
    }
    const page = await pageAs(browser, 'cashier', '/counter', { width: 390, height: 844 }, own.baseURL);
    const strip = page.getByRole('region', { name: 'Ready for pickup' });
    await expect(strip.getByRole('button', { name: /^Mark collected #\d+/ })).toHaveCount(1);
    const more = strip.getByRole('button', { name: '+1 more ready' });
    await expect(more).toBeInViewport({ ratio: 1 });
    const box = (await more.boundingBox())!;
    expect(box.x + box.width).toBeLessThanOrEqual(390);
    expect(errorsOf(page)).toEqual([]);
    await Promise.all([cashier.dispose(), barista.dispose()]);
    await page.context().close();
  });
});
