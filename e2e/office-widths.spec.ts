// The back-office screens at phone, tablet and desktop widths: the page never scrolls sideways and
// no input, button or text runs past the screen's edge. A wide table may scroll inside its own
// box, and then the box is labelled (a region with a name) so a screen reader says what scrolls.
import { expect, test, type Page } from '@playwright/test';
import { errorsOf, pageAs, WIDTHS as ALL_WIDTHS } from './fixtures';
import { shot } from './shots';

const SCREENS = [
  { path: '/admin/menu', heading: 'Menu' },
  { path: '/dial-in', heading: 'Dial-in' },
  { path: '/admin/beans', heading: 'Beans' },
  { path: '/reports', heading: 'Reports' },
  { path: '/admin/team', heading: 'Team' },
  { path: '/admin/settings', heading: 'Settings' },
];
const WIDTHS = ALL_WIDTHS.map((v) => v.width);
const SHOT_WIDTHS = new Set([390, 1024, 1366]);

/** What sticks out past the viewport, outside a scroll box of its own, and any scroll box without a name. */
async function overflowOf(page: Page) {
  return page.evaluate(() => {
    const width = document.documentElement.clientWidth;
    const problems: string[] = [];
    if (document.documentElement.scrollWidth > width) problems.push(`page scrolls sideways: ${document.documentElement.scrollWidth} > ${width}`);
    const describe = (el: Element) =>
      `${el.tagName.toLowerCase()}${el.getAttribute('name') ? `[name=${el.getAttribute('name')}]` : ''}${el.getAttribute('aria-label') ? `[aria-label="${el.getAttribute('aria-label')}"]` : ''} "${(el.textContent ?? '').trim().slice(0, 40)}"`;
    const scrollBoxOf = (el: Element): Element | null => {
      for (let p = el.parentElement; p && p !== document.body; p = p.parentElement) {
        const o = getComputedStyle(p).overflowX;
        if (o === 'auto' || o === 'scroll') return p;
      }
      return null;
    };
    for (const el of document.body.querySelectorAll('input, select, textarea, button, a, label, h1, h2, h3, p, td, th')) {
      const r = el.getBoundingClientRect();
      if (r.width === 0 || r.height === 0 || getComputedStyle(el).visibility === 'hidden') continue;
      const box = scrollBoxOf(el);
      if (box) {
        const region = box.getAttribute('role') === 'region' || box.tagName === 'SECTION';
        const named = region && (box.getAttribute('aria-label') || box.getAttribute('aria-labelledby'));
        if (!named && box.scrollWidth > box.clientWidth + 1) problems.push(`unnamed scroll box around ${describe(el)}`);
        continue;
      }
      if (r.left < -1 || r.right > width + 1) problems.push(`${describe(el)} runs past the edge (${Math.round(r.left)}–${Math.round(r.right)} of ${width})`);
      // an input narrower than its own text box is cut
      if ((el.tagName === 'INPUT' || el.tagName === 'SELECT') && el.parentElement) {
        const pr = el.parentElement.getBoundingClientRect();
        if (getComputedStyle(el.parentElement).overflow !== 'visible' && r.right > pr.right + 1) problems.push(`${describe(el)} is cut by its box`);
      }
      // a value wider than its field is cut off as you read it
      if (el.tagName === 'INPUT' && (el as HTMLInputElement).value && el.scrollWidth > el.clientWidth + 1) problems.push(`${describe(el)} cuts its value`);
    }
    // anything else past the edge (an invisible box widens the page too): the outermost one only
    const past = (el: Element) => {
      const r = el.getBoundingClientRect();
      return r.width > 0 && r.right > width + 1 && !scrollBoxOf(el);
    };
    for (const el of document.body.querySelectorAll('*')) {
      if (past(el) && !(el.parentElement && el.parentElement !== document.body && past(el.parentElement))) problems.push(`${describe(el)} widens the page`);
    }
    return [...new Set(problems)];
  });
}

test('Menu, Dial-in, Beans, Reports, Team and Settings fit 390 to 1920 px wide', async ({ browser }) => {
  test.setTimeout(240_000);
  const page = await pageAs(browser, 'owner', '/admin/menu', { width: 1366, height: 768 });
  const found: Record<string, string[]> = {};
  for (const screen of SCREENS) {
    for (const width of WIDTHS) {
      await page.setViewportSize({ width, height: width === 390 ? 844 : 768 });
      await page.goto(screen.path);
      await expect(page.getByRole('heading', { level: 1, name: screen.heading })).toBeVisible();
      await page.waitForLoadState('networkidle');
      const problems = await overflowOf(page);
      if (problems.length) found[`${screen.path} @ ${width}`] = problems;
      if (SHOT_WIDTHS.has(width)) {
        await page.screenshot(shot(`office${screen.path.replace(/\//g, '-')}-${width}`, { fullPage: true }));
      }
    }
  }
  // unnamed scroll boxes list every cell: name the box once
  const short = Object.fromEntries(
    Object.entries(found).map(([k, v]) => [k, v.filter((p, i) => !p.startsWith('unnamed') || v.findIndex((q) => q.startsWith('unnamed')) === i)]),
  );
  expect(short).toEqual({});
  expect(errorsOf(page)).toEqual([]);
});
