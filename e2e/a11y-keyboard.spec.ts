// The keyboard alone: a sign-in, a Counter order and a Bar bump with Tab, Space, Enter and Esc;
// the focus ring visible on every stop; a dialog keeps the focus inside (Tab cycles), closes on
// Esc and hands the focus back to what opened it.
import type { Locator, Page } from '@playwright/test';
import { errorsOf, expect, test } from './fixtures';
import { Contexts, open } from './screens';

let contexts: Contexts;
test.beforeAll(async ({ browser }, info) => {
  contexts = new Contexts(browser, info.project.use.baseURL!);
});
test.afterAll(async () => contexts?.close());

/**
 * The focused element shows a ring: it matches :focus-visible, has a solid outline (or a ring
 * shadow) at least 2 px wide, and the outline stands out 3:1 from the background it is drawn on
 * (WCAG 2.1 SC 1.4.11 non-text contrast; relative luminance and contrast ratio per WCAG 2.1).
 */
async function expectFocusVisible(page: Page) {
  // polled: a button's colour transition moves its outline colour in over a few frames
  await expect.poll(() => focusRingProblem(page)).toBeNull();
}

async function focusRingProblem(page: Page): Promise<string | null> {
  const ring = await page.evaluate(() => {
    const el = document.activeElement as HTMLElement | null;
    if (!el || el === document.body) return { problem: 'nothing focused' };
    const what = `${el.tagName.toLowerCase()} "${(el.getAttribute('aria-label') ?? el.textContent ?? '').trim().slice(0, 40)}"`;
    if (!el.matches(':focus-visible')) return { problem: `${what}: not :focus-visible` };
    const css = getComputedStyle(el);
    if (css.outlineStyle === 'none' || parseFloat(css.outlineWidth) < 2) return { problem: `${what}: no outline (${css.outlineStyle} ${css.outlineWidth})` };
    const rgb = (c: string) => {
      const m = /rgba?\(([\d.]+),? ([\d.]+),? ([\d.]+)(?:,? \/? ?([\d.]+))?\)/.exec(c);
      return m ? { c: [Number(m[1]), Number(m[2]), Number(m[3])], a: m[4] === undefined ? 1 : Number(m[4]) } : null;
    };
    // the outline sits just outside the element: the background is that of the nearest opaque ancestor
    let bg: { c: number[]; a: number } | null = null;
    for (let p = el.parentElement; p && !bg; p = p.parentElement) {
      const c = rgb(getComputedStyle(p).backgroundColor);
      if (c && c.a >= 0.99) bg = c;
    }
    bg ??= { c: [255, 255, 255], a: 1 };
    const line = rgb(css.outlineColor);
    if (!line) return { problem: `${what}: outline colour ${css.outlineColor} unreadable` };
    const lum = ([r, g, b]: number[]) => {
      const ch = (v: number) => ((v /= 255) <= 0.03928 ? v / 12.92 : ((v + 0.055) / 1.055) ** 2.4);
      return 0.2126 * ch(r!) + 0.7152 * ch(g!) + 0.0722 * ch(b!);
    };
    const [hi, lo] = [lum(line.c), lum(bg.c)].sort((x, y) => y - x);
    const ratio = (hi! + 0.05) / (lo! + 0.05);
    return ratio >= 3 ? { problem: null } : { problem: `${what}: outline ${css.outlineColor} on ${bg.c.join(',')} is ${ratio.toFixed(2)}:1` };
  });
  return ring.problem;
}

/** Tab (at most `max` times) until `target` has the focus, checking the ring at every stop. */
async function tabTo(page: Page, target: Locator, max = 80) {
  for (let i = 0; i < max; i++) {
    if (await target.evaluate((el) => el === document.activeElement)) return;
    await page.keyboard.press('Tab');
    await expectFocusVisible(page);
  }
  throw new Error(`Tab never reached ${target}`);
}

/** Tab once round the dialog and once more: the focus never leaves it; Shift+Tab from the first goes to the last. */
async function expectTrapped(page: Page, dialog: Locator) {
  const stops = await dialog.evaluate(
    (box) =>
      [
        ...box.querySelectorAll<HTMLElement>(
          'a[href], button:not([disabled]), input:not([disabled]), select:not([disabled]), textarea:not([disabled]), [tabindex]',
        ),
      ].filter((el) => el.tabIndex >= 0 && el.getClientRects().length > 0).length,
  );
  expect(stops).toBeGreaterThan(0);
  for (let i = 0; i <= stops + 1; i++) {
    await page.keyboard.press('Tab');
    expect(await dialog.evaluate((box) => box.contains(document.activeElement)), `Tab ${i + 1} of ${stops + 2} stays in the dialog`).toBe(true);
  }
  for (let i = 0; i <= stops + 1; i++) {
    await page.keyboard.press('Shift+Tab');
    expect(await dialog.evaluate((box) => box.contains(document.activeElement)), `Shift+Tab ${i + 1} stays in the dialog`).toBe(true);
  }
}

