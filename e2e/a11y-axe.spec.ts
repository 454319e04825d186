// axe-core on every screen and every dialog, on a café in service: no serious or critical
// violation of the WCAG 2.1 A and AA rules. One test per screen, so a failure names it.
// Screens owned by other engineers (Bar, Counter, Pickup, Pulse, Menu, Dial-in, Beans, Reports,
// Team, Settings) are checked here too: a failure there is listed for their owner, not skipped.
import AxeBuilder from '@axe-core/playwright';
import type { Page } from '@playwright/test';
import { errorsOf, expect, test, type Login } from './fixtures';
import { open, SCREEN_NAMES, screenSuite } from './screens';

const WCAG_21_AA = ['wcag2a', 'wcag2aa', 'wcag21a', 'wcag21aa'];
const MODAL = '[role="dialog"], [role="alertdialog"], dialog[open]';

/** The serious and critical violations on the page (or `within` it), one readable line each. */
async function seriousViolations(page: Page, within?: string): Promise<string[]> {
  const axe = new AxeBuilder({ page }).withTags(WCAG_21_AA);
  // a dialog is checked alone: the screen behind it had its own test (and axe is slow on a busy machine)
  const { violations } = await (within ? axe.include(within) : axe).analyze();
  return violations
    .filter((v) => v.impact === 'serious' || v.impact === 'critical')
    .map(
      (v) =>
        `${v.impact} ${v.id}: ${v.help} → ${v.nodes
          .map((n) => n.target.join(' '))
          .slice(0, 6)
          .join(' | ')}`,
    );
}

const suite = screenSuite();

for (const name of SCREEN_NAMES) {
  test(`axe: ${name}`, async () => {
    test.slow(); // a full WCAG audit of a whole screen is heavy on a 2-core machine
    const screen = suite.screen(name);
    const page = await suite.contexts.page(screen.as);
    await open(page, screen.path);
    expect(await seriousViolations(page)).toEqual([]);
    expect(errorsOf(page).filter((e) => !/404|Not Found/.test(e))).toEqual([]);
    await page.close();
  });
}

/** Each dialog, opened the way a person opens it; checked on its own so a failure names it. */
const DIALOGS: { name: string; as: Login; path: string; open(page: Page): Promise<void> }[] = [
  {
    name: 'Counter item sheet',
    as: 'cashier',
    path: '/counter',
    open: (page) => page.getByRole('button', { name: /^Latte from/ }).click(),
  },
  {
    name: 'Counter today’s orders',
    as: 'cashier',
    path: '/counter',
    open: async (page) => {
      await page.getByRole('button', { name: 'Today’s orders' }).click();
      await expect(page.getByTestId('order-row').first()).toBeVisible();
    },
  },
  {
    name: 'Switch person',
    as: 'cashier',
    path: '/counter',
    open: async (page) => {
      await page.getByRole('button', { name: 'Switch person' }).click();
      await expect(page.getByRole('dialog').getByRole('button').first()).toBeVisible();
    },
  },
  { name: 'Menu item form', as: 'owner', path: '/admin/menu', open: (page) => page.getByRole('button', { name: 'Edit Latte' }).click() },
  {
    name: 'Menu retire confirmation',
    as: 'owner',
    path: '/admin/menu',
    open: async (page) => {
      await page.getByRole('button', { name: 'Edit Latte' }).click();
      await page
        .getByRole('dialog')
        .getByRole('button', { name: /^Retire/ })
        .click();
      await expect(page.getByRole('alertdialog')).toBeVisible();
    },
  },
  {
    name: 'Menu milk sheet',
    as: 'owner',
    path: '/admin/menu',
    open: async (page) => {
      await page.getByRole('tab', { name: 'Milks' }).click();
      await page.getByRole('button', { name: 'Edit Oat' }).click();
    },
  },
  {
    name: 'Menu extras group sheet',
    as: 'owner',
    path: '/admin/menu',
    open: async (page) => {
      await page.getByRole('tab', { name: 'Extras' }).click();
      await page
        .getByRole('button', { name: /^Edit group/ })
        .first()
        .click();
    },
  },
];

for (const dialog of DIALOGS) {
  test(`axe: ${dialog.name}`, async () => {
    test.slow(); // the screen's load and a WCAG audit of the dialog
    const page = await suite.contexts.page(dialog.as);
    await open(page, dialog.path);
    await dialog.open(page);
    await expect(page.locator(MODAL).last()).toBeVisible();
    expect(await seriousViolations(page, MODAL)).toEqual([]);
    expect(errorsOf(page)).toEqual([]);
    await page.close();
  });
}
