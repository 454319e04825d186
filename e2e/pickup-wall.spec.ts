// The Pickup wall in a rush: every name is shown whole or counted in "+n more", none is cut in
// half, an empty half gives its room to the other, and the board works from a 1920×1080 wall down
// to a 390 px phone (numbers not clipped, nothing scrolls sideways).
import type { APIRequestContext, Page } from '@playwright/test';
import { apiAs, errorsOf, expect, pageAs, test, WIDTHS } from './fixtures';
import { ownServerFor } from './own-server';
import { shot } from './shots';

// a board with only this spec's orders on it: the counts below are exact
const own = ownServerFor('pickup-wall');

const NAMES = ['Ada', 'Bram', 'Cleo', 'Dov', 'Maximiliana', 'Fern', 'Gus', 'Hana', 'Ivo', 'Juno', 'Kit', 'Lior', 'Mae', 'Nico', 'Oona', 'Pim'];
/** From the wall down to a phone. */
const VIEWPORTS = [...WIDTHS].reverse();

async function placeOrders(cashier: APIRequestContext, names: string[]): Promise<number[]> {
  const menu = await (await cashier.get('/api/menu')).json();
  const latte = menu.items.find((i: { name: string }) => i.name === 'Latte').id;
  const ids: number[] = [];
  for (const name of names) {
    const res = await cashier.post('/api/orders', {
      data: {
        clientOrderId: crypto.randomUUID(),
        customerName: `${name} Quill`,
        items: [{ menuItemId: latte }],
        payment: { method: 'cash', tenderedCents: 1000 },
      },
    });
    expect(res.status()).toBe(201);
    ids.push((await res.json()).order.id);
  }
  return ids;
}

/** What the board should hold, from the API it is fed by (other specs' tickets count too). */
async function expectedCounts(page: Page) {
  const board = await (await page.request.get('/api/pickup')).json();
  const now = Date.parse(board.now);
  const tickets = board.tickets as { status: string; readyAt: string | null }[];
  return {
    making: tickets.filter((t) => t.status === 'open').length,
    ready: tickets.filter((t) => t.status === 'ready' && now - Date.parse(t.readyAt!) < board.location.pickupTimeoutSeconds * 1000).length,
  };
}

/** Per half: names shown whole, names counted in "+n more", and any name or number cut off. */
function readBoard(page: Page) {
  return page.evaluate(() => {
    const inside = (r: DOMRect, box: DOMRect) => r.left >= box.left - 1 && r.right <= box.right + 1 && r.top >= box.top - 1 && r.bottom <= box.bottom + 1;
    const view = new DOMRect(0, 0, window.innerWidth, document.documentElement.scrollHeight);
    const half = (id: string) => {
      const section = document.querySelector<HTMLElement>(`section[aria-labelledby="${id}"]`)!;
      const box = section.getBoundingClientRect();
      const cut: string[] = [];
      const sizes: number[] = [];
      const shortSizes: number[] = [];
      const rows = [...section.querySelectorAll<HTMLElement>('[data-testid="pickup-name"]')];
      for (const li of rows) {
        for (const part of li.querySelectorAll<HTMLElement>('span')) {
          const r = part.getBoundingClientRect();
          const clipped = part.scrollWidth > part.clientWidth + 1 && getComputedStyle(part).overflow !== 'visible';
          if (!inside(r, box) || !inside(r, view) || clipped || r.width === 0) cut.push(part.textContent ?? '');
        }
        const name = li.querySelector('span')!;
        sizes.push(parseFloat(getComputedStyle(name).fontSize));
        if ((name.textContent ?? '').length <= 7) shortSizes.push(parseFloat(getComputedStyle(name).fontSize));
      }
      const more = section.querySelector('[data-testid="pickup-more"]');
      return {
        shown: rows.length,
        more: more ? Number(/\+(\d+) more/.exec(more.textContent ?? '')?.[1]) : 0,
        cut,
        smallestName: Math.min(...sizes),
        smallestShortName: Math.min(...shortSizes),
      };
    };
    return { making: half('making'), ready: half('ready'), sideways: document.documentElement.scrollWidth > window.innerWidth };
  });
}

async function checkBoard(page: Page, label: string) {
  const want = await expectedCounts(page);
  // read as one settled board: after a resize or a burst of orders the wall lays itself out again
  // (columns, then name sizes), and a read in between can catch names mid-fit
  await expect
    .poll(
      async () => {
        const b = await readBoard(page);
        return { making: b.making.shown + b.making.more, ready: b.ready.shown + b.ready.more, cut: [...b.making.cut, ...b.ready.cut], sideways: b.sideways };
      },
      { message: `${label}: every name shown whole or counted, none cut off, nothing sideways` },
    )
    .toEqual({ ...want, cut: [], sideways: false });
  return readBoard(page);
}

test('the Pickup wall in a rush shows or counts every name, at every width', async ({ browser }) => {
  test.setTimeout(120_000);
  const cashier = await apiAs(own.baseURL, 'cashier');
  const barista = await apiAs(own.baseURL, 'barista');
  const page = await pageAs(browser, 'lead', '/pickup', VIEWPORTS[0], own.baseURL);
  await expect(page.getByRole('status').filter({ hasText: 'Live' })).toBeVisible();

  // 16 being made, nothing ready: the empty "Ready" half gives its room to "Being made"
  await placeOrders(cashier, NAMES);
  const first = await checkBoard(page, '1920, 16 being made');
  expect(first.making.more, 'with the Ready half empty, 16 names fit at 1920×1080').toBe(0);
  // readable from 2 m: the look's 96 px for a usual name; a long one shrinks to fit, never below 40 px
  // (about 1 in of letter per 10 ft of reading distance, common practice for signs)
  expect(first.making.smallestShortName).toBeGreaterThanOrEqual(90);
  expect(first.making.smallestName).toBeGreaterThanOrEqual(40);

  // 6 more, made and bumped: 16 being made and 6 ready
  const ready = await placeOrders(cashier, ['Quin', 'Rey', 'Sol', 'Tove', 'Uma', 'Vik']);
  for (const id of ready) expect((await barista.post(`/api/tickets/${id}/bump`)).status()).toBe(200);
  for (const viewport of VIEWPORTS) {
    await page.setViewportSize(viewport);
    const b = await checkBoard(page, `${viewport.width}×${viewport.height}, 16 + 6`);
    if (viewport.width === 1920) {
      expect(b.making.more + b.ready.more, 'every name fits at 1920×1080').toBe(0);
      expect(b.making.smallestShortName).toBeGreaterThanOrEqual(90);
      expect(b.making.smallestName).toBeGreaterThanOrEqual(40);
    }
    await page.screenshot(shot(`pickup-${viewport.width}-16-making-6-ready`, { fullPage: true }));
  }

  // 40 being made: the wall counts what it can't show
  await placeOrders(
    cashier,
    NAMES.concat(NAMES)
      .slice(0, 24)
      .map((n) => `${n}a`),
  );
  for (const viewport of [VIEWPORTS[0], VIEWPORTS[4]]) {
    await page.setViewportSize(viewport);
    const b = await checkBoard(page, `${viewport.width}, 40 being made`);
    if (viewport.width === 1920) expect(b.making.more).toBeGreaterThan(0);
    await page.screenshot(shot(`pickup-${viewport.width}-40-making`, { fullPage: true }));
  }
  await cashier.dispose();
  await barista.dispose();
  expect(errorsOf(page)).toEqual([]);
});
