// Every screen at 390, 768, 1024, 1366 and 1920 px wide, on a café in service: nothing scrolls
// sideways, no control sits past the right edge, no text spills out of its box. One test per
// screen (the widths inside), so a failure names the screen and lists every width that fails.
// Screenshots: test-results/shots/widths/<screen>-<width>.png.
import type { Page } from '@playwright/test';
import { errorsOf, expect, test, WIDTHS } from './fixtures';
import { open, SCREEN_NAMES, screenSuite } from './screens';
import { shot } from './shots';

/** What is wrong with the layout at the current width, one line per problem. */
function layoutProblems(page: Page): Promise<string[]> {
  return page.evaluate(() => {
    const vw = window.innerWidth;
    const out: string[] = [];
    const doc = document.scrollingElement ?? document.documentElement;
    if (doc.scrollWidth > vw) out.push(`the page scrolls sideways: ${doc.scrollWidth} px wide in ${vw}`);

    const name = (el: Element) => {
      const text = (el.getAttribute('aria-label') ?? (el as HTMLElement).innerText ?? el.getAttribute('placeholder') ?? '').replace(/\s+/g, ' ').trim();
      const test = el.closest('[data-testid]')?.getAttribute('data-testid');
      return `${el.tagName.toLowerCase()}${test ? ` in [${test}]` : ''} "${text.slice(0, 40) || el.outerHTML.slice(0, 120)}"`;
    };
    const shown = (el: Element) => {
      const r = el.getBoundingClientRect();
      const css = getComputedStyle(el);
      // a closed <details> keeps its content laid out but out of sight (Chromium's content-visibility)
      const folded = el.closest('details:not([open]) > :not(summary)');
      return r.width > 2 && r.height > 2 && css.visibility !== 'hidden' && !folded && !el.closest('[aria-hidden="true"], .sr-only, [inert]');
    };
    /**
     * Inside a box that scrolls sideways on its own (a wide table, the Bar's lanes): reachable there
     * if that box, or a scrolling box around it, fits the screen.
     */
    const inScroller = (el: Element) => {
      for (let p = el.parentElement; p && p !== document.body; p = p.parentElement) {
        const o = getComputedStyle(p).overflowX;
        if (o !== 'auto' && o !== 'scroll') continue;
        const r = p.getBoundingClientRect();
        if (r.left >= -1 && r.right <= vw + 1) return true;
      }
      return false;
    };

    // controls: wholly inside the viewport, left to right
    for (const el of document.querySelectorAll(
      'button, input:not([type="hidden"]), select, textarea, a[href], [role="button"], [role="tab"], [role="radio"]',
    )) {
      if (!shown(el) || inScroller(el)) continue;
      const r = el.getBoundingClientRect();
      if (r.left < -1 || r.right > vw + 1) out.push(`${name(el)} spans ${Math.round(r.left)}–${Math.round(r.right)} px, outside 0–${vw}`);
    }

    // text: no element holding text spills past its own box or off the right edge
    const walker = document.createTreeWalker(document.body, NodeFilter.SHOW_TEXT);
    const holders = new Set<HTMLElement>();
    for (let n = walker.nextNode(); n; n = walker.nextNode()) {
      if (n.textContent?.trim() && n.parentElement) holders.add(n.parentElement);
    }
    for (const el of holders) {
      if (!shown(el) || el.closest('svg, script, style, noscript, option')) continue;
      const css = getComputedStyle(el);
      const r = el.getBoundingClientRect();
      if (r.right > vw + 1 && !inScroller(el)) {
        out.push(`${name(el)} runs to ${Math.round(r.right)} px, past the ${vw} px edge`);
        continue;
      }
      // inline runs have no box of their own; a cut with an ellipsis counts unless a title holds the whole
      if (css.display === 'inline' || el.clientWidth === 0 || (css.textOverflow === 'ellipsis' && el.title)) continue;
      if (el.scrollWidth > el.clientWidth + 1 && !['auto', 'scroll'].includes(css.overflowX)) {
        out.push(`${name(el)} text is ${el.scrollWidth} px wide in a ${el.clientWidth} px box${css.overflowX === 'visible' ? ' (spills over)' : ' (clipped)'}`);
      }
    }
    return [...new Set(out)].slice(0, 12);
  });
}

const suite = screenSuite();

for (const name of SCREEN_NAMES) {
  test(`widths: ${name}`, async () => {
    test.slow(); // five loads and five full-page screenshots in one test
    const screen = suite.screen(name);
    const page = await suite.contexts.page(screen.as);
    const problems: string[] = [];
    for (const viewport of WIDTHS) {
      // loaded at each width: a screen may lay itself out from the width it starts at
      await page.setViewportSize(viewport);
      await open(page, screen.path);
      await page.evaluate(() => document.fonts.ready.then(() => undefined));
      await page.screenshot(shot(`widths/${name}-${viewport.width}`, { fullPage: true }));
      for (const p of await layoutProblems(page)) problems.push(`${viewport.width} px: ${p}`);
    }
    expect(problems, `${name} at some width`).toEqual([]);
    expect(errorsOf(page).filter((e) => !/404|Not Found/.test(e))).toEqual([]);
    await page.close();
  });
}
