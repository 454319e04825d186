// Where the e2e specs put their screenshots: test-results/shots/<name>.png, gitignored, so a run
// never touches the tracked docs/screenshots/ (`npm run screenshots` refreshes those from a demo rush).
import { fileURLToPath } from 'node:url';

export const SHOTS_DIR = fileURLToPath(new URL('../test-results/shots/', import.meta.url));

/** Screenshot options for `page.screenshot(shot('bar-rush'))`; Playwright makes the folder. */
export function shot(name: string, options: { fullPage?: boolean } = {}) {
  return { ...options, path: `${SHOTS_DIR}${name}.png` };
}
