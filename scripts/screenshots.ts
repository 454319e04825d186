// npm run screenshots [-- --only bar,pickup] [--days 56] [--port 4426]
// Refreshes the README's pictures in docs/screenshots/ from a believable morning at the demo café:
// the built app on a fresh temporary database with weeks of invented history behind Pulse and the
// reports, a rush played through the real API on the server's injected clock, then each screen in
// Debian's Chromium at the width it is used at. Not part of `npm test`. Every process it starts
// (the build, Chromium) is stopped by its pid before it exits.
import { spawnSync } from 'node:child_process';
import { mkdirSync, mkdtempSync, readdirSync, rmSync, statSync } from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { parseArgs } from 'node:util';
import { chromium, request, type APIRequestContext, type BrowserServer } from '@playwright/test';
import playwrightConfig from '../playwright.config';
import { DEMO_PASSWORD } from '@seeds/demo-cafe';
import { loadConfig } from '@server/config';
import { startServer, type RunningServer } from '@server/server';
import { CLIENT_DIR, isBuilt } from '@server/ssr/pages';
import { businessDate, localDayStartMs } from './history/calendar';
import { generateHistory } from './history/generate';
import { describeBoard, playRush, type SceneClock } from './screenshots/rush';
import { SCREENS, type Scene } from './screenshots/screens';
import type { Login } from '../e2e/fixtures';

const ROOT = path.resolve(import.meta.dirname, '..');
const OUT = path.join(ROOT, 'docs/screenshots');
const TIME_ZONE = 'America/New_York'; // the demo café's (demo-scenario.md)

const { values } = parseArgs({
  options: {
    only: { type: 'string' },
    days: { type: 'string', default: '56' },
    port: { type: 'string', default: process.env.SCREENSHOTS_PORT ?? '4426' },
    build: { type: 'boolean', default: false },
  },
});
const only = values.only ? new Set(values.only.split(',')) : null;
const unknown = [...(only ?? [])].filter((n) => !SCREENS.some((s) => s.name === n));
if (unknown.length) throw new Error(`--only: no screen named ${unknown.join(', ')}; the screens are ${SCREENS.map((s) => s.name).join(', ')}`);

/** Newest change under the folders the build is made from. */
function newestSource(): number {
  let newest = 0;
  const walk = (p: string) => {
    const st = statSync(p);
    if (st.isDirectory()) for (const f of readdirSync(p)) walk(path.join(p, f));
    else newest = Math.max(newest, st.mtimeMs);
  };
  for (const p of ['src', 'public', 'index.html', 'vite.config.ts', 'package-lock.json']) walk(path.join(ROOT, p));
  return newest;
}

function ensureBuild() {
  const stale = !isBuilt() || statSync(path.join(CLIENT_DIR, 'index.html')).mtimeMs < newestSource();
  if (!stale && !values.build) return;
  console.log('Building the screens (the build is missing or older than src/)…');
  const run = spawnSync('npm', ['run', 'build'], { cwd: ROOT, stdio: ['ignore', 'ignore', 'inherit'] });
  if (run.status !== 0) throw new Error(`npm run build failed (exit ${run.status}); run it yourself to see why`);
}

/** The server's clock: runs in real time from wherever the scene last set it, never backwards. */
function sceneClock(startMs: number): SceneClock & { clock: () => Date } {
  let base = startMs;
  let realAtBase = Date.now();
  const nowMs = () => base + (Date.now() - realAtBase);
  return {
    nowMs,
    set: (ms) => {
      base = Math.max(ms, nowMs());
      realAtBase = Date.now();
    },
    clock: () => new Date(nowMs()),
  };
}

async function signedIn(baseURL: string, login: Login): Promise<APIRequestContext> {
  const api = await request.newContext({ baseURL });
  const res = await api.post('/api/session', { data: { username: login, password: DEMO_PASSWORD } });
  if (!res.ok()) throw new Error(`sign-in as ${login} answered ${res.status()}`);
  return api;
}