/** Opens a dialog from `opener` with Enter; checks the focus moved in, is trapped, Esc closes, the focus is back. */
async function checkDialog(page: Page, opener: Locator, dialog: Locator) {
  await opener.focus();
  await page.keyboard.press('Enter');
  await expect(dialog).toBeVisible();
  await expect.poll(() => dialog.evaluate((box) => box.contains(document.activeElement)), { message: 'the focus moves into the dialog' }).toBe(true);
  await expectTrapped(page, dialog);
  await page.keyboard.press('Escape');
  await expect(dialog).toHaveCount(0);
  await expect(opener).toBeFocused();
}

test('sign-in with the keyboard alone', async () => {
  const page = await contexts.page(null);
  await open(page, '/signin');
  await tabTo(page, page.getByLabel('Sign-in name'));
  await page.keyboard.type('cashier');
  await page.keyboard.press('Tab');
  await expect(page.getByLabel('Password')).toBeFocused();
  await expectFocusVisible(page);
  await page.keyboard.type('jugline-demo');
  await page.keyboard.press('Tab');
  await expect(page.getByRole('button', { name: 'Sign in' })).toBeFocused();
  await expectFocusVisible(page);
  await page.keyboard.press('Enter');
  await expect(page).toHaveURL(/\/counter$/);
  expect(errorsOf(page)).toEqual([]);
});

test('a Counter order with the keyboard alone, then its drink bumped on the Bar with the keyboard', async () => {
  test.slow(); // a key press and a focus read per stop, a few hundred round trips to the browser
  const counter = await contexts.page('cashier');
  await open(counter, '/counter');
  const latte = counter.getByRole('button', { name: /^Latte from/ });
  await tabTo(counter, latte);
  await counter.keyboard.press('Enter');
  const sheet = counter.getByRole('dialog', { name: 'Latte' });
  await expect(sheet).toBeVisible();
  await expect.poll(() => sheet.evaluate((box) => box.contains(document.activeElement)), { message: 'the focus moves into the sheet' }).toBe(true);
  await tabTo(counter, sheet.getByRole('radio', { name: /Oat/ }), 30);
  await counter.keyboard.press('Space');
  await expect(sheet.getByRole('radio', { name: /Oat/ })).toHaveAttribute('aria-checked', 'true');
  await counter.keyboard.press('Enter'); // adds the drink
  await expect(sheet).toHaveCount(0);
  await expect(latte).toBeFocused(); // back on the tile that opened it
  await expect(counter.getByTestId('order-line')).toHaveCount(1);

  await tabTo(counter, counter.getByLabel('Name for the cup'));
  await counter.keyboard.type('Keyes Tabbot');
  const send = counter.getByRole('button', { name: /^Send/ });
  await tabTo(counter, send);
  await counter.keyboard.press('Enter');
  await expect(counter.getByRole('status').filter({ hasText: /Sent #\d+/ })).toContainText('Keyes Tabbot');
  expect(errorsOf(counter)).toEqual([]);

  const bar = await contexts.page('barista');
  await open(bar, '/bar');
  const card = bar.getByTestId('drink-card').filter({ hasText: 'Keyes Tabbot' });
  await expect(card).toHaveCount(1);
  await tabTo(bar, card.getByRole('button', { name: 'Bump ✓' }), 200);
  await bar.keyboard.press('Enter');
  await expect(card).toHaveCount(0);
  expect(errorsOf(bar)).toEqual([]);
});

test('Counter dialogs keep the focus: item sheet, today’s orders, switch person', async () => {
  test.slow(); // a key press and a focus read per stop, a few hundred round trips to the browser
  const page = await contexts.page('cashier');
  await open(page, '/counter');
  await checkDialog(page, page.getByRole('button', { name: /^Cappuccino/ }), page.getByRole('dialog', { name: 'Cappuccino' }));
  await checkDialog(page, page.getByRole('button', { name: 'Today’s orders' }), page.getByRole('dialog', { name: 'Today’s orders' }));
  await checkDialog(page, page.getByRole('button', { name: 'Switch person' }), page.getByRole('dialog', { name: 'Switch person' }));
  expect(errorsOf(page)).toEqual([]);
});

test('Menu admin dialogs keep the focus: item form, and the retire confirmation over it', async () => {
  test.slow(); // a key press and a focus read per stop, a few hundred round trips to the browser
  const page = await contexts.page('owner');
  await open(page, '/admin/menu');
  const edit = page.getByRole('button', { name: 'Edit Latte' });
  const form = page.getByRole('dialog', { name: /Latte/ });
  await checkDialog(page, edit, form);

  // the confirmation on top: it traps the focus, Esc closes it alone and the focus returns to Retire
  await edit.focus();
  await page.keyboard.press('Enter');
  await expect(form).toBeVisible();
  const retire = form.getByRole('button', { name: /^Retire/ });
  const confirm = page.getByRole('alertdialog');
  await retire.focus();
  await page.keyboard.press('Enter');
  await expect(confirm).toBeVisible();
  await expect(confirm.getByRole('button', { name: 'Keep it' })).toBeFocused();
  await expectTrapped(page, confirm);
  await page.keyboard.press('Escape');
  await expect(confirm).toHaveCount(0);
  await expect(form).toBeVisible();
  await expect(retire).toBeFocused();
  await page.keyboard.press('Escape');
  await expect(form).toHaveCount(0);
  await expect(edit).toBeFocused();
  expect(errorsOf(page)).toEqual([]);
});
