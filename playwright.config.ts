import { defineConfig } from '@playwright/test';

const PORT = Number(process.env.E2E_PORT ?? 4310);

// Debian's Chromium, never a downloaded browser. The flags keep it off the closed network.
export default defineConfig({
  testDir: 'e2e',
  fullyParallel: false,
  workers: 1,
  forbidOnly: !!process.env.CI,
  retries: 0,
  reporter: [['list']],
  // fails the run if it changed the git tree (screenshots go to test-results/shots, see e2e/shots.ts)
  globalSetup: './e2e/tree-check.ts',
  use: {
    baseURL: `http://127.0.0.1:${PORT}`,
    launchOptions: {
      executablePath: process.env.CHROMIUM_PATH ?? '/usr/bin/chromium',
      args: [
        '--no-sandbox',
        '--disable-gpu',
        '--disable-quic',
        '--no-first-run',
        '--disable-background-networking',
        '--disable-component-update',
        '--disable-sync',
      ],
    },
  },
  webServer: {
    // the built app on a fresh database of its own (see e2e/serve.ts)
    command: `node_modules/.bin/tsx e2e/serve.ts`,
    url: `http://127.0.0.1:${PORT}/api/session`,
    env: { E2E_PORT: String(PORT) },
    reuseExistingServer: false,
    timeout: 60_000,
    // a SIGTERM, so the server closes and removes its temp folder (e2e/serve.ts)
    gracefulShutdown: { signal: 'SIGTERM', timeout: 15_000 },
  },
});