async function main() {
  ensureBuild();
  const dir = mkdtempSync(path.join(os.tmpdir(), 'jugline-screenshots-'));
  const databaseFile = path.join(dir, 'jugline.sqlite');
  // Today at the café, 06:30 when the doors open; the rush is stopped at 08:04:40.
  const today = businessDate(new Date(), TIME_ZONE);
  const dayStart = localDayStartMs(today, TIME_ZONE);
  const openMs = dayStart + (6 * 60 + 30) * 60_000;
  const endMs = dayStart + (8 * 3600 + 4 * 60 + 40) * 1000;
  const scene = sceneClock(openMs - 10 * 60_000);

  let running: RunningServer | null = null;
  let browserServer: BrowserServer | null = null;
  const apis: APIRequestContext[] = [];
  const failures: string[] = [];
  try {
    const days = Number(values.days);
    console.log(`History: ${days} days before ${today} …`);
    const history = await generateHistory({ file: databaseFile, days, now: new Date(openMs) });
    console.log(`  ${history.orders} orders in ${history.seconds.toFixed(0)} s`);
    const config = loadConfig({
      NODE_ENV: 'production',
      PORT: values.port,
      HOST: '127.0.0.1',
      DATABASE_FILE: databaseFile,
      SEED_DEMO: 'true',
      LOG_LEVEL: 'error',
    });
    running = await startServer(config, { pages: 'production', clock: scene.clock, log: () => {} });
    const baseURL = running.url;

    const [cashier, lead, barista, barista2, owner] = await Promise.all(
      (['cashier', 'lead', 'barista', 'barista2', 'owner'] as const).map((l) => signedIn(baseURL, l)),
    );
    apis.push(cashier, lead, barista, barista2, owner);
    console.log('The morning rush …');
    const rush = await playRush({
      clock: scene,
      startMs: openMs,
      endMs,
      staff: {
        cashier,
        lead,
        baristas: [
          { name: 'Jonah', api: barista, fromMs: openMs },
          { name: 'Ines', api: barista2, fromMs: openMs + 45 * 60_000 },
          { name: 'Theo', api: lead, fromMs: openMs + 80 * 60_000 },
        ],
      },
    });
    const sceneData = await finishScene(rush.showcaseOrderId, { cashier, barista, owner });
    const board = JSON.parse(await (await cashier.get('/api/tickets?view=board')).text());
    console.log(`  ${rush.orders.length} orders by ${new Date(scene.nowMs()).toISOString()}: ${describeBoard(board)}`);

    browserServer = await chromium.launchServer(playwrightConfig.use?.launchOptions);
    const browser = await chromium.connect(browserServer.wsEndpoint());
    mkdirSync(OUT, { recursive: true });
    for (const screen of SCREENS) {
      if (only && !only.has(screen.name)) continue;
      const target = screen.path(sceneData);
      if (!target) {
        failures.push(`${screen.name}: the scene has nothing to show (no path)`);
        continue;
      }
      const context = await browser.newContext({ baseURL, viewport: screen.viewport });
      // the tablet's own clock agrees with the café's (the server's injected one), as a real one would
      await context.clock.install({ time: scene.nowMs() });
      const page = await context.newPage();
      const errors: string[] = [];
      page.on('pageerror', (e) => errors.push(e.message));
      try {
        if (screen.as) {
          const person = await signedIn(baseURL, screen.as);
          await context.addCookies((await person.storageState()).cookies);
          await person.dispose();
        }
        await page.goto(target);
        await screen.ready(page);
        await page.evaluate(() => document.fonts.ready);
        await page.screenshot({ path: path.join(OUT, `${screen.name}.png`), fullPage: screen.fullPage ?? false });
        if (errors.length) failures.push(`${screen.name}: the page logged ${errors.join('; ')}`);
        console.log(`  ${screen.name}.png  ${screen.viewport.width}×${screen.viewport.height}  ${target}`);
      } catch (err) {
        const where = path.join(dir, `${screen.name}-failed.png`);
        await page.screenshot({ path: where }).catch(() => {});
        failures.push(`${screen.name} (${target}): ${(err as Error).message.split('\n').slice(0, 3).join(' ')} — the page as it was: ${where}`);
      } finally {
        await context.close();
      }
    }
    await browser.close();
  } finally {
    await Promise.all(apis.map((a) => a.dispose()));
    if (browserServer) {
      const pid = browserServer.process().pid;
      await browserServer.close();
      if (pid && alive(pid)) process.kill(pid, 'SIGKILL');
    }
    await running?.close();
    if (failures.length === 0) rmSync(dir, { recursive: true, force: true });
  }
  if (failures.length) {
    console.error(`\n${failures.length} screen(s) failed; docs/screenshots/ has the others:\n  ${failures.join('\n  ')}`);
    process.exitCode = 1;
  } else console.log(`Done: docs/screenshots/ (look at them before committing).`);
}

/** The parts of the scene the rush leaves out: a mailed receipt, dial-in shots, an invitation. */
async function finishScene(showcaseOrderId: number, api: { cashier: APIRequestContext; barista: APIRequestContext; owner: APIRequestContext }): Promise<Scene> {
  const ok = async (what: string, res: Promise<{ ok(): boolean; status(): number; text(): Promise<string> }>) => {
    const r = await res;
    if (!r.ok()) throw new Error(`${what} answered ${r.status()}: ${(await r.text()).slice(0, 300)}`);
    return r;
  };
  await ok('the receipt mail', api.cashier.post(`/api/orders/${showcaseOrderId}/receipt`, { data: { email: 'harriet.moreau@example.test' } }));

  const dialIn = JSON.parse(await (await ok('the dial-in page', api.barista.get('/api/dial-in'))).text());
  const lot = dialIn.lots.find((l: { hopper: string }) => l.hopper === 'espresso') ?? dialIn.lots[0];
  const shots = [
    { grind: '14', doseG: 19, yieldG: 44.5, timeS: 22, tasteNote: 'thin, sour finish' },
    { grind: '12', doseG: 19, yieldG: 39, timeS: 27, tasteNote: 'sweet, caramel, balanced' },
  ];
  for (const s of shots) await ok('a dial-in shot', api.barista.post('/api/dial-in/shots', { data: { lotId: lot.id, ...s } }));

  await ok(
    'the invitation',
    api.owner.post('/api/team', { data: { name: 'Rosa Bright', username: 'rosa', email: 'rosa.bright@example.test', role: 'barista' } }),
  );
  const outbox = await (await ok('the outbox', api.owner.get('/api/outbox'))).text();
  const welcomePath = /\/welcome\/[A-Za-z0-9_-]{43}/.exec(outbox)?.[0] ?? null;
  return { showcaseOrderId, welcomePath };
}

function alive(pid: number) {
  try {
    process.kill(pid, 0);
    return true;
  } catch {
    return false;
  }
}

await main();
